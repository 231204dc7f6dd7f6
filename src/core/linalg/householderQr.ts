/**
 * Householder QR factorisation with column pivoting, and the least-squares quantities that
 * come from it without ever forming X′X: the basic solution, Q′y, leverages, (X′X)⁻¹ on the
 * estimable columns, x′(X′X)⁻¹x for a new row, and whether a row is estimable at all.
 *
 * Method: Householder reflections with Businger–Golub column pivoting (Businger & Golub, 1965,
 * "Linear least squares solutions by Householder transformations", Numer. Math. 7; Golub &
 * Van Loan, 2013, "Matrix Computations", 4th ed., Alg. 5.1.1 and §5.4.2). Before factorising,
 * every column is divided by its Euclidean norm (column equilibration, which nearly minimises
 * the condition number over column scalings: van der Sluis, 1969, "Condition numbers and
 * equilibration of matrices", Numer. Math. 14). Scaling changes neither the least-squares fit
 * nor the solution in exact arithmetic; it makes the pivot order and the rank decision
 * independent of the units each column happens to carry.
 *
 * Pivoting and rank rule (both on the equilibrated columns, whose norms are all 1):
 * - `order` (default): columns are taken in their given order; a column whose remaining
 *   norm, after the reflections of the columns already taken, is at or below `tolerance`
 *   is numerically a combination of those earlier columns, so it is moved to the end and
 *   counted inestimable ("limited pivoting", as in LINPACK's least-squares use of dqrdc:
 *   Dongarra et al., 1979, "LINPACK Users' Guide", ch. 9). The inestimable columns are
 *   then the LATER ones of a dependent set — for a model in the usual order, the
 *   higher-order terms — which is what a reader of the fit expects to be told.
 * - `norm`: Businger–Golub pivoting, the remaining column of largest norm first; the
 *   factorisation stops when that norm is at or below `tolerance · |r₁₁|` (numerical rank,
 *   Golub & Van Loan §5.4.2).
 * The default tolerance is max(n, p) · ε (ε = 2⁻⁵², machine epsilon), the usual floor for a
 * column-scaled problem: a column closer than that to the span of the others cannot be told
 * apart from it in double precision. Columns that are exactly zero are inestimable too.
 *
 * Conventions: input matrices are row-major n × p Float64Arrays (as `modelMatrix` writes
 * them); internally the factor is column-major. Coefficient vectors are in the ORIGINAL
 * column order and units; inestimable coefficients are NaN. The factor does not keep A.
 */

/** Machine epsilon of IEEE double precision. */
const EPSILON = 2 ** -52;

/** Relative tolerance of the estimability test of a new row (`isEstimableRow`). */
export const ESTIMABILITY_TOLERANCE = 1e-8;

export interface QrFactor {
  n: number;
  p: number;
  /** Numerical rank: the first `rank` pivoted columns are estimable. */
  rank: number;
  /** Relative rank tolerance that was applied (see the module header). */
  tolerance: number;
  /** permutation[k] = original column placed at position k. */
  permutation: Int32Array;
  /** Euclidean norm of each original column (1 for a zero column); A·diag(1/scale) was factorised. */
  scale: Float64Array;
  /**
   * Column-major n × p work array: on and above the diagonal the strict upper part of R
   * (position k, column j > k), below and on the diagonal the Householder vector of step k.
   */
  packed: Float64Array;
  /** Diagonal of R, length p (zero past the rank). */
  diagonal: Float64Array;
  /** Householder coefficients τ_k = 2 / (v_k′v_k), length rank. */
  tau: Float64Array;
}

export interface QrOptions {
  /** Relative rank tolerance; default max(n, p)·ε. */
  tolerance?: number;
  /** Pivot rule (see the module header); default `order`. */
  pivoting?: 'order' | 'norm';
}

