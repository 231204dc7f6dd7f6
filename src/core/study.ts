/**
 * The validated study: what every later stage reads.
 *
 * The study file on disk (YAML or JSON) names its index tables by path; by the time a
 * `Study` exists, `src/io/studyFile.ts` has read those tables, checked every row and
 * resolved every default. Core code never sees paths, only the data here.
 *
 * Units: factor bounds, limits, precision and explicit levels are in engineering units
 * (the factor's `unit`). Coded units map low → −1 and high → +1 (see `region/codedUnits.ts`).
 *
 * The allowed values of the enumerated keys (aggregate rule, confidence basis, model preset,
 * criterion) and the validity rules of a tier policy are declared here once; the study reader
 * and the command-line options both check against them.
 */

export type FactorRole = 'operating' | 'model';

export interface EquipmentLimits {
  low: number;
  high: number;
}

export interface Factor {
  id: string;
  name: string;
  unit: string;
  role: FactorRole;
  low: number;
  high: number;
  nominal: number;
  /** Smallest settable step in engineering units; settings are rounded to a multiple of it. */
  precision?: number;
  /** The equipment's rated range; a planned setting outside it is refused. */
  limits?: EquipmentLimits;
  /** A level count, or explicit level values in engineering units. Overrides the tier default. */
  levels?: number | number[];
  hardToChange?: boolean;
  /**
   * Minutes a hard-to-change factor needs to settle after its setting changes, shown on the
   * worksheets as a wait step (0 to 1440, optional; no effect unless `hardToChange`).
   */
  settleMinutes?: number;
  /**
   * The range the sensitivity analysis sampled, when it differs from [low, high]; predicted
   * effects are scaled by (high − low) / (analysedRange.high − analysedRange.low).
   */
  analysedRange?: { low: number; high: number };
}

export interface Response {
  id: string;
  name: string;
  unit: string;
  /** Relative weight for the `weighted` aggregate; defaults to 1. */
  weight: number;
  /** Standard deviation of the response over the analysed input ranges, as the sensitivity analysis reports it (engineering units). */
  spread?: number;
  /** Standard deviation of one lab result: repeatability of process plus measurement (engineering units). */
  noise?: number;
  /** Smallest change across the studied range worth detecting (engineering units); used when `spread` is absent. */
  smallestEffect?: number;
  /** Acceptable prediction error at the holdout runs, used by `analyze` for its verdict (engineering units). */
  tolerance?: number;
}

/** One row of the first-order / total index table (long format). */
export interface IndexRow {
  factor: string;
  response: string;
  first: number;
  total: number;
  firstLow?: number;
  firstHigh?: number;
  totalLow?: number;
  totalHigh?: number;
}

/** One row of the second-order index table. */
export interface InteractionRow {
  factorA: string;
  factorB: string;
  response: string;
  index: number;
}

/** How indices combine over the responses; the one list the study reader and the options check against. */
export const AGGREGATE_RULES = ['mean', 'max', 'weighted'] as const;
export type AggregateRule = (typeof AGGREGATE_RULES)[number];
/** What a factor is tiered on: the estimate (`point`) or its upper confidence bound (`upper`). */
export const CONFIDENCE_POLICIES = ['point', 'upper'] as const;
export type ConfidencePolicy = (typeof CONFIDENCE_POLICIES)[number];

export interface TierPolicy {
  aggregate: AggregateRule;
  /** Aggregated total index at or above which a factor is critical. Default 0.30 (common practice). */
  critical: number;
  /** Aggregated total index at or above which a factor is moderate. Default 0.05 (common practice). */
  moderate: number;
  /** Second-order index (or interaction share) at or above which a pair earns an interaction term. Default 0.05. */
  interaction: number;
  /** `point` tiers on the estimate; `upper` tiers on the upper confidence bound (conservative). */
  confidence: ConfidencePolicy;
}

export const MODEL_PRESETS = ['linear', 'interactions', 'quadratic'] as const;
export type ModelPreset = (typeof MODEL_PRESETS)[number];
/** The optimality criterion of the exact design search: D (det X'X) or I (average prediction variance). */
export const CRITERIA = ['D', 'I'] as const;
export type Criterion = (typeof CRITERIA)[number];

export function isCriterion(text: string): text is Criterion {
  return (CRITERIA as readonly string[]).includes(text);
}

export interface PrecisionTarget {
  /** Power every required effect must reach. Default 0.8 (common practice). */
  power: number;
  /** Level of the tests. Default 0.05. */
  alpha: number;
}

