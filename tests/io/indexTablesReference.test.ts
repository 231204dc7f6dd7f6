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
import { decideTiers } from '../../src/core/sensitivity/decideTiers.js';
import { writeFiles } from './studyScratch.js';

const referenceFolder = new URL('../reference/ishigami-intake/', import.meta.url).pathname;
const reference = JSON.parse(readFileSync(join(referenceFolder, 'ishigami-intake.json'), 'utf8')) as {
  rows: { factor: string; first: number; total: number; first_low: number; first_high: number; total_low: number; total_high: number }[];
  closedForm: { first: number[]; total: number[] };
};

function ishigamiStudy(indices: string, tables: Record<string, string> = {}, interactions?: string): string {
  const factor = (id: string) => ({ id, name: `Input ${id}`, unit: '-', role: 'operating', low: -3.14159, high: 3.14159, nominal: 0 });
  const folder = writeFiles({
    'study.yaml': stringify({
      title: 'Ishigami function (test reference)',
      factors: [factor('x1'), factor('x2'), factor('x3')],
      responses: [{ id: 'y', name: 'Ishigami output', unit: '-' }],
      indices: indices in tables ? indices : join(referenceFolder, indices),
      ...(interactions !== undefined ? { interactions } : {}),
    }),
    ...tables,
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

// The main job end to end: the table goes through intake, then the tier rule (default cut-offs
// 0.30 / 0.05, common practice). Closed-form Ishigami indices (a = 7, b = 0.1; Ishigami &
// Homma 1990, values as tabulated in Saltelli et al. 2008, "Global Sensitivity Analysis:
// The Primer"): ST = 0.5576, 0.4424, 0.2437, so x1 and x2 are critical and x3 moderate, x3
// purely through its interaction with x1 (S1 = 0, S13 = ST3 = 0.2437; S12 = S23 = 0).
describe('intake then tiers on the Ishigami function', () => {
  it('closed-form indices written as a table give the tiers those values imply', async () => {
    const { first, total } = reference.closedForm;
    const indices = ['factor,response,S1,ST', ...['x1', 'x2', 'x3'].map((id, i) => `${id},y,${first[i]},${total[i]}`)].join('\n');
    const pairs = ['factor_a,factor_b,response,S2', 'x1,x2,y,0', `x1,x3,y,${total[2]}`, 'x2,x3,y,0'].join('\n');
    const study = await loadStudy(ishigamiStudy('closed.csv', { 'closed.csv': indices, 'pairs.csv': pairs }, 'pairs.csv'));
    expect(study.warnings).toEqual([]);
    const result = decideTiers(study);
    expect(result.factors.map((factor) => [factor.id, factor.tier])).toEqual([['x1', 'critical'], ['x2', 'critical'], ['x3', 'moderate']]);
    expect(result.factors[0].aggregatedTotal).toBeCloseTo(0.5576, 4);
    expect(result.factors[2].interactionShare).toBeCloseTo(0.2437, 4);
    expect(result.factors[1].interactionShare).toBeCloseTo(0, 12);
    expect(result.interactionPairs.map((pair) => [pair.factorA, pair.factorB])).toEqual([['x1', 'x3']]);
    expect(result.interactionPairs[0].index).toBeCloseTo(0.2437, 4);
  });

  it('the scipy estimate gives the same tiers, none borderline: every bootstrap interval stays inside one tier', async () => {
    const result = decideTiers(await loadStudy(ishigamiStudy('indices.csv')));
    expect(result.factors.map((factor) => [factor.id, factor.tier, factor.borderline])).toEqual([
      ['x1', 'critical', false],
      ['x2', 'critical', false],
      ['x3', 'moderate', false],
    ]);
    // x3's first-order estimate −0.0019 was clipped to 0, so its whole total is interaction.
    expect(result.factors[2].interactionShare).toBeCloseTo(reference.rows[2].total, 12);
    // Under the conservative policy x3 is tiered on its upper bound 0.290, still below 0.30.
    const upper = decideTiers({ ...(await loadStudy(ishigamiStudy('indices.csv'))), policy: { ...result.policy, confidence: 'upper' } });
    expect(upper.factors[2].decidedOn).toBeCloseTo(reference.rows[2].total_high, 12);
    expect(upper.factors[2].tier).toBe('moderate');
  });
});
