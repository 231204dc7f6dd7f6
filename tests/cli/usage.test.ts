/**
 * Usage mistakes on the command line get the same treatment as every other user error:
 * one line on stderr, exit code 2, nothing on stdout.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../support/runCli.js';

describe('command-line usage errors', () => {
  it.each([
    [['tiers', '--jsn', 'samples/spray-dryer/study.yaml'], /unknown option '--jsn'.*--json/],
    [['plan'], /missing required argument 'study'/],
    [['frobnicate'], /unknown command 'frobnicate'/],
  ])('%j is refused in one line', (args, pattern) => {
    const result = runCli(args);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    const lines = result.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^tierplan: /);
    expect(lines[0]).toMatch(pattern);
  });

  it('prints help and the version with exit code 0', () => {
    const help = runCli(['--help']);
    expect(help.status).toBe(0);
    for (const command of ['tiers', 'plan', 'compare']) expect(help.stdout).toContain(command);
    const version = runCli(['--version']);
    expect(version.status).toBe(0);
    expect(version.stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
  });
});
