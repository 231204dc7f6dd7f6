/**
 * The tier rule: a factor's aggregated total Sobol' index against two cut-offs.
 *
 *   decidedOn ≥ critical → critical;  decidedOn ≥ moderate → moderate;  else negligible.
 *
 * Tiering on the total index is the factor-fixing setting of variance-based sensitivity
 * analysis: a factor whose total index is near zero can be fixed anywhere in its range
 * without changing the output variance (Sobol' 2001, "Global sensitivity indices for
 * nonlinear mathematical models and their Monte Carlo estimates"; Saltelli et al. 2008,
 * *Global Sensitivity Analysis: The Primer*, ch. 1 and 4). The default cut-offs 0.30 and
 * 0.05 are common-practice starting points, not published constants; users set their own.
 *
 * A factor is borderline when the interval [low, high] of its aggregated total crosses a
 * cut-off, i.e. the tier at the low end differs from the tier at the high end.
 *
 * Comparisons allow 1e-12 of rounding so a mean that should equal a cut-off exactly
 * reaches it ((0.01 + 0.09) / 2 is 0.049999999999999996 in doubles).
 */
import type { TierPolicy } from '../study.js';
import type { Tier } from './tierTypes.js';
import { InputError } from '../inputError.js';

const ROUNDING = 1e-12;

export function reaches(value: number, cutoff: number): boolean {
  return value >= cutoff - ROUNDING;
}

export function tierOf(value: number, critical: number, moderate: number): Tier {
  if (reaches(value, critical)) return 'critical';
  if (reaches(value, moderate)) return 'moderate';
  return 'negligible';
}

export function isBorderline(low: number | null, high: number | null, critical: number, moderate: number): boolean {
  if (low === null || high === null) return false;
  return tierOf(low, critical, moderate) !== tierOf(high, critical, moderate);
}

/** Checks the cut-offs a user gave; `keyPrefix` names where they came from in messages. */
export function checkTierPolicy(policy: TierPolicy, keyPrefix = 'policy'): void {
  const inUnit = (value: number, name: 'critical' | 'moderate' | 'interaction'): void => {
    if (!Number.isFinite(value) || value < 0 || value > 1) {
      throw new InputError(`${name} must be a number between 0 and 1, got ${value}`, { key: `${keyPrefix}.${name}` });
    }
  };
  inUnit(policy.critical, 'critical');
  inUnit(policy.moderate, 'moderate');
  inUnit(policy.interaction, 'interaction');
  if (!(policy.moderate < policy.critical)) {
    throw new InputError(
      `moderate (${policy.moderate}) must be below critical (${policy.critical})`,
      { key: `${keyPrefix}.moderate` },
    );
  }
  if (!['mean', 'max', 'weighted'].includes(policy.aggregate)) {
    throw new InputError(`aggregate must be mean, max or weighted, got ${String(policy.aggregate)}`, {
      key: `${keyPrefix}.aggregate`,
    });
  }
  if (!['point', 'upper'].includes(policy.confidence)) {
    throw new InputError(`confidence must be point or upper, got ${String(policy.confidence)}`, {
      key: `${keyPrefix}.confidence`,
    });
  }
}

/** Distance from `value` to the nearest cut-off that would change its tier (≥ 0). */
export function tierMargin(value: number, critical: number, moderate: number): number {
  const tier = tierOf(value, critical, moderate);
  const margin =
    tier === 'critical'
      ? value - critical
      : tier === 'moderate'
        ? Math.min(value - moderate, critical - value)
        : moderate - value;
  return Math.max(0, margin);
}

/**
 * The cut-off ranges over which the tier of `value` holds, each with the other cut-off at
 * its policy value (see `FactorTier.tierStable`). Cut-offs live in [0, 1]; the critical
 * cut-off must stay above the moderate one.
 */
export function tierStableRange(
  value: number,
  critical: number,
  moderate: number,
): { critical: { from: number; to: number | null }; moderate: { from: number; to: number | null } } {
  const tier = tierOf(value, critical, moderate);
  if (tier === 'critical') {
    return { critical: { from: moderate, to: value }, moderate: { from: 0, to: critical } };
  }
  if (tier === 'moderate') {
    return { critical: { from: value, to: null }, moderate: { from: 0, to: value } };
  }
  return { critical: { from: moderate, to: null }, moderate: { from: value, to: critical } };
}
