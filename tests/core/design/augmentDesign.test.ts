/**
 * D-optimal augmentation (Dykstra, 1971, Technometrics 13, 682–688). The check: a 2²
 * factorial with one centre run, augmented by 4 runs from the 3 × 3 grid for the full
 * quadratic model, adds exactly the four edge midpoints — completing the 3² factorial, the
 * D-optimal 9-run design on that grid for the full quadratic (Atkinson, Donev & Tobias, 2007,
 * "Optimum Experimental Designs, with SAS", §11; the determinant comparison below is made by
 * enumeration, so the test does not rest on memory).
 */
import { describe, expect, it } from 'vitest';
import { augmentDesign } from '../../../src/core/design/augmentDesign.js';
import { compileModel, informationMatrix } from '../../../src/core/model/modelMatrix.js';
import { choleskyFactor, choleskyLogDeterminant } from '../../../src/core/linalg/cholesky.js';

const quadratic = compileModel(
  [{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { a: 1, b: 1 } }, { powers: { a: 2 } }, { powers: { b: 2 } }],
  ['a', 'b'],
);
const grid = [-1, 0, 1].flatMap((a) => [-1, 0, 1].map((b) => [a, b]));
const done = [[-1, -1], [-1, 1], [1, -1], [1, 1], [0, 0]];

function logDet(points: number[][]): number {
  const L = choleskyFactor(informationMatrix(quadratic, points), quadratic.p, 0);
  return L ? choleskyLogDeterminant(L, quadratic.p) : Number.NEGATIVE_INFINITY;
}

describe('D-optimal augmentation', () => {
  it('adds exactly the four edge midpoints to a 2² factorial with a centre run (full quadratic, 3 × 3 grid)', () => {
    const result = augmentDesign(quadratic, done, grid, 4);
    const added = result.added.map((c) => grid[c].join(',')).sort();
    expect(added).toEqual(['-1,0', '0,-1', '0,1', '1,0']);
    expect(result.estimable).toBe(true);
    expect(result.logDet).toBeCloseTo(logDet([...done, ...result.added.map((c) => grid[c])]), 10);
  });

  it('is the best of all 4-run additions, with replication allowed (enumerated: 9^4 choices)', () => {
    const result = augmentDesign(quadratic, done, grid, 4);
    let best = Number.NEGATIVE_INFINITY;
    for (let i = 0; i < 9; i++) for (let j = i; j < 9; j++) for (let k = j; k < 9; k++) for (let l = k; l < 9; l++) {
      best = Math.max(best, logDet([...done, grid[i], grid[j], grid[k], grid[l]]));
    }
    expect(result.logDet).toBeCloseTo(best, 10);
  });

  it('keeps the runs done and chooses by the combined information (1 added run after the full 3²)', () => {
    // After the full grid, one more run of the full quadratic goes to a corner (largest f′M⁻¹f
    // on the 3² grid: 29/36 at the corners, 5/9 at the edge midpoints and the centre; numpy).
    const result = augmentDesign(quadratic, grid, grid, 1);
    expect(Math.abs(grid[result.added[0]][0])).toBe(1);
    expect(Math.abs(grid[result.added[0]][1])).toBe(1);
  });
});
