/**
 * Restricted randomisation for hard-to-change factors: runs that share the setting of such a
 * factor are done one after another, so the factor is reset as seldom as the plan allows.
 *
 * Method: the run order of a split-plot arrangement, where the settings of the hard-to-change
 * factors are the whole plots and are randomised as units, and the runs inside each whole plot
 * are randomised separately (D. C. Montgomery, Design and Analysis of Experiments, 8th ed.,
 * 2013, §14.5 "The split-plot design"; P. Goos, 2002, The Optimal Design of Blocked and
 * Split-Plot Experiments, ch. 7).
 *
 * Conventions fixed here:
 * - With several hard-to-change factors the grouping is nested in study order: by the first
 *   factor's setting, inside that by the second, and so on. Group order is random at each level,
 *   except that an inner group continuing the previous run's inner setting is put first, which
 *   saves one change of that inner factor without touching the outer ones.
 * - Centre replicates belong to the group whose setting they share, spread evenly inside it
 *   (see `centreSpread.ts`). When no other run shares the centre setting, each replicate becomes
 *   a one-run block of its own and the blocks are spread over the campaign (first run, the
 *   block boundary nearest the middle run, last run for three): a drift check is worth the two
 *   extra resets each inner one costs, and replicates run back to back would check nothing.
 * - A level change is a pair of consecutive runs whose settings of a factor differ; the first
 *   set-up of the campaign is not a change. Changes are summed over the hard-to-change factors.
 *   With one such factor, grouping reaches the minimum: (distinct settings − 1).
 */
import { spreadSlots } from './centreSpread.js';
import { shuffled } from './randomOrder.js';
import type { RandomGenerator } from '../random.js';

export interface GroupableRun {
  point: string;
  purpose: 'fit' | 'centre' | 'holdout';
  settings: Record<string, number>;
}

/** Settings compare on 12 significant digits so that rounding noise never makes a new group. */
function settingKey(value: number): string {
  return Number.isFinite(value) ? value.toPrecision(12) : String(value);
}

/** The one test of "same setting" for grouping, change counting and the schedule's notes. */
export function sameSetting(a: number, b: number): boolean {
  return settingKey(a) === settingKey(b);
}

/**
 * Runs in a random order where every centre replicate sits at its even-spread slot and the
 * rest (fit and holdout runs alike) fill the other slots at random.
 */
export function orderWithCentresSpread<T extends GroupableRun>(runs: readonly T[], rng: RandomGenerator): T[] {
  const centres = runs.filter((run) => run.purpose === 'centre');
  const others = shuffled(
    runs.filter((run) => run.purpose !== 'centre'),
    rng,
  );
  const slots = new Set(spreadSlots(centres.length, runs.length));
  const out: T[] = [];
  let nextCentre = 0;
  let nextOther = 0;
  for (let slot = 0; slot < runs.length; slot++) {
    out.push(slots.has(slot) ? centres[nextCentre++] : others[nextOther++]);
  }
  return out;
}

/**
 * The runs as consecutive groups, one per combination of hard-to-change settings, in a random
 * order nested by factor (see the header). Each group is already in its own random order.
 */
export function groupByHardToChange<T extends GroupableRun>(
  runs: readonly T[],
  factorIds: readonly string[],
  rng: RandomGenerator,
): T[][] {
  const groups: T[][] = [];
  let last: T | undefined;

  const arrange = (members: readonly T[], depth: number): void => {
    if (depth === factorIds.length) {
      const group = orderWithCentresSpread(members, rng);
      groups.push(group);
      last = group[group.length - 1];
      return;
    }
    const factor = factorIds[depth];
    const byKey = new Map<string, T[]>();
    for (const run of members) {
      const key = settingKey(run.settings[factor]);
      const bucket = byKey.get(key);
      if (bucket) bucket.push(run);
      else byKey.set(key, [run]);
    }
    // Sort before shuffling so the result does not depend on the order runs arrived in.
    const keys = shuffled([...byKey.keys()].sort(), rng);
    if (depth > 0 && last !== undefined) {
      const continuing = keys.indexOf(settingKey(last.settings[factor]));
      if (continuing > 0) keys.unshift(...keys.splice(continuing, 1));
    }
    for (const key of keys) arrange(byKey.get(key)!, depth + 1);
  };

  arrange(runs, 0);
  return spreadLoneCentres(groups, factorIds[0]);
}

/**
 * Replaces a block made only of centre replicates by one-run blocks spread over the campaign:
 * the first opens it, the last closes it, and each one between goes to the block boundary
 * whose run position is nearest its even-spread slot k·(n − 1)/(c − 1) (ties to the earlier
 * boundary). Placing by run position rather than by block count keeps the middle replicate
 * near the middle run when the blocks differ in size.
 */
function spreadLoneCentres<T extends GroupableRun>(groups: T[][], outerFactor: string): T[][] {
  const lone = groups.findIndex((group) => group.length > 1 && group.every((run) => run.purpose === 'centre'));
  if (lone < 0) return groups;
  const centres = groups[lone];
  const rest = groups.filter((_, index) => index !== lone);
  // Only a block that is alone in the outermost setting can move without splitting another block.
  const outerKey = settingKey(centres[0].settings[outerFactor]);
  if (rest.some((group) => settingKey(group[0].settings[outerFactor]) === outerKey)) return groups;
  const runsBefore = [0];
  for (const group of rest) runsBefore.push(runsBefore[runsBefore.length - 1] + group.length);
  const count = centres.length;
  const lastSlot = runsBefore[rest.length] + count - 1;
  // boundaryOf[k]: how many of the other blocks come before centre replicate k.
  const boundaryOf: number[] = [];
  let from = 0;
  for (let k = 0; k < count; k++) {
    const target = (k * lastSlot) / (count - 1);
    let best = from;
    for (let b = from + 1; b <= rest.length; b++) {
      if (Math.abs(runsBefore[b] + k - target) < Math.abs(runsBefore[best] + k - target) - 1e-9) best = b;
    }
    boundaryOf.push(best);
    from = best;
  }
  const out: T[][] = [];
  let nextCentre = 0;
  for (let b = 0; b <= rest.length; b++) {
    while (nextCentre < count && boundaryOf[nextCentre] === b) out.push([centres[nextCentre++]]);
    if (b < rest.length) out.push(rest[b]);
  }
  return out;
}

/** Changes of the given factors along the sequence; the first set-up is not counted. */
export function countLevelChanges(sequence: readonly { settings: Record<string, number> }[], factorIds: readonly string[]): number {
  let changes = 0;
  for (let i = 1; i < sequence.length; i++) {
    for (const factor of factorIds) {
      if (!sameSetting(sequence[i].settings[factor], sequence[i - 1].settings[factor])) changes++;
    }
  }
  return changes;
}

/** Number of distinct settings of one factor over the runs (the fewest changes of it is this less one). */
export function distinctSettings(runs: readonly { settings: Record<string, number> }[], factorId: string): number {
  return new Set(runs.map((run) => settingKey(run.settings[factorId]))).size;
}
