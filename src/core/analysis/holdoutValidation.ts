/**
 * Holdout validation: the fitted model predicts each holdout run it never saw, with a
 * prediction interval for one new run, and the prediction is compared with the result.
 *
 * Interval: ŷ ± t_{ν, 1−α/2} · √(Var(ŷ) + σ̂²_new), supplied by the fit (least squares:
 * s·√(1 + x′(X′X)⁻¹x) from the QR factor; REML: whole-plot and run variance added; see
 * leastSquaresFit.ts and wholePlotReml.ts). `inside` is lower ≤ observed ≤ upper.
 * Summary: coverage = inside / checked, and the root-mean-square prediction error
 * √(mean (y − ŷ)²) against the residual SD — their ratio is about 1 when the model predicts
 * new runs as well as it fits the old ones (Snee, 1977, "Validation of regression models:
 * methods and examples", Technometrics 19, 415–428).
 */
import type { HoldoutPrediction, HoldoutSummary } from './analysisTypes.js';
import type { PredictionInterval } from './leastSquaresFit.js';

export interface HoldoutCase {
  run: number;
  point: string;
  observed: number | null;
  /** Model row f(x) (with block columns, when the fit has them). */
  row: Float64Array;
}

export function holdoutValidation(
  holdouts: readonly HoldoutCase[],
  predict: (row: Float64Array) => PredictionInterval | null,
  residualSd: number | null,
  level = 0.95,
): { holdout: HoldoutPrediction[]; summary: HoldoutSummary } {
  let checked = 0;
  let inside = 0;
  let squared = 0;
  const holdout = holdouts.map((h): HoldoutPrediction => {
    const interval = predict(h.row);
    const observed = h.observed !== null && Number.isFinite(h.observed) ? h.observed : null;
    if (!interval) return { run: h.run, point: h.point, observed, predicted: null, lower: null, upper: null, inside: null };
    let within: boolean | null = null;
    if (observed !== null) {
      within = observed >= interval.lower && observed <= interval.upper;
      checked += 1;
      if (within) inside += 1;
      squared += (observed - interval.predicted) ** 2;
    }
    return { run: h.run, point: h.point, observed, predicted: interval.predicted, lower: interval.lower, upper: interval.upper, inside: within };
  });
  const rmsPredictionError = checked > 0 ? Math.sqrt(squared / checked) : null;
  const summary: HoldoutSummary = {
    checked,
    inside,
    coverage: checked > 0 ? inside / checked : null,
    rmsPredictionError,
    residualSd,
    errorRatio: rmsPredictionError !== null && residualSd !== null && residualSd > 0 ? rmsPredictionError / residualSd : null,
    level,
  };
  return { holdout, summary };
}
