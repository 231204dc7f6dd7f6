/**
 * `npm run fuzz -- --cases N --seed S`: the suite's fuzz harness, run for longer, with counts.
 *
 * Cases are dealt round-robin to the targets of fuzzTargets.ts and generated from the seed
 * (target t draws from seed S + t, as in the suite). Each runs in a worker thread; a case that
 * has not finished after --bound seconds (default 30) is a hang: the worker is terminated and
 * a fresh one takes the next case. Crashes and hangs are written, files and all, to
 * fuzz-failures/<seed>-<case>/ so they can be replayed. Exit status 1 when there is any.
 *
 * Flags: --cases N (default 1000), --seed S (default 20260417, the suite's), --bound SECONDS,
 * --target NAME (only that target).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import fc from 'fast-check';
import { FUZZ_TARGETS } from './fuzzTargets.js';
import { writeCaseFiles, type Outcome, type OutcomeKind } from './fuzzCase.js';
import type { FuzzFiles } from './fuzzInputs.js';

function flag(name: string, fallback: number | string): string {
  const args = process.argv.slice(2);
  const at = args.indexOf(name);
  if (at >= 0 && args[at + 1] !== undefined) return args[at + 1];
  const inline = args.find((arg) => arg.startsWith(`${name}=`));
  return inline ? inline.slice(name.length + 1) : String(fallback);
}

const cases = Number(flag('--cases', 1000));
const seed = Number(flag('--seed', 20260417));
const boundSeconds = Number(flag('--bound', 30));
const only = flag('--target', '');
if (!Number.isInteger(cases) || cases < 1 || !Number.isInteger(seed) || !(boundSeconds > 0)) {
  process.stderr.write('usage: npm run fuzz -- --cases N --seed S [--bound SECONDS] [--target NAME]\n');
  process.exit(2);
}
const targets = FUZZ_TARGETS.map((target, t) => ({ target, t })).filter(({ target }) => only === '' || target.name === only);
if (targets.length === 0) {
  process.stderr.write(`no target named "${only}"; targets: ${FUZZ_TARGETS.map((target) => target.name).join(', ')}\n`);
  process.exit(2);
}

interface Job {
  index: number;
  target: string;
  input: FuzzFiles;
}

// Target t's cases come from seed + t, in the order the suite draws them.
const perTarget = targets.map(({ target, t }, slot) => {
  const count = slot < cases ? Math.floor((cases - 1 - slot) / targets.length) + 1 : 0;
  return count === 0 ? [] : fc.sample(target.inputs, { seed: seed + t, numRuns: count });
});
const jobs: Job[] = [];
for (let i = 0; i < cases; i++) {
  const slot = i % targets.length;
  jobs.push({ index: i, target: targets[slot].target.name, input: perTarget[slot][Math.floor(i / targets.length)] });
}

const counts = new Map<string, Record<OutcomeKind, number>>();
const time = new Map<string, number>();
let slowest = { milliseconds: 0, index: -1 };
const failures: { job: Job; outcome: Outcome }[] = [];

function workerUrl(): URL {
  return new URL('./fuzzWorker.ts', import.meta.url);
}

/** A worker running fuzzWorker.ts: TypeScript, so it registers tsx's loader before importing it. */
function newWorker(): Worker {
  const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(require('node:worker_threads').workerData); });`;
  return new Worker(bootstrap, { eval: true, workerData: workerUrl().href });
}

function record(job: Job, outcome: Outcome): void {
  const entry = counts.get(job.target) ?? { valid: 0, inputError: 0, crash: 0, hang: 0 };
  entry[outcome.kind]++;
  counts.set(job.target, entry);
  time.set(job.target, (time.get(job.target) ?? 0) + outcome.milliseconds);
  if (outcome.milliseconds > slowest.milliseconds) slowest = { milliseconds: outcome.milliseconds, index: job.index };
  if (outcome.kind === 'crash' || outcome.kind === 'hang') failures.push({ job, outcome });
}

/** Runs the jobs on one worker, replacing it after a hang. */
async function runLane(lane: Job[]): Promise<void> {
  let worker = newWorker();
  for (const job of lane) {
    const outcome = await new Promise<Outcome>((resolve) => {
      const started = performance.now();
      const timer = setTimeout(() => {
        worker.removeAllListeners();
        void worker.terminate();
        worker = newWorker();
        resolve({ kind: 'hang', milliseconds: performance.now() - started, detail: `no answer after ${boundSeconds} s` });
      }, boundSeconds * 1000);
      worker.once('message', (message: { outcome: Outcome }) => {
        clearTimeout(timer);
        worker.removeAllListeners('error');
        resolve(message.outcome);
      });
      worker.once('error', (error) => {
        clearTimeout(timer);
        worker.removeAllListeners('message');
        worker = newWorker();
        resolve({ kind: 'crash', milliseconds: performance.now() - started, detail: `worker died: ${String(error)}` });
      });
      worker.postMessage(job);
    });
    record(job, outcome);
    const done = [...counts.values()].reduce((sum, entry) => sum + entry.valid + entry.inputError + entry.crash + entry.hang, 0);
    if (done % 500 === 0) process.stderr.write(`… ${done} of ${cases} cases\n`);
  }
  await worker.terminate();
}

const started = performance.now();
// One worker per core beyond the first (the main thread only waits), at least one.
const lanes = Math.max(1, Math.min(availableParallelism() - 1, 4));
const laneJobs = Array.from({ length: lanes }, (_, lane) => jobs.filter((_, i) => i % lanes === lane));
await Promise.all(laneJobs.map(runLane));
const seconds = (performance.now() - started) / 1000;

for (const { job, outcome } of failures) {
  const folder = join('fuzz-failures', `${seed}-${job.index}`);
  mkdirSync(folder, { recursive: true });
  await writeCaseFiles(job.input.files, folder);
  writeFileSync(join(folder, 'FAILURE.txt'), `${job.target}, case ${job.index}, seed ${seed}: ${outcome.kind}\nmutations: ${job.input.mutations.join(' | ')}\n\n${outcome.detail}\n`);
}

const rows = [...counts.entries()].map(([name, entry]) => ({ name, ...entry, seconds: (time.get(name) ?? 0) / 1000 }));
const total = rows.reduce(
  (sum, row) => ({ valid: sum.valid + row.valid, inputError: sum.inputError + row.inputError, crash: sum.crash + row.crash, hang: sum.hang + row.hang }),
  { valid: 0, inputError: 0, crash: 0, hang: 0 },
);
const line = (name: string, entry: { valid: number; inputError: number; crash: number; hang: number }) =>
  `${name.padEnd(20)}${String(entry.valid + entry.inputError + entry.crash + entry.hang).padStart(8)}${String(entry.valid).padStart(8)}${String(entry.inputError).padStart(13)}${String(entry.crash).padStart(9)}${String(entry.hang).padStart(7)}`;
process.stdout.write(`fuzz: seed ${seed}, ${cases} cases, bound ${boundSeconds} s per case, ${lanes} worker${lanes === 1 ? '' : 's'}, load ${loadavg()[0].toFixed(1)}\n`);
process.stdout.write(`${'target'.padEnd(20)}${'cases'.padStart(8)}${'valid'.padStart(8)}${'input errors'.padStart(13)}${'crashes'.padStart(9)}${'hangs'.padStart(7)}\n`);
for (const row of rows) process.stdout.write(`${line(row.name, row)}\n`);
process.stdout.write(`${line('total', total)}\n`);
process.stdout.write(`time ${seconds.toFixed(1)} s (slowest case ${Math.round(slowest.milliseconds)} ms, case ${slowest.index})\n`);
if (failures.length > 0) {
  process.stdout.write(`${failures.length} failing case${failures.length === 1 ? '' : 's'} written to fuzz-failures/\n`);
  for (const { job, outcome } of failures.slice(0, 10)) process.stdout.write(`  case ${job.index} (${job.target}): ${outcome.kind}: ${outcome.detail.split('\n')[0]}\n`);
  process.exitCode = 1;
}
