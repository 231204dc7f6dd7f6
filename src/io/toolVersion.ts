/**
 * The tool's own version, read from package.json so there is one place to bump it.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

let cached: string | undefined;

export function toolVersion(): string {
  if (cached === undefined) {
    // dist/io/toolVersion.js and src/io/toolVersion.ts both sit two levels below the package root.
    const packageJson = fileURLToPath(new URL('../../package.json', import.meta.url));
    cached = (JSON.parse(readFileSync(packageJson, 'utf8')) as { version: string }).version;
  }
  return cached;
}
