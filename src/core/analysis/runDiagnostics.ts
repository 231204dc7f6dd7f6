/**
 * Per-run regression diagnostics of a least-squares fit, with the limits above which a run
 * is flagged for a second look.
 *
 * - Leverage h_i (diagonal of the hat matrix). Flag above 2p′/n, p′ = rank (Belsley, Kuh &
 *   Welsch, 1980, "Regression Diagnostics", §2.1; Hoaglin & Welsch, 1978, "The hat matrix in
 *   regression and ANOVA", American Statistician 32).
 * - Internally studentised residual r_i = e_i / (s √(1 − h_i)). Flag at |r_i| > 3 (common
 *   practice; e.g. Montgomery, Peck & Vining, 2012, "Introduction to Linear Regression
 *   Analysis", 5th ed., §4.2, "potential outlier").
 * - Cook's distance D_i = r_i² h_i / (p′ (1 − h_i)) (Cook, 1977, "Detection of influential
 *   observation in linear regression", Technometrics 19). Flag above 1 (Cook & Weisberg,
 *   1982, "Residuals and Influence in Regression", §3.5: about the median of F(p′, n − p′)).
 *
 * A run with leverage 1 (within UNIT_LEVERAGE_TOLERANCE) has no studentised residual or
 * Cook's distance (null); so does every run when s is 0 or undefined.
 */
import type { RunFlag } from './analysisTypes.js';
import { UNIT_LEVERAGE_TOLERANCE } from './fitStatistics.js';
import type { LeastSquaresFit } from './leastSquaresFit.js';

/** Leverage flag: h_i > LEVERAGE_LIMIT_FACTOR · p′ / n (Belsley, Kuh & Welsch 1980). */
export const LEVERAGE_LIMIT_FACTOR = 2;
/** Studentised-residual flag: |r_i| > STUDENTISED_LIMIT (common practice). */
export const STUDENTISED_LIMIT = 3;
/** Cook's-distance flag: D_i > COOKS_DISTANCE_LIMIT (Cook & Weisberg 1982). */
export const COOKS_DISTANCE_LIMIT = 1;

export interface RunDiagnosticValues {
  leverage: number;
  studentised: number | null;
  cooksDistance: number | null;
  flags: RunFlag[];
}

export function runDiagnostics(fit: LeastSquaresFit): RunDiagnosticValues[] {
  const { n, rank, residualSd: s } = fit;
  const leverageLimit = (LEVERAGE_LIMIT_FACTOR * rank) / n;
  const out: RunDiagnosticValues[] = [];
  for (let i = 0; i < n; i++) {
    const h = fit.leverages[i];
    const flags: RunFlag[] = [];
    if (h > leverageLimit) flags.push('leverage');
    let studentised: number | null = null;
    let cooksDistance: number | null = null;
    if (h < 1 - UNIT_LEVERAGE_TOLERANCE && s > 0) {
      studentised = fit.residuals[i] / (s * Math.sqrt(1 - h));
      cooksDistance = (studentised * studentised * h) / (rank * (1 - h));
      if (Math.abs(studentised) > STUDENTISED_LIMIT) flags.push('studentised');
      if (cooksDistance > COOKS_DISTANCE_LIMIT) flags.push('cooksDistance');
    }
    out.push({ leverage: h, studentised, cooksDistance, flags });
  }
  return out;
}
