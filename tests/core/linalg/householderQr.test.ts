// Householder QR with column pivoting: NIST StRD linear least-squares certified values
// (tests/reference/nist-strd/, https://www.itl.nist.gov/div898/strd/lls/lls.shtml), fitted on
// the raw columns exactly as NIST states each model, and hand-worked rank-deficient cases.
import { describe, expect, it } from 'vitest';
import {
  householderQr,
  inestimableColumns,
  isEstimableRow,
  leverages,
  logDetCrossProduct,
  rowVarianceFactor,
  solveLeastSquares,
  unscaledCovariance,
} from '../../../src/core/linalg/householderQr.js';
import { NIST_STRD, logRelativeError } from '../../support/nistStrdSets.js';

/**
 * Digits reached on the raw columns (minimum LRE over the coefficients, their standard
 * deviations, the residual SD and R²), each a little below what this implementation gets,
 * so a worse kernel fails. Filip on raw powers of x (condition number about 5e9 after
 * column scaling) is the hard case: 7 digits is the usual bar for double precision.
 */
const RAW_DIGITS: Record<string, { coefficients: number; standardDeviations: number; residualSd: number; rSquared: number }> = {
  Norris: { coefficients: 12, standardDeviations: 13, residualSd: 13, rSquared: 14 },
  Pontius: { coefficients: 11, standardDeviations: 12, residualSd: 12, rSquared: 14 },
  Longley: { coefficients: 11, standardDeviations: 11, residualSd: 12, rSquared: 14 },
  Filip: { coefficients: 7, standardDeviations: 7, residualSd: 8, rSquared: 10 },
  Wampler1: { coefficients: 8.5, standardDeviations: 9, residualSd: 9, rSquared: 14 },
  Wampler2: { coefficients: 13, standardDeviations: 13, residualSd: 13, rSquared: 14 },
  Wampler3: { coefficients: 8.5, standardDeviations: 13, residualSd: 13, rSquared: 14 },
  Wampler4: { coefficients: 8.5, standardDeviations: 13, residualSd: 13, rSquared: 14 },
  Wampler5: { coefficients: 6.5, standardDeviations: 13, residualSd: 13, rSquared: 13 },
};

/**
 * Where the order-keeping rule (the default, which never reorders a well-conditioned
 * column) reaches fewer digits on raw columns: Filip 7.0, Wampler4 8.0 and Wampler5 5.9
 * coefficient digits (against 7.3, 9.1 and 7.1 with norm pivoting). Wampler5's coefficients
 * are 1 with standard deviations near 2e5, so six digits of them are far below their
 * uncertainty. The analysis fits coded columns, where all sets reach 7 digits or more
 * (tests/core/analysis/engineeringCoefficients.test.ts).
 */
const ORDER_RULE_DIGITS: Record<string, Partial<(typeof RAW_DIGITS)[string]>> = {
  Wampler2: { coefficients: 12.5 },
  Wampler4: { coefficients: 7.5 },
  Wampler5: { coefficients: 5.5 },
};

function rawDesign(name: string): { X: Float64Array; n: number; p: number } {
  const set = NIST_STRD[name];
  const p = set.estimates.length;
  const n = set.y.length;
  const X = new Float64Array(n * p);
  set.x.forEach((row, i) => {
    X[i * p] = 1;
    // Longley: six predictors as given; the others: powers of the one predictor.
    for (let j = 1; j < p; j++) X[i * p + j] = row.length === 1 ? row[0] ** j : row[j - 1];
  });
  return { X, n, p };
}

describe.each(['order', 'norm'] as const)('NIST StRD certified values, raw columns, %s pivoting (NIST StRD lls)', (pivoting) => {
  for (const name of Object.keys(RAW_DIGITS)) {
    it(`${name}: coefficients, their standard deviations, residual SD and R²`, () => {
      const set = NIST_STRD[name];
      const { X, n, p } = rawDesign(name);
      const factor = householderQr(X, n, p, { pivoting });
      expect(factor.rank).toBe(p);
      const solution = solveLeastSquares(factor, set.y);
      const covariance = unscaledCovariance(factor);
      const s = Math.sqrt(solution.residualSs / (n - p));
      const mean = set.y.reduce((a, b) => a + b, 0) / n;
      const sst = set.y.reduce((a, b) => a + (b - mean) ** 2, 0);
      const digits = {
        coefficients: Math.min(...set.estimates.map((c, j) => logRelativeError(solution.coefficients[j], c))),
        standardDeviations: Math.min(...set.standardDeviations.map((c, j) => logRelativeError(s * Math.sqrt(covariance[j * p + j]), c))),
        residualSd: logRelativeError(s, set.residualSd),
        rSquared: logRelativeError(1 - solution.residualSs / sst, set.rSquared),
      };
      const bar = { ...RAW_DIGITS[name], ...(pivoting === 'order' ? ORDER_RULE_DIGITS[name] : {}) };
      expect(digits.coefficients).toBeGreaterThanOrEqual(bar.coefficients);
      expect(digits.standardDeviations).toBeGreaterThanOrEqual(bar.standardDeviations);
      expect(digits.residualSd).toBeGreaterThanOrEqual(bar.residualSd);
      expect(digits.rSquared).toBeGreaterThanOrEqual(bar.rSquared);
    });
  }
});

