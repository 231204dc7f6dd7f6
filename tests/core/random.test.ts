import { describe, expect, it } from 'vitest';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { createRandom } from '../../src/core/random.js';
import { InputError } from '../../src/core/inputError.js';

function draws(rng: { next(): number }, count: number): number[] {
  return Array.from({ length: count }, () => rng.next());
}

describe('seeded generator', () => {
  it('is xoroshiro128+ seeded directly for every seed a study accepts (0 to 2^32 − 1)', () => {
    // Plans made before the generator had one home drew from xoroshiro128plus(seed) itself.
    for (const seed of [0, 1, 20261201, 2 ** 31 - 1, 2 ** 31, 2 ** 32 - 1]) {
      expect(draws(createRandom(seed), 8)).toEqual(draws(xoroshiro128plus(seed), 8));
    }
  });

  it('keeps the jumps of the generator, so independent streams stay the same', () => {
    const ours = createRandom(5);
    const direct = xoroshiro128plus(5);
    ours.jump();
    direct.jump();
    expect(draws(ours, 4)).toEqual(draws(direct, 4));
  });

  it('folds the high part of large seeds in, so 1 and 2^32 + 1 differ', () => {
    expect(draws(createRandom(1), 8)).not.toEqual(draws(createRandom(2 ** 32 + 1), 8));
  });
});

describe('seed the user got wrong', () => {
  it('refuses a seed that is not a safe integer', () => {
    expect(() => createRandom(1.5)).toThrow(InputError);
    expect(() => createRandom(2 ** 60)).toThrow(InputError);
  });
});
