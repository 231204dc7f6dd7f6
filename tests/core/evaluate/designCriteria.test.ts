import { describe, expect, it } from 'vitest';
import reference from '../../reference/design/design.json' with { type: 'json' };
import { dEfficiency, iCriterion, logDetPerRun } from '../../../src/core/evaluate/designCriteria.js';
import { firstOrderExponents, modelFromExponents, quadraticExponents } from '../design/gridRegions.js';

describe('design criteria', () => {
  // Expected values: numpy.linalg.slogdet / inv of X'X and trace((X'X)^-1 W) with W from
  // Gauss–Legendre quadrature (tests/reference/design/generate.py → design.json).
  for (const entry of reference.criteria) {
    it(`matches numpy for ${entry.name}`, () => {
      const model = modelFromExponents(entry.exponents);
      expect(logDetPerRun(model, entry.points)).toBeCloseTo(entry.logDetPerRun, 9);
      expect(dEfficiency(model, entry.points)).toBeCloseTo(entry.dEfficiency, 8);
      const W = Float64Array.from(entry.moments);
      expect(iCriterion(model, entry.points, W) / entry.iCriterion).toBeCloseTo(1, 10);
    });
  }

  it('gives 100 % D-efficiency to the 2^3 full factorial with all interactions (Montgomery, Design and Analysis of Experiments, orthogonal ±1 designs)', () => {
    const exponents = [...quadraticExponents(3, false), [1, 1, 1]];
    const model = modelFromExponents(exponents);
    const points = [-1, 1].flatMap((a) => [-1, 1].flatMap((b) => [-1, 1].map((c) => [a, b, c])));
    expect(dEfficiency(model, points)).toBeCloseTo(100, 10);
    expect(logDetPerRun(model, points)).toBeCloseTo(0, 12);
  });

  it('gives the first-order model on the 2^2 factorial the I-criterion of W = diag(1, 1/3, 1/3) over N = 4 (closed form: trace(I/4 · W))', () => {
    const model = modelFromExponents(firstOrderExponents(2));
    const points = [[-1, -1], [-1, 1], [1, -1], [1, 1]];
    const W = Float64Array.from([1, 0, 0, 0, 1 / 3, 0, 0, 0, 1 / 3]);
    expect(iCriterion(model, points, W)).toBeCloseTo((1 + 2 / 3) / 4, 12);
  });

  it('reports a singular design as −Infinity, 0 % and Infinity', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const points = [[-1, -1], [1, 1], [-1, 1], [1, -1], [-1, -1], [1, 1]];
    expect(logDetPerRun(model, points)).toBe(Number.NEGATIVE_INFINITY);
    expect(dEfficiency(model, points)).toBe(0);
    expect(iCriterion(model, points, new Float64Array(36))).toBe(Number.POSITIVE_INFINITY);
  });
});