/** Householder QR with column pivoting of the row-major n × p matrix `A`. */
export function householderQr(A: ArrayLike<number>, n: number, p: number, options: QrOptions = {}): QrFactor {
  const tolerance = options.tolerance ?? Math.max(n, p) * EPSILON;
  const packed = new Float64Array(n * p);
  const scale = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += A[i * p + j] ** 2;
    const norm = Math.sqrt(sum);
    scale[j] = norm > 0 && Number.isFinite(norm) ? norm : 1;
    for (let i = 0; i < n; i++) packed[j * n + i] = A[i * p + j] / scale[j];
  }
  const permutation = new Int32Array(p);
  for (let j = 0; j < p; j++) permutation[j] = j;
  const diagonal = new Float64Array(p);
  const steps = Math.min(n, p);
  const tau = new Float64Array(steps);
  const byNorm = options.pivoting === 'norm';
  let rank = 0;
  let leading = 0;
  let deferred = 0;
  for (let k = 0; k < steps && k < p - deferred; k++) {
    let norm: number;
    if (byNorm) {
      // Remaining norms are recomputed exactly at every step: O(n p²) in all, the same order
      // as the factorisation, and free of the cancellation that down-dated norms suffer.
      let best = -1;
      let bestNorm = -1;
      for (let j = k; j < p; j++) {
        const sum = remainingNormSquared(packed, n, k, j);
        if (sum > bestNorm) {
          bestNorm = sum;
          best = j;
        }
      }
      norm = Math.sqrt(bestNorm);
      if (k === 0) leading = norm;
      if (!(norm > 0) || norm <= tolerance * leading) break;
      if (best !== k) swapColumns(packed, n, k, best, permutation);
    } else {
      norm = Math.sqrt(remainingNormSquared(packed, n, k, k));
      while (!(norm > tolerance) && k < p - deferred) {
        // Numerically dependent on the columns already taken: to the back, order kept.
        moveToEnd(packed, n, p, k, permutation);
        deferred += 1;
        if (k < p - deferred) norm = Math.sqrt(remainingNormSquared(packed, n, k, k));
      }
      if (k >= p - deferred) break;
    }
    // Householder vector v = x − α e₁ with α = −sign(x₁)‖x‖ (no cancellation in v₁).
    const head = packed[k * n + k];
    const alpha = head >= 0 ? -norm : norm;
    packed[k * n + k] = head - alpha;
    let vv = 0;
    for (let i = k; i < n; i++) vv += packed[k * n + i] ** 2;
    const t = 2 / vv;
    tau[k] = t;
    diagonal[k] = alpha;
    for (let j = k + 1; j < p; j++) {
      let dot = 0;
      for (let i = k; i < n; i++) dot += packed[k * n + i] * packed[j * n + i];
      const f = t * dot;
      for (let i = k; i < n; i++) packed[j * n + i] -= f * packed[k * n + i];
    }
    rank = k + 1;
  }
  return { n, p, rank, tolerance, permutation, scale, packed, diagonal, tau: tau.slice(0, rank) };
}

/** Σ_{i ≥ k} A[i, j]² of the working column j. */
function remainingNormSquared(packed: Float64Array, n: number, k: number, j: number): number {
  let sum = 0;
  for (let i = k; i < n; i++) sum += packed[j * n + i] ** 2;
  return sum;
}

/** Moves working column k to position p − 1, shifting k + 1 … p − 1 one place forward. */
function moveToEnd(packed: Float64Array, n: number, p: number, k: number, permutation: Int32Array): void {
  const column = packed.slice(k * n, (k + 1) * n);
  packed.copyWithin(k * n, (k + 1) * n, p * n);
  packed.set(column, (p - 1) * n);
  const original = permutation[k];
  permutation.copyWithin(k, k + 1, p);
  permutation[p - 1] = original;
}

function swapColumns(packed: Float64Array, n: number, a: number, b: number, permutation: Int32Array): void {
  for (let i = 0; i < n; i++) {
    const keep = packed[a * n + i];
    packed[a * n + i] = packed[b * n + i];
    packed[b * n + i] = keep;
  }
  const column = permutation[a];
  permutation[a] = permutation[b];
  permutation[b] = column;
}

/** Q′y (length n), by applying the reflectors in order. */
export function applyQTranspose(factor: QrFactor, y: ArrayLike<number>): Float64Array {
  const { n, rank, packed, tau } = factor;
  const out = Float64Array.from(y);
  for (let k = 0; k < rank; k++) {
    let dot = 0;
    for (let i = k; i < n; i++) dot += packed[k * n + i] * out[i];
    const f = tau[k] * dot;
    for (let i = k; i < n; i++) out[i] -= f * packed[k * n + i];
  }
  return out;
}

