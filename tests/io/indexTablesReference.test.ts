/**
 * Intake of index tables written from an independent estimator's output.
 *
 * Source: tests/reference/ishigami-intake/generate.py runs scipy.stats.sobol_indices
 * (scipy 1.17) on the Ishigami function (Ishigami & Homma 1990, a = 7, b = 0.1) with a small
 * sample, so the table carries real estimator noise: the first-order index of x3 (exactly 0)
 * is estimated at −0.0019 and its lower bootstrap bound at −0.090. The closed-form indices
 * (Sobol' & Levitan 1999; Saltelli et al. 2008, "Global Sensitivity Analysis: The Primer")
 * check that the columns land in the right fields.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { stringify } from 'yaml';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/io/studyFile.js';
import { writeFiles } from './studyScratch.js';

const referenceFolder = new URL('../reference/ishigami-intake/', import.meta.url).pathname;
const reference = JSON.parse(readFileSync(join(referenceFolder, 'ishigami-intake.json'), 'utf8')) as {
  rows: { factor: string; first: number; total: number; first_low: number; first_high: number; total_low: number; total_high: number }[];
  closedForm: { first: number[]; total: number[] };
};

function ishigamiStudy(indices: string): string {
  const factor = (id: string) => ({ id, name: `Input ${id}`, unit: '-', role: 'operating', low: -3.14159, high: 3.14159, nominal: 0 });
  const folder = writeFiles({
    'study.yaml': stringify({
      title: 'Ishigami function (test reference)',
      factors: [factor('x1'), factor('x2'), factor('x3')],
      responses: [{ id: 'y', name: 'Ishigami output', unit: '-' }],
      indices: join(referenceFolder, indices),
    }),
  });
  return join(folder, 'study.yaml');
}

describe('a table computed by scipy.stats.sobol_indices', () => {
  it('reads every estimate, clipping the slightly negative ones with warnings', async () => {
    const study = await loadStudy(ishigamiStudy('indices.csv'));
    expect(study.indices).toHaveLength(3);
    study.indices.forEach((row, i) => {
      const expected = reference.rows[i];
      expect(row.factor).toBe(expected.factor);
      expect(row.response).toBe('y');
      expect(row.first).toBeCloseTo(Math.max(0, expected.first), 15);
      expect(row.total).toBeCloseTo(expected.total, 15);
      expect(row.firstLow).toBeCloseTo(Math.max(0, expected.first_low), 15);
      expect(row.firstHigh).toBeCloseTo(expected.first_high, 15);
      expect(row.totalLow).toBeCloseTo(expected.total_low, 15);
      expect(row.totalHigh).toBeCloseTo(expected.total_high, 15);
    });
    const file = join(referenceFolder, 'indices.csv');
    // x3 is data row 3: comment line 1, header line 2, so spreadsheet row 5.
    expect(study.warnings).toEqual([
      `${file}, row 5, column first: -0.001859409958952508 clipped to 0 (estimator noise around the [0, 1] range)`,
      `${file}, row 5, column first_low: 1 confidence bound lies outside [0, 1] and was clipped to it (first here)`,
    ]);
  });

  it('puts each column in its field: the closed-form indices lie within the bootstrap bounds', async () => {
    const study = await loadStudy(ishigamiStudy('indices.csv'));
    study.indices.forEach((row, i) => {
      // Closed form: S1 = 0.3139, 0.4424, 0; ST = 0.5576, 0.4424, 0.2437 (Saltelli et al. 2008).
      const first = reference.closedForm.first[i];
      const total = reference.closedForm.total[i];
      expect(first).toBeGreaterThanOrEqual(row.firstLow! - 0.02);
      expect(first).toBeLessThanOrEqual(row.firstHigh! + 0.02);
      expect(total).toBeGreaterThanOrEqual(row.totalLow! - 0.02);
      expect(total).toBeLessThanOrEqual(row.totalHigh! + 0.02);
      expect(Math.abs(row.first - first)).toBeLessThan(0.05);
      expect(Math.abs(row.total - total)).toBeLessThan(0.05);
    });
  });

  it('gives the same Study from the semicolon / decimal-comma export of the same numbers', async () => {
    const comma = await loadStudy(ishigamiStudy('indices.csv'));
    const semicolon = await loadStudy(ishigamiStudy('indices-semicolon.csv'));
    expect(semicolon.indices).toEqual(comma.indices);
    expect(semicolon.warnings.map((line) => line.replace('indices-semicolon.csv', 'indices.csv'))).toEqual(comma.warnings);
  });
});
