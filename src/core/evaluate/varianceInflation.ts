/**
 * Variance inflation factors of the model terms.
 *
 * The usual definition (Marquardt, 1970, "Generalized inverses, ridge regression, biased
 * linear estimation, and nonlinear estimation", Technometrics 12; Montgomery, Peck & Vining,
 * 2012, "Introduction to Linear Regression Analysis", 5th ed., §9.4): centre each
 * non-intercept column, scale it to unit length, form the correlation matrix R, and read
 * VIF_j = (R⁻¹)_jj = 1 / (1 − R²_j). An orthogonal design gives 1 for every term.
 */
import { symmetricInverse } from '../linalg/cholesky.js';

/**
 * VIF of each non-intercept column of the N × p row-major model matrix X (in column order,
 * `interceptColumn` skipped). Null when the centred columns are linearly dependent.
 */
export function varianceInflationFactors(X: Float64Array, N: number, p: number, interceptColumn: number): number[] | null {
  const columns: number[] = [];
  for (let c = 0; c < p; c++) if (c !== interceptColumn) columns.push(c);
  const q = columns.length;
  if (q === 0) return [];
  const Z = new Float64Array(N * q);
  for (let j = 0; j < q; j++) {
    const c = columns[j];
    let mean = 0;
    for (let i = 0; i < N; i++) mean += X[i * p + c];
    mean /= N;
    let length = 0;
    for (let i = 0; i < N; i++) {
      const centred = X[i * p + c] - mean;
      Z[i * q + j] = centred;
      length += centred * centred;
    }
    if (length === 0) return null;
    length = Math.sqrt(length);
    for (let i = 0; i < N; i++) Z[i * q + j] /= length;
  }
  const R = new Float64Array(q * q);
  for (let i = 0; i < N; i++) {
    for (let a = 0; a < q; a++) {
      const za = Z[i * q + a];
      for (let b = 0; b < q; b++) R[a * q + b] += za * Z[i * q + b];
    }
  }
  const inverse = symmetricInverse(R, q);
  if (!inverse) return null;
  return columns.map((_, j) => inverse[j * q + j]);
}
