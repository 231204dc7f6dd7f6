/**
 * Information of a design under the error structure of a split-plot campaign run in sessions.
 *
 * Model: y = Xβ + Bθ + Zγ + ε, with X the model rows of the fitted runs, B the session
 * indicators (fixed block effects), Z the whole-plot incidence, γ ~ N(0, σ_γ² I) and
 * ε ~ N(0, σ_ε² I). In σ_ε² units the covariance of y is V = I + η ZZ', η = σ_γ²/σ_ε² (the
 * variance ratio). Sources: Goos & Vandebroek, 2003, "D-optimal split-plot designs with given
 * numbers and sizes of whole plots", Technometrics 45, 235–245; Jones & Goos, 2007, "A
 * candidate-set-free algorithm for generating D-optimal split-plot designs", Applied
 * Statistics 56, 347–364; for fixed blocks, Goos & Vandebroek, 2001, Technometrics 43, and
 * Atkinson, Donev & Tobias, 2007, "Optimum Experimental Designs, with SAS", ch. 15.
 *
 * Closed forms used (V is block diagonal by whole plot):
 * - V⁻¹ = I − Σ_w c_w 1_w 1_w', c_w = η / (1 + η n_w), so X'V⁻¹X = X'X − Σ_w c_w s_w s_w'
 *   with s_w the sum of the rows of whole plot w.
 * - With S > 1 sessions and whole plots nested in them, B'V⁻¹B is diagonal with
 *   d_b = Σ_{w∈b} n_w g_w, g_w = 1 / (1 + η n_w), and X'V⁻¹B has columns
 *   a_b = Σ_{w∈b} g_w s_w, so the information on β adjusted for the blocks is
 *   X'V⁻¹X − Σ_b a_b a_b' / d_b. The intercept lies in the span of B, so its row and column
 *   vanish: the adjusted information is kept over the other p − 1 terms only.
 *
 * Rows are row-major Float64Arrays; the intercept is column 0 (the model's term order).
 */
import { crossProduct } from '../linalg/crossProduct.js';
import { addScaledOuter } from '../linalg/symmetricKernels.js';

export interface ErrorStructure {
  /** Whole plot of each fitted run (0-based, every index from 0 to wholePlots − 1 used). */
  wholePlotOf: Int32Array;
  /** Session of each whole plot (0-based, every index from 0 to sessions − 1 used). */
  sessionOfWholePlot: Int32Array;
  wholePlots: number;
  sessions: number;
  /** η = σ_γ² / σ_ε² ≥ 0. */
  varianceRatio: number;
}

/** The structure of independent runs in one session: every run its own whole plot, η = 0. */
export function independentRuns(runs: number): ErrorStructure {
  return {
    wholePlotOf: Int32Array.from({ length: runs }, (_, i) => i),
    sessionOfWholePlot: new Int32Array(runs),
    wholePlots: runs,
    sessions: 1,
    varianceRatio: 0,
  };
}

/** Runs per whole plot. */
export function wholePlotSizes(structure: ErrorStructure): Int32Array {
  const sizes = new Int32Array(structure.wholePlots);
  for (const w of structure.wholePlotOf) sizes[w]++;
  return sizes;
}

/** Sums s_w of the rows (width `width`, starting at column `from` of each p-wide row) per whole plot. */
function wholePlotSums(X: ArrayLike<number>, p: number, from: number, structure: ErrorStructure): Float64Array {
  const width = p - from;
  const sums = new Float64Array(structure.wholePlots * width);
  structure.wholePlotOf.forEach((w, i) => {
    for (let a = 0; a < width; a++) sums[w * width + a] += X[i * p + from + a];
  });
  return sums;
}

/** X'V⁻¹X (p × p) of the N × p rows X. */
export function glsInformation(X: ArrayLike<number>, N: number, p: number, structure: ErrorStructure): Float64Array {
  const M = crossProduct(X, N, p);
  subtractWholePlots(M, p, wholePlotSums(X, p, 0, structure), structure);
  return M;
}

function subtractWholePlots(M: Float64Array, width: number, sums: Float64Array, structure: ErrorStructure): void {
  const eta = structure.varianceRatio;
  if (eta === 0) return;
  const sizes = wholePlotSizes(structure);
  for (let w = 0; w < structure.wholePlots; w++) {
    const c = eta / (1 + eta * sizes[w]);
    addScaledOuter(M, width, sums, -c, w * width);
  }
}


/**
 * The information on β adjusted for fixed session effects: over the p − 1 terms other than the
 * intercept when there is more than one session, else X'V⁻¹X over all p terms.
 */
export function blockAdjustedInformation(X: ArrayLike<number>, N: number, p: number, structure: ErrorStructure): { matrix: Float64Array; size: number } {
  if (structure.sessions <= 1) return { matrix: glsInformation(X, N, p, structure), size: p };
  const q = p - 1;
  const reduced = new Float64Array(N * q);
  for (let i = 0; i < N; i++) for (let a = 0; a < q; a++) reduced[i * q + a] = X[i * p + 1 + a];
  const M = crossProduct(reduced, N, q);
  const sums = wholePlotSums(reduced, q, 0, structure);
  subtractWholePlots(M, q, sums, structure);
  const { a, d } = sessionSums(sums, q, structure);
  for (let b = 0; b < structure.sessions; b++) if (d[b] > 0) addScaledOuter(M, q, a, -1 / d[b], b * q);
  return { matrix: M, size: q };
}

/** a_b = Σ_{w∈b} g_w s_w and d_b = Σ_{w∈b} n_w g_w per session. */
export function sessionSums(sums: Float64Array, width: number, structure: ErrorStructure): { a: Float64Array; d: Float64Array } {
  const eta = structure.varianceRatio;
  const sizes = wholePlotSizes(structure);
  const a = new Float64Array(structure.sessions * width);
  const d = new Float64Array(structure.sessions);
  for (let w = 0; w < structure.wholePlots; w++) {
    const b = structure.sessionOfWholePlot[w];
    const g = 1 / (1 + eta * sizes[w]);
    d[b] += sizes[w] * g;
    for (let c = 0; c < width; c++) a[b * width + c] += g * sums[w * width + c];
  }
  return { a, d };
}

/**
 * The information on the p − 1 terms other than the intercept with the intercept as the only
 * nuisance parameter: the Schur complement M₂₂ − M₂₁ M₁₁⁻¹ M₁₂ of M = X'V⁻¹X. It is what the
 * blocked information is compared with (one session holds the same runs).
 */
export function interceptAdjusted(M: Float64Array, p: number): Float64Array {
  const q = p - 1;
  const out = new Float64Array(q * q);
  const m11 = M[0];
  for (let a = 0; a < q; a++) {
    for (let b = 0; b < q; b++) out[a * q + b] = M[(a + 1) * p + b + 1] - (m11 > 0 ? (M[(a + 1) * p] * M[b + 1]) / m11 : 0);
  }
  return out;
}
