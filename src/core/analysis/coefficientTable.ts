/**
 * The coefficient table of a fitted model: estimate, standard error, t = estimate / SE,
 * two-sided p from Student's t, and the confidence interval estimate ± t_{df, 1−α/2}·SE
 * (Seber & Lee, 2003, "Linear Regression Analysis", 2nd ed., §5.1). One denominator df per
 * coefficient, so the same table serves least squares (all n − rank) and the split-plot
 * REML fit (containment df, whole-plot terms against whole-plot error).
 *
 * NaN inputs (an inestimable term, no residual df) become null fields.
 */
import type { CoefficientRow } from './analysisTypes.js';
import { tQuantile, twoSidedTProbability } from './tailProbabilities.js';

export function coefficientRows(
  labels: readonly string[],
  coefficients: ArrayLike<number>,
  covariance: ArrayLike<number>,
  df: readonly (number | null)[],
  level = 0.95,
): CoefficientRow[] {
  const p = coefficients.length;
  return labels.map((term, j) => {
    const estimate = finite(coefficients[j]);
    const variance = covariance[j * p + j];
    const standardError = estimate !== null && variance >= 0 ? finite(Math.sqrt(variance)) : null;
    const dof = df[j];
    if (estimate === null || standardError === null || dof === null || !(dof > 0)) {
      return { term, estimate, standardError, t: null, p: null, lower: null, upper: null, df: dof !== null && dof > 0 ? dof : null };
    }
    const t = standardError > 0 ? estimate / standardError : null;
    const half = tQuantile(1 - (1 - level) / 2, dof) * standardError;
    return {
      term,
      estimate,
      standardError,
      t,
      p: t === null ? null : twoSidedTProbability(t, dof),
      lower: estimate - half,
      upper: estimate + half,
      df: dof,
    };
  });
}

function finite(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}
