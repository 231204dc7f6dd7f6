import { describe, expect, it } from 'vitest';
import { defaultRunCount } from '../../../src/core/design/runCount.js';

// The rule N = p + max(3, ⌈p/4⌉) is ours (documented in runCount.ts); the "at least 3 lack-of-fit
// degrees of freedom" floor is common practice.
describe('default run count', () => {
  it.each([
    [4, 7],
    [10, 13],
    [12, 15],
    [13, 17],
    [21, 27],
    [66, 83],
  ])('p = %i gives N = %i', (p, runs) => {
    expect(defaultRunCount(p).runs).toBe(runs);
  });

  it('explains the allowance in terms of lack of fit', () => {
    const { note } = defaultRunCount(21);
    expect(note).toMatch(/21 model parameters plus 6 extra runs/);
    expect(note).toMatch(/lack of fit/);
  });
});