/** Q·z (length n), the reflectors applied in reverse order. */
function applyQ(factor: QrFactor, z: Float64Array): Float64Array {
  const { n, rank, packed, tau } = factor;
  const out = Float64Array.from(z);
  for (let k = rank - 1; k >= 0; k--) {
    let dot = 0;
    for (let i = k; i < n; i++) dot += packed[k * n + i] * out[i];
    const f = tau[k] * dot;
    for (let i = k; i < n; i++) out[i] -= f * packed[k * n + i];
  }
  return out;
}

/** Entry (a, b) of R, a ≤ b, in pivoted and scaled coordinates. */
function rEntry(factor: QrFactor, a: number, b: number): number {
  return a === b ? factor.diagonal[a] : factor.packed[b * factor.n + a];
}

/** Solves R₁₁ z = c in place (back substitution over the first `rank` entries). */
function solveUpper(factor: QrFactor, c: Float64Array): void {
  for (let a = factor.rank - 1; a >= 0; a--) {
    let sum = c[a];
    for (let b = a + 1; b < factor.rank; b++) sum -= rEntry(factor, a, b) * c[b];
    c[a] = sum / factor.diagonal[a];
  }
}

/** Solves R₁₁′ z = c in place (forward substitution over the first `rank` entries). */
function solveUpperTranspose(factor: QrFactor, c: Float64Array): void {
  for (let a = 0; a < factor.rank; a++) {
    let sum = c[a];
    for (let b = 0; b < a; b++) sum -= rEntry(factor, b, a) * c[b];
    c[a] = sum / factor.diagonal[a];
  }
}

export interface LeastSquaresSolution {
  /** Basic solution in original column order and units; NaN for inestimable columns. */
  coefficients: Float64Array;
  /** y − Xβ̂ (length n), from Q′y, so exact to rounding even when X is ill-conditioned. */
  residuals: Float64Array;
  /** Σ residuals², as the squared norm of the trailing part of Q′y. */
  residualSs: number;
}

/** Least-squares solution of X β ≈ y from the factor of X. */
export function solveLeastSquares(factor: QrFactor, y: ArrayLike<number>): LeastSquaresSolution {
  const { n, p, rank, permutation, scale } = factor;
  const qty = applyQTranspose(factor, y);
  const z = qty.slice(0, Math.max(rank, 0));
  const head = new Float64Array(p);
  head.set(z);
  solveUpper(factor, head);
  const coefficients = new Float64Array(p).fill(Number.NaN);
  for (let k = 0; k < rank; k++) coefficients[permutation[k]] = head[k] / scale[permutation[k]];
  let residualSs = 0;
  for (let i = rank; i < n; i++) residualSs += qty[i] ** 2;
  const tail = new Float64Array(n);
  for (let i = rank; i < n; i++) tail[i] = qty[i];
  return { coefficients, residuals: applyQ(factor, tail), residualSs };
}

/** Original indices of the inestimable columns, ascending. */
export function inestimableColumns(factor: QrFactor): number[] {
  const out: number[] = [];
  for (let k = factor.rank; k < factor.p; k++) out.push(factor.permutation[k]);
  return out.sort((a, b) => a - b);
}

/** Diagonal of the hat matrix, h_i = Σ_k Q[i, k]² over the first `rank` columns of Q. */
export function leverages(factor: QrFactor): Float64Array {
  const { n, rank } = factor;
  const h = new Float64Array(n);
  const unit = new Float64Array(n);
  for (let k = 0; k < rank; k++) {
    unit.fill(0);
    unit[k] = 1;
    const column = applyQ(factor, unit);
    for (let i = 0; i < n; i++) h[i] += column[i] ** 2;
  }
  return h;
}

/**
 * (X′X)⁻¹ restricted to the estimable columns (p × p row-major, original order and units;
 * NaN in the rows and columns of inestimable ones), as R₁₁⁻¹R₁₁⁻ᵀ mapped back through the
 * pivoting and the column scales. Used for standard errors and the engineering-unit
 * covariance; predictions use `rowVarianceFactor`, which solves instead.
 */
