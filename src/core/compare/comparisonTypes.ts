/**
 * Result of setting the proposed plan side by side with the plans a manager knows.
 *
 * Key names are a contract (plan.json `comparison`, `tierplan compare --json`).
 * Every figure is for the proposed plan's target model, in coded units.
 */
import type { EqualPrecisionEntry } from './equalPrecision.js';

export type ComparatorId =
  | 'proposed'
  | 'conventional'
  | 'full-factorial'
  | 'fractional'
  | 'plackett-burman'
  | 'full-grid'
  | 'ccd-face'
  | 'ccd-rotatable'
  | 'box-behnken';

export interface ComparatorRow {
  id: ComparatorId;
  /** Human label, e.g. "2-level full factorial, all 5 operating factors + 3 centre runs". */
  label: string;
  /** Total runs (centre and holdout runs counted), or null when the plan cannot be built. */
  runs: number | null;
  /** Why the plan cannot be built (only when `runs` is null). */
  reason?: string;
  fitsModel: boolean | null;
  /** Target-model terms the plan cannot estimate (study syntax). */
  missingTerms: string[];
  /** Textbook D-efficiency for the target model; null when the model cannot be fitted. */
  dEfficiency: number | null;
  /** (det M_this / det M_proposed)^(1/p), M = X'X / runs used for fitting. */
  relativeInformationPerRun: number | null;
  /** (det X'X_this / det X'X_proposed)^(1/p). */
  relativeInformationTotal: number | null;
  /** Average prediction variance over the region, σ² units. */
  averagePredictionVariance: number | null;
  /** Smallest power over the model terms (intercept excluded). */
  minPower: number | null;
  /** The term whose power is `minPower` (optional addition). */
  minPowerTerm?: string;
  cost: number | null;
  hours: number | null;
  /** Level changes of hard-to-change factors, when the study marks any. */
  levelChanges: number | null;
  /** Runs the proposed plan saves against this one (positive = proposed is smaller). */
  runsSaved: number | null;
  percentRunsSaved: number | null;
  costSaved: number | null;
  percentCostSaved: number | null;
  verdict: string;
  /** Runs the figures are computed on: every run of a comparator; fit + centre runs of the proposed plan (optional addition). */
  fittingRuns?: number;
  /** Runs that break the study's constraints or equipment limits, so cannot be run as listed (optional addition). */
  offLimitsRuns?: number;
  /** Runs outside the studied range, coded |x| > 1, e.g. rotatable axial runs (optional addition). */
  runsOutsideRange?: number;
  /** A-criterion trace((X'X)⁻¹)/p in σ² units; null when the model cannot be fitted (optional addition). */
  aCriterion?: number | null;
  /** G-efficiency in %, against the p/N floor of the largest scaled prediction variance (optional addition). */
  gEfficiency?: number | null;
  /** Over which points the worst prediction variance of `gEfficiency` was sought (optional addition). */
  gEfficiencyBasis?: string | null;
  /** Largest variance inflation factor over the model terms (optional addition). */
  maxVif?: number | null;
  /** Terms that cannot be estimated and the estimated terms they are aliased with, from the alias matrix (optional addition). */
  aliases?: { term: string; aliasedWith: { term: string; coefficient: number }[] }[];
  /** Every model term of a plan that fits: standard error (σ units), VIF and power (optional addition). */
  terms?: { term: string; standardError: number; vif: number | null; power: number | null }[];
  /** Only on `fractional`. */
  generators?: string[];
  resolution?: number;
  wordLengthPattern?: number[];
}

export interface Comparison {
  /** Target model terms (study syntax, intercept excluded) every row is judged on. */
  modelTerms: string[];
  p: number;
  /** Effect size in σ units and test level used for the power figures. */
  delta: number;
  alpha: number;
  /** What the power figures mean, in words (optional addition). */
  powerConvention?: string;
  /** How the average prediction variance was obtained (exact moments or quasi-random average). */
  predictionVarianceMethod: string;
  currency: string | null;
  comparators: ComparatorRow[];
  /**
   * Fraction-of-design-space curves (Zahran, Anderson-Cook & Myers 2003), per comparator that fits.
   * `variance` is the unscaled prediction variance f'(X'X)⁻¹f in σ² units; the optional
   * `scaledVariance` is N times it (N = fitting runs), the per-run view.
   */
  fdsCurves: { id: ComparatorId; fraction: number[]; variance: number[]; scaledVariance?: number[] }[];
  /** The decision in one or two sentences, for the report. */
  summary: string;
  /** Runs each plan family needs for the proposed plan's precision target (plan = comparator id); absent without a precision block. */
  equalPrecision?: EqualPrecisionEntry[];
}
