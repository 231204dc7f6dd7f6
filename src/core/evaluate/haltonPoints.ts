/**
 * A fixed quasi-random sample of the coded cube [−1, 1]^k: the Halton sequence
 * (Halton, 1960, "On the efficiency of certain quasi-random sequences of points in
 * evaluating multi-dimensional integrals", Numerische Mathematik 2).
 *
 * Conventions: coordinate j uses the j-th prime as radix; the first `HALTON_SKIP` points are
 * skipped because the early Halton points of neighbouring radices are strongly correlated.
 * The sample is deterministic, so every plan is judged on exactly the same points.
 */

const PRIMES = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97];
const HALTON_SKIP = 20;

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

/** `count` Halton points in [−1, 1]^dimension. */
export function haltonPoints(count: number, dimension: number): number[][] {
  if (dimension > PRIMES.length) throw new Error(`Halton sample supports at most ${PRIMES.length} factors`);
  const points: number[][] = [];
  for (let i = 0; i < count; i++) {
    const point = new Array<number>(dimension);
    for (let j = 0; j < dimension; j++) point[j] = 2 * radicalInverse(i + 1 + HALTON_SKIP, PRIMES[j]) - 1;
    points.push(point);
  }
  return points;
}
