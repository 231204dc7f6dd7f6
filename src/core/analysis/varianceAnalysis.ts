/**
 * Analysis of variance of a least-squares fit: model, residual, and the split of the
 * residual into lack of fit and pure error.
 *
 * - Model: the extra sum of squares of the model terms over the baseline model (intercept,
 *   plus the session blocks when there are sessions), SS = RSS(baseline) − RSS(full),
 *   df = rank(full) − rank(baseline), F = MS_model / MS_residual (Seber & Lee, 2003,
 *   "Linear Regression Analysis", 2nd ed., §4.5).
 * - Pure error: Σ (y − ȳ_group)² over replicate groups (identical coded points, within a
 *   session), df = n − groups.
 * - Lack of fit: RSS − SS_pure, df = groups − rank, F = MS_lof / MS_pure
 *   (Montgomery, 2017, "Design and Analysis of Experiments", 9th ed., §11.3; Draper &
 *   Smith, 1998, "Applied Regression Analysis", 3rd ed., §2.1).
 *
 * A line exists only with positive df: pure error needs a replicate, lack of fit needs both a
 * replicate and more distinct points than parameters; otherwise the entry is null.
 */
import type { AnovaEntry, AnovaTable } from './analysisTypes.js';
import type { ReplicateGroups } from './replicateGroups.js';
import { fUpperProbability } from './tailProbabilities.js';

export interface VarianceAnalysisInput {
  observed: ArrayLike<number>;
  residualSs: number;
  rank: number;
  /** Residual sum of squares and rank of the baseline model (intercept, or intercept + blocks). */
  baseline: { residualSs: number; rank: number };
  groups: ReplicateGroups;
}

/** Σ (y − ȳ_group)² over the replicate groups. */
export function pureErrorSs(observed: ArrayLike<number>, groups: ReplicateGroups): number {
  const sums = new Float64Array(groups.count);
  for (let i = 0; i < observed.length; i++) sums[groups.group[i]] += observed[i];
  let ss = 0;
  for (let i = 0; i < observed.length; i++) {
    const g = groups.group[i];
    ss += (observed[i] - sums[g] / groups.sizes[g]) ** 2;
  }
  return ss;
}

export function varianceAnalysis(input: VarianceAnalysisInput): AnovaTable {
  const { observed, residualSs, rank, baseline, groups } = input;
  const n = observed.length;
  const residualDf = n - rank;
  const residual: AnovaEntry | null = residualDf > 0 ? { df: residualDf, ss: residualSs, F: null, p: null } : null;
  const modelDf = rank - baseline.rank;
  let model: AnovaEntry | null = null;
  if (modelDf > 0) {
    const ss = Math.max(0, baseline.residualSs - residualSs);
    const F = residual && residualSs > 0 ? ss / modelDf / (residualSs / residualDf) : null;
    model = { df: modelDf, ss, F, p: F === null ? null : fUpperProbability(F, modelDf, residualDf) };
  }
  const pureDf = n - groups.count;
  let pureError: AnovaEntry | null = null;
  let lackOfFit: AnovaEntry | null = null;
  if (pureDf > 0) {
    const pureSs = pureErrorSs(observed, groups);
    pureError = { df: pureDf, ss: pureSs, F: null, p: null };
    const lackDf = groups.count - rank;
    if (lackDf > 0) {
      // RSS ≥ SS_pure in exact arithmetic (the cell-means model contains the fitted one).
      const lackSs = Math.max(0, residualSs - pureSs);
      const F = pureSs > 0 ? lackSs / lackDf / (pureSs / pureDf) : null;
      lackOfFit = { df: lackDf, ss: lackSs, F, p: F === null ? null : fUpperProbability(F, lackDf, pureDf) };
    }
  }
  return { model, residual, lackOfFit, pureError };
}