export function unscaledCovariance(factor: QrFactor): Float64Array {
  const { p, rank, permutation, scale } = factor;
  // Columns of R₁₁⁻ᵀ, one triangular solve each: row a of R₁₁⁻¹ is column a of R₁₁⁻ᵀ.
  const inverseTranspose = new Float64Array(rank * rank);
  const e = new Float64Array(p);
  for (let a = 0; a < rank; a++) {
    e.fill(0);
    e[a] = 1;
    solveUpperTranspose(factor, e);
    for (let b = 0; b < rank; b++) inverseTranspose[b * rank + a] = e[b];
  }
  const C = new Float64Array(p * p).fill(Number.NaN);
  for (let a = 0; a < rank; a++) {
    for (let b = 0; b < rank; b++) {
      // (R⁻¹R⁻ᵀ)_ab = Σ_m (R⁻ᵀ)_ma (R⁻ᵀ)_mb
      let sum = 0;
      for (let m = 0; m < rank; m++) sum += inverseTranspose[m * rank + a] * inverseTranspose[m * rank + b];
      const ia = permutation[a];
      const ib = permutation[b];
      C[ia * p + ib] = sum / (scale[ia] * scale[ib]);
    }
  }
  return C;
}

/** The row f in pivoted, scaled coordinates: g_k = f[π_k] / s[π_k]. */
function pivotedRow(factor: QrFactor, row: ArrayLike<number>): Float64Array {
  const g = new Float64Array(factor.p);
  for (let k = 0; k < factor.p; k++) g[k] = row[factor.permutation[k]] / factor.scale[factor.permutation[k]];
  return g;
}

/**
 * Whether f′β is estimable: f is orthogonal to the null space of X, whose basis vectors are
 * [−R₁₁⁻¹R₁₂e_c ; e_c] for each inestimable pivoted column c. Relative tolerance
 * `ESTIMABILITY_TOLERANCE` on |g′n_c| / (‖g‖·‖n_c‖). Always true at full rank.
 */
export function isEstimableRow(factor: QrFactor, row: ArrayLike<number>): boolean {
  const { p, rank } = factor;
  if (rank === p) return true;
  const g = pivotedRow(factor, row);
  let gNorm = 0;
  for (let k = 0; k < p; k++) gNorm += g[k] ** 2;
  gNorm = Math.sqrt(gNorm);
  if (gNorm === 0) return true;
  const w = new Float64Array(p);
  for (let c = rank; c < p; c++) {
    w.fill(0);
    for (let a = 0; a < rank; a++) w[a] = rEntry(factor, a, c);
    solveUpper(factor, w);
    let dot = g[c];
    let nNorm = 1;
    for (let a = 0; a < rank; a++) {
      dot -= g[a] * w[a];
      nNorm += w[a] ** 2;
    }
    if (Math.abs(dot) > ESTIMABILITY_TOLERANCE * gNorm * Math.sqrt(nNorm)) return false;
  }
  return true;
}

/**
 * f′(X′X)⁻f for an estimable row f: ‖R₁₁⁻ᵀ g₁‖² with g the pivoted, scaled row — the
 * variance of f′β̂ in units of σ², by one triangular solve. NaN when f is not estimable.
 */
export function rowVarianceFactor(factor: QrFactor, row: ArrayLike<number>): number {
  if (!isEstimableRow(factor, row)) return Number.NaN;
  const g = pivotedRow(factor, row);
  solveUpperTranspose(factor, g);
  let sum = 0;
  for (let a = 0; a < factor.rank; a++) sum += g[a] ** 2;
  return sum;
}

/** ln det(X′X) over the estimable columns: 2 Σ ln|r_kk| + 2 Σ ln s_j (pivoted columns in the rank). */
export function logDetCrossProduct(factor: QrFactor): number {
  let sum = 0;
  for (let k = 0; k < factor.rank; k++) sum += Math.log(Math.abs(factor.diagonal[k])) + Math.log(factor.scale[factor.permutation[k]]);
  return 2 * sum;
}
