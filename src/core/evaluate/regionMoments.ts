/**
 * Region moment matrix W = average of f(x) f(x)' over the experimental region, for the
 * I-criterion trace((X'X)⁻¹ W) (Atkinson, Donev & Tobias, 2007, "Optimum Experimental
 * Designs, with SAS", §10.6).
 *
 * The region is the box spanned by each factor's lowest and highest coded level (normally
 * [−1, 1]), cut by the constraints in `isFeasible`.
 * - Uncut box: exact, in closed form (`boxMoments`, cubeMoments.ts).
 * - Cut box: a quasi-Monte Carlo average over Halton points (Halton, 1960, "On the efficiency
 *   of certain quasi-random sequences of points in evaluating multi-dimensional integrals",
 *   Numer. Math. 2) with a seeded Cranley–Patterson random shift (Cranley & Patterson, 1976,
 *   "Randomization of number theoretic methods for multiple integration", SIAM J. Numer.
 *   Anal. 13), keeping the feasible points. Deterministic for a seed.
 * - No quasi-random point feasible (a region without volume): the average over the
 *   enumerated feasible grid points, or an InputError when there are none.
 * The box counts as uncut when the enumerated feasible grid is the whole grid, or — for grids
 * too large to enumerate — when every quasi-random test point is feasible.
 */
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { expandInto, type CompiledModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { InputError } from '../inputError.js';
import { boxMoments } from './cubeMoments.js';
import { haltonBases, haltonUnitPoint } from './haltonPoints.js';
import { createRandom } from '../random.js';

/** Feasible quasi-random points averaged for a cut region. */
const QMC_POINTS = 8192;
/** Halton indices tried before giving up on finding QMC_POINTS feasible ones. */
const QMC_ATTEMPTS = 20 * QMC_POINTS;

export function regionMoments(model: CompiledModel, region: CandidateRegion, seed = 1): { matrix: Float64Array; method: string } {
  const k = model.factorIds.length;
  const lower = region.levels.map((levels) => Math.min(...levels));
  const upper = region.levels.map((levels) => Math.max(...levels));
  const boxText = describeBox(lower, upper);
  if (region.points !== null && region.points.length === region.gridSize) {
    return { matrix: boxMoments(model, lower, upper), method: `exact moments of the uncut box ${boxText}` };
  }

  const p = model.p;
  const sum = new Float64Array(p * p);
  const f = new Float64Array(p);
  const x = new Float64Array(k);
  const rng = createRandom(seed);
  const shift = Array.from({ length: k }, () => uniformFloat64(rng));
  const bases = haltonBases(k);
  const u = new Float64Array(k);
  let accepted = 0;
  let tried = 0;
  for (let index = 1; accepted < QMC_POINTS && index <= QMC_ATTEMPTS; index++) {
    tried++;
    haltonUnitPoint(index, bases, u);
    for (let j = 0; j < k; j++) x[j] = lower[j] + ((u[j] + shift[j]) % 1) * (upper[j] - lower[j]);
    if (!region.isFeasible(x)) continue;
    accepted++;
    addOuterProduct(model, x, f, sum);
  }
  if (accepted === tried) {
    return {
      matrix: boxMoments(model, lower, upper),
      method: `exact moments of the box ${boxText}: all ${accepted} quasi-random test points were feasible, so no constraint was found to cut it`,
    };
  }
  if (accepted === 0) {
    if (region.points === null || region.points.length === 0) {
      throw new InputError('no feasible setting was found in the candidate region; check the constraints and equipment limits', {
        key: 'constraints',
      });
    }
    // The constraints leave no volume (e.g. an equality written as two inequalities): average the grid.
    for (const point of region.points) addOuterProduct(model, point, f, sum);
    accepted = region.points.length;
    return {
      matrix: meanOfSum(sum, accepted, p),
      method: `average over the ${accepted} feasible grid points: none of ${tried} quasi-random points in the box was feasible`,
    };
  }
  return {
    matrix: meanOfSum(sum, accepted, p),
    method:
      `quasi-Monte Carlo average over ${accepted} feasible points of ${tried} Halton points in the box ${boxText} ` +
      `(random shift from seed ${seed}); the constraints cut about ${Math.round((100 * (tried - accepted)) / tried)} % of the box`,
  };
}

/** Adds the upper triangle of f(x) f(x)' to `sum`; `f` is scratch of length p. */
function addOuterProduct(model: CompiledModel, x: ArrayLike<number>, f: Float64Array, sum: Float64Array): void {
  const p = model.p;
  expandInto(model, x, f);
  for (let a = 0; a < p; a++) {
    const fa = f[a];
    for (let b = a; b < p; b++) sum[a * p + b] += fa * f[b];
  }
}

/** The full symmetric mean, in place, from an upper-triangle sum over `count` points. */
function meanOfSum(sum: Float64Array, count: number, p: number): Float64Array {
  for (let a = 0; a < p; a++) {
    for (let b = a; b < p; b++) {
      const mean = sum[a * p + b] / count;
      sum[a * p + b] = mean;
      sum[b * p + a] = mean;
    }
  }
  return sum;
}

function describeBox(lower: number[], upper: number[]): string {
  const allUnit = lower.every((value) => value === -1) && upper.every((value) => value === 1);
  return allUnit ? `[−1, 1]^${lower.length} (coded)` : 'spanned by the extreme coded levels';
}
