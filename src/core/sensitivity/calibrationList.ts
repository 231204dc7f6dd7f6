/**
 * The calibration list: which model parameters need precise estimation and which can take
 * a literature or nominal value.
 *
 * A model parameter with a critical or moderate total index drives the predictions, so it
 * is estimated (fitted to the lab data or measured in a dedicated characterisation); a
 * negligible one can be fixed anywhere in its range without changing the output variance
 * (the factor-fixing reading of the total index, Saltelli et al. 2008, *Global
 * Sensitivity Analysis: The Primer*, sec. 1.2.15), so a literature value does. The count of
 * `literature` entries is the characterisation work the sensitivity analysis saved.
 * Operating settings are not listed: the lab plan handles them.
 */
import type { CalibrationEntry, FactorTier, TierResult } from './tierTypes.js';

export function calibrationList(factors: readonly FactorTier[]): TierResult['calibration'] {
  const entries: CalibrationEntry[] = factors
    .filter((factor) => factor.role === 'model')
    .map((factor) => ({
      id: factor.id,
      name: factor.name,
      tier: factor.tier,
      aggregatedTotal: factor.aggregatedTotal,
      action: factor.tier === 'negligible' ? 'literature' : 'estimate',
    }));
  return {
    entries,
    estimate: entries.filter((entry) => entry.action === 'estimate').length,
    literature: entries.filter((entry) => entry.action === 'literature').length,
  };
}
