/**
 * Two-level full factorial 2^k in coded units.
 *
 * The complete set of 2^k combinations of low (−1) and high (+1) levels (Yates 1937, "The design
 * and analysis of factorial experiments", Imperial Bureau of Soil Science). Returned in standard
 * (Yates) order, unrandomised: run i sets factor j high exactly when bit j of i is 1, so the first
 * factor alternates fastest and the last factor changes only once.
 */

/** Largest k accepted: 2^20 runs is far beyond any lab campaign and still fits in memory. */
const MAX_FULL_FACTORIAL_FACTORS = 20;

export function twoLevelFullFactorial(k: number): number[][] {
  if (!Number.isInteger(k) || k < 1 || k > MAX_FULL_FACTORIAL_FACTORS) {
    throw new RangeError(`a two-level full factorial needs an integer number of factors from 1 to ${MAX_FULL_FACTORIAL_FACTORS}, got ${k}`);
  }
  const runs = 2 ** k;
  const points: number[][] = new Array(runs);
  for (let i = 0; i < runs; i++) {
    const point = new Array<number>(k);
    for (let j = 0; j < k; j++) point[j] = (i >>> j) & 1 ? 1 : -1;
    points[i] = point;
  }
  return points;
}