describe('rank and estimability (hand-worked)', () => {
  // Columns: 1, x, 2x (a copy), x² on x = −1, 0, 1, 2: column 2 = 2·column 1.
  const xs = [-1, 0, 1, 2];
  const X = Float64Array.from(xs.flatMap((x) => [1, x, 2 * x, x * x]));

  it('finds the copied column inestimable and keeps the earlier one (both pivot rules)', () => {
    for (const pivoting of ['order', 'norm'] as const) {
      const factor = householderQr(X, 4, 4, { pivoting });
      expect(factor.rank).toBe(3);
      // x and 2x have the same scaled column; the order rule defers the later, and under the
      // norm rule they tie and the earlier wins.
      expect(inestimableColumns(factor)).toEqual([2]);
    }
  });

  it('order rule: of x and x² on two levels (−1, 0), the later term x² is the inestimable one', () => {
    // On x ∈ {−1, 0}: x² = −x, so one of the two cannot be estimated; the model order
    // (1, x, x²) decides which is reported. The norm rule is free to keep x² instead.
    const two = [-1, 0, -1, 0];
    const Q = Float64Array.from(two.flatMap((x) => [1, x, x * x]));
    expect(inestimableColumns(householderQr(Q, 4, 3))).toEqual([2]);
    expect(householderQr(Q, 4, 3, { pivoting: 'norm' }).rank).toBe(2);
  });

  it('solves the estimable part exactly: y = 1 + x + x² is recovered, the copy is NaN', () => {
    const y = xs.map((x) => 1 + x + x * x);
    const { coefficients, residualSs } = solveLeastSquares(householderQr(X, 4, 4), y);
    expect(coefficients[0]).toBeCloseTo(1, 12);
    expect(coefficients[1]).toBeCloseTo(1, 12);
    expect(coefficients[2]).toBeNaN();
    expect(coefficients[3]).toBeCloseTo(1, 12);
    expect(residualSs).toBeLessThan(1e-24);
  });

  it('tells estimable from inestimable functions: β_x + 2β_2x is, β_x alone is not', () => {
    const factor = householderQr(X, 4, 4);
    expect(isEstimableRow(factor, [0, 1, 2, 0])).toBe(true);
    expect(isEstimableRow(factor, [1, 0.5, 1, 0.25])).toBe(true); // a model row at x = 0.5
    expect(isEstimableRow(factor, [0, 1, 0, 0])).toBe(false);
    expect(rowVarianceFactor(factor, [0, 1, 0, 0])).toBeNaN();
  });

  it('treats an all-zero column as inestimable', () => {
    const Z = Float64Array.from(xs.flatMap((x) => [1, 0, x]));
    const factor = householderQr(Z, 4, 3);
    expect(factor.rank).toBe(2);
    expect(inestimableColumns(factor)).toEqual([1]);
  });

  it('leverages sum to the rank and match the straight-line formula 1/n + (x − x̄)²/Sxx', () => {
    // Straight line on x = −1, 0, 1, 2: x̄ = 0.5, Sxx = 5 (Seber & Lee 2003, §10.2).
    const line = Float64Array.from(xs.flatMap((x) => [1, x]));
    const h = leverages(householderQr(line, 4, 2));
    xs.forEach((x, i) => expect(h[i]).toBeCloseTo(1 / 4 + (x - 0.5) ** 2 / 5, 14));
    expect(h.reduce((a, b) => a + b, 0)).toBeCloseTo(2, 14);
  });

  it('x′(X′X)⁻¹x and ln det X′X of the straight line agree with the closed forms', () => {
    const line = Float64Array.from(xs.flatMap((x) => [1, x]));
    const factor = householderQr(line, 4, 2);
    // X′X = [[4, 2], [2, 6]]: det 20; at x0 = 3: 1/4 + (3 − 0.5)²/5 = 1.5.
    expect(logDetCrossProduct(factor)).toBeCloseTo(Math.log(20), 13);
    expect(rowVarianceFactor(factor, [1, 3])).toBeCloseTo(1.5, 13);
  });
});
