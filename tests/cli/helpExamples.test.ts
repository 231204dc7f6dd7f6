/**
 * Every `--help` ends with one example, and each example works as typed from the top of a
 * clone: run here in a scratch folder holding a copy of the bundled sample, exit 0.
 */
import { cpSync, existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repoRoot, runCli } from '../support/runCli.js';

/** The last lines of `tierplan <command> --help`: "Example:" and one command line. */
function example(command: string[]): string[] {
  const help = runCli([...command, '--help']);
  expect(help.status).toBe(0);
  const lines = help.stdout.trimEnd().split('\n');
  expect(lines.at(-2)).toBe('Example:');
  const line = lines.at(-1)!;
  expect(line).toMatch(/^ {2}\$ tierplan /);
  return line.replace(/^ {2}\$ tierplan /, '').split(' ');
}

describe('--help examples', () => {
  const scratch = mkdtempSync(join(tmpdir(), 'tierplan-examples-'));
  cpSync(join(repoRoot, 'samples'), join(scratch, 'samples'), { recursive: true });

  it.each([[['init']], [['tiers']], [['compare']], [['plan']]])('tierplan %j --help ends with an example that runs', (command) => {
    const args = example(command);
    expect(args[0]).toBe(command[0]);
    const result = runCli(args, { cwd: scratch });
    expect(result.stderr).not.toMatch(/^tierplan:/m);
    expect(result.status).toBe(0);
  });

  it('the top-level help ends with an example too: the plan of the sample, the example above without its option', () => {
    expect(example([])).toEqual(['plan', 'samples/spray-dryer/study.yaml', '--out', 'out/spray-dryer']);
    expect(existsSync(join(scratch, 'out/spray-dryer/plan.json'))).toBe(true);
  });
});
