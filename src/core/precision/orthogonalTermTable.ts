/**
 * How precisely each model term is estimated once the terms are written as orthogonal
 * (Legendre) polynomials: the standard error of each coefficient in σ units and how much the
 * term overlaps the others (variance inflation). A secondary view beside the power of each
 * factor's joint test: it shows which terms the plan pins down and which ones share
 * information, without blaming a linear term for its overlap with a raw cubic one.
 *
 * Sources: the coding, legendreCoding.ts; variance inflation, varianceInflation.ts
 * (Marquardt, 1970). Fitted runs = fitting runs plus centre replicates.
 */
import type { CompiledModel } from '../model/modelMatrix.js';
import { crossProduct } from '../linalg/crossProduct.js';
import { legendreLabel, legendreModelMatrix } from '../model/legendreCoding.js';
import { symmetricInverse } from '../linalg/cholesky.js';
import { varianceInflationFactors } from '../evaluate/varianceInflation.js';

export interface OrthogonalTerm {
  /** The term in study syntax. */
  term: string;
  /** The same term in Legendre coding, e.g. P2(x). */
  orthogonal: string;
  /** Standard error of the Legendre coefficient, σ units. */
  standardError: number;
  /** Variance inflation in Legendre coding; null for the intercept. */
  overlap: number | null;
}

/** Null when the fitted points cannot estimate the model. */
export function orthogonalTermTable(model: CompiledModel, termLabels: readonly string[], fittedPoints: readonly ArrayLike<number>[]): OrthogonalTerm[] | null {
  const { p } = model;
  const N = fittedPoints.length;
  if (N < p) return null;
  const X = legendreModelMatrix(model, fittedPoints);
  const inverse = symmetricInverse(crossProduct(X, N, p), p);
  if (!inverse) return null;
  const k = model.factorIds.length;
  let intercept = -1;
  for (let t = 0; t < p && intercept < 0; t++) {
    let degree = 0;
    for (let j = 0; j < k; j++) degree += model.exponents[t * k + j];
    if (degree === 0) intercept = t;
  }
  const vifs = varianceInflationFactors(X, N, p, intercept);
  let next = 0;
  return termLabels.map((term, t) => ({
    term,
    orthogonal: legendreLabel(model, t),
    standardError: Math.sqrt(inverse[t * p + t]),
    overlap: t === intercept ? null : (vifs?.[next++] ?? null),
  }));
}
