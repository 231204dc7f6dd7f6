import { describe, expect, it } from 'vitest';
import { shuffled } from '../../../src/core/schedule/randomOrder.js';
import { createRandom } from '../../../src/core/random.js';

describe('seeded shuffle', () => {
  it('gives the same permutation for the same seed and a different one for another seed', () => {
    const items = Array.from({ length: 20 }, (_, i) => i);
    const a = shuffled(items, createRandom(20261201));
    const b = shuffled(items, createRandom(20261201));
    const c = shuffled(items, createRandom(20261202));
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
    expect([...a].sort((x, y) => x - y)).toEqual(items);
  });

  it('makes all 6 orders of 3 items about equally likely (chi-square test)', () => {
    // Fisher–Yates gives each of the n! permutations probability 1/n! (Knuth, TAOCP vol. 2,
    // §3.4.2, Algorithm P). With 6000 seeded shuffles the chi-square statistic on 5 degrees of
    // freedom must stay below 20.52, the 0.001 upper critical value (NIST/SEMATECH e-Handbook
    // of Statistical Methods, §1.3.6.7.4, table of chi-square critical values).
    const counts = new Map<string, number>();
    const rng = createRandom(7);
    const draws = 6000;
    for (let i = 0; i < draws; i++) {
      const key = shuffled(['a', 'b', 'c'], rng).join('');
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    expect(counts.size).toBe(6);
    const expected = draws / 6;
    let chiSquare = 0;
    for (const observed of counts.values()) chiSquare += (observed - expected) ** 2 / expected;
    expect(chiSquare).toBeLessThan(20.52);
  });
});
