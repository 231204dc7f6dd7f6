/**
 * The dense kernels on small row-major p × p matrices that the design search, the continuous
 * bound and the evaluation share: A·x, x·y, the quadratic form f′Af (with A = M⁻¹ it is the
 * prediction variance d(x) = f(x)′M⁻¹f(x)), trace(AB) of two symmetric matrices and the
 * rank-one change M += s·vv′.
 *
 * Sources: the definitions themselves (Golub & Van Loan, 2013, "Matrix Computations", 4th ed.,
 * §1.1); trace(AB) = Σ_ij A_ij B_ij holds because B is symmetric.
 *
 * Conventions fixed here: matrices are row-major Float64Arrays; vectors may start at an
 * offset into a longer array (a row of a model matrix), so a caller loops over candidate rows
 * without copying them; nothing allocates. The summation order is part of the contract —
 * every caller gets the same bits for the same inputs: f′Af = Σ_a f_a (Σ_b A_ab f_b).
 */

/** out = A x for a p × p row-major A, x = x[xOffset .. xOffset + p). */
export function multiplyInto(A: ArrayLike<number>, p: number, x: ArrayLike<number>, out: Float64Array, xOffset = 0): void {
  for (let i = 0; i < p; i++) {
    let sum = 0;
    const base = i * p;
    for (let j = 0; j < p; j++) sum += A[base + j] * x[xOffset + j];
    out[i] = sum;
  }
}

/** x · y over p entries, x from xOffset and y from yOffset. */
export function dot(x: ArrayLike<number>, y: ArrayLike<number>, p: number, xOffset = 0, yOffset = 0): number {
  let sum = 0;
  for (let i = 0; i < p; i++) sum += x[xOffset + i] * y[yOffset + i];
  return sum;
}

/** f′Af for a p × p row-major A, f = f[offset .. offset + p). */
export function quadraticForm(A: ArrayLike<number>, p: number, f: ArrayLike<number>, offset = 0): number {
  let total = 0;
  for (let a = 0; a < p; a++) {
    const fa = f[offset + a];
    // A zero coordinate adds ±0 to the sum: skipping it changes no bit (model rows at coded
    // 0 are sparse).
    if (fa === 0) continue;
    let row = 0;
    const base = a * p;
    for (let b = 0; b < p; b++) row += A[base + b] * f[offset + b];
    total += fa * row;
  }
  return total;
}

/** trace(AB) = Σ_ij A_ij B_ij of two p × p matrices, B symmetric. */
export function traceOfProduct(A: ArrayLike<number>, B: ArrayLike<number>): number {
  let trace = 0;
  for (let i = 0; i < A.length; i++) trace += A[i] * B[i];
  return trace;
}

/** M += scale · v v′ for a p × p row-major M, v = v[offset .. offset + p) (a rank-one update of M itself). */
export function addScaledOuter(M: Float64Array, p: number, v: ArrayLike<number>, scale: number, offset = 0): void {
  for (let a = 0; a < p; a++) {
    const va = scale * v[offset + a];
    if (va === 0) continue;
    const base = a * p;
    for (let b = 0; b < p; b++) M[base + b] += va * v[offset + b];
  }
}
