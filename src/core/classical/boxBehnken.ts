/**
 * Box–Behnken three-level designs for second-order models.
 *
 * Box & Behnken (1960), "Some new three level designs for the study of quantitative variables",
 * Technometrics 2: take an incomplete block design on the k factors; for every block run the
 * two-level full factorial on the block's factors with all other factors at their centre; add
 * centre runs. No point sits on a corner of the cube and every factor takes only −1, 0, +1.
 *
 * Blocks used (factors numbered from 1):
 * - k = 3, 4, 5: every pair of factors (the balanced design with blocks of two), 4 runs per
 *   pair: 12, 24 and 40 runs.
 * - k = 6: the partially balanced design of six blocks of three printed by Box & Behnken,
 *   (1 2 4) (2 3 5) (3 4 6) (1 4 5) (2 5 6) (1 3 6), 8 runs per block: 48 runs.
 * - k = 7: the balanced design of seven blocks of three (each pair once),
 *   (4 5 6) (1 6 7) (2 5 7) (1 2 4) (3 4 7) (1 3 5) (2 3 6), 8 runs per block: 56 runs.
 * Larger k in the 1960 paper rest on block designs not built here; those k return a reason.
 *
 * Every run of a block has the same number of non-zero coordinates, so Σ x_i² is the same in
 * all non-centre runs: without at least one centre run the intercept is a combination of the
 * squared columns and a full quadratic model cannot be fitted.
 *
 * Conventions: coded units; blocks in the order listed, each block's runs in standard order
 * of its factors (first factor fastest), then the centre runs; unrandomised.
 */
import { twoLevelFullFactorial } from './fullFactorial.js';

/** Blocks of 1-based factor numbers, as listed above. */
const BLOCKS: Record<number, number[][]> = {
  3: allPairs(3),
  4: allPairs(4),
  5: allPairs(5),
  6: [[1, 2, 4], [2, 3, 5], [3, 4, 6], [1, 4, 5], [2, 5, 6], [1, 3, 6]],
  7: [[4, 5, 6], [1, 6, 7], [2, 5, 7], [1, 2, 4], [3, 4, 7], [1, 3, 5], [2, 3, 6]],
};

export type BoxBehnkenDesign = { points: number[][] } | { points: null; reason: string };

export function boxBehnken(k: number, centreRuns: number): BoxBehnkenDesign {
  if (!Number.isInteger(centreRuns) || centreRuns < 0) throw new RangeError(`centre runs must be a whole number ≥ 0, got ${centreRuns}`);
  if (!Number.isInteger(k) || k < 3) {
    return { points: null, reason: `a Box–Behnken design needs at least 3 factors (has ${k})` };
  }
  const blocks = BLOCKS[k];
  if (!blocks) {
    return { points: null, reason: `Box–Behnken designs are built here for 3 to 7 factors (has ${k})` };
  }
  const points: number[][] = [];
  for (const block of blocks) {
    for (const corner of twoLevelFullFactorial(block.length)) {
      const point = new Array<number>(k).fill(0);
      block.forEach((factor, b) => {
        point[factor - 1] = corner[b];
      });
      points.push(point);
    }
  }
  for (let c = 0; c < centreRuns; c++) points.push(new Array<number>(k).fill(0));
  return { points };
}

function allPairs(k: number): number[][] {
  const pairs: number[][] = [];
  for (let a = 1; a <= k; a++) for (let b = a + 1; b <= k; b++) pairs.push([a, b]);
  return pairs;
}
