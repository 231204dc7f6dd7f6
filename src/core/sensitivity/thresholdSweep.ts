/**
 * Threshold sweep: how many factors land in each tier as one cut-off moves and the other
 * stays at the policy value. A tier count that hardly moves near the policy row is a
 * robust decision; one that jumps there says the cut-off itself is doing the deciding.
 *
 * Grids (common-practice ranges for Sobol' total-index cut-offs): the critical cut-off
 * 0.10 to 0.60 in steps of 0.05, the moderate cut-off 0.01 to 0.20 in steps of 0.01. The
 * policy's own value is added to its grid when it is not on it, and that row is marked
 * `isPolicy`. Rows where critical ≤ moderate are skipped: they describe no tiering.
 * Counts cover factors of both roles; `countsByRole` splits them.
 */
import type { FactorRole, TierPolicy } from '../study.js';
import type { SweepRow, Tier } from './tierTypes.js';
import { tierOf } from './tierRules.js';

export interface SweepGrid {
  critical: number[];
  moderate: number[];
}

/** `count` values from `start` in steps of `step`, rounded to 1e-9 so 0.1 + 0.05·k prints cleanly. */
function grid(start: number, step: number, count: number): number[] {
  return Array.from({ length: count }, (_, k) => Math.round((start + k * step) * 1e9) / 1e9);
}

export const DEFAULT_SWEEP_GRID: SweepGrid = {
  critical: grid(0.1, 0.05, 11),
  moderate: grid(0.01, 0.01, 20),
};

function withPolicyValue(values: readonly number[], policyValue: number): number[] {
  const onGrid = values.some((value) => Math.abs(value - policyValue) < 1e-9);
  return (onGrid ? [...values] : [...values, policyValue]).sort((a, b) => a - b);
}

function emptyCounts(): Record<Tier, number> {
  return { critical: 0, moderate: 0, negligible: 0 };
}

export function thresholdSweep(
  factors: readonly { role: FactorRole; decidedOn: number }[],
  policy: Pick<TierPolicy, 'critical' | 'moderate'>,
  sweepGrid: SweepGrid = DEFAULT_SWEEP_GRID,
): SweepRow[] {
  const row = (critical: number, moderate: number, swept: 'critical' | 'moderate'): SweepRow => {
    const counts = emptyCounts();
    const countsByRole: Record<FactorRole, Record<Tier, number>> = { operating: emptyCounts(), model: emptyCounts() };
    for (const factor of factors) {
      const tier = tierOf(factor.decidedOn, critical, moderate);
      counts[tier] += 1;
      countsByRole[factor.role][tier] += 1;
    }
    const isPolicy =
      Math.abs(critical - policy.critical) < 1e-9 && Math.abs(moderate - policy.moderate) < 1e-9;
    return { critical, moderate, counts, swept, isPolicy, countsByRole };
  };

  const rows: SweepRow[] = [];
  for (const critical of withPolicyValue(sweepGrid.critical, policy.critical)) {
    if (critical > policy.moderate) rows.push(row(critical, policy.moderate, 'critical'));
  }
  for (const moderate of withPolicyValue(sweepGrid.moderate, policy.moderate)) {
    if (moderate < policy.critical) rows.push(row(policy.critical, moderate, 'moderate'));
  }
  return rows;
}
