/**
 * Types shared by the design stages: levels → candidate region → exact design → runs. The
 * region's own types (`CandidateRegion`, `AxisLevels`) live in ../region/candidateRegion.ts.
 *
 * Coded units throughout the search: low → −1, high → +1, linear in between.
 */
import type { Tier } from '../sensitivity/tierTypes.js';
import type { AxisLevels } from '../region/candidateRegion.js';

/** The levels stage's result for one operating factor: the region's axis, with name, tier and why. */
export interface FactorLevels extends AxisLevels {
  name: string;
  unit: string;
  tier: Tier;
  /** Why this many levels, or why fixed. */
  reason: string;
}

export type RunPurpose = 'fit' | 'centre' | 'holdout';

export interface PlannedRun {
  /** Stable id of the design point, e.g. `F01`, `C1`, `H1`. */
  point: string;
  purpose: RunPurpose;
  /** Factor id → coded value, design factors only. */
  coded: Record<string, number>;
  /** Factor id → engineering setting, fixed operating factors included. */
  settings: Record<string, number>;
  /** 1-based whole plot of a split-plot plan, consecutive in run order (absent otherwise). */
  wholePlot?: number;
  /** 1-based session the run belongs to, when the design fixes it (split-plot and blocked plans). */
  session?: number;
}
