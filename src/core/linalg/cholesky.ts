/**
 * Cholesky factorisation of a small symmetric positive-definite matrix (an information
 * matrix X'X), its inverse and its log-determinant — the one from-scratch inversion that the
 * design search, the continuous bound and the evaluation all use.
 *
 * Method: the classical row-wise Cholesky–Banachiewicz recurrence, then L⁻¹ by forward
 * substitution and A⁻¹ = L⁻ᵀL⁻¹ (Golub & Van Loan, 2013, "Matrix Computations", 4th ed.,
 * §4.2). Matrices are row-major Float64Arrays of p × p; only the lower triangle of the input
 * is read.
 *
 * Singularity: a pivot at or below `pivotTolerance` times the largest diagonal entry counts
 * as singular. The default (1e-12) is only a guard for callers that have already checked the
 * rank of the model matrix; the exchange search passes a stricter one (see
 * ../design/exchangeState.ts).
 */

/** Default relative pivot floor: below it a matrix is treated as singular. */
const PIVOT_TOLERANCE = 1e-12;

/** Lower-triangular L with A = L L', or null when A is not numerically positive definite. */
export function choleskyFactor(A: Float64Array, p: number, pivotTolerance = PIVOT_TOLERANCE): Float64Array | null {
  const L = new Float64Array(p * p);
  let largestDiagonal = 0;
  for (let i = 0; i < p; i++) largestDiagonal = Math.max(largestDiagonal, A[i * p + i]);
  const floor = pivotTolerance * Math.max(largestDiagonal, Number.MIN_VALUE);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = A[i * p + j];
      for (let m = 0; m < j; m++) sum -= L[i * p + m] * L[j * p + m];
      if (i === j) {
        if (!(sum > floor)) return null;
        L[i * p + i] = Math.sqrt(sum);
      } else {
        L[i * p + j] = sum / L[j * p + j];
      }
    }
  }
  return L;
}

/** ln det A from its Cholesky factor: 2 Σ ln L_ii. */
export function choleskyLogDeterminant(L: Float64Array, p: number): number {
  let sum = 0;
  for (let i = 0; i < p; i++) sum += Math.log(L[i * p + i]);
  return 2 * sum;
}

/** A⁻¹ (full symmetric, row-major) from the Cholesky factor of A, written into `out`. */
export function choleskyInverse(L: Float64Array, p: number, out: Float64Array = new Float64Array(p * p)): Float64Array {
  const Linv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) {
    Linv[i * p + i] = 1 / L[i * p + i];
    for (let j = 0; j < i; j++) {
      let sum = 0;
      for (let m = j; m < i; m++) sum += L[i * p + m] * Linv[m * p + j];
      Linv[i * p + j] = -sum / L[i * p + i];
    }
  }
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = 0;
      for (let m = i; m < p; m++) sum += Linv[m * p + i] * Linv[m * p + j];
      out[i * p + j] = sum;
      out[j * p + i] = sum;
    }
  }
  return out;
}

/** A⁻¹ of a symmetric positive-definite matrix, or null when it is singular. */
export function symmetricInverse(A: Float64Array, p: number): Float64Array | null {
  const L = choleskyFactor(A, p);
  return L ? choleskyInverse(L, p) : null;
}

/**
 * Writes A⁻¹ into `inverse` and returns ln det A, or returns −Infinity (leaving `inverse`
 * unspecified) when A is not numerically positive definite at `pivotTolerance`.
 */
export function invertSymmetric(A: Float64Array, p: number, inverse: Float64Array, pivotTolerance = PIVOT_TOLERANCE): number {
  const L = choleskyFactor(A, p, pivotTolerance);
  if (L === null) return Number.NEGATIVE_INFINITY;
  choleskyInverse(L, p, inverse);
  return choleskyLogDeterminant(L, p);
}
