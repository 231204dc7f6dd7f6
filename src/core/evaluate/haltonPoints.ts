/**
 * Halton quasi-random points (Halton, 1960, "On the efficiency of certain quasi-random
 * sequences of points in evaluating multi-dimensional integrals", Numerische Mathematik 2):
 * coordinate j of point i is the radical inverse of i in the j-th prime base.
 *
 * Used twice: `haltonPoints` is the fixed sample of the coded cube on which every plan's
 * prediction variance is judged; `haltonUnitPoint` feeds the randomly shifted quasi-Monte
 * Carlo average of the region moments (regionMoments.ts).
 *
 * Conventions: indices start at 1 (index 0 is the origin in every base); `haltonPoints`
 * skips the first `HALTON_SKIP` points because the early Halton points of neighbouring
 * radices are strongly correlated. Deterministic, so every plan is judged on the same points.
 */

const HALTON_SKIP = 20;

/** The radical inverse of `index` in `base`: its base-b digits mirrored about the point. */
function radicalInverse(index: number, base: number): number {
  let result = 0;
  let scale = 1 / base;
  let rest = index;
  while (rest > 0) {
    result += (rest % base) * scale;
    rest = Math.floor(rest / base);
    scale /= base;
  }
  return result;
}

/** The first `count` primes, the bases of the Halton coordinates. */
export function haltonBases(count: number): number[] {
  const primes: number[] = [];
  for (let candidate = 2; primes.length < count; candidate++) {
    if (primes.every((prime) => candidate % prime !== 0)) primes.push(candidate);
  }
  return primes;
}

/** Writes Halton point number `index` of the unit cube [0, 1)^bases.length into `out`. */
export function haltonUnitPoint(index: number, bases: readonly number[], out: { [j: number]: number }): void {
  for (let j = 0; j < bases.length; j++) out[j] = radicalInverse(index, bases[j]);
}

/** `count` Halton points in [−1, 1]^dimension. */
export function haltonPoints(count: number, dimension: number): number[][] {
  const bases = haltonBases(dimension);
  const points: number[][] = [];
  for (let i = 0; i < count; i++) {
    const point = new Array<number>(dimension);
    haltonUnitPoint(i + 1 + HALTON_SKIP, bases, point);
    for (let j = 0; j < dimension; j++) point[j] = 2 * point[j] - 1;
    points.push(point);
  }
  return points;
}
