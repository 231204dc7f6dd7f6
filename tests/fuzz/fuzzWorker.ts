/**
 * Worker thread of `npm run fuzz`: runs the cases the main thread sends, one at a time, so
 * that a hang can be ended by terminating the worker without losing the run.
 */
import { parentPort } from 'node:worker_threads';
import { FUZZ_TARGETS } from './fuzzTargets.js';
import { runFuzzCase } from './fuzzCase.js';
import type { FuzzFiles } from './fuzzInputs.js';

parentPort!.on('message', async (message: { index: number; target: string; input: FuzzFiles }) => {
  const target = FUZZ_TARGETS.find((candidate) => candidate.name === message.target)!;
  // The main thread's watchdog decides what a hang is; here every case runs to its end.
  const outcome = await runFuzzCase(target, message.input, Number.POSITIVE_INFINITY);
  parentPort!.postMessage({ index: message.index, outcome });
});
