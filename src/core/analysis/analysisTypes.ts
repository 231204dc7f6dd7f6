/**
 * Result types of the analysis of lab results: one `ResponseAnalysis` per response.
 *
 * The field names map one-to-one onto the analysis.json contract (`responses[]`: id, n,
 * terms, coefficients, engineering, anova, rSquared, adjustedRSquared, predictedRSquared,
 * press, residualSd, runs, holdout, verdict), so the writer serialises these objects as
 * they are. Fields beyond the contract (method, inestimable, varianceComponents, validation,
 * sensitivity, noise, flags, verdictReasons, verdictPassed) are additions the contract allows; none renames a contract key.
 *
 * Conventions: coefficients are in coded units (low → −1, high → +1) unless under
 * `engineering`; a value that does not exist (an inestimable term, a statistic without
 * degrees of freedom) is null, never NaN, so the JSON stays valid.
 */

/** One run given to the analysis: a fitting run, a centre replicate or a holdout. */
export interface AnalysisRun {
  /** Run number of the run sheet. */
  run: number;
  /** Stable id of the design point (`F01`, `C1`, `H1`). */
  point: string;
  /** Coded coordinates, one per model factor in `CompiledModel.factorIds` order (as-run values where recorded). */
  coded: readonly number[];
  /** The result; null or NaN when the run has none. */
  observed: number | null;
  /** 1-based whole plot (split-plot plans). */
  wholePlot?: number;
  /** 1-based session (fixed block). */
  session?: number;
}

/** One ANOVA line; null in `AnovaTable` when the line does not exist. */
export interface AnovaEntry {
  df: number;
  ss: number;
  /** Mean square against the residual (model) or pure error (lack of fit); null for error lines. */
  F: number | null;
  p: number | null;
}

export interface AnovaTable {
  model: AnovaEntry | null;
  residual: AnovaEntry | null;
  lackOfFit: AnovaEntry | null;
  pureError: AnovaEntry | null;
}

export interface CoefficientRow {
  term: string;
  estimate: number | null;
  standardError: number | null;
  t: number | null;
  p: number | null;
  /** 95 % confidence interval (or the level asked for). */
  lower: number | null;
  upper: number | null;
  /** Denominator degrees of freedom of t and the interval. */
  df: number | null;
}

export interface EngineeringRow {
  term: string;
  estimate: number | null;
  standardError: number | null;
}

/** Limits above which a run is flagged; each carries its source in `diagnosticLimits`. */
export type RunFlag = 'leverage' | 'studentised' | 'cooksDistance';

export interface RunDiagnostics {
  run: number;
  point: string;
  observed: number | null;
  fitted: number | null;
  residual: number | null;
  leverage: number | null;
  studentised: number | null;
  cooksDistance: number | null;
  flags: RunFlag[];
}

export interface HoldoutPrediction {
  run: number;
  point: string;
  observed: number | null;
  predicted: number | null;
  lower: number | null;
  upper: number | null;
  /** Observed value within [lower, upper]; null without an observation or an interval. */
  inside: boolean | null;
}

export interface HoldoutSummary {
  /** Holdouts with a result and an interval. */
  checked: number;
  inside: number;
  /** inside / checked; null when nothing was checked. */
  coverage: number | null;
  /** √(mean (observed − predicted)²) over the checked holdouts. */
  rmsPredictionError: number | null;
  residualSd: number | null;
  /** rmsPredictionError / residualSd: about 1 when the model predicts as well as it fits. */
  errorRatio: number | null;
  /** Interval level (0.95). */
  level: number;
}

export type VerdictReasonKind =
  | 'lackOfFit'
  | 'holdoutOutside'
  | 'predictionError'
  | 'noHoldout'
  | 'inestimableTerms'
  | 'noResidualDf';

export interface VerdictReason {
  kind: VerdictReasonKind;
  message: string;
}

export interface Verdict {
  status: 'calibrated' | 'not yet';
  /** Why not yet (empty when calibrated). */
  reasons: VerdictReason[];
  /** What was checked and passed, in the order the rule checks. */
  passed: string[];
}

export interface VarianceComponents {
  /** σ²_w: variance of the whole-plot effect. */
  wholePlot: number;
  /** σ²: run-to-run variance within a whole plot. */
  run: number;
  /** γ = σ²_w / σ². */
  ratio: number;
  /** Maximised restricted log-likelihood (Harville 1977 form, constants included). */
  restrictedLogLikelihood: number;
  /** True when the maximum lies on γ = 0 (no whole-plot variance found). */
  atZero: boolean;
  wholePlots: number;
  /** Containment degrees of freedom: whole-plot error and within-plot error. */
  wholePlotDf: number;
  withinPlotDf: number;
}

export interface FactorSensitivity {
  factor: string;
  first: number;
  total: number;
}

export interface PairSensitivity {
  factors: [string, string];
  index: number;
}

export interface PolynomialSensitivity {
  /** Mean of the fitted polynomial over the coded box [−1, 1]^k (uniform inputs). */
  mean: number;
  variance: number;
  factors: FactorSensitivity[];
  pairs: PairSensitivity[];
}

export interface ResponseAnalysis {
  id: string;
  /** Runs the fit used (runs with a result). */
  n: number;
  /** Model terms in the plan's syntax and order, intercept (`1`) first. */
  terms: string[];
  method: 'least squares' | 'REML';
  /** Terms the runs with results cannot estimate (their rows are null). */
  inestimable: string[];
  /** Run numbers left out because their result is missing. */
  missingRuns: number[];
  coefficients: CoefficientRow[];
  engineering: EngineeringRow[];
  anova: AnovaTable;
  rSquared: number | null;
  adjustedRSquared: number | null;
  predictedRSquared: number | null;
  press: number | null;
  residualSd: number | null;
  varianceComponents: VarianceComponents | null;
  runs: RunDiagnostics[];
  holdout: HoldoutPrediction[];
  validation: HoldoutSummary;
  sensitivity: PolynomialSensitivity | null;
  noise: NoiseComparison | null;
  /** The contract's verdict: `calibrated` or `not yet`. */
  verdict: Verdict['status'];
  /** Why not yet (empty when calibrated), from the verdict rule. */
  verdictReasons: VerdictReason[];
  /** What the verdict rule checked and passed, in its order. */
  verdictPassed: string[];
}

export interface NoiseComparison {
  /** The study's `noise` (engineering units). */
  study: number;
  /** The estimate compared: pure-error SD when replicates exist, else the residual SD (under REML the within-plot SD). */
  estimated: number;
  basis: 'pure error' | 'residual' | 'within whole plot';
  /** estimated / study. */
  ratio: number;
}
