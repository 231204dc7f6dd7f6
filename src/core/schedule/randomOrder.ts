/**
 * Seeded random order: a reproducible shuffle for the run sheet.
 *
 * Method: the Fisher–Yates shuffle in Durstenfeld's in-place form (R. Durstenfeld, 1964,
 * "Algorithm 235: Random permutation", Communications of the ACM 7(7):420; D. E. Knuth,
 * The Art of Computer Programming, vol. 2, §3.4.2, Algorithm P). Every permutation is equally
 * likely when the integer draws are uniform; pure-rand's `uniformInt` rejects rather than
 * folds, so they are.
 *
 * Generator: the plan's seeded stream (../random.ts).
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import type { RandomGenerator } from '../random.js';

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
