/**
 * Drawing and visiting points of a candidate region's level grid without enumerating it.
 *
 * Random points: each coordinate an independent uniform draw from the factor's coded levels,
 * redrawn until `isFeasible` accepts the point (rejection sampling), or a uniform draw from
 * the enumerated feasible points when the region lists them. Visiting: an odometer over the
 * grid in lexicographic order, skipping infeasible points, so a grid too large to store can
 * still be scanned once.
 */
import type { RandomGenerator } from '../random.js';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import type { CandidateRegion } from './candidateRegion.js';

/** Rejection-sampling attempts per point before the region counts as (nearly) empty. */
const ATTEMPTS = 2000;

/** Writes a random feasible grid point into `out`; false when none was found. */
export function randomFeasiblePoint(region: CandidateRegion, rng: RandomGenerator, out: Float64Array): boolean {
  if (region.points !== null) {
    if (region.points.length === 0) return false;
    out.set(region.points[uniformInt(rng, 0, region.points.length - 1)]);
    return true;
  }
  const k = region.levels.length;
  for (let attempt = 0; attempt < ATTEMPTS; attempt++) {
    for (let j = 0; j < k; j++) {
      const levels = region.levels[j];
      out[j] = levels[uniformInt(rng, 0, levels.length - 1)];
    }
    if (region.isFeasible(out)) return true;
  }
  return false;
}

/** Calls `visit` with every feasible grid point (the same buffer each time; copy to keep it). */
export function forEachFeasibleGridPoint(region: CandidateRegion, visit: (point: Float64Array) => void): void {
  const k = region.levels.length;
  const index = new Int32Array(k);
  const point = new Float64Array(k);
  for (let j = 0; j < k; j++) point[j] = region.levels[j][0];
  for (;;) {
    if (region.isFeasible(point)) visit(point);
    let j = k - 1;
    while (j >= 0) {
      index[j]++;
      if (index[j] < region.levels[j].length) {
        point[j] = region.levels[j][index[j]];
        break;
      }
      index[j] = 0;
      point[j] = region.levels[j][0];
      j--;
    }
    if (j < 0) return;
  }
}
