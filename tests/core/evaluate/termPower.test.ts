// Power of the t-test of one coefficient; reference values from scipy.stats.nct / scipy.stats.t
// (tests/reference/evaluate/generate.py).
import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import fixture from '../../reference/evaluate/evaluate.json' with { type: 'json' };
import { termPower, termRange, twoSidedTPower } from '../../../src/core/evaluate/termPower.js';

describe('noncentral t distribution (jstat) against scipy.stats.nct.cdf', () => {
  for (const c of fixture.nctCdf) {
    it(`cdf(${c.x}; df=${c.df}, ncp=${c.ncp})`, () => {
      expect(jStat.noncentralt.cdf(c.x, c.df, c.ncp)).toBeCloseTo(c.cdf, 7);
    });
  }
});

describe('two-sided t-test power against scipy', () => {
  for (const c of fixture.twoSidedPower) {
    it(`df=${c.df}, ncp=${c.ncp}, alpha=${c.alpha}`, () => {
      expect(twoSidedTPower(c.ncp, c.df, c.alpha)).toBeCloseTo(c.power, 6);
    });
  }
});

describe('termPower', () => {
  it('uses coefficient = δσ / range (range 2 for a main effect): scipy, 2^3 + 3 centre runs', () => {
    // Main effect of a 2^3 factorial with 3 centre runs: se = 1/√8, 4 residual df (scipy fixture).
    const power = termPower(1 / Math.sqrt(8), 2, 2, 0.05, 4);
    expect(power).toBeCloseTo(fixture.factorial2cubedCentre3.mainEffectPower, 6);
  });

  it('is null without residual degrees of freedom or without a positive standard error', () => {
    expect(termPower(0.3, 2, 2, 0.05, 0)).toBeNull();
    expect(termPower(0, 2, 2, 0.05, 4)).toBeNull();
    expect(termPower(Number.POSITIVE_INFINITY, 2, 2, 0.05, 4)).toBeNull();
  });

  it('tests with a single residual degree of freedom (scipy: df 1, noncentrality 2)', () => {
    const c = fixture.twoSidedPower.find((entry) => entry.df === 1 && entry.ncp === 2)!;
    // δ = 2, range 2, se = 0.5: noncentrality 2 / 2 / 0.5 = 2.
    expect(termPower(0.5, 2, 2, c.alpha, 1)).toBeCloseTo(c.power, 6);
  });

  it('reads the range of a term over the coded cube (x, x·z, x³: 2; x², x²z²: 1)', () => {
    expect(termRange([1, 0])).toBe(2);
    expect(termRange([1, 1])).toBe(2);
    expect(termRange([3, 0])).toBe(2);
    expect(termRange([2, 1])).toBe(2);
    expect(termRange([2, 0])).toBe(1);
    expect(termRange([2, 2])).toBe(1);
  });
});
