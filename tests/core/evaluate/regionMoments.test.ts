import { describe, expect, it } from 'vitest';
import reference from '../../reference/design/design.json' with { type: 'json' };
import { regionMoments } from '../../../src/core/evaluate/regionMoments.js';
import { gridRegion, modelFromExponents, THREE_LEVELS } from '../design/gridRegions.js';

describe('region moments', () => {
  // Expected values: tensor Gauss–Legendre quadrature over [−1, 1]^k, exact for these
  // polynomial degrees (tests/reference/design/generate.py → design.json).
  for (const entry of reference.criteria) {
    it(`is exact on the uncut cube for ${entry.name} (quadrature fixture)`, () => {
      const model = modelFromExponents(entry.exponents);
      const k = entry.exponents[0].length;
      const levels = entry.name.startsWith('4-level') ? [[-1, -1 / 3, 1 / 3, 1], THREE_LEVELS, THREE_LEVELS] : Array(k).fill(THREE_LEVELS);
      const { matrix, method } = regionMoments(model, gridRegion(levels));
      expect(method).toMatch(/exact/);
      entry.moments.forEach((value, i) => expect(matrix[i]).toBeCloseTo(value, 12));
    });
  }

  it('treats a non-enumerated grid whose test points are all feasible as the uncut cube', () => {
    const entry = reference.criteria[0];
    const model = modelFromExponents(entry.exponents);
    const { matrix, method } = regionMoments(model, gridRegion([THREE_LEVELS, THREE_LEVELS], () => true, false));
    expect(method).toMatch(/exact moments/);
    entry.moments.forEach((value, i) => expect(matrix[i]).toBeCloseTo(value, 12));
  });

  // Expected values: scipy.integrate.dblquad over the square cut by x1 + x2 ≤ 0.5, divided by its area.
  const cut = reference.cutRegionMoments;
  const feasible = (x: ArrayLike<number>) => x[0] + x[1] <= 0.5;
  it('averages a cut region by quasi-Monte Carlo within 3e-3 of scipy dblquad (fixture)', () => {
    const model = modelFromExponents(cut.exponents);
    const { matrix, method } = regionMoments(model, gridRegion([THREE_LEVELS, THREE_LEVELS], feasible), 7);
    expect(method).toMatch(/quasi-Monte Carlo/);
    cut.moments.forEach((value, i) => expect(Math.abs(matrix[i] - value)).toBeLessThan(3e-3));
  });

  it('is deterministic for a seed', () => {
    const model = modelFromExponents(cut.exponents);
    const region = gridRegion([THREE_LEVELS, THREE_LEVELS], feasible);
    expect(Array.from(regionMoments(model, region, 3).matrix)).toEqual(Array.from(regionMoments(model, region, 3).matrix));
  });

  it('averages the feasible grid points when the constraints leave no volume', () => {
    // x1 = x2 exactly: the feasible grid is the diagonal (−1,−1), (0,0), (1,1); E[x1²] = 2/3 (hand calculation).
    const model = modelFromExponents([[0, 0], [1, 0]]);
    const region = gridRegion([THREE_LEVELS, THREE_LEVELS], (x) => x[0] === x[1]);
    const { matrix, method } = regionMoments(model, region);
    expect(method).toMatch(/average over the 3 feasible grid points/);
    expect(Array.from(matrix)).toEqual([1, 0, 0, 2 / 3]);
  });
});
