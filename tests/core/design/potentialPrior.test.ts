// The DuMouchel & Jones (1994) potential-term prior against numpy (tests/reference/precision/generate.py):
// α by numpy.linalg.lstsq, residual ranges, adjusted rows, and the Bayesian criterion
// ln|X̃'X̃ + K| by numpy.linalg.slogdet.
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/precision/precision.json' with { type: 'json' };
import { potentialPrior } from '../../../src/core/design/potentialPrior.js';
import { crossProduct } from '../../../src/core/linalg/crossProduct.js';
import { invertSymmetric } from '../../../src/core/linalg/cholesky.js';

type Case = typeof fixture.potentialOneFactor;

function rawRows(c: Case, terms: ((x: number[]) => number)[]): Float64Array {
  const p = terms.length;
  const rows = new Float64Array(c.candidates.length * p);
  c.candidates.forEach((x, i) => terms.forEach((f, t) => (rows[i * p + t] = f(x))));
  return rows;
}

function logDet(M: Float64Array, p: number): number {
  return invertSymmetric(M, p, new Float64Array(p * p));
}

const cases: { name: string; c: Case; terms: ((x: number[]) => number)[]; potential: boolean[] }[] = [
  {
    name: 'one factor at 4 levels, primary 1, x, x², potential x³',
    c: fixture.potentialOneFactor,
    terms: [() => 1, (x) => x[0], (x) => x[0] ** 2, (x) => x[0] ** 3],
    potential: [false, false, false, true],
  },
  {
    name: '3×3 grid, primary 1, x1, x2, potential x1x2, x1², x2²',
    c: fixture.potentialTwoFactors as unknown as Case,
    terms: [() => 1, (x) => x[0], (x) => x[1], (x) => x[0] * x[1], (x) => x[0] ** 2, (x) => x[1] ** 2],
    potential: [false, false, false, true, true, true],
  },
];

describe('potentialPrior', () => {
  for (const { name, c, terms, potential } of cases) {
    describe(name, () => {
      const p = terms.length;
      const n = c.candidates.length;
      const rows = rawRows(c, terms);
      const prior = potentialPrior(rows, n, p, potential);

      it('regresses the potential columns on the primary ones and scales the residual by its range', () => {
        prior.alpha.flat().forEach((value, i) => expect(value).toBeCloseTo(c.alpha.flat()[i], 10));
        prior.ranges.forEach((value, i) => expect(value).toBeCloseTo(c.ranges[i], 10));
        for (let i = 0; i < n; i++) {
          const adjusted = prior.adjust(rows.subarray(i * p, (i + 1) * p));
          adjusted.forEach((value, t) => expect(value).toBeCloseTo(c.adjustedRows[i][t], 10));
        }
      });

      it('ln|X̃\'X̃ + K| = ln|X\'X + P| + ln|B|²: the search can add P to the raw X\'X', () => {
        const design = c.design.map((i) => Array.from(rows.subarray(i * p, (i + 1) * p)));
        const M = crossProduct(Float64Array.from(design.flat()), design.length, p);
        for (let i = 0; i < p * p; i++) M[i] += prior.priorInformation[i];
        expect(logDet(M, p) + prior.logDetAdjustment).toBeCloseTo(c.logDetBayes, 9);
      });
    });
  }

  it('with no potential terms the criterion is plain D (P = 0)', () => {
    const c = fixture.potentialOneFactor;
    const rows = rawRows(c, [() => 1, (x) => x[0], (x) => x[0] ** 2]);
    const prior = potentialPrior(rows, c.candidates.length, 3, [false, false, false]);
    expect(prior.priorInformation.every((value) => value === 0)).toBe(true);
    const design = c.design.map((i) => Array.from(rows.subarray(i * 3, (i + 1) * 3)));
    expect(logDet(crossProduct(Float64Array.from(design.flat()), design.length, 3), 3) + prior.logDetAdjustment).toBeCloseTo(c.logDetPlain, 10);
  });

  it('marks a potential column the primary terms explain as aliased (x³ on three levels)', () => {
    const candidates = [[-1], [0], [1]];
    const terms = [() => 1, (x: number[]) => x[0], (x: number[]) => x[0] ** 3];
    const rows = new Float64Array(9);
    candidates.forEach((x, i) => terms.forEach((f, t) => (rows[i * 3 + t] = f(x))));
    const prior = potentialPrior(rows, 3, 3, [false, false, true]);
    expect(prior.aliased).toEqual([2]);
    expect(prior.priorInformation[8]).toBe(0);
  });
});
