// The Sobol' index ↔ coefficient identities (Saltelli et al. 2008, The Primer, ch. 1: a linear
// model's indices are its squared standardised coefficients), checked on y = x1 + 2x2 + 3x3 and
// y = x1·x2 with uniform inputs on [−1, 1]: closed form, and scipy.stats.sobol_indices estimates
// (tests/reference/precision/generate.py).
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/precision/precision.json' with { type: 'json' };
import { bilinearCoefficient, linearCoefficient, predictEffects, rangeScale } from '../../../src/core/precision/predictedEffects.js';
import type { FactorLevels } from '../../../src/core/design/designTypes.js';
import type { Factor, Response } from '../../../src/core/study.js';

describe('β = √(3·S)·spread for a linear trend', () => {
  const { coefficients, spread, firstExact, firstScipy } = fixture.sobol.linear;
  it('recovers 1, 2, 3 from the closed-form indices 1/14, 4/14, 9/14', () => {
    firstExact.forEach((S, i) => expect(linearCoefficient(S, spread)).toBeCloseTo(coefficients[i], 12));
  });
  it('recovers them from scipy.stats.sobol_indices estimates (2^14 samples) to the estimate’s accuracy', () => {
    firstScipy.forEach((S, i) => expect(Math.abs(linearCoefficient(S, spread) - coefficients[i])).toBeLessThan(2e-3));
  });
});

describe('β_ij = 3·√(S_ij)·spread for a bilinear term', () => {
  it('recovers the coefficient 1 of y = x1·x2 (Var = 1/9, S_12 = 1; scipy: first orders ≈ 0)', () => {
    const { coefficient, spread, secondScipy, firstScipy } = fixture.sobol.bilinear;
    expect(bilinearCoefficient(1, spread)).toBeCloseTo(coefficient, 12);
    expect(bilinearCoefficient(secondScipy, spread)).toBeCloseTo(coefficient, 6);
    for (const S of firstScipy) expect(S).toBeLessThan(1e-4);
  });
});

function level(id: string, varied: boolean, coded = [-1, 0, 1]): FactorLevels {
  return { id, name: id, unit: 'u', tier: varied ? 'critical' : 'negligible', varied, values: varied ? coded : [], coded: varied ? coded : [], fixedAt: varied ? null : 0, reason: '' };
}
function factor(id: string, patch: Partial<Factor> = {}): Factor {
  return { id, name: id, unit: 'u', role: 'operating', low: -1, high: 1, nominal: 0, ...patch };
}

describe('predictEffects', () => {
  // Invented three-factor case, hand-worked from the identities above.
  const factors = [factor('a'), factor('b', { analysedRange: { low: -2, high: 2 } }), factor('c')];
  const responses: Response[] = [
    { id: 'y', name: 'y', unit: 'g', weight: 1, spread: 2, noise: 0.5 },
    { id: 'z', name: 'z', unit: 'g', weight: 1, smallestEffect: 3, noise: 1 },
    { id: 'w', name: 'w', unit: 'g', weight: 1, spread: 1 },
  ];
  const indices = [
    { factor: 'a', response: 'y', first: 0.3, total: 0.4 },
    { factor: 'b', response: 'y', first: 0.12, total: 0.2 },
    { factor: 'c', response: 'y', first: 0.01, total: 0.03 },
    { factor: 'a', response: 'z', first: 0.2, total: 0.2 },
    { factor: 'b', response: 'z', first: 0.01, total: 0.02 },
    { factor: 'c', response: 'z', first: 0.0, total: 0.0 },
    { factor: 'a', response: 'w', first: 0.5, total: 0.5 },
    { factor: 'b', response: 'w', first: 0.5, total: 0.5 },
    { factor: 'c', response: 'w', first: 0.0, total: 0.0 },
  ];
  const result = predictEffects({
    factors,
    responses,
    indices,
    interactions: [{ factorA: 'b', factorB: 'a', response: 'y', index: 0.04 }, { factorA: 'a', factorB: 'b', response: 'z', index: 0.01 }],
    policy: { moderate: 0.05, interaction: 0.03 },
    levels: [level('a', true), level('b', true), level('c', false)],
  });

  it('takes the pairs whose first-order index reaches policy.moderate, per judged response', () => {
    expect(result.factors.map((e) => `${e.factor}/${e.response}`)).toEqual(['a/y', 'a/z', 'b/y']);
    expect(result.judged).toEqual(['y', 'z']);
    expect(result.basis).toBe('predicted');
  });

  it('computes β from the index and spread, scaled by the plan/analysed range ratio', () => {
    const ay = result.factors.find((e) => e.factor === 'a' && e.response === 'y')!;
    expect(ay.effect).toBeCloseTo(Math.sqrt(0.9) * 2, 12);
    const by = result.factors.find((e) => e.factor === 'b' && e.response === 'y')!;
    expect(rangeScale(factors[1])).toBeCloseTo(0.5, 12);
    expect(by.effect).toBeCloseTo(Math.sqrt(0.36) * 2 * 0.5, 12);
    expect(result.notes.some((note) => note.includes('scaled by 0.5'))).toBe(true);
  });

  it('uses smallestEffect / 2 when a response gives no spread', () => {
    const az = result.factors.find((e) => e.factor === 'a' && e.response === 'z')!;
    expect(az.effect).toBe(1.5);
    expect(az.basis).toBe('smallestEffect');
  });

  it('predicts interactions from second-order indices at or above the threshold, factors in plan order', () => {
    expect(result.interactions).toHaveLength(1);
    expect(result.interactions[0].factors).toEqual(['a', 'b']);
    expect(result.interactions[0].effect).toBeCloseTo(3 * Math.sqrt(0.04) * 2 * 0.5, 12);
  });

  it('gives the largest unexplained effect of a fixed factor from its total index', () => {
    expect(result.fixed).toEqual([{ factor: 'c', response: 'y', largestEffect: Math.sqrt(0.09) * 2, largestEffectInNoise: (Math.sqrt(0.09) * 2) / 0.5 }]);
  });

  it('says why a response is not judged', () => {
    expect(result.notes.some((note) => note.startsWith('w gives no noise'))).toBe(true);
  });
});
