/**
 * Seeded random order: a reproducible shuffle for the run sheet.
 *
 * Method: the Fisher–Yates shuffle in Durstenfeld's in-place form (R. Durstenfeld, 1964,
 * "Algorithm 235: Random permutation", Communications of the ACM 7(7):420; D. E. Knuth,
 * The Art of Computer Programming, vol. 2, §3.4.2, Algorithm P). Every permutation is equally
 * likely when the integer draws are uniform; pure-rand's `uniformInt` rejects rather than
 * folds, so they are.
 *
 * Generator: xoroshiro128+ from pure-rand, seeded from the plan's seed. The same seed gives the
 * same stream on every platform, which is what makes a run sheet reproducible.
 */
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { InputError } from '../inputError.js';

export type { RandomGenerator };

/**
 * A generator for `seed`. pure-rand takes a 32-bit seed, so the high part of larger integer
 * seeds is folded in rather than dropped: seeds 1 and 2^32 + 1 still give different streams.
 */
export function createRandom(seed: number): RandomGenerator {
  if (!Number.isSafeInteger(seed)) {
    throw new InputError(`the seed must be a whole number below 2^53, not ${seed}`, { key: 'design.seed' });
  }
  const low = seed | 0;
  const high = Math.floor(seed / 0x1_0000_0000) | 0;
  return xoroshiro128plus(high === 0 ? low : (low ^ Math.imul(high, 0x9e3779b1)) | 0);
}

/** A shuffled copy of `items` (the input is left untouched). */
export function shuffled<T>(items: readonly T[], rng: RandomGenerator): T[] {
  const out = items.slice();
  for (let i = out.length - 1; i > 0; i--) {
    const j = uniformInt(rng, 0, i);
    const held = out[i];
    out[i] = out[j];
    out[j] = held;
  }
  return out;
}
