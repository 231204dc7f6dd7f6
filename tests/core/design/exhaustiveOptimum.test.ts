// The exact search against optima found by enumerating every multiset of N candidate points
// (numpy, tests/reference/precision/generate.py: slogdet of every X'X; for I, trace((X'X)⁻¹W)
// with W by Gauss–Legendre quadrature). Small grids, few starts: the search must reach the
// enumerated optimum, which on the cut grids needs the point-exchange pass (coordinate
// exchange alone cannot cross the cut between feasible points: with the pass switched off the
// band case stops at ln det(X'X/N) = −12.00 instead of −11.50 — tried).
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/precision/precision.json' with { type: 'json' };
import { findExactDesign } from '../../../src/core/design/exactDesign.js';
import { boxMoments } from '../../../src/core/evaluate/cubeMoments.js';
import { gridRegion, modelFromExponents } from './gridRegions.js';

const feasibility: Record<string, (x: ArrayLike<number>) => boolean> = {
  band: (x) => Math.abs(x[0] - x[1]) <= 0.5 + 1e-12,
  corner: (x) => x[0] + x[1] <= 2 / 3 + 1e-12,
};

function regionFor(name: string, levels: number[][]) {
  if (name.includes('band')) return gridRegion(levels, feasibility.band);
  if (name.includes('corner')) return gridRegion(levels, feasibility.corner);
  return gridRegion(levels);
}

describe('exact search reaches the enumerated optimum', () => {
  for (const entry of fixture.exhaustive) {
    it(`${entry.name} (${entry.multisets} multisets enumerated)`, () => {
      const model = modelFromExponents(entry.exponents);
      const region = regionFor(entry.name, entry.levels);
      expect(region.points!.length).toBe(entry.candidates);
      const criterion = entry.criterion as 'D' | 'I';
      const moments = boxMoments(model, entry.levels.map(() => -1), entry.levels.map(() => 1));
      const result = findExactDesign({ model, region, runs: entry.runs, criterion, seed: 7, starts: 3, moments });
      if (criterion === 'D') expect(result.logDetPerRun).toBeCloseTo(entry.bestLogDetPerRun!, 9);
      else expect(result.iCriterion).toBeCloseTo(entry.bestICriterion!, 9);
    });
  }
});
