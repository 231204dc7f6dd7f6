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

  it('says when there is no pure error to test lack of fit against', () => {
    // Pure error needs at least two replicates of one point (Montgomery, 9th ed., §11.2).
    expect(defaultRunCount(10, 3).note).toMatch(/pure error from the 3 centre replicates/);
    expect(defaultRunCount(10, 0).note).toMatch(/no centre replicates there is no pure error/);
    expect(defaultRunCount(10, 1).note).toMatch(/one centre replicate there is no pure error/);
    expect(defaultRunCount(10, 0).runs).toBe(defaultRunCount(10, 3).runs);
  });
});
