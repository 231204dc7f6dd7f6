/**
 * The precision block of plan.json (`precision`) and the equal-precision comparison
 * (`comparison.equalPrecision`): what the plan can detect, per factor and response, with the
 * power of the test. Key names are a contract with users and later commands.
 *
 * Power: the chance that the F test of a factor's terms (or the t test of an interaction) at
 * level `alpha` detects the effect the sensitivity analysis predicts, with the lab noise σ of
 * the response; effects are coded coefficients in response units, `effectInNoise` = effect / σ.
 * `basis` says where the effects came from: `predicted` (indices × response spread),
 * `smallestEffect` (the study's smallest effect worth detecting) or `none` (no noise given:
 * precision cannot be judged and the run count follows the default rule).
 */

export interface FactorPrecision {
  factor: string;
  response: string;
  effect: number;
  effectInNoise: number;
  power: number;
}

export interface InteractionPrecision {
  factors: [string, string];
  response: string;
  effect: number;
  effectInNoise: number;
  power: number;
}

export interface PrecisionBlock {
  /** Target power and test level. */
  power: number;
  alpha: number;
  /** True when every required pair and interaction reaches `power`. */
  met: boolean;
  basis: 'predicted' | 'smallestEffect' | 'none';
  factors: FactorPrecision[];
  interactions: InteractionPrecision[];
  /** The entry with the lowest power (a factor or an interaction entry), null when there is none. */
  weakest: FactorPrecision | InteractionPrecision | null;
  /** Weakest power over the run counts tried. */
  runCurve: { runs: number; weakestPower: number }[];
  /** For each fixed factor, the largest effect fixing it can leave unexplained, in noise units. */
  fixed: { factor: string; response: string; largestEffectInNoise: number }[];
}

/** Runs each comparator family needs to reach the same precision (null: it cannot). */
export interface EqualPrecisionEntry {
  plan: string;
  runs: number | null;
  weakestPower: number;
}
