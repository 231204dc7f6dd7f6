import { describe, expect, it } from 'vitest';
import {
  checkTierPolicy,
  isBorderline,
  tierMargin,
  tierOf,
  tierStableRange,
} from '../../../src/core/sensitivity/tierRules.js';
import { InputError } from '../../../src/core/inputError.js';
import { policy } from './studyFixture.js';

describe('tierOf', () => {
  it('applies ≥ at both cut-offs', () => {
    expect(tierOf(0.3, 0.3, 0.05)).toBe('critical');
    expect(tierOf(0.2999, 0.3, 0.05)).toBe('moderate');
    expect(tierOf(0.05, 0.3, 0.05)).toBe('moderate');
    expect(tierOf(0.0499, 0.3, 0.05)).toBe('negligible');
    expect(tierOf(0, 0.3, 0.05)).toBe('negligible');
  });

  it('a mean that equals the cut-off up to rounding reaches it', () => {
    const mean = (0.01 + 0.09) / 2; // 0.05 in exact arithmetic, 0.049999999999999996 in doubles
    expect(mean).toBeLessThan(0.05);
    expect(tierOf(mean, 0.3, 0.05)).toBe('moderate');
  });
});

describe('isBorderline', () => {
  it('is true when the interval crosses either cut-off', () => {
    expect(isBorderline(0.25, 0.35, 0.3, 0.05)).toBe(true);
    expect(isBorderline(0.02, 0.07, 0.3, 0.05)).toBe(true);
    expect(isBorderline(0.02, 0.4, 0.3, 0.05)).toBe(true);
  });

  it('is false inside one tier and without bounds', () => {
    expect(isBorderline(0.31, 0.5, 0.3, 0.05)).toBe(false);
    expect(isBorderline(0.06, 0.29, 0.3, 0.05)).toBe(false);
    expect(isBorderline(null, null, 0.3, 0.05)).toBe(false);
  });

  it('an upper bound exactly at a cut-off counts as reaching it', () => {
    expect(isBorderline(0.2, 0.3, 0.3, 0.05)).toBe(true);
  });
});

describe('tierMargin and tierStableRange', () => {
  it('critical factor: distance above the critical cut-off', () => {
    expect(tierMargin(0.42, 0.3, 0.05)).toBeCloseTo(0.12, 12);
    expect(tierStableRange(0.42, 0.3, 0.05)).toEqual({
      critical: { from: 0.05, to: 0.42 },
      moderate: { from: 0, to: 0.3 },
    });
  });

  it('moderate factor: the nearer of the two cut-offs', () => {
    expect(tierMargin(0.08, 0.3, 0.05)).toBeCloseTo(0.03, 12);
    expect(tierMargin(0.27, 0.3, 0.05)).toBeCloseTo(0.03, 12);
    expect(tierStableRange(0.08, 0.3, 0.05)).toEqual({
      critical: { from: 0.08, to: null },
      moderate: { from: 0, to: 0.08 },
    });
  });

  it('negligible factor: distance below the moderate cut-off', () => {
    expect(tierMargin(0.01, 0.3, 0.05)).toBeCloseTo(0.04, 12);
    expect(tierStableRange(0.01, 0.3, 0.05)).toEqual({
      critical: { from: 0.05, to: null },
      moderate: { from: 0.01, to: 0.3 },
    });
  });
});

describe('checkTierPolicy', () => {
  it('accepts the defaults', () => {
    expect(() => checkTierPolicy(policy())).not.toThrow();
  });

  it('refuses cut-offs out of order or out of [0, 1], naming the key', () => {
    const error = (() => {
      try {
        checkTierPolicy(policy({ critical: 0.05, moderate: 0.3 }));
      } catch (caught) {
        return caught;
      }
      return undefined;
    })();
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).location.key).toBe('policy.moderate');
    expect(() => checkTierPolicy(policy({ critical: 1.2 }))).toThrow(/critical must be a number between 0 and 1/);
    expect(() => checkTierPolicy(policy({ moderate: -0.1 }))).toThrow(InputError);
    expect(() => checkTierPolicy(policy({ critical: Number.NaN }))).toThrow(InputError);
  });
});
