import { describe, expect, it } from 'vitest';
import { boundForRegion, continuousDOptimal } from '../../../src/core/design/continuousBound.js';
import { findExactDesign } from '../../../src/core/design/exactDesign.js';
import { informationMatrix, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { invertSymmetric } from '../../../src/core/linalg/cholesky.js';
import { firstOrderExponents, gridRegion, modelFromExponents, quadraticExponents, THREE_LEVELS } from './gridRegions.js';

const square = gridRegion([THREE_LEVELS, THREE_LEVELS]).points as number[][];

describe('continuous D-optimal design', () => {
  // Atkinson, Donev & Tobias (2007), Optimum Experimental Designs, with SAS, §11 (the
  // two-factor second-order model on the 3×3 grid): weights 0.1458 on each corner, 0.0802 on
  // each edge midpoint, 0.0960 at the centre.
  it('reproduces the published weights for the two-factor quadratic on the 3×3 grid', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const bound = continuousDOptimal(model, square, { epsilon: 1e-6 });
    expect(bound.converged).toBe(true);
    square.forEach((point, i) => {
      const zeros = point.filter((v) => v === 0).length;
      const published = zeros === 0 ? 0.1458 : zeros === 1 ? 0.0802 : 0.096;
      expect(Math.abs(bound.weights[i] - published)).toBeLessThan(1e-3);
    });
    // Equivalence theorem: max f'M⁻¹f = p at the optimum (Kiefer & Wolfowitz 1960).
    expect(bound.maxVariance).toBeLessThanOrEqual(6 * (1 + 1e-6));
    expect(bound.maxVariance).toBeGreaterThanOrEqual(6 - 1e-9);
    expect(bound.support).toHaveLength(9);
  });

  // Textbook fact (Kiefer 1959 / Atkinson et al. 2007, §9): the D-optimal design for the quadratic
  // in one factor on [−1, 1] puts weight 1/3 on −1, 0, 1; det M = 4/27 for f = (1, x, x²).
  it('gives weights 1/3 at −1, 0, 1 for the one-factor quadratic', () => {
    const model = modelFromExponents([[0], [1], [2]]);
    const candidates = [-1, -0.5, 0, 0.5, 1].map((x) => [x]);
    const bound = continuousDOptimal(model, candidates, { epsilon: 1e-8 });
    expect(bound.weights[0]).toBeCloseTo(1 / 3, 4);
    expect(bound.weights[2]).toBeCloseTo(1 / 3, 4);
    expect(bound.weights[4]).toBeCloseTo(1 / 3, 4);
    expect(bound.logDet).toBeCloseTo(Math.log(4 / 27), 6);
  });

  // Atwood (1969): any design ξ has D-efficiency at least p / max_x d(x, ξ) relative to the optimum.
  it('satisfies the equivalence-theorem lower bound for a non-optimal design', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const optimum = continuousDOptimal(model, square, { epsilon: 1e-8 });
    const p = model.p;
    const M = informationMatrix(model, square).map((v) => v / square.length);
    const inverse = new Float64Array(p * p);
    const logDetUniform = invertSymmetric(M, p, inverse);
    const F = modelMatrix(model, square);
    let maxVariance = 0;
    for (let i = 0; i < square.length; i++) {
      let d = 0;
      for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) d += F[i * p + a] * inverse[a * p + b] * F[i * p + b];
      maxVariance = Math.max(maxVariance, d);
    }
    const efficiency = Math.exp((logDetUniform - optimum.logDet) / p);
    expect(efficiency).toBeLessThan(1);
    expect(efficiency).toBeGreaterThanOrEqual(p / maxVariance);
  });

  it('puts equal weight on the corners for the first-order model on the square (M = I)', () => {
    const model = modelFromExponents(firstOrderExponents(2));
    const bound = continuousDOptimal(model, square, { epsilon: 1e-8 });
    expect(bound.logDet).toBeCloseTo(0, 6);
  });

  it('reports the exact plan against the whole small grid, with a note that says so', () => {
    const model = modelFromExponents(quadraticExponents(3));
    const region = gridRegion(Array(3).fill(THREE_LEVELS));
    const exact = findExactDesign({ model, region, runs: 14, criterion: 'D', seed: 1, starts: 5 });
    const result = boundForRegion(model, region, exact.points, 1);
    expect(result.bound?.converged).toBe(true);
    expect(result.efficiency).not.toBeNull();
    expect(result.efficiency as number).toBeGreaterThan(80);
    expect(result.efficiency as number).toBeLessThanOrEqual(100.1);
    expect(result.note).toMatch(/relative to the continuous D-optimal design on all 27 feasible grid points/);
  });

  it('falls back to a sample with an honest note when the grid is not enumerated', () => {
    const model = modelFromExponents(quadraticExponents(3));
    const region = gridRegion(Array(3).fill(THREE_LEVELS), () => true, false);
    const exact = findExactDesign({ model, region, runs: 14, criterion: 'D', seed: 1, starts: 5 });
    const result = boundForRegion(model, region, exact.points, 1);
    expect(result.note).toMatch(/found on \d+ feasible grid points \(a seeded sample/);
    expect(result.note).toMatch(/relative to/);
    // The 27-point grid is scanned, so the equivalence check decides the guarantee.
    expect(result.note).toMatch(/whole grid/);
    const full = boundForRegion(model, gridRegion(Array(3).fill(THREE_LEVELS)), exact.points, 1);
    expect(Math.abs((result.efficiency as number) - (full.efficiency as number))).toBeLessThan(0.5);
  });

  it('says the sampled bound is unchecked when the grid is too large to scan', () => {
    const model = modelFromExponents(quadraticExponents(3));
    const region = { ...gridRegion(Array(3).fill(THREE_LEVELS), () => true, false), gridSize: 5_000_000 };
    const exact = findExactDesign({ model, region, runs: 14, criterion: 'D', seed: 1, starts: 3 });
    const result = boundForRegion(model, region, exact.points, 1);
    expect(result.efficiency).not.toBeNull();
    expect(result.note).toMatch(/not a guaranteed bound: the 5000000-point grid is too large to check/);
  });

  it('returns no efficiency, with the reason, for a plan that cannot estimate the model', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const result = boundForRegion(model, gridRegion([THREE_LEVELS, THREE_LEVELS]), [[0, 0], [1, 1], [1, 1], [0, 0], [1, 0], [0, 1]], 1);
    expect(result.efficiency).toBeNull();
    expect(result.note).toMatch(/cannot estimate/);
  });
});
