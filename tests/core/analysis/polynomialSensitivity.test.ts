// Closed-form Sobol' indices of polynomials in uniform inputs on [−1, 1], via the Legendre
// expansion (Sudret 2008). References: exact rational values worked by hand; exact values
// by Gauss–Legendre quadrature of the conditional variances and Monte Carlo estimates from
// scipy.stats.sobol_indices (tests/reference/sobol/generate.py → sobol.json).
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/sobol/sobol.json' with { type: 'json' };
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { polynomialSensitivity } from '../../../src/core/analysis/polynomialSensitivity.js';

function polynomial(k: number, terms: { coefficient: number; exponents: number[] }[]) {
  const ids = Array.from({ length: k }, (_, j) => `x${j + 1}`);
  const model = compileModel(
    terms.map((t) => ({ powers: Object.fromEntries(t.exponents.flatMap((e, j) => (e ? [[ids[j], e]] : []))) })),
    ids,
  );
  return polynomialSensitivity(model, terms.map((t) => t.coefficient));
}

describe('exact values worked by hand', () => {
  it('y = x1 + 2 x2 + 3 x3: S = 1/14, 4/14, 9/14, totals equal, no pair (variance (1 + 4 + 9)/3)', () => {
    const result = polynomial(3, [
      { coefficient: 1, exponents: [1, 0, 0] },
      { coefficient: 2, exponents: [0, 1, 0] },
      { coefficient: 3, exponents: [0, 0, 1] },
    ]);
    expect(result.variance).toBeCloseTo(14 / 3, 14);
    [1, 4, 9].forEach((w, j) => {
      expect(result.factors[j].first).toBeCloseTo(w / 14, 14);
      expect(result.factors[j].total).toBeCloseTo(w / 14, 14);
    });
    expect(result.pairs).toEqual([]);
  });

  it('y = x1·x2: S1 = S2 = 0, S12 = 1, both totals 1 (variance 1/9)', () => {
    const result = polynomial(2, [{ coefficient: 1, exponents: [1, 1] }]);
    expect(result.variance).toBeCloseTo(1 / 9, 15);
    expect(result.factors.map((f) => f.first)).toEqual([0, 0]);
    expect(result.factors.map((f) => f.total)).toEqual([1, 1]);
    expect(result.pairs).toEqual([{ factors: ['x1', 'x2'], index: 1 }]);
  });

  it('y = x²: mean 1/3, variance 4/45 (E x⁴ − (E x²)² = 1/5 − 1/9), S = 1', () => {
    const result = polynomial(1, [{ coefficient: 1, exponents: [2] }]);
    expect(result.mean).toBeCloseTo(1 / 3, 15);
    expect(result.variance).toBeCloseTo(4 / 45, 15);
    expect(result.factors[0].first).toBeCloseTo(1, 15);
  });

  it('y = x1 x2²: variance on x1 alone is (1/3)(1/3)² = 1/27 of 1/15 total, so S1 = 5/9, S12 = 4/9', () => {
    // E[y | x1] = x1/3, variance 1/27; Var y = E x1² E x2⁴ = (1/3)(1/5) = 1/15.
    const result = polynomial(2, [{ coefficient: 1, exponents: [1, 2] }]);
    expect(result.factors[0].first).toBeCloseTo(5 / 9, 14);
    expect(result.factors[1].first).toBeCloseTo(0, 15);
    expect(result.factors[0].total).toBeCloseTo(1, 14);
    expect(result.factors[1].total).toBeCloseTo(4 / 9, 14);
    expect(result.pairs[0].index).toBeCloseTo(4 / 9, 14);
  });
});

describe('against quadrature-exact values and scipy.stats.sobol_indices (sobol.json)', () => {
  for (const [name, c] of Object.entries(fixture.cases)) {
    const result = polynomial(c.k, c.terms);

    it(`${name}: mean, variance, first-order, total and pair indices equal the quadrature values`, () => {
      expect(result.mean).toBeCloseTo(c.exact.mean, 12);
      expect(result.variance / c.exact.variance).toBeCloseTo(1, 12);
      result.factors.forEach((f, j) => {
        expect(f.first).toBeCloseTo(c.exact.first[j], 12);
        expect(f.total).toBeCloseTo(c.exact.total[j], 12);
      });
      // Every pair that shares a term is listed; pairs that share none have index 0 in the reference.
      for (const pair of c.exact.pairs) {
        const ids = pair.factors.map((j) => `x${j + 1}`);
        const found = result.pairs.find((p) => p.factors[0] === ids[0] && p.factors[1] === ids[1]);
        expect(found?.index ?? 0).toBeCloseTo(pair.index, 12);
      }
    });

    it(`${name}: within four Monte Carlo standard errors of scipy (${c.scipy.replicates} × ${c.scipy.samplesPerReplicate} samples)`, () => {
      const replicates = c.scipy.replicates;
      result.factors.forEach((f, j) => {
        const firstSe = c.scipy.firstSd[j] / Math.sqrt(replicates);
        const totalSe = c.scipy.totalSd[j] / Math.sqrt(replicates);
        expect(Math.abs(f.first - c.scipy.firstMean[j])).toBeLessThanOrEqual(4 * firstSe + 1e-9);
        expect(Math.abs(f.total - c.scipy.totalMean[j])).toBeLessThanOrEqual(4 * totalSe + 1e-9);
      });
    });
  }
});
