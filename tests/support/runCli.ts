/**
 * Runs the built CLI as a user would and captures what it printed and its exit code.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url));
const entry = `${repoRoot}/dist/cli/main.js`;

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], options: { cwd?: string; env?: Record<string, string>; nodeArgs?: string[] } = {}): CliResult {
  const result = spawnSync(process.execPath, [...(options.nodeArgs ?? []), entry, ...args], {
    cwd: options.cwd ?? repoRoot,
    env: { ...process.env, NO_COLOR: '1', ...options.env },
    encoding: 'utf8',
  });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}
