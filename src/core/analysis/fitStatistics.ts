/**
 * Summary statistics of a least-squares fit:
 * - R² = 1 − RSS / SST and adjusted R² = 1 − (RSS / (n − rank)) / (SST / (n − 1)), with SST
 *   the total sum of squares about the mean (session blocks, when present, count as fitted);
 * - PRESS = Σ (e_i / (1 − h_i))², the sum of squared leave-one-out prediction errors, from
 *   the leverages of the one fit, not by refitting (Allen, 1974, "The relationship between
 *   variable selection and data augmentation and a method for prediction", Technometrics 16;
 *   Myers, Montgomery & Anderson-Cook, 2016, "Response Surface Methodology", 4th ed., §2.7);
 * - predicted R² = 1 − PRESS / SST.
 *
 * PRESS is null when a run has leverage 1 (within `UNIT_LEVERAGE_TOLERANCE`): the model
 * cannot predict that run without it. Ratios are null when SST = 0 or there is no residual df.
 */
import type { LeastSquaresFit } from './leastSquaresFit.js';

/** A leverage within this of 1 is treated as 1 (the run alone determines its fitted value). */
export const UNIT_LEVERAGE_TOLERANCE = 1e-10;

export interface FitStatistics {
  rSquared: number | null;
  adjustedRSquared: number | null;
  press: number | null;
  predictedRSquared: number | null;
}

export function totalSs(observed: ArrayLike<number>): number {
  let mean = 0;
  for (let i = 0; i < observed.length; i++) mean += observed[i];
  mean /= observed.length;
  let ss = 0;
  for (let i = 0; i < observed.length; i++) ss += (observed[i] - mean) ** 2;
  return ss;
}

export function fitStatistics(observed: ArrayLike<number>, fit: LeastSquaresFit): FitStatistics {
  const sst = totalSs(observed);
  const n = fit.n;
  const usable = sst > 0;
  const rSquared = usable ? 1 - fit.residualSs / sst : null;
  const adjustedRSquared = usable && fit.residualDf > 0 && n > 1 ? 1 - fit.residualSs / fit.residualDf / (sst / (n - 1)) : null;
  let press: number | null = 0;
  for (let i = 0; i < n; i++) {
    const h = fit.leverages[i];
    if (h >= 1 - UNIT_LEVERAGE_TOLERANCE) {
      press = null;
      break;
    }
    press += (fit.residuals[i] / (1 - h)) ** 2;
  }
  const predictedRSquared = usable && press !== null ? 1 - press / sst : null;
  return { rSquared, adjustedRSquared, press, predictedRSquared };
}
