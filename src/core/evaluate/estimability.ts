/**
 * Which model terms a design can estimate, and what the others are aliased with.
 *
 * Rank: the columns of the model matrix X are taken in model order (intercept first) and
 * orthogonalised by modified Gram–Schmidt with one re-orthogonalisation pass (Björck, 1996,
 * "Numerical Methods for Least Squares Problems", §2.4). A column whose residual norm is at
 * or below `RANK_TOLERANCE` times its own norm adds nothing new: it is not estimable once the
 * earlier terms are in the model. The number of kept columns is the numerical rank of X.
 * Ordering by model order (rather than by column norm) means the lower-order terms are kept
 * and the higher-order terms are reported as missing, which is how an engineer reads it.
 *
 * Aliases: for kept columns X1 and dropped columns X2 the alias matrix is
 * A = (X1'X1)⁻¹ X1'X2 (Box & Draper, 1987, "Empirical Model-Building and Response
 * Surfaces", §10; Montgomery, 2017, "Design and Analysis of Experiments", 9th ed., §8.2).
 * Column j of A says which estimated terms absorb the dropped term j, and by how much.
 */
import { householderQr, solveLeastSquares } from '../linalg/householderQr.js';

/** Relative residual norm at or below which a column counts as dependent (coded units, |x| ≤ ~1.7). */
const RANK_TOLERANCE = 1e-9;
/** Alias coefficients smaller than this in magnitude are left out of the report. */
const ALIAS_REPORT_TOLERANCE = 1e-8;

export interface AliasPartner {
  term: string;
  coefficient: number;
}

export interface NonEstimableTerm {
  term: string;
  /** Estimated terms whose coefficients absorb this term; empty when the column is all zeros. */
  aliasedWith: AliasPartner[];
}

export interface Estimability {
  /** Numerical rank of X. */
  rank: number;
  /** Model columns kept, in model order. */
  estimableColumns: number[];
  nonEstimable: NonEstimableTerm[];
}

/** Rank, estimable columns and aliases of an N × p row-major model matrix. */
export function estimability(X: Float64Array, N: number, p: number, termLabels: readonly string[]): Estimability {
  const basis: Float64Array[] = [];
  const kept: number[] = [];
  const dropped: number[] = [];
  for (let c = 0; c < p; c++) {
    const column = new Float64Array(N);
    for (let i = 0; i < N; i++) column[i] = X[i * p + c];
    const originalNorm = norm(column);
    if (originalNorm === 0) {
      dropped.push(c);
      continue;
    }
    for (let pass = 0; pass < 2; pass++) {
      for (const q of basis) {
        let dot = 0;
        for (let i = 0; i < N; i++) dot += q[i] * column[i];
        for (let i = 0; i < N; i++) column[i] -= dot * q[i];
      }
    }
    const residual = norm(column);
    if (residual <= RANK_TOLERANCE * originalNorm) {
      dropped.push(c);
      continue;
    }
    for (let i = 0; i < N; i++) column[i] /= residual;
    basis.push(column);
    kept.push(c);
  }

  const nonEstimable: NonEstimableTerm[] = [];
  if (dropped.length > 0) {
    const X1 = selectColumns(X, N, p, kept);
    const X2 = selectColumns(X, N, p, dropped);
    const A = aliasMatrix(X1, X2, N, kept.length, dropped.length);
    dropped.forEach((c, d) => {
      const aliasedWith: AliasPartner[] = [];
      kept.forEach((e, r) => {
        const coefficient = A[r * dropped.length + d];
        if (Number.isFinite(coefficient) && Math.abs(coefficient) > ALIAS_REPORT_TOLERANCE) aliasedWith.push({ term: termLabels[e], coefficient: round(coefficient) });
      });
      nonEstimable.push({ term: termLabels[c], aliasedWith });
    });
  }
  return { rank: kept.length, estimableColumns: kept, nonEstimable };
}

/**
 * Alias matrix A = (X1'X1)⁻¹ X1'X2, row-major p1 × p2, for N-row model matrices X1 (fitted
 * terms, full column rank) and X2 (terms left out of the fit). Column b of A is the
 * least-squares fit of X2's column b on X1, solved by Householder QR (householderQr.ts), never
 * through X1'X1: on a badly scaled plan (settings far outside the coded range) the normal
 * equations lose the rank the orthogonalisation above found. A coefficient QR cannot resolve
 * (a column it finds dependent at its own tolerance) is NaN and is left out of the report.
 */
export function aliasMatrix(X1: Float64Array, X2: Float64Array, N: number, p1: number, p2: number): Float64Array {
  const factor = householderQr(X1, N, p1);
  const A = new Float64Array(p1 * p2);
  const column = new Float64Array(N);
  for (let b = 0; b < p2; b++) {
    for (let i = 0; i < N; i++) column[i] = X2[i * p2 + b];
    const { coefficients } = solveLeastSquares(factor, column);
    for (let a = 0; a < p1; a++) A[a * p2 + b] = coefficients[a];
  }
  return A;
}

function selectColumns(X: Float64Array, N: number, p: number, columns: number[]): Float64Array {
  const out = new Float64Array(N * columns.length);
  for (let i = 0; i < N; i++) columns.forEach((c, j) => (out[i * columns.length + j] = X[i * p + c]));
  return out;
}

function norm(v: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < v.length; i++) sum += v[i] * v[i];
  return Math.sqrt(sum);
}

/** Report alias coefficients to 1e-10 so that 0.9999999999 reads as 1. */
function round(value: number): number {
  return Math.round(value * 1e10) / 1e10;
}
