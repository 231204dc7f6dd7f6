/**
 * Cholesky factorisation of a small symmetric positive-definite matrix (an information
 * matrix X'X), its inverse and its log-determinant.
 *
 * Method: the classical column-wise Cholesky–Banachiewicz recurrence (Golub & Van Loan,
 * 2013, "Matrix Computations", 4th ed., §4.2). Matrices are row-major Float64Arrays of
 * p × p; only the lower triangle of the input is read. A pivot at or below
 * `PIVOT_TOLERANCE` times the largest diagonal entry counts as singular: the caller has
 * already checked the rank of the model matrix, so this is only a guard.
 */

const PIVOT_TOLERANCE = 1e-12;

/** Lower-triangular L with A = L L', or null when A is not numerically positive definite. */
export function choleskyFactor(A: Float64Array, p: number): Float64Array | null {
  const L = new Float64Array(p * p);
  let largestDiagonal = 0;
  for (let i = 0; i < p; i++) largestDiagonal = Math.max(largestDiagonal, A[i * p + i]);
  const floor = PIVOT_TOLERANCE * Math.max(largestDiagonal, Number.MIN_VALUE);
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

/** A⁻¹ (full symmetric, row-major) from the Cholesky factor of A. */
export function choleskyInverse(L: Float64Array, p: number): Float64Array {
  // Invert L by forward substitution, then A⁻¹ = L⁻ᵀ L⁻¹.
  const Linv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) {
    Linv[i * p + i] = 1 / L[i * p + i];
    for (let j = 0; j < i; j++) {
      let sum = 0;
      for (let m = j; m < i; m++) sum += L[i * p + m] * Linv[m * p + j];
      Linv[i * p + j] = -sum / L[i * p + i];
    }
  }
  const inverse = new Float64Array(p * p);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = 0;
      for (let m = i; m < p; m++) sum += Linv[m * p + i] * Linv[m * p + j];
      inverse[i * p + j] = sum;
      inverse[j * p + i] = sum;
    }
  }
  return inverse;
}

/** A⁻¹ of a symmetric positive-definite matrix, or null when it is singular. */
export function symmetricInverse(A: Float64Array, p: number): Float64Array | null {
  const L = choleskyFactor(A, p);
  return L ? choleskyInverse(L, p) : null;
}
