/**
 * Vitest global setup: compile the CLI once so command-line tests run the real `dist/` build,
 * exactly what `npx tierplan` runs after `npm ci`, and leave its entry executable.
 *
 * Type errors do not stop the run here (tsc still emits JavaScript): the command-line tests
 * then fail on their own, and `npm run typecheck` is the place that reports types.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export default function buildOnce(): void {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  const result = spawnSync(process.execPath, [`${root}/node_modules/typescript/bin/tsc`, '-p', `${root}/tsconfig.json`], {
    cwd: root,
    encoding: 'utf8',
  });
  if (result.status !== 0) {
    process.stderr.write(`buildOnce: tsc reported errors; the CLI tests run whatever was emitted.\n${result.stdout}${result.stderr}\n`);
  }
  // The bin entry must stay executable: `npx tierplan` runs it directly (as `npm run build` leaves it).
  const entry = `${root}/dist/cli/main.js`;
  if (existsSync(entry)) chmodSync(entry, 0o755);
}
