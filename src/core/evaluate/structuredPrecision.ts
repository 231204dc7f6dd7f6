/**
 * What a design is worth under the error structure the lab will have: the coefficient
 * covariance and test degrees of freedom behind the power of a split-plot or blocked plan,
 * and the two figures plan.json records (`metrics.gls`, `metrics.blocks`).
 *
 * Units. The study's `noise` is the standard deviation of one lab result, so it holds both
 * variance components: noise² = σ_γ² + σ_ε² = σ_ε² (1 + η). With V = I + ηZZ' in σ_ε² units
 * (glsInformation.ts), the covariance of the GLS estimates in noise² units is
 * A⁻¹ / (1 + η), A the session-adjusted information. With one whole plot per run and one
 * session this is (X'X)⁻¹ whatever η is: a completely randomised plan pays the whole-plot
 * variance on every run, which is why it needs no special analysis.
 *
 * With sessions, the intercept is absorbed by the session effects; its row and column of the
 * covariance are set to zero (it is never tested).
 *
 * Degrees of freedom per term: the containment rule (containmentDf.ts).
 *
 * Recorded figures (issue contract):
 * - gls.logDetPerRun = ln det(X'V⁻¹X / n) over the n fitted runs, without the session effects;
 *   with η = 0 it is the ordinary ln det(X'X / n);
 * - blocks.informationKept = (det A / det M₀)^(1/(p−1)), A the session-adjusted information and
 *   M₀ the same runs' information with the intercept as the only nuisance parameter, both over
 *   the p − 1 terms other than the intercept; 1 with one session, 0 when a term is confounded
 *   with the sessions.
 */
import { blockAdjustedInformation, glsInformation, interceptAdjusted, type ErrorStructure } from '../model/glsInformation.js';
import { choleskyFactor, choleskyInverse, choleskyLogDeterminant } from '../linalg/cholesky.js';
import type { CompiledModel } from '../model/modelMatrix.js';
import { modelMatrix } from '../model/modelMatrix.js';
import { containmentDf, type StratumDf } from './containmentDf.js';

/** Pivots below this (relative to the matrix scale) make a matrix singular here. */
const SINGULAR_PIVOT = 1e-10;

export interface StructuredPrecision {
  /** Coefficient covariance in noise² units (p × p, model order); null when a term cannot be estimated. */
  covariance: Float64Array | null;
  df: StratumDf;
  gls: { varianceRatio: number; logDetPerRun: number | null };
  blocks: { sessions: number; informationKept: number | null };
}

/** Per model term: true when every factor in it is hard to change (the intercept too). */
export function wholePlotTerms(model: CompiledModel, hard: readonly boolean[]): boolean[] {
  const k = model.factorIds.length;
  return Array.from({ length: model.p }, (_, t) => {
    for (let j = 0; j < k; j++) if (model.exponents[t * k + j] !== 0 && !hard[j]) return false;
    return true;
  });
}

/**
 * @param fittedPoints coded points of the fitted runs (fitting runs and centre replicates), in
 *   the order of `structure.wholePlotOf`
 * @param hard per design factor, true when it is hard to change
 */
export function structuredPrecision(
  model: CompiledModel,
  fittedPoints: readonly ArrayLike<number>[],
  structure: ErrorStructure,
  hard: readonly boolean[],
): StructuredPrecision {
  const n = fittedPoints.length;
  const { p } = model;
  const X = modelMatrix(model, fittedPoints);
  const eta = structure.varianceRatio;

  const M = glsInformation(X, n, p, structure);
  // ln det(M / n) = ln det M − p ln n; the pivot floor is relative, so scaling changes nothing else.
  const factor = choleskyFactor(M, p, SINGULAR_PIVOT);
  const logDetPerRun = factor ? choleskyLogDeterminant(factor, p) - p * Math.log(n) : null;

  const adjusted = blockAdjustedInformation(X, n, p, structure);
  const adjustedFactor = choleskyFactor(adjusted.matrix, adjusted.size, SINGULAR_PIVOT);
  let covariance: Float64Array | null = null;
  if (adjustedFactor) {
    const inverse = choleskyInverse(adjustedFactor, adjusted.size);
    const from = p - adjusted.size;
    covariance = new Float64Array(p * p);
    for (let a = 0; a < adjusted.size; a++) {
      for (let b = 0; b < adjusted.size; b++) covariance[(a + from) * p + b + from] = inverse[a * adjusted.size + b] / (1 + eta);
    }
  }

  let informationKept: number | null = 1;
  if (structure.sessions > 1) {
    const reference = choleskyFactor(interceptAdjusted(M, p), p - 1, SINGULAR_PIVOT);
    if (!reference) informationKept = null;
    else if (!adjustedFactor) informationKept = 0;
    else informationKept = Math.exp((choleskyLogDeterminant(adjustedFactor, p - 1) - choleskyLogDeterminant(reference, p - 1)) / (p - 1));
  }

  const df = containmentDf(wholePlotTerms(model, hard), n, structure.wholePlots, structure.sessions);
  return {
    covariance,
    df,
    gls: { varianceRatio: eta, logDetPerRun },
    blocks: { sessions: structure.sessions, informationKept },
  };
}
