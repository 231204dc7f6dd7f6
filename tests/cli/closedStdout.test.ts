/**
 * A reader that goes away early (`tierplan analyze … | head -1`, `plan --json | head`) is not
 * an error: every command writing to stdout ends quietly with status 0 and nothing on stderr
 * when its stdout pipe is closed — before the command writes anything, and after the reader
 * has taken the first chunk. The pipe is a real one: the built CLI is spawned and the test
 * closes its end of the child's stdout. The analysed sheet is the sample's invented results
 * (samples/spray-dryer/makeResults.ts, INVENTED) for the plan made here.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadPlan } from '../../src/io/planFile.js';
import { filledWorkbook } from '../../samples/spray-dryer/makeResults.js';
import { repoRoot, runCli } from '../support/runCli.js';

const work = mkdtempSync(join(tmpdir(), 'tierplan-closed-stdout-'));
const planPath = join(work, 'plan', 'plan.json');
const results = join(work, 'results.xlsx');
const study = join(repoRoot, 'samples/spray-dryer/study.yaml');

beforeAll(async () => {
  expect(runCli(['plan', study, '--out', join(work, 'plan'), '--starts', '2']).status).toBe(0);
  writeFileSync(results, await filledWorkbook(await loadPlan(planPath)));
});

interface Ended {
  status: number | null;
  signal: NodeJS.Signals | null;
  stderr: string;
  /** Bytes the reader took before closing the pipe. */
  read: number;
}

/** Runs the CLI with stdout on a pipe that the reader closes at once (`when: 'first'`: after the first chunk). */
function runWithStdoutClosed(args: string[], when: 'start' | 'first'): Promise<Ended> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [join(repoRoot, 'dist/cli/main.js'), ...args], {
      cwd: repoRoot,
      env: { ...process.env, NO_COLOR: '1' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    let read = 0;
    child.stderr.setEncoding('utf8').on('data', (text: string) => (stderr += text));
    if (when === 'start') child.stdout.destroy();
    else
      child.stdout.once('data', (chunk: Buffer) => {
        read = chunk.length;
        child.stdout.destroy();
      });
    child.on('error', reject);
    child.on('close', (status, signal) => resolve({ status, signal, stderr, read }));
  });
}

/** One of each kind of stdout writer (summaries, --json, help); the slow planners are closed after the first chunk only. */
const AT_START: [string, () => string[]][] = [
  ['tiers', () => ['tiers', study]],
  ['tiers --json', () => ['tiers', study, '--json']],
  ['analyze', () => ['analyze', planPath, results]],
  ['analyze --json', () => ['analyze', planPath, results, '--json']],
  ['augment --json', () => ['augment', planPath, results, '--runs', '3', '--json']],
  // init writes its skeleton to a file and prints where; into the scratch folder, never the clone.
  ['init', () => ['init', join(repoRoot, 'samples/spray-dryer/indices.csv'), '--out', join(work, 'study-skeleton.yaml'), '--force']],
  ['--help', () => ['--help']],
];
const AFTER_FIRST_CHUNK: [string, () => string[]][] = [
  ['plan --json', () => ['plan', study, '--json', '--starts', '2']],
  ['analyze', () => ['analyze', planPath, results]],
  ['analyze --json', () => ['analyze', planPath, results, '--json']],
  ['augment', () => ['augment', planPath, results, '--runs', '3']],
];

describe('stdout closed early by its reader', () => {
  it.each(AT_START)('%s ends with status 0 and nothing on stderr when the pipe is closed before it writes', async (_, args) => {
    const ended = await runWithStdoutClosed(args(), 'start');
    expect(ended.stderr).toBe('');
    expect(ended.signal).toBeNull();
    expect(ended.status).toBe(0);
  }, 60_000);

  it.each(AFTER_FIRST_CHUNK)(
    '%s ends with status 0 and nothing on stderr when the reader closes the pipe after the first chunk (| head -1)',
    async (_, args) => {
      const ended = await runWithStdoutClosed(args(), 'first');
      expect(ended.read).toBeGreaterThan(0);
      expect(ended.stderr).toBe('');
      expect(ended.status).toBe(0);
    },
    60_000,
  );

  it('still reports a wrong input with status 2 when stdout is closed', async () => {
    const ended = await runWithStdoutClosed(['analyze', planPath, join(work, 'missing.xlsx')], 'start');
    expect(ended.status).toBe(2);
    expect(ended.stderr).toMatch(/^tierplan: .*missing\.xlsx: file not found\n$/);
  }, 60_000);
});
