/**
 * Default number of fitting runs: N = p + max(3, ⌈p/4⌉).
 *
 * Used when no response gives `noise` (without it the run count cannot be sized to the
 * effects; see plan/campaignSize.ts). Why: p runs fit the model exactly and leave nothing to
 * test it with. The extra runs are meant as distinct design points for lack of fit (the plan
 * counts the degrees of freedom it really gets from its distinct points), tested
 * against pure error from the replicated centre points (the lack-of-fit F test, Montgomery,
 * "Design and Analysis of Experiments", 2017, 9th ed., §11.2). At least 3 extra degrees of
 * freedom so the test is not powerless (common practice), growing with p (a quarter of the
 * parameter count) so larger models keep a comparable margin for checking the fit.
 * Without at least two centre replicates there is no pure error, and the note says that the
 * extra runs then only estimate the residual error.
 */

/**
 * The default fitting-run count for a model with p parameters (intercept included), with a
 * note that explains it; `centreRuns` (default 3) decides whether a lack-of-fit test exists.
 */
export function defaultRunCount(p: number, centreRuns = 3): { runs: number; note: string } {
  const allowance = Math.max(3, Math.ceil(p / 4));
  const start = `${p} model parameters plus ${allowance} extra runs (the larger of 3 and a quarter of p, a rule of thumb)`;
  return {
    runs: p + allowance,
    note:
      centreRuns >= 2
        ? `${start}, so that lack of fit can be tested against pure error from the ${centreRuns} centre replicates`
        : `${start} for the residual error; with ${centreRuns === 0 ? 'no' : 'one'} centre replicate${centreRuns === 0 ? 's' : ''} ` +
          'there is no pure error, so lack of fit cannot be tested',
  };
}
