/**
 * Ordinary least-squares fit of one response on a model matrix, by Householder QR with
 * column pivoting (src/core/linalg/householderQr.ts); the normal equations are never formed.
 *
 * Returns the basic solution (inestimable coefficients NaN), s²(X′X)⁻¹ on the estimable
 * columns, fitted values and residuals from Q′y, and the leverages h_i (diagonal of the hat
 * matrix, from Q). Residual df = n − rank; s² = RSS / df (Seber & Lee, 2003, "Linear
 * Regression Analysis", 2nd ed., ch. 3). With no residual df, s and every standard error
 * are NaN.
 *
 * Prediction of a new run at row f (one more observation, not its mean):
 * ŷ ± t_{df, 1−α/2} · s · √(1 + f′(X′X)⁻¹f) (Seber & Lee §5.3), with f′(X′X)⁻¹f from one
 * triangular solve on the QR factor; null when f′β is not estimable or df = 0.
 */
import {
  householderQr,
  leverages,
  rowVarianceFactor,
  solveLeastSquares,
  unscaledCovariance,
  type QrFactor,
  type QrOptions,
} from '../linalg/householderQr.js';
import { tQuantile } from './tailProbabilities.js';

export interface LeastSquaresFit {
  n: number;
  p: number;
  rank: number;
  residualDf: number;
  factor: QrFactor;
  coefficients: Float64Array;
  /** s²(X′X)⁻¹, p × p row-major; NaN for inestimable columns or without residual df. */
  covariance: Float64Array;
  fitted: Float64Array;
  residuals: Float64Array;
  leverages: Float64Array;
  residualSs: number;
  /** s = √(RSS / df); NaN when df = 0. */
  residualSd: number;
}

export function fitLeastSquares(X: ArrayLike<number>, y: ArrayLike<number>, n: number, p: number, options: QrOptions = {}): LeastSquaresFit {
  const factor = householderQr(X, n, p, options);
  const solution = solveLeastSquares(factor, y);
  const residualDf = n - factor.rank;
  const residualSd = residualDf > 0 ? Math.sqrt(solution.residualSs / residualDf) : Number.NaN;
  const covariance = unscaledCovariance(factor);
  const s2 = residualSd * residualSd;
  for (let i = 0; i < covariance.length; i++) covariance[i] *= s2;
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) fitted[i] = y[i] - solution.residuals[i];
  return {
    n,
    p,
    rank: factor.rank,
    residualDf,
    factor,
    coefficients: solution.coefficients,
    covariance,
    fitted,
    residuals: solution.residuals,
    leverages: leverages(factor),
    residualSs: solution.residualSs,
    residualSd,
  };
}

export interface PredictionInterval {
  predicted: number;
  lower: number;
  upper: number;
}

/** Prediction and interval for one new run at model row `row` (length p). */
export function predictNewRun(fit: LeastSquaresFit, row: ArrayLike<number>, level = 0.95): PredictionInterval | null {
  if (!(fit.residualDf > 0)) return null;
  const h = rowVarianceFactor(fit.factor, row);
  if (!Number.isFinite(h)) return null;
  let predicted = 0;
  // The basic solution's inestimable coefficients count as 0: f′β̂ is unique for estimable f.
  for (let j = 0; j < fit.p; j++) if (row[j] !== 0 && Number.isFinite(fit.coefficients[j])) predicted += row[j] * fit.coefficients[j];
  const half = tQuantile(1 - (1 - level) / 2, fit.residualDf) * fit.residualSd * Math.sqrt(1 + h);
  return { predicted, lower: predicted - half, upper: predicted + half };
}
