/**
 * The prior information of potential terms for Bayesian D-optimal design (DuMouchel & Jones,
 * 1994, "A simple Bayesian modification of D-optimal designs to reduce dependence on an
 * assumed model", Technometrics 36, 37–47).
 *
 * Primary terms must be estimated; potential terms (a cubic trend, a doubtful interaction)
 * get a prior N(0, τ²σ²) so that the plan protects against them without a run for each. As
 * the paper describes (recalled from memory): over the candidate set, regress each potential
 * column on the primary columns, α = (X_pri'X_pri)⁻¹X_pri'X_pot (here by QR, never normal
 * equations), take the residual R = X_pot − X_pri·α and scale it to Z = R / (max R − min R);
 * the design's adjusted rows are [f_pri(x), z(x)] and the criterion is
 * |X̃'X̃ + K/τ²|, K = diag(0 for primary, 1 for potential), τ = 1 by default.
 *
 * Because the adjustment is a fixed linear map B of the raw row (z = D⁻¹(f_pot − α'f_pri),
 * D = diag of the ranges), X̃ = X·B and |X̃'X̃ + K/τ²| = |B|²·|X'X + P| with
 * P = B⁻ᵀKB⁻¹/τ² = diag(0, D²)/τ² (the α part cancels, since K is zero on the primary
 * block). So the exchange search can keep its raw rows and rank-one updates and add the
 * constant matrix P to X'X: the plans are the same, the criterion differs by |B|² only.
 *
 * Conventions fixed here: model columns in any order, `potential` marks which are potential;
 * a potential column the primary ones explain over the candidates (range below 1e-9 of its
 * size) cannot be protected against and is reported as aliased, with prior 0.
 */
import { householderQr, solveLeastSquares } from '../linalg/householderQr.js';

export interface PotentialPrior {
  /** Regression of each potential column on the primary ones, q_primary × q_potential. */
  alpha: number[][];
  /** max R − min R of each potential column's residual over the candidates. */
  ranges: number[];
  /** Column indices (in the model) of the potential terms, in order. */
  potentialColumns: number[];
  primaryColumns: number[];
  /** Potential columns the primary terms explain over the candidates (prior 0, unprotected). */
  aliased: number[];
  /** P = diag(0, D²)/τ², p × p row-major: the matrix added to X'X by the search. */
  priorInformation: Float64Array;
  /** K/τ² in the adjusted coordinates (diagonal 0 / 1/τ²), p × p. */
  K: Float64Array;
  tau: number;
  /** ln |B|² = −2 Σ ln range: ln|X̃'X̃ + K/τ²| = ln|X'X + P| + this. */
  logDetAdjustment: number;
  /** The adjusted row [f_pri, z] of a raw model row (same column order). */
  adjust(row: ArrayLike<number>): Float64Array;
}

export const DEFAULT_TAU = 1;

/**
 * @param candidateRows raw model rows of the candidate points, n × p row-major
 * @param potential one flag per model column
 */
export function potentialPrior(candidateRows: Float64Array, n: number, p: number, potential: readonly boolean[], tau = DEFAULT_TAU): PotentialPrior {
  const potentialColumns: number[] = [];
  const primaryColumns: number[] = [];
  potential.forEach((flag, c) => (flag ? potentialColumns : primaryColumns).push(c));
  const priorInformation = new Float64Array(p * p);
  const K = new Float64Array(p * p);
  const qPot = potentialColumns.length;
  const qPri = primaryColumns.length;
  if (qPot === 0) {
    return { alpha: [], ranges: [], potentialColumns, primaryColumns, aliased: [], priorInformation, K, tau, logDetAdjustment: 0, adjust: (row) => Float64Array.from(row) };
  }
  const primary = new Float64Array(n * qPri);
  for (let i = 0; i < n; i++) primaryColumns.forEach((c, a) => (primary[i * qPri + a] = candidateRows[i * p + c]));
  const qr = householderQr(primary, n, qPri);
  if (qr.rank < qPri) throw new RangeError('the candidate set cannot estimate the primary terms, so potential terms cannot be adjusted');
  const alpha: number[][] = Array.from({ length: qPri }, () => new Array<number>(qPot).fill(0));
  const ranges: number[] = [];
  const aliased: number[] = [];
  const column = new Float64Array(n);
  for (let a = 0; a < qPot; a++) {
    const c = potentialColumns[a];
    let size = 0;
    for (let i = 0; i < n; i++) {
      column[i] = candidateRows[i * p + c];
      size = Math.max(size, Math.abs(column[i]));
    }
    const fit = solveLeastSquares(qr, column);
    for (let b = 0; b < qPri; b++) alpha[b][a] = fit.coefficients[b];
    let min = Number.POSITIVE_INFINITY;
    let max = Number.NEGATIVE_INFINITY;
    for (let i = 0; i < n; i++) {
      const value = fit.residuals[i];
      if (value < min) min = value;
      if (value > max) max = value;
    }
    const range = max - min;
    if (!(range > 1e-9 * Math.max(size, 1e-300))) {
      aliased.push(potentialColumns[a]);
      ranges.push(0);
      continue;
    }
    ranges.push(range);
    priorInformation[c * p + c] = (range * range) / (tau * tau);
    K[c * p + c] = 1 / (tau * tau);
  }
  let logDetAdjustment = 0;
  for (const range of ranges) if (range > 0) logDetAdjustment -= 2 * Math.log(range);

  const adjust = (row: ArrayLike<number>): Float64Array => {
    const out = Float64Array.from(row);
    potentialColumns.forEach((c, a) => {
      if (ranges[a] === 0) return;
      let fitted = 0;
      primaryColumns.forEach((pc, b) => (fitted += alpha[b][a] * row[pc]));
      out[c] = (row[c] - fitted) / ranges[a];
    });
    return out;
  };
  return { alpha, ranges, potentialColumns, primaryColumns, aliased, priorInformation, K, tau, logDetAdjustment, adjust };
}