export interface DesignSettings {
  /**
   * Fitting runs, or `auto`: the smallest number whose plan meets the precision target (or,
   * when no response gives `noise`, p plus the lack-of-fit allowance).
   */
  runs: number | 'auto';
  /** Derived from the tiers when absent; otherwise a preset or an explicit term list. */
  model?: ModelPreset | string[];
  criterion: Criterion;
  centreRuns: number;
  /** Holdout validation runs, or `auto` (about 20 % of N, at least 2). */
  holdoutRuns: number | 'auto';
  seed: number;
  /** Default level counts per tier. */
  levels: { critical: number; moderate: number };
  /** Number of random starts of the exchange search. */
  starts: number;
  /** The power target of the precision block. */
  precision: PrecisionTarget;
  /** Cap on the fitting runs `auto` may choose; absent = `defaultMaxRuns(p)` (4p). */
  maxRuns?: number;
  /** Potential terms (Bayesian D-optimality): `auto` (the rule in potentialTerms.ts) or a term list ([] for none). */
  potential: 'auto' | string[];
  /**
   * Whole plots of the fitting runs when a varied factor is hard to change: `auto` (chosen from
   * the costs and the precision target, core/plan/wholePlotCount.ts) or a count. Optional only
   * so that plans written before the key existed still read; the study reader fills `auto`.
   */
  wholePlots?: number | 'auto';
  /**
   * η, the whole-plot variance over the run-to-run variance, for the split-plot criterion and
   * its precision (default DEFAULT_VARIANCE_RATIO). Filled by the study reader like `wholePlots`.
   */
  varianceRatio?: number;
}

/**
 * η when the study gives none: whole-plot and run variances equal, the value the split-plot
 * literature uses when nothing is known (Goos & Vandebroek, 2003, Technometrics 45, 235–245,
 * report designs for η = 1 as the central case; "common practice").
 */
export const DEFAULT_VARIANCE_RATIO = 1;

export interface SessionSettings {
  /** Maximum runs in one session (day, shift or batch). */
  maxRuns: number;
  /** What a session is called on the run sheet, e.g. "Day". */
  label: string;
  /**
   * Bench hours one session may hold (a working day or shift); the worksheets and the run sheet
   * warn for a session whose hours exceed it. The study reader fills in DEFAULT_SESSION_HOURS;
   * optional only so that plans written before the key existed still read.
   */
  hours?: number;
}

/** A working day at the bench, in hours, when `sessions.hours` is not given (common practice). */
export const DEFAULT_SESSION_HOURS = 8;

export interface CostSettings {
  currency: string;
  /** Cost of one run, in `currency`. */
  perRun: number;
  /** Bench hours for one run. */
  hoursPerRun: number;
  /** Extra cost and hours for each level change of a hard-to-change factor. */
  perLevelChange?: { cost: number; hours: number };
}

export interface Study {
  title: string;
  factors: Factor[];
  responses: Response[];
  indices: IndexRow[];
  interactions: InteractionRow[];
  policy: TierPolicy;
  design: DesignSettings;
  constraints: string[];
  sessions?: SessionSettings;
  costs?: CostSettings;
  /** Where the study came from, for messages and the plan echo. Paths as given by the user. */
  source: { studyFile: string; indicesFile: string; interactionsFile?: string };
  /** Non-fatal findings from reading the study (clamped indices, first > total, …). */
  warnings: string[];
}

/** The cut-offs of a tier policy; each must lie strictly between 0 and 1. */
export const POLICY_CUT_OFFS = ['critical', 'moderate', 'interaction'] as const;

/**
 * The validity rules of a tier policy, in one place for the study reader and the `tiers`
 * options: a cut-off lies strictly between 0 and 1, and moderate lies below critical.
 */
export function isCutOff(value: number): boolean {
  return value > 0 && value < 1;
}

/** Whether moderate lies below critical (false for NaN too). */
export function cutOffsInOrder(policy: Pick<TierPolicy, 'critical' | 'moderate'>): boolean {
  return policy.moderate < policy.critical;
}

export const DEFAULT_POLICY: TierPolicy = {
  aggregate: 'mean',
  critical: 0.3,
  moderate: 0.05,
  interaction: 0.05,
  confidence: 'point',
};

export const DEFAULT_DESIGN: DesignSettings = {
  runs: 'auto',
  criterion: 'D',
  centreRuns: 3,
  holdoutRuns: 'auto',
  seed: 1,
  levels: { critical: 4, moderate: 3 },
  starts: 20,
  precision: { power: 0.8, alpha: 0.05 },
  potential: 'auto',
  wholePlots: 'auto',
  varianceRatio: DEFAULT_VARIANCE_RATIO,
};
