/**
 * The cross-product matrix X′X = Σ_i x_i x_i′ of the rows of an N × p matrix, and its
 * weighted form X′WX = Σ_i w_i x_i x_i′ (W diagonal): the information matrix of an exact
 * design and of a continuous design (Atkinson, Donev & Tobias, 2007, "Optimum Experimental
 * Designs, with SAS", §9.1).
 *
 * Conventions fixed here: X is row-major N × p; the lower triangle is accumulated row by row
 * and mirrored, so the result is exactly symmetric; zero entries and zero weights are skipped
 * (the rows of polynomial models are sparse at coded 0). Used on model rows already
 * expanded — least-squares fitting goes through QR, never through X′X.
 */

/** X′X (p × p, row-major) of an N × p row-major X, written into `out` (allocated when absent). */
export function crossProduct(X: ArrayLike<number>, N: number, p: number, out: Float64Array = new Float64Array(p * p)): Float64Array {
  return weightedCrossProduct(X, null, N, p, out);
}

/**
 * X′WX = Σ_i w_i x_i x_i′ (p × p, row-major) into `out` (allocated when absent); `weights`
 * null means every weight is 1.
 */
export function weightedCrossProduct(
  X: ArrayLike<number>,
  weights: ArrayLike<number> | null,
  N: number,
  p: number,
  out: Float64Array = new Float64Array(p * p),
): Float64Array {
  out.fill(0);
  for (let i = 0; i < N; i++) {
    const w = weights === null ? 1 : weights[i];
    if (w === 0) continue;
    const base = i * p;
    for (let a = 0; a < p; a++) {
      const wa = weights === null ? X[base + a] : w * X[base + a];
      if (wa === 0) continue;
      for (let b = 0; b <= a; b++) out[a * p + b] += wa * X[base + b];
    }
  }
  for (let a = 0; a < p; a++) for (let b = 0; b < a; b++) out[b * p + a] = out[a * p + b];
  return out;
}
