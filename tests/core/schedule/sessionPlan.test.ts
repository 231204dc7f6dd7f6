import { describe, expect, it } from 'vitest';
import { cutIntoSessions, equalSessionSizes, sessionCountFor } from '../../../src/core/schedule/sessionPlan.js';

// Expected values are worked by hand: ceil(n / maxRuns) sessions, sizes differing by at most one.
describe('sessions', () => {
  it('uses the fewest sessions and sizes as equal as possible', () => {
    expect(sessionCountFor(18, 6)).toBe(3);
    expect(sessionCountFor(19, 6)).toBe(4);
    expect(equalSessionSizes(19, 4)).toEqual([5, 5, 5, 4]);
    expect(equalSessionSizes(18, 3)).toEqual([6, 6, 6]);
  });

  it('cuts on group boundaries when it can', () => {
    // Groups 4 | 1 | 7 | 1 | 5 with at most 8 a session. Whole-group cuts: 4+1 | 7 | 1+5
    // (squared deviations from 6: 1 + 1 + 0 = 2) beats 4+1 | 7+1 | 5 (1 + 4 + 1 = 6).
    const cut = cutIntoSessions([4, 1, 7, 1, 5], 8);
    expect(cut.splitGroups).toBe(0);
    expect(cut.sizes).toEqual([5, 7, 6]);
  });

  it('splits a group only when it must, and never exceeds the maximum', () => {
    // A group of 7 cannot fit a session of 6.
    const cut = cutIntoSessions([4, 1, 7, 1, 5], 6);
    expect(cut.sizes).toEqual([6, 6, 6]);
    expect(cut.splitGroups).toBeGreaterThan(0);
    for (const size of cut.sizes) expect(size).toBeLessThanOrEqual(6);
  });

  it('balances sizes when there are no groups to respect', () => {
    const cut = cutIntoSessions(new Array(19).fill(1), 6);
    expect(cut.sizes).toEqual([5, 5, 5, 4]);
  });
});

describe('session settings the user got wrong', () => {
  it('refuses a maximum below one as an input error on sessions.maxRuns', async () => {
    const { InputError } = await import('../../../src/core/inputError.js');
    expect(() => sessionCountFor(10, 0)).toThrow(InputError);
    expect(() => sessionCountFor(10, 2.5)).toThrow(/sessions\.maxRuns|whole number/);
  });
});
