// Noncentral F against scipy.stats.ncf / scipy.stats.f (tests/reference/precision/generate.py).
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/precision/precision.json' with { type: 'json' };
import { fCritical, fTestPower, noncentralFCdf, noncentralityForPower } from '../../../src/core/distribution/noncentralF.js';

// jstat's incomplete beta is good to about 1e-8 (see the module header): 1e-7 is the tolerance
// that still fails for any real error in the series.
const TOLERANCE = 1e-7;

describe('noncentral F cdf against scipy.stats.ncf.cdf', () => {
  for (const c of fixture.ncfCdf) {
    it(`F(${c.x}; ${c.dfn}, ${c.dfd}, λ = ${c.nc})`, () => {
      expect(Math.abs(noncentralFCdf(c.x, c.dfn, c.dfd, c.nc) - c.cdf)).toBeLessThan(TOLERANCE);
    });
  }
});

describe('F-test power against scipy (1 − ncf.cdf at f.ppf(1 − α))', () => {
  for (const c of fixture.ncfPower) {
    it(`q = ${c.q}, ν = ${c.nu}, λ = ${c.lambda}, α = ${c.alpha}`, () => {
      expect(fCritical(c.q, c.nu, c.alpha)).toBeCloseTo(c.critical, 6);
      expect(Math.abs(fTestPower(c.q, c.nu, c.lambda, c.alpha) - c.power)).toBeLessThan(TOLERANCE);
    });
  }
});

describe('the 2^3 factorial, main-effects model, N = 8, ν = 4 (scipy fixture)', () => {
  it('detects a main effect of Δ = 2σ with power 0.5716 and Δ = 3σ with 0.8802', () => {
    const { covariance, cases } = fixture.factorial2cubed;
    for (const c of cases) {
      const lambda = c.beta ** 2 / covariance;
      expect(lambda).toBeCloseTo(c.lambda, 12);
      expect(Math.abs(fTestPower(1, 4, lambda, 0.05) - c.power)).toBeLessThan(TOLERANCE);
    }
    expect(fTestPower(1, 4, 8, 0.05)).toBeCloseTo(0.5716, 4);
    expect(fTestPower(1, 4, 18, 0.05)).toBeCloseTo(0.8802, 4);
  });
});

describe('noncentralityForPower', () => {
  it('inverts the power: the λ found gives the power asked for', () => {
    for (const [q, nu, target] of [[1, 4, 0.8], [2, 12, 0.9], [3, 30, 0.5]] as const) {
      const lambda = noncentralityForPower(q, nu, 0.05, target);
      expect(fTestPower(q, nu, lambda, 0.05)).toBeCloseTo(target, 7);
    }
  });

  it('is 0 at or below α and infinite for power 1', () => {
    expect(noncentralityForPower(1, 4, 0.05, 0.05)).toBe(0);
    expect(noncentralityForPower(1, 4, 0.05, 1)).toBe(Number.POSITIVE_INFINITY);
  });

  it('at λ = 0 the power is α (the central F)', () => {
    expect(fTestPower(3, 9, 0, 0.05)).toBeCloseTo(0.05, 7);
  });
});
