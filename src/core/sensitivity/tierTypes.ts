/**
 * Result types of the tier decision (see `tierRules.ts`).
 */
import type { FactorRole, TierPolicy } from '../study.js';

export type Tier = 'critical' | 'moderate' | 'negligible';

export interface FactorTier {
  id: string;
  name: string;
  unit: string;
  role: FactorRole;
  /** Total index aggregated over responses by the policy's rule. */
  aggregatedTotal: number;
  /** First-order index aggregated the same way. */
  aggregatedFirst: number;
  /** Aggregated lower / upper bounds of the total index, when every response row carries them. */
  aggregatedTotalLow: number | null;
  aggregatedTotalHigh: number | null;
  /** The value the tier was decided on (the estimate, or the upper bound under the `upper` policy). */
  decidedOn: number;
  tier: Tier;
  /** The confidence interval of the aggregated total straddles a threshold. */
  borderline: boolean;
  /** Aggregated total − first-order: the part of the factor's effect that acts through interactions. */
  interactionShare: number;
  /** Per-response values, for tables and charts. */
  perResponse: { response: string; first: number; total: number; totalLow?: number; totalHigh?: number }[];
  /**
   * What `decidedOn` is: the estimate (`point` policy), the aggregated upper bound
   * (`upper` policy), or the estimate because the factor has no bounds under `upper`.
   */
  decisionBasis?: 'estimate' | 'upperBound' | 'estimateWithoutBounds';
  /**
   * Distance from `decidedOn` to the nearest cut-off that would change the tier
   * (critical: decidedOn − critical; moderate: the smaller of decidedOn − moderate and
   * critical − decidedOn; negligible: moderate − decidedOn). Never negative.
   */
  margin?: number;
  /**
   * Cut-off ranges over which the tier stays as it is, each with the other cut-off held
   * at the policy value. The ends are the points where the tier changes; a cut-off equal
   * to `decidedOn` counts the factor as reaching it (comparison is ≥). `null`: no end.
   */
  tierStable?: {
    critical: { from: number; to: number | null };
    moderate: { from: number; to: number | null };
  };
}

export interface InteractionPair {
  factorA: string;
  factorB: string;
  /** Largest second-order index over responses: one plan serves every response, so a pair that matters for any response earns its term. */
  index: number;
  /** The responses where the pair reaches the threshold. */
  responses: string[];
}

export interface CalibrationEntry {
  id: string;
  name: string;
  tier: Tier;
  aggregatedTotal: number;
  /** `estimate`: fit precisely in the lab; `literature`: take a literature or nominal value. */
  action: 'estimate' | 'literature';
}

export interface SweepRow {
  /** Critical threshold used for this row. */
  critical: number;
  moderate: number;
  /** Factors of both roles in each tier. */
  counts: Record<Tier, number>;
  /** Which cut-off this row varies; the other is held at the policy value. */
  swept?: 'critical' | 'moderate';
  /** The row whose cut-offs are the policy's own. */
  isPolicy?: boolean;
  /** The same counts split by factor role. */
  countsByRole?: Record<FactorRole, Record<Tier, number>>;
}

export interface TierResult {
  policy: TierPolicy;
  factors: FactorTier[];
  /** Pairs at or above the interaction threshold (empty when no second-order table). */
  interactionPairs: InteractionPair[];
  calibration: {
    entries: CalibrationEntry[];
    estimate: number;
    literature: number;
  };
  sweep: SweepRow[];
  /** Findings about the decision itself (e.g. factors tiered on the estimate for want of bounds). */
  notes?: string[];
}
