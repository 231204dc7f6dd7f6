/**
 * Types shared by the design stages: levels → candidate region → exact design → runs.
 *
 * Coded units throughout the search: low → −1, high → +1, linear in between.
 */
import type { Tier } from '../sensitivity/tierTypes.js';

export interface FactorLevels {
  id: string;
  name: string;
  unit: string;
  tier: Tier;
  /** Varied in the plan (critical or moderate operating factor), or fixed. */
  varied: boolean;
  /** Level settings in engineering units, rounded to the factor's precision (empty when fixed). */
  values: number[];
  /** The same levels in coded units. */
  coded: number[];
  /** The engineering setting a fixed factor is held at (its nominal), else null. */
  fixedAt: number | null;
  /** Why this many levels, or why fixed. */
  reason: string;
}

/**
 * Where design points may go: a grid of coded levels per design factor, cut by constraints
 * and equipment limits. Large grids are never enumerated; `points` is null for them and the
 * search works factor by factor through `levels` and `isFeasible`.
 */
export interface CandidateRegion {
  factorIds: string[];
  /** Coded level values of each design factor, ascending. */
  levels: number[][];
  /** True when the coded point satisfies every constraint and equipment limit. */
  isFeasible(coded: ArrayLike<number>): boolean;
  /** Size of the full grid (product of level counts). */
  gridSize: number;
  /** Every feasible grid point, when the grid is small enough to enumerate; else null. */
  points: number[][] | null;
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
}
