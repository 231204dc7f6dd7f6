/**
 * Power of the joint F test of a block of model terms against a given effect.
 *
 * For the terms T of a fitted linear model with coefficient covariance σ²·C (C = (X'X)⁻¹ for
 * ordinary least squares; the generalised-least-squares (X'V⁻¹X)⁻¹ for split-plot and
 * blocked designs), the Wald/F statistic for H0: β_T = 0 has, when the true coefficients are
 * b, q = |T| numerator degrees of freedom, ν denominator degrees of freedom and
 * noncentrality λ = b' C_TT⁻¹ b / σ², where C_TT is the T×T block of C (Searle, 1971, "Linear
 * Models", §5.5; Scheffé, 1959, "The Analysis of Variance", §2.8). Power =
 * 1 − F_nc(F_crit(q, ν, α); q, ν, λ) (noncentralF.ts).
 *
 * The test and λ are invariant to a nonsingular recoding of the block (raw powers x, x², x³
 * or Legendre polynomials give the same λ for the same true function), which is why the
 * precision block tests each factor's terms jointly.
 *
 * Conventions fixed here: C is p × p row-major in σ² = 1 units; b and σ in response units;
 * the block's own order is kept; ν is passed in (N − p for OLS; a containment rule for
 * split-plot designs is the caller's choice).
 */
import { choleskyFactor } from '../linalg/cholesky.js';
import { fTestPower } from '../distribution/noncentralF.js';

/** The T×T block of a p × p row-major matrix. */
export function covarianceBlock(covariance: ArrayLike<number>, p: number, terms: readonly number[]): Float64Array {
  const q = terms.length;
  const block = new Float64Array(q * q);
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) block[a * q + b] = covariance[terms[a] * p + terms[b]];
  return block;
}

/** λ = b' C_TT⁻¹ b / σ², by Cholesky C_TT = LL' and λ = |L⁻¹b|²/σ²; NaN when C_TT is singular. */
export function blockNoncentrality(block: Float64Array, coefficients: readonly number[], sigma: number): number {
  const q = coefficients.length;
  const L = choleskyFactor(block, q);
  if (!L) return Number.NaN;
  const y = new Float64Array(q);
  let sum = 0;
  for (let i = 0; i < q; i++) {
    let value = coefficients[i];
    for (let m = 0; m < i; m++) value -= L[i * q + m] * y[m];
    y[i] = value / L[i * q + i];
    sum += y[i] * y[i];
  }
  return sum / (sigma * sigma);
}

export interface TermBlockPowerRequest {
  /** C_TT, q × q row-major, σ² = 1 units. */
  covarianceBlock: Float64Array;
  /** True coefficients of the block's terms, response units. */
  coefficients: readonly number[];
  /** Standard deviation of one result, response units. */
  sigma: number;
  /** Denominator degrees of freedom ν. */
  residualDf: number;
  alpha: number;
}

export interface TermBlockPower {
  q: number;
  residualDf: number;
  noncentrality: number;
  /** Null when there are no residual degrees of freedom or the block is singular. */
  power: number | null;
}

export function termBlockPower(request: TermBlockPowerRequest): TermBlockPower {
  const q = request.coefficients.length;
  const { residualDf, alpha } = request;
  const noncentrality = blockNoncentrality(request.covarianceBlock, request.coefficients, request.sigma);
  const power = residualDf >= 1 && Number.isFinite(noncentrality) ? fTestPower(q, residualDf, noncentrality, alpha) : null;
  return { q, residualDf, noncentrality, power };
}
