/**
 * A small invented study written to a fresh temporary folder, so each test can break one
 * thing and check the one-line message it produces. Not a test file itself.
 */
import { mkdtempSync, readdirSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { stringify } from 'yaml';
import { expect } from 'vitest';
import { InputError } from '../../src/core/inputError.js';

/** Invented: a stirred bioreactor step with two settings and one kinetic parameter. */
export function baseStudy(): Record<string, any> {
  return {
    title: 'Small invented test study',
    factors: [
      { id: 'temp', name: 'Jacket temperature', unit: '°C', role: 'operating', low: 20, high: 60, nominal: 40 },
      {
        id: 'ph',
        name: 'pH set-point',
        unit: '-',
        role: 'operating',
        low: 5,
        high: 8,
        nominal: 6.5,
        precision: 0.1,
        limits: { low: 4, high: 9 },
        hardToChange: true,
      },
      { id: 'k_ref', name: 'Reference rate constant', unit: '1/h', role: 'model', low: 0.1, high: 1, nominal: 0.4 },
    ],
    responses: [
      { id: 'titre', name: 'Product titre', unit: 'g/L' },
      { id: 'purity', name: 'Purity', unit: '%', weight: 2 },
    ],
    indices: 'indices.csv',
    interactions: 'interactions.csv',
  };
}

/** Comment on row 1, header on row 2, data on rows 3–8. */
export const BASE_INDICES_CSV = [
  '# invented test indices, not from any model run',
  'factor,response,first,total,first_low,first_high,total_low,total_high',
  'temp,titre,0.42,0.55,0.38,0.46,0.50,0.60',
  'temp,purity,0.10,0.18,,,,',
  'ph,titre,0.20,0.31,0.17,0.23,0.27,0.35',
  'ph,purity,0.51,0.66,,,,',
  'k_ref,titre,0.05,0.09,,,,',
  'k_ref,purity,0.02,0.03,,,,',
  '',
].join('\n');

export const BASE_INTERACTIONS_CSV = ['factor_a,factor_b,response,index', 'temp,ph,titre,0.08', 'ph,k_ref,purity,0.01', ''].join('\n');

export const STUDY_IDS = { factorIds: ['temp', 'ph', 'k_ref'], responseIds: ['titre', 'purity'] };

/** The rows BASE_INDICES_CSV must produce, whatever the file format. */
export const BASE_INDEX_ROWS = [
  { factor: 'temp', response: 'titre', first: 0.42, total: 0.55, firstLow: 0.38, firstHigh: 0.46, totalLow: 0.5, totalHigh: 0.6 },
  { factor: 'temp', response: 'purity', first: 0.1, total: 0.18 },
  { factor: 'ph', response: 'titre', first: 0.2, total: 0.31, firstLow: 0.17, firstHigh: 0.23, totalLow: 0.27, totalHigh: 0.35 },
  { factor: 'ph', response: 'purity', first: 0.51, total: 0.66 },
  { factor: 'k_ref', response: 'titre', first: 0.05, total: 0.09 },
  { factor: 'k_ref', response: 'purity', first: 0.02, total: 0.03 },
];

export function scratchFolder(): string {
  return mkdtempSync(join(tmpdir(), 'tierplan-study-'));
}

/** Writes files (relative path → text or bytes) into a new folder and returns the folder. */
export function writeFiles(files: Record<string, string | Uint8Array>, folder = scratchFolder()): string {
  for (const [name, content] of Object.entries(files)) {
    mkdirSync(dirname(join(folder, name)), { recursive: true });
    writeFileSync(join(folder, name), content);
  }
  return folder;
}

/** The base study, changed by `edit`, written as study.yaml with the base tables. */
export function writeStudy(
  edit: (study: Record<string, any>) => void = () => {},
  tables: Record<string, string | Uint8Array> = {},
): { folder: string; studyPath: string } {
  const study = baseStudy();
  edit(study);
  const folder = writeFiles({
    'study.yaml': stringify(study),
    'indices.csv': BASE_INDICES_CSV,
    'interactions.csv': BASE_INTERACTIONS_CSV,
    ...tables,
  });
  return { folder, studyPath: join(folder, 'study.yaml') };
}

/** Awaits `action`, expects an InputError whose one-line description is exactly `line`, and no new files. */
export async function expectInputError(action: () => Promise<unknown>, line: string, folder?: string): Promise<InputError> {
  const before = folder ? readdirSync(folder).sort() : [];
  let caught: unknown;
  try {
    await action();
  } catch (error) {
    caught = error;
  }
  expect(caught).toBeInstanceOf(InputError);
  const error = caught as InputError;
  expect(error.describe()).toBe(line);
  expect(error.describe()).not.toContain('\n');
  if (folder) expect(readdirSync(folder).sort()).toEqual(before);
  return error;
}
