/**
 * The seeded random generator every stage draws from: xoroshiro128+ from pure-rand (Blackman
 * & Vigna, 2018, "Scrambled linear pseudorandom number generators"). The same seed gives the
 * same stream on every platform, which is what makes a plan and its run sheet reproducible.
 *
 * Conventions fixed here: one way to turn a plan's seed into a generator (`createRandom`);
 * independent streams, where a stage needs several, come from `jump()` on a clone, never from
 * re-seeding with a derived seed.
 */
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { InputError } from './inputError.js';

export type { JumpableRandomGenerator, RandomGenerator };

/**
 * A generator for `seed`. pure-rand takes a 32-bit seed, so the high part of larger integer
 * seeds is folded in rather than dropped: seeds 1 and 2^32 + 1 still give different streams.
 * Seeds from 0 to 2^32 − 1 (all a study or --seed accepts) seed xoroshiro128+ directly.
 */
export function createRandom(seed: number): JumpableRandomGenerator {
  if (!Number.isSafeInteger(seed)) {
    throw new InputError(`the seed must be a whole number below 2^53, not ${seed}`, { key: 'design.seed' });
  }
  const low = seed | 0;
  const high = Math.floor(seed / 0x1_0000_0000) | 0;
  return xoroshiro128plus(high === 0 ? low : (low ^ Math.imul(high, 0x9e3779b1)) | 0);
}
