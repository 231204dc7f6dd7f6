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

export interface EqualPrecisionEntry {
  plan: string;
  runs: number | null;
  weakestPower: number;
}
