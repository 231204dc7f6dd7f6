/**
 * The last-resort handler of src/cli/main.ts: an internal error (a bug, never the user's
 * input) ends in one line "internal error — please report" with the tool version, exit code 3,
 * no stack trace, and nothing half-written. The bugs are planted by
 * tests/support/injectFault.mjs, preloaded with `node --import`.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repoRoot, runCli } from '../support/runCli.js';
import { writeStudy } from '../io/studyScratch.js';

const version = (JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8')) as { version: string }).version;
const preload = ['--import', join(repoRoot, 'tests/support/injectFault.mjs')];
// A small study plans in a fraction of a second, so the planted fault is what the time goes on.
const study = writeStudy().studyPath;

function planWithFault(fault: string): { status: number | null; stderr: string; left: string[] } {
  const out = mkdtempSync(join(tmpdir(), 'tierplan-fault-'));
  writeFileSync(join(out, 'notes.txt'), 'the user keeps this file here\n');
  const result = runCli(['plan', study, '--out', out], { nodeArgs: preload, env: { TIERPLAN_TEST_FAULT: fault } });
  return { status: result.status, stderr: result.stderr, left: readdirSync(out).sort() };
}

describe('an internal error', () => {
  it.each([
    ['hash', 'a bug before anything is written', 'TypeError: planted fault in createHash'],
    ['rename', 'a bug while the files are being put in place', 'TypeError: planted fault in rename'],
    ['async', 'a bug thrown from a timer while a temporary file exists', 'TypeError: planted fault in a timer'],
  ])('%s (%s): one line, exit 3, nothing written', (fault, _, what) => {
    const { status, stderr, left } = planWithFault(fault);
    expect(status).toBe(3);
    expect(stderr).toBe(`tierplan: internal error — please report (tierplan ${version}): ${what}\n`);
    expect(stderr).not.toMatch(/\n\s+at /);
    expect(left).toEqual(['notes.txt']);
  });

  it('shows the stack with TIERPLAN_DEBUG=1, for the report', () => {
    const failing = runCli(['plan', study, '--json'], { nodeArgs: preload, env: { TIERPLAN_TEST_FAULT: 'hash', TIERPLAN_DEBUG: '1' } });
    expect(failing.status).toBe(3);
    expect(failing.stderr).toMatch(/^tierplan: internal error — please report/);
    expect(failing.stderr).toMatch(/\n\s+at /);
  });
});

describe('a reader that goes away', () => {
  it('is no error: `plan --json | head -c 1` ends quietly', () => {
    const result = spawnSync('sh', ['-c', `"${process.execPath}" "${join(repoRoot, 'dist/cli/main.js')}" plan "${study}" --json | head -c 1`], {
      encoding: 'utf8',
      env: { ...process.env, NO_COLOR: '1' },
    });
    expect(result.stdout).toBe('{');
    expect(result.stderr).toBe('');
  });
});
