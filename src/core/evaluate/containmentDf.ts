/**
 * Denominator degrees of freedom for tests of fixed effects in a split-plot design run in
 * sessions, by the containment rule: an effect is tested against the error stratum that
 * contains it (SAS Institute's "containment" method for mixed models; for split-plot designs,
 * Goos, Langhans & Vandebroek, 2006, "Practical inference from industrial split-plot
 * designs", Journal of Quality Technology 38, 162–179).
 *
 * Rule fixed here:
 * - A term is a whole-plot term when every factor in it is hard to change (it is constant
 *   inside every whole plot); the intercept and the session effects are whole-plot effects too.
 * - Whole-plot error: df_wp = W − S − t_wp, with W the whole plots of the fitted runs, S the
 *   sessions (1 when there is a single session: the intercept) and t_wp the whole-plot terms
 *   other than the intercept.
 * - Subplot (run) error: df_sp = N − W − t_sp, with t_sp the other terms.
 * - When no whole plot holds more than one run there is a single error stratum and every term
 *   has df = N − p − (S − 1).
 * A joint test of several terms uses the smallest df among them (conservative).
 */

export interface StratumDf {
  /** df of each model term (the intercept included, at the whole-plot stratum), in model order. */
  perTerm: number[];
  wholePlot: number;
  subplot: number;
  /** True when the design has two error strata. */
  split: boolean;
}

/**
 * @param wholePlotTerm per model term, true when it involves only hard-to-change factors
 *   (the intercept counts as a whole-plot term)
 */
export function containmentDf(wholePlotTerm: readonly boolean[], runs: number, wholePlots: number, sessions: number): StratumDf {
  const p = wholePlotTerm.length;
  const split = wholePlots < runs;
  if (!split) {
    const df = runs - p - (sessions - 1);
    return { perTerm: wholePlotTerm.map(() => df), wholePlot: df, subplot: df, split };
  }
  const wholePlotTerms = wholePlotTerm.filter(Boolean).length - 1;
  const subplotTerms = p - 1 - wholePlotTerms;
  const wholePlot = wholePlots - sessions - wholePlotTerms;
  const subplot = runs - wholePlots - subplotTerms;
  return { perTerm: wholePlotTerm.map((isWhole) => (isWhole ? wholePlot : subplot)), wholePlot, subplot, split };
}
