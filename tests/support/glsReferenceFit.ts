/**
 * The reference fit the analysis tests compare with: generalised least squares at a given
 * whole-plot variance ratio γ, computed from its definition with ml-matrix (a general-purpose
 * reference library): columns 1, the model terms (study syntax), then the sessions in
 * sum-to-zero coding (+1 in session s, −1 in the last; sessionBlocks.ts); V = I + γZZ′ from the
 * runs' whole plots (a run without one is its own); whiten by the Cholesky factor L of V and
 * solve by QR. With γ = 0 and one session it is ordinary least squares.
 */
import { CholeskyDecomposition, Matrix, QrDecomposition, inverse } from 'ml-matrix';

export interface ReferenceRun {
  coded: Record<string, number>;
  session?: number;
  wholePlot?: number;
  y: number;
}

/** The value of a study-syntax term (`a`, `a^2`, `a*b`) at coded settings. */
export function termValue(term: string, coded: Record<string, number>): number {
  return term.split('*').reduce((v, f) => v * coded[f.split('^')[0]] ** Number(f.split('^')[1] ?? 1), 1);
}

/** Coefficients (intercept, terms, session effects) and residuals y − Xβ. */
export function glsReferenceFit(runs: readonly ReferenceRun[], terms: readonly string[], ratio: number): { beta: number[]; residuals: number[] } {
  const sessions = [...new Set(runs.map((run) => run.session ?? 1))].sort((a, b) => a - b);
  const last = sessions[sessions.length - 1];
  const X = new Matrix(
    runs.map((run) => {
      const s = run.session ?? 1;
      return [1, ...terms.map((term) => termValue(term, run.coded)), ...sessions.slice(0, -1).map((b) => (s === b ? 1 : s === last ? -1 : 0))];
    }),
  );
  const y = Matrix.columnVector(runs.map((run) => run.y));
  const n = runs.length;
  const V = new Matrix(n, n);
  runs.forEach((a, i) =>
    runs.forEach((b, j) => V.set(i, j, (i === j ? 1 : 0) + (i === j || (a.wholePlot !== undefined && a.wholePlot === b.wholePlot) ? ratio : 0))),
  );
  const Li = inverse(new CholeskyDecomposition(V).lowerTriangularMatrix);
  const beta = new QrDecomposition(Li.mmul(X)).solve(Li.mmul(y)).getColumn(0);
  const residuals = y.sub(X.mmul(Matrix.columnVector(beta))).getColumn(0);
  return { beta, residuals };
}
