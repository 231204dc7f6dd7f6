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
  counts: Record<Tier, number>;
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
}
