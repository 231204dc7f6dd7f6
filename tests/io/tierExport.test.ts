/**
 * Writing `--out` files of the tier decision: the CSV row per factor, and the refusals that
 * keep the user's files safe (an input of the study, a folder, a missing folder), each one
 * line with nothing left behind.
 */
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { decideTiers } from '../../src/core/sensitivity/decideTiers.js';
import { tierDocument, writeTierExport } from '../../src/io/tierExport.js';
import { factor, policy, response, row } from '../core/sensitivity/studyFixture.js';
import { expectInputError } from './studyScratch.js';

// Invented: two settings, one response. a: 0.4 → critical (bounds 0.35–0.45); b: 0.04 → negligible.
const result = decideTiers({
  factors: [factor('a'), factor('b')],
  responses: [response('y')],
  indices: [row('a', 'y', 0.3, 0.4, [0.35, 0.45]), row('b', 'y', 0.03, 0.04)],
  interactions: [],
  policy: policy(),
});
const document = tierDocument('Invented', result, []);

function folder(): string {
  return mkdtempSync(join(tmpdir(), 'tierplan-export-'));
}

describe('writeTierExport', () => {
  it('writes one CSV row per factor with the hand-worked values', async () => {
    const dir = folder();
    await writeTierExport(join(dir, 'tiers.csv'), document, result, ['y']);
    const lines = readFileSync(join(dir, 'tiers.csv'), 'utf8').trimEnd().split('\r\n');
    expect(lines).toHaveLength(3);
    expect(lines[1]).toMatch(/^"a","Factor a","'?-","operating","critical","no",0\.4,0\.35,0\.45,0\.3,0\.1,0\.4,"estimate",0\.1,0\.4$/);
    expect(lines[2]).toMatch(/^"b","Factor b","'?-","operating","negligible","no",0\.04,,,0\.03,0\.01,0\.04,"estimate",0\.01,0\.04$/);
    expect(readdirSync(dir)).toEqual(['tiers.csv']);
  });

  it('refuses to overwrite an input of the study, also through another name for it', async () => {
    const dir = folder();
    writeFileSync(join(dir, 'indices.csv'), 'original');
    symlinkSync(join(dir, 'indices.csv'), join(dir, 'alias.csv'));
    const inputs = [join(dir, 'study.yaml'), join(dir, 'indices.csv')];
    const message = 'is an input of the study (the study file or one of its index tables); choose another --out file';
    await expectInputError(() => writeTierExport(join(dir, 'indices.csv'), document, result, ['y'], inputs), `${join(dir, 'indices.csv')}: ${message}`, dir);
    await expectInputError(() => writeTierExport(join(dir, 'alias.csv'), document, result, ['y'], inputs), `${join(dir, 'alias.csv')}: ${message}`, dir);
    expect(readFileSync(join(dir, 'indices.csv'), 'utf8')).toBe('original');
    // A different file next to the inputs is fine.
    await writeTierExport(join(dir, 'tiers.json'), document, result, ['y'], inputs);
    expect(JSON.parse(readFileSync(join(dir, 'tiers.json'), 'utf8')).factors.map((f: { tier: string }) => f.tier)).toEqual(['critical', 'negligible']);
  });

  it('refuses a folder as the target and a folder that does not exist', async () => {
    const dir = folder();
    mkdirSync(join(dir, 'tiers.json'));
    await expectInputError(
      () => writeTierExport(join(dir, 'tiers.json'), document, result, ['y']),
      `${join(dir, 'tiers.json')}: is a folder; give a file name ending in .csv or .json`,
      dir,
    );
    await expectInputError(
      () => writeTierExport(join(dir, 'missing', 'tiers.csv'), document, result, ['y']),
      `${join(dir, 'missing')}: folder does not exist; create it first`,
      dir,
    );
  });
});
