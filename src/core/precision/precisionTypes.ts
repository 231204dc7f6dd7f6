/**
 * The precision block of plan.json: whether the plan will see every effect the sensitivity
 * analysis predicts, effect by effect, and how the run count was reached.
 *
 * Key names are a contract (plan.json `precision`); fields marked "addition" are extras.
 * Effects are coded coefficients β in response units (a linear trend moves the response by
 * 2β across the range); "in noise" means divided by the response's `noise`.
 */
export type PrecisionBasis = 'predicted' | 'smallestEffect' | 'none';

export interface FactorPrecision {
  factor: string;
  response: string;
  effect: number;
  effectInNoise: number;
  /** Power of the joint F test of the factor's own terms; null when it cannot be tested. */
  power: number | null;
  /** The model terms tested jointly (addition). */
  terms?: string[];
}

export interface InteractionPrecision {
  factors: [string, string];
  response: string;
  effect: number;
  effectInNoise: number;
  power: number | null;
}

export interface FixedFactorPrecision {
  factor: string;
  response: string;
  largestEffectInNoise: number;
}

export interface RunCurvePoint {
  /** Fitting runs (centre replicates come on top). */
  runs: number;
  weakestPower: number | null;
}

export interface PlanPrecision {
  power: number;
  alpha: number;
  met: boolean;
  basis: PrecisionBasis;
  factors: FactorPrecision[];
  interactions: InteractionPrecision[];
  weakest: FactorPrecision | InteractionPrecision | null;
  runCurve: RunCurvePoint[];
  fixed: FixedFactorPrecision[];
  /** The verdict in one sentence: met, out of reach (with the best power and what would change it), or not judged (addition). */
  statement?: string;
  /** Assumptions, scalings and responses not judged (addition). */
  notes?: string[];
  /** Runs the powers are computed on: fitting runs plus centre replicates, holdouts excluded (addition). */
  fittedRuns?: number;
  /**
   * Denominator degrees of freedom ν = fitted runs − p; with sessions or whole plots, the
   * run-stratum df of the containment rule (addition).
   */
  residualDf?: number;
  /** Whole-plot error df of a split-plot plan, the df of the hard-to-change factors' tests (addition). */
  wholePlotDf?: number;
}
