/**
 * Headless Chromium for the real-browser checks: Debian's `chromium` package driven by
 * playwright-core. The flags keep it from reaching for the network (the test machines have
 * none) and from needing a sandbox or GPU. Each launch gets a fresh temporary profile.
 *
 * `npm run test:browser` sets TIERPLAN_REQUIRE_CHROMIUM=1 (vitest.browser.config.ts), so a
 * missing browser fails there; plain `npm test` skips these checks with a warning instead.
 */
import { existsSync } from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

/** Debian's path; TIERPLAN_CHROMIUM_PATH overrides it (also handy to try the skip path). */
export const CHROMIUM_PATH = process.env.TIERPLAN_CHROMIUM_PATH ?? '/usr/bin/chromium';
export const hasChromium = existsSync(CHROMIUM_PATH);
export const chromiumRequired = process.env.TIERPLAN_REQUIRE_CHROMIUM === '1';

export const SKIP_MESSAGE = `Browser checks skipped: Chromium is not installed at ${CHROMIUM_PATH} (apt-get install -y chromium; npm run test:browser requires it).`;

/** Warns once per file when the checks are skipped; throws when they are required. */
export function announceAvailability(): void {
  if (hasChromium) return;
  if (chromiumRequired) throw new Error(`npm run test:browser needs Chromium at ${CHROMIUM_PATH}: apt-get install -y chromium`);
  console.warn(SKIP_MESSAGE);
}

export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** Pages in a PDF written by Chromium: one `/Type /Page` object per page (`/Pages` excluded). */
export function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}
