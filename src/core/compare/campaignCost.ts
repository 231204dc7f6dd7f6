/**
 * Cost and bench time of a lab campaign, and the level changes of hard-to-change factors.
 *
 * cost  = runs × costs.perRun  + level changes × costs.perLevelChange.cost
 * hours = runs × costs.hoursPerRun + level changes × costs.perLevelChange.hours
 *
 * Level changes under grouped run order (all runs at one setting of a hard-to-change factor
 * are done together: the restricted randomisation of a split-plot arrangement, Montgomery,
 * 2013, "Design and Analysis of Experiments", 8th ed., §14.5): each distinct setting is set up
 * once. As in the run schedule (schedule/hardToChangeGrouping.ts), a change is a switch
 * between consecutive runs and the first set-up of the campaign is not one, so a factor with
 * s distinct settings needs s − 1 changes and a factor held fixed needs none; the counts are
 * summed over the hard-to-change factors. With several such factors this is the least a plan
 * of that shape can need (nested groups may force the inner factor to change more), so the
 * comparators' set-up costs are never overstated.
 */
import type { CostSettings } from '../study.js';

/** Values closer than this (coded units) count as one setting. */
const SAME_SETTING = 1e-9;

export interface CampaignCost {
  cost: number | null;
  hours: number | null;
}

export function campaignCost(runs: number, levelChanges: number | null, costs: CostSettings | undefined): CampaignCost {
  if (!costs) return { cost: null, hours: null };
  const change = levelChanges !== null && costs.perLevelChange ? costs.perLevelChange : null;
  const changes = levelChanges ?? 0;
  return {
    cost: runs * costs.perRun + (change ? changes * change.cost : 0),
    hours: runs * costs.hoursPerRun + (change ? changes * change.hours : 0),
  };
}

/** Number of distinct values in column `column` of `points`. */
export function distinctSettings(points: readonly ArrayLike<number>[], column: number): number {
  const values = points.map((x) => x[column]).sort((a, b) => a - b);
  let count = 0;
  let last = -Infinity;
  for (const value of values) {
    if (value - last > SAME_SETTING) {
      count++;
      last = value;
    }
  }
  return count;
}

/**
 * Level changes under grouped order: for each hard-to-change factor, its distinct settings
 * among `points` (coordinate given by `columnOf`) minus one, or 0 when the plan holds it fixed
 * (`columnOf` returns −1).
 */
export function groupedLevelChanges(
  points: readonly ArrayLike<number>[],
  hardToChange: readonly string[],
  columnOf: (factorId: string) => number,
): number {
  let total = 0;
  for (const id of hardToChange) {
    const column = columnOf(id);
    if (column >= 0 && points.length > 0) total += distinctSettings(points, column) - 1;
  }
  return total;
}
