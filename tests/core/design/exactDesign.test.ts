import { describe, expect, it } from 'vitest';
import { findExactDesign } from '../../../src/core/design/exactDesign.js';
import { InputError } from '../../../src/core/inputError.js';
import { informationMatrix } from '../../../src/core/model/modelMatrix.js';
import { iCriterion } from '../../../src/core/evaluate/designCriteria.js';
import { regionMoments } from '../../../src/core/evaluate/regionMoments.js';
import { firstOrderExponents, gridRegion, modelFromExponents, quadraticExponents, THREE_LEVELS, TWO_LEVELS } from './gridRegions.js';
import reference from '../../reference/design-search/design-search.json' with { type: 'json' };

function isOrthogonal(M: Float64Array, p: number, N: number): boolean {
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) if (Math.abs(M[a * p + b] - (a === b ? N : 0)) > 1e-9) return false;
  return true;
}

describe('exact design search', () => {
  // Textbook fact: orthogonal two-level ±1 designs reach 100 % D-efficiency, and the 2^(3−1)
  // half fraction (4 runs) is orthogonal for three main effects (Montgomery, Design and
  // Analysis of Experiments, ch. 8 on two-level fractional factorials).
  it('finds a 100 % D-efficient 4-run design for 3 factors, first-order', () => {
    const model = modelFromExponents(firstOrderExponents(3));
    const result = findExactDesign({ model, region: gridRegion(Array(3).fill(TWO_LEVELS)), runs: 4, criterion: 'D', seed: 1, starts: 10 });
    expect(result.dEfficiency).toBeCloseTo(100, 9);
    expect(isOrthogonal(informationMatrix(model, result.points), model.p, 4)).toBe(true);
  });

  // Textbook fact: the 2^4 full factorial (16 runs) is orthogonal for all main effects and
  // two-factor interactions (Montgomery, ch. 6).
  it('finds a 100 % D-efficient 16-run design for 4 factors with all two-factor interactions', () => {
    const model = modelFromExponents(quadraticExponents(4, false));
    const result = findExactDesign({ model, region: gridRegion(Array(4).fill(TWO_LEVELS)), runs: 16, criterion: 'D', seed: 2, starts: 10 });
    expect(result.dEfficiency).toBeCloseTo(100, 9);
  });

  it('also reaches 100 % by coordinate exchange alone when the grid is not enumerated', () => {
    const model = modelFromExponents(quadraticExponents(4, false));
    const region = gridRegion(Array(4).fill(TWO_LEVELS), () => true, false);
    const result = findExactDesign({ model, region, runs: 16, criterion: 'D', seed: 3, starts: 10 });
    expect(result.algorithm).toMatch(/grid not enumerated/);
    expect(result.dEfficiency).toBeCloseTo(100, 9);
  });

  it('gives identical plans for the same seed and reports every start', () => {
    const model = modelFromExponents(quadraticExponents(3));
    const region = gridRegion(Array(3).fill(THREE_LEVELS), () => true, false);
    const progress: number[] = [];
    const first = findExactDesign({ model, region, runs: 14, criterion: 'D', seed: 11, starts: 6, onProgress: (done) => progress.push(done) });
    const second = findExactDesign({ model, region, runs: 14, criterion: 'D', seed: 11, starts: 6 });
    expect(second.points).toEqual(first.points);
    expect(second.perStart).toEqual(first.perStart);
    expect(first.perStart).toHaveLength(6);
    expect(progress).toEqual([1, 2, 3, 4, 5, 6]);
    expect(first.logDetPerRun).toBeCloseTo(Math.max(...first.perStart), 9);
  });

  // Reference: the best of 200 seeded starts of a plain Fedorov exchange in numpy
  // (tests/reference/design-search/generate.py, case 6; 88 of the 200 reach it), not a proven optimum.
  it('keeps every point feasible in a region cut by a constraint and reaches the best design numpy finds', () => {
    const feasible = (x: ArrayLike<number>) => x[0] + x[1] + x[2] <= 1;
    const model = modelFromExponents(quadraticExponents(3));
    const ref = reference.cutRegion;
    for (const enumerate of [true, false]) {
      const region = gridRegion(Array(3).fill(THREE_LEVELS), feasible, enumerate);
      const result = findExactDesign({ model, region, runs: ref.runs, criterion: 'D', seed: 5, starts: 5 });
      expect(result.points).toHaveLength(ref.runs);
      for (const point of result.points) expect(feasible(point)).toBe(true);
      expect(result.logDetPerRun).toBeCloseTo(ref.bestLogDetPerRun, 9);
      expect(result.dEfficiency).toBeCloseTo(100 * Math.exp(ref.bestLogDetPerRun / model.p), 9);
    }
  });

  // Reference: every 9-run design on the 3×3 grid enumerated in numpy, W by Gauss–Legendre
  // quadrature over the square (tests/reference/design-search/generate.py, case 7): the
  // I-optimum 0.43889 beats the 3² factorial's 0.45.
  it('finds the enumerated I-optimal 9-run plan when asked for I-optimality', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const region = gridRegion([THREE_LEVELS, THREE_LEVELS]);
    const moments = regionMoments(model, region).matrix;
    const ref = reference.iOptimum;
    expect(iCriterion(model, region.points!, moments)).toBeCloseTo(ref.factorialICriterion, 10);
    const iPlan = findExactDesign({ model, region, runs: 9, criterion: 'I', seed: 1, starts: 10, moments });
    expect(iPlan.iCriterion).toBeCloseTo(ref.bestICriterion, 10);
    expect(iPlan.iCriterion).toBeCloseTo(iCriterion(model, iPlan.points, moments), 10);
    expect(iPlan.perStart.every((value) => value >= iPlan.iCriterion - 1e-9)).toBe(true);
  });

  it('refuses fewer runs than parameters with an InputError at design.runs', () => {
    const model = modelFromExponents(quadraticExponents(3));
    const call = () => findExactDesign({ model, region: gridRegion(Array(3).fill(THREE_LEVELS)), runs: 9, criterion: 'D', seed: 1, starts: 2 });
    expect(call).toThrow(InputError);
    try {
      call();
    } catch (error) {
      expect((error as InputError).location.key).toBe('design.runs');
    }
  });

  it('refuses a region with no feasible setting with an InputError at constraints', () => {
    const model = modelFromExponents(firstOrderExponents(2));
    const region = gridRegion([THREE_LEVELS, THREE_LEVELS], () => false, false);
    const call = () => findExactDesign({ model, region, runs: 4, criterion: 'D', seed: 1, starts: 1 });
    expect(call).toThrow(InputError);
    expect(call).toThrow(/no feasible setting/);
  });

  // Rank facts behind the named causes: X has at most as many independent rows as distinct points,
  // and on m distinct values x^d (d ≥ m) is a polynomial of degree m − 1 in x (Lagrange
  // interpolation), so x^d is a combination of 1, x, …, x^(m−1) — common practice, from memory.
  it('refuses a region with fewer feasible points than parameters, naming the count', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const call = () => findExactDesign({ model, region: gridRegion([TWO_LEVELS, TWO_LEVELS]), runs: 8, criterion: 'D', seed: 1, starts: 3 });
    expect(call).toThrow(/cannot support the model: it has only 4 feasible grid points, fewer than the 6 model parameters/);
  });

  it('names the factor whose feasible settings are too few for a power, key constraints when they cut it', () => {
    // x1 ≤ 0 leaves x1 two of its three levels; x1² then equals a combination of 1 and x1.
    const model = modelFromExponents(quadraticExponents(2));
    const region = gridRegion([THREE_LEVELS, THREE_LEVELS], (x) => x[0] <= 0);
    const call = () => findExactDesign({ model, region, runs: 8, criterion: 'D', seed: 1, starts: 3 });
    expect(call).toThrow(/x1 has only 2 feasible settings of its 3 levels, too few for the term x1\^2/);
    try {
      call();
    } catch (error) {
      expect((error as InputError).location.key).toBe('constraints');
    }
  });

  it('names two factors whose feasible combinations are too few for the terms in them', () => {
    // Cutting the edge x1 = x2 = 1 off the 2×2×2 cube leaves 6 points (≥ p = 5) but only 3 (x1, x2)
    // combinations for 1, x1, x2, x1·x2 (rank ≤ 3).
    const model = modelFromExponents([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 1, 0]]);
    const region = gridRegion(Array(3).fill(TWO_LEVELS), (x) => !(x[0] === 1 && x[1] === 1));
    const call = () => findExactDesign({ model, region, runs: 6, criterion: 'D', seed: 1, starts: 2 });
    expect(call).toThrow(/x1 and x2 have only 3 feasible combinations of settings, too few for the 4 terms in them \(1, x1, x2, x1\*x2\)/);
  });

  it('refuses, after searching, a grid too large to enumerate that cannot support the model', () => {
    const model = modelFromExponents(quadraticExponents(2));
    const region = gridRegion([TWO_LEVELS, TWO_LEVELS], () => true, false);
    const call = () => findExactDesign({ model, region, runs: 8, criterion: 'D', seed: 1, starts: 3 });
    expect(call).toThrow(/cannot support the model: every one of 3 searches/);
  });
});
