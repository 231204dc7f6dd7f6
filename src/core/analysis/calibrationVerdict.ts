/**
 * The verdict per response: `calibrated`, or `not yet` with every reason found.
 *
 * The rule, checked in this order (each failure adds a reason; the verdict is `calibrated`
 * only when none fails):
 * 1. every model term is estimable from the runs with results;
 * 2. the fit has residual degrees of freedom (otherwise nothing can be tested);
 * 3. lack of fit is not significant: p ≥ α (α = 0.05 by default). When the test does not
 *    exist (no replicate, or no spare distinct point) it cannot fail, and `passed` says it
 *    was not testable;
 * 4. at least one holdout run has a result and an interval (an untested model is not called
 *    calibrated);
 * 5. every checked holdout lies inside its prediction interval (at 95 %, one holdout in
 *    twenty falls outside by chance; the rule still asks for a look, because a few added
 *    runs settle it — the plan places few holdouts, so one miss is material);
 * 6. with a tolerance (the response's acceptable prediction error, engineering units), the
 *    RMS prediction error over the holdouts is at most the tolerance.
 * The rule is ours, built from the standard checks of a fitted response-surface model
 * (lack of fit: Montgomery, 2017, "Design and Analysis of Experiments", §11.3; prediction of
 * new runs: Snee, 1977, Technometrics 19).
 */
import type { AnovaTable, HoldoutPrediction, HoldoutSummary, Verdict, VerdictReason } from './analysisTypes.js';

export interface VerdictInput {
  inestimable: readonly string[];
  residualDf: number;
  anova: AnovaTable;
  /** Whether a lack-of-fit test applies to the fit at all (not under REML). */
  lackOfFitApplies: boolean;
  holdout: readonly HoldoutPrediction[];
  validation: HoldoutSummary;
  tolerance?: number;
  alpha?: number;
}

export function calibrationVerdict(input: VerdictInput): Verdict {
  const alpha = input.alpha ?? 0.05;
  const reasons: VerdictReason[] = [];
  const passed: string[] = [];
  if (input.inestimable.length > 0) {
    reasons.push({
      kind: 'inestimableTerms',
      message: `the runs with results cannot estimate ${input.inestimable.join(', ')}: complete the missing runs or drop these terms`,
    });
  } else {
    passed.push('every model term is estimable');
  }
  if (!(input.residualDf > 0)) {
    reasons.push({ kind: 'noResidualDf', message: 'no residual degrees of freedom: the fit cannot be tested' });
  }
  const lack = input.anova.lackOfFit;
  if (!input.lackOfFitApplies) {
    passed.push('lack of fit is not tested under the split-plot (REML) fit');
  } else if (lack && lack.p !== null) {
    if (lack.p < alpha) {
      reasons.push({
        kind: 'lackOfFit',
        message: `lack of fit is significant (F = ${fixed(lack.F)}, p = ${fixed(lack.p)} < ${alpha}): the model misses curvature or an interaction`,
      });
    } else {
      passed.push(`no significant lack of fit (p = ${fixed(lack.p)} ≥ ${alpha})`);
    }
  } else {
    passed.push('lack of fit not testable (needs replicated runs and more distinct points than terms)');
  }
  const { validation } = input;
  if (validation.checked === 0) {
    reasons.push({ kind: 'noHoldout', message: 'no holdout run has a result: the predictions are untested' });
  } else {
    const outside = input.holdout.filter((h) => h.inside === false).map((h) => `run ${h.run}`);
    if (outside.length > 0) {
      reasons.push({
        kind: 'holdoutOutside',
        message: `${outside.join(', ')} ${outside.length === 1 ? 'lies' : 'lie'} outside ${outside.length === 1 ? 'its' : 'their'} ${Math.round(validation.level * 100)} % prediction interval`,
      });
    } else {
      passed.push(`all ${validation.checked} holdout runs inside their ${Math.round(validation.level * 100)} % prediction intervals`);
    }
    if (input.tolerance !== undefined && validation.rmsPredictionError !== null) {
      if (validation.rmsPredictionError > input.tolerance) {
        reasons.push({
          kind: 'predictionError',
          message: `the RMS prediction error ${fixed(validation.rmsPredictionError)} exceeds the tolerance ${input.tolerance}`,
        });
      } else {
        passed.push(`RMS prediction error ${fixed(validation.rmsPredictionError)} within the tolerance ${input.tolerance}`);
      }
    }
  }
  return { status: reasons.length === 0 ? 'calibrated' : 'not yet', reasons, passed };
}

/** Three significant digits for the reason text (the numbers themselves are in the result). */
function fixed(value: number | null): string {
  return value === null ? '–' : Number(value.toPrecision(3)).toString();
}
