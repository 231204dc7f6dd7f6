/**
 * Vitest global setup: compile the CLI once so command-line tests run the real `dist/` build,
 * exactly what `npx tierplan` runs after `npm ci`.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export default function buildOnce(): void {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  execFileSync(process.execPath, [`${root}/node_modules/typescript/bin/tsc`, '-p', `${root}/tsconfig.json`], {
    cwd: root,
    stdio: 'inherit',
  });
}
