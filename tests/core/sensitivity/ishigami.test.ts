/**
 * Outside check: the Ishigami function (Ishigami & Homma 1990, a = 7, b = 0.1) has
 * closed-form Sobol' indices, tabulated in Saltelli et al. 2008, *Global Sensitivity
 * Analysis: The Primer*: S1 ≈ 0.3139, S2 ≈ 0.4424, S3 = 0, ST1 ≈ 0.5576, ST2 ≈ 0.4424,
 * ST3 ≈ 0.2437, S13 ≈ 0.2437. The fixture comes from tests/reference/ishigami/generate.py
 * (analytic formulas, cross-checked by a numpy Monte Carlo estimate).
 */
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/ishigami/ishigami.json' with { type: 'json' };
import { decideTiers } from '../../../src/core/sensitivity/decideTiers.js';
import type { IndexRow, InteractionRow } from '../../../src/core/study.js';
import { factor, policy, response } from './studyFixture.js';

const ids = fixture.factors;
const factors = ids.map((id) => factor(id, 'model'));
const responses = [response('y')];
const analyticRows: IndexRow[] = ids.map((id, i) => ({
  factor: id,
  response: 'y',
  first: fixture.analytic.first[i],
  total: fixture.analytic.total[i],
}));
const interactions: InteractionRow[] = [
  { factorA: 'x1', factorB: 'x2', response: 'y', index: fixture.analytic.second['x1,x2'] },
  { factorA: 'x1', factorB: 'x3', response: 'y', index: fixture.analytic.second['x1,x3'] },
  { factorA: 'x2', factorB: 'x3', response: 'y', index: fixture.analytic.second['x2,x3'] },
];

describe('Ishigami reference indices', () => {
  it('the fixture matches the values tabulated in Saltelli et al. 2008 (4 decimals)', () => {
    expect(fixture.analytic.first[0]).toBeCloseTo(0.3139, 4);
    expect(fixture.analytic.first[1]).toBeCloseTo(0.4424, 4);
    expect(fixture.analytic.first[2]).toBe(0);
    expect(fixture.analytic.total[0]).toBeCloseTo(0.5576, 4);
    expect(fixture.analytic.total[1]).toBeCloseTo(0.4424, 4);
    expect(fixture.analytic.total[2]).toBeCloseTo(0.2437, 4);
  });

  it('default policy: x1 and x2 critical, x3 moderate through interaction alone', () => {
    const result = decideTiers({ factors, responses, indices: analyticRows, interactions, policy: policy() });
    expect(result.factors.map((tier) => tier.tier)).toEqual(['critical', 'critical', 'moderate']);
    const x3 = result.factors[2];
    // S3 = 0, so the whole total index of x3 is interaction (with x1): ST3 − S3 ≈ 0.2437
    expect(x3.interactionShare).toBeCloseTo(0.2437, 4);
    expect(result.factors[1].interactionShare).toBeCloseTo(0, 12);
    // ST1 − S1 = S13 ≈ 0.2437 as well (x1 interacts only with x3)
    expect(result.factors[0].interactionShare).toBeCloseTo(0.2437, 4);
    expect(result.interactionPairs).toEqual([
      { factorA: 'x1', factorB: 'x3', index: fixture.analytic.second['x1,x3'], responses: ['y'] },
    ]);
    expect(result.calibration.estimate).toBe(3);
    expect(result.calibration.literature).toBe(0);
  });

  it('a tier rule on the first-order index would have fixed x3; the total-index rule does not', () => {
    // Factor fixing needs ST ≈ 0 (Saltelli et al. 2008, sec. 1.2.15); S3 = 0 alone is not enough.
    const firstOnly = analyticRows.map((indexRow) => ({ ...indexRow, total: indexRow.first }));
    const result = decideTiers({ factors, responses, indices: firstOnly, interactions: [], policy: policy() });
    expect(result.factors[2].tier).toBe('negligible');
  });

  it('other cut-offs: critical 0.45 leaves only x1 critical; moderate 0.25 drops x3', () => {
    const strict = decideTiers({ factors, responses, indices: analyticRows, interactions, policy: policy({ critical: 0.45 }) });
    expect(strict.factors.map((tier) => tier.tier)).toEqual(['critical', 'moderate', 'moderate']);
    const coarse = decideTiers({
      factors,
      responses,
      indices: analyticRows,
      interactions,
      policy: policy({ moderate: 0.25 }),
    });
    expect(coarse.factors.map((tier) => tier.tier)).toEqual(['critical', 'critical', 'negligible']);
    expect(coarse.calibration.literature).toBe(1);
  });

  it('Monte Carlo estimates with their intervals give the same tiers and none is borderline', () => {
    const mc = fixture.monteCarlo;
    const mcRows: IndexRow[] = ids.map((id, i) => ({
      factor: id,
      response: 'y',
      first: mc.first[i],
      total: mc.total[i],
      totalLow: mc.totalLow[i],
      totalHigh: mc.totalHigh[i],
    }));
    for (const confidence of ['point', 'upper'] as const) {
      const result = decideTiers({ factors, responses, indices: mcRows, interactions, policy: policy({ confidence }) });
      expect(result.factors.map((tier) => tier.tier)).toEqual(['critical', 'critical', 'moderate']);
      expect(result.factors.some((tier) => tier.borderline)).toBe(false);
    }
  });
});
