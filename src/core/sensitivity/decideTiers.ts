/**
 * The tier decision for a whole study: aggregate each factor's indices over the responses,
 * tier it on its aggregated total Sobol' index, flag borderline factors, list interaction
 * pairs, the calibration list of model parameters and a threshold sweep.
 *
 * Method: factor fixing on the total index (Sobol' 2001, "Global sensitivity indices for
 * nonlinear mathematical models and their Monte Carlo estimates"; Saltelli et al. 2008,
 * *Global Sensitivity Analysis: The Primer*). The rules themselves live in
 * `aggregateIndices.ts`, `tierRules.ts`, `interactionPairs.ts`, `calibrationList.ts` and
 * `thresholdSweep.ts`; this module only composes them.
 *
 * Conventions: factors keep the study's order; the interaction share is the aggregated
 * total minus the aggregated first-order index, clamped at 0 (sampling error can make
 * first > total for a factor with no interactions). Under the `upper` confidence policy a
 * factor without bounds is tiered on its estimate and a note says so.
 */
import type { Study } from '../study.js';
import type { FactorTier, TierResult } from './tierTypes.js';
import { aggregateIndices, dropRoundingNoise } from './aggregateIndices.js';
import { checkTierPolicy, isBorderline, tierMargin, tierOf, tierStableRange } from './tierRules.js';
import { interactionPairs } from './interactionPairs.js';
import { calibrationList } from './calibrationList.js';
import { thresholdSweep } from './thresholdSweep.js';

export type TierInput = Pick<Study, 'factors' | 'responses' | 'indices' | 'interactions' | 'policy'>;

export function decideTiers(input: TierInput): TierResult {
  const { factors, responses, indices, interactions, policy } = input;
  checkTierPolicy(policy);
  const notes: string[] = [];
  const withoutBounds: string[] = [];
  const withoutRows: string[] = [];
  const responseRank = new Map(responses.map((response, i) => [response.id, i]));

  const tiers: FactorTier[] = factors.map((factor) => {
    const rows = indices
      .filter((row) => row.factor === factor.id)
      .sort((a, b) => (responseRank.get(a.response) ?? Infinity) - (responseRank.get(b.response) ?? Infinity));
    if (rows.length === 0) withoutRows.push(factor.id);
    const aggregated = aggregateIndices(rows, responses, policy.aggregate);

    let decidedOn = aggregated.total;
    let decisionBasis: FactorTier['decisionBasis'] = 'estimate';
    if (policy.confidence === 'upper') {
      if (aggregated.totalHigh !== null) {
        decidedOn = aggregated.totalHigh;
        decisionBasis = 'upperBound';
      } else {
        decisionBasis = 'estimateWithoutBounds';
        withoutBounds.push(factor.id);
      }
    }

    return {
      id: factor.id,
      name: factor.name,
      unit: factor.unit,
      role: factor.role,
      aggregatedTotal: aggregated.total,
      aggregatedFirst: aggregated.first,
      aggregatedTotalLow: aggregated.totalLow,
      aggregatedTotalHigh: aggregated.totalHigh,
      decidedOn,
      tier: tierOf(decidedOn, policy.critical, policy.moderate),
      borderline: isBorderline(aggregated.totalLow, aggregated.totalHigh, policy.critical, policy.moderate),
      interactionShare: dropRoundingNoise(Math.max(0, aggregated.total - aggregated.first)),
      perResponse: rows.map((row) => ({
        response: row.response,
        first: row.first,
        total: row.total,
        ...(row.totalLow !== undefined ? { totalLow: row.totalLow } : {}),
        ...(row.totalHigh !== undefined ? { totalHigh: row.totalHigh } : {}),
      })),
      decisionBasis,
      margin: dropRoundingNoise(tierMargin(decidedOn, policy.critical, policy.moderate)),
      tierStable: tierStableRange(decidedOn, policy.critical, policy.moderate),
    };
  });

  if (withoutBounds.length > 0) {
    notes.push(
      `no confidence bounds for ${withoutBounds.join(', ')}: tiered on the estimate, not the upper bound`,
    );
  }
  if (withoutRows.length > 0) {
    notes.push(`no index rows for ${withoutRows.join(', ')}: treated as zero (negligible)`);
  }

  return {
    policy: { ...policy },
    factors: tiers,
    interactionPairs: interactionPairs(
      interactions,
      policy.interaction,
      factors.map((factor) => factor.id),
      responses.map((response) => response.id),
    ),
    calibration: calibrationList(tiers),
    sweep: thresholdSweep(tiers, policy),
    notes,
  };
}
