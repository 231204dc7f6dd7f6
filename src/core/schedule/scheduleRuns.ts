/**
 * The randomised run order of a plan: sequence, session and, where the study marks factors as
 * hard to change, restricted randomisation.
 *
 * Randomisation protects the effect estimates from drift and from whatever else changes with
 * time (R. A. Fisher, 1935, The Design of Experiments, ch. II). The order comes from the seed
 * alone: the same plan and seed give the same order.
 *
 * Steps:
 * 1. Without hard-to-change factors: centre replicates take evenly spread slots
 *    (`centreSpread.ts`), fit and holdout runs fill the rest in random order.
 *    With them: runs are grouped by those settings (`hardToChangeGrouping.ts`).
 * 2. With sessions: the fewest sessions of at most `maxRuns` runs (`sessionPlan.ts`). With groups,
 *    up to GROUP_ORDER_TRIES random group orders are drawn and the first one that can be cut into
 *    sessions without splitting a group is kept (else the one splitting fewest).
 */
import type { Study } from '../study.js';
import type { FactorLevels, PlannedRun } from '../design/designTypes.js';
import type { Schedule, ScheduledRun } from './scheduleTypes.js';
import { createRandom } from '../random.js';
import { cutIntoSessions, equalSessionSizes, sessionCountFor } from './sessionPlan.js';
import {
  countLevelChanges,
  distinctSettings,
  groupByHardToChange,
  orderWithCentresSpread,
  sameSetting,
  type GroupableRun,
} from './hardToChangeGrouping.js';
import { wordList } from '../wordList.js';
import { orderByWholePlots } from './wholePlotOrder.js';

const GROUP_ORDER_TRIES = 64;
const DEFAULT_SESSION_LABEL = 'Session';

/** What the run order reads of a plan (a PlanDocument is one; the plan stage depends on this one, not back). */
export interface SchedulingInput {
  runs: PlannedRun[];
  levels: FactorLevels[];
  study: Pick<Study, 'factors' | 'sessions'>;
}

export function scheduleRuns(plan: SchedulingInput, seed: number): Schedule {
  const rng = createRandom(seed);
  const runs: GroupableRun[] = plan.runs.map((run) => ({ point: run.point, purpose: run.purpose, settings: run.settings }));
  const n = runs.length;
  const sessions = plan.study.sessions;
  const sessionLabel = sessions?.label?.trim() || DEFAULT_SESSION_LABEL;

  const variedIds = new Set(plan.levels.filter((level) => level.varied).map((level) => level.id));
  const hardFactors = plan.study.factors.filter((factor) => factor.hardToChange === true && variedIds.has(factor.id));
  const hardIds = hardFactors.map((factor) => factor.id);

  let sequence: GroupableRun[];
  let sizes: number[];
  let splitGroups = 0;
  let groupCount = 0;
  if (hardIds.length === 0) {
    sequence = orderWithCentresSpread(runs, rng);
    sizes = sessions ? equalSessionSizes(n, sessionCountFor(n, sessions.maxRuns)) : [n];
  } else {
    let best: { groups: GroupableRun[][]; sizes: number[]; splits: number } | undefined;
    for (let attempt = 0; attempt < (sessions ? GROUP_ORDER_TRIES : 1); attempt++) {
      const groups = groupByHardToChange(runs, hardIds, rng);
      const cut = sessions ? cutIntoSessions(groups.map((group) => group.length), sessions.maxRuns) : { sizes: [n], splitGroups: 0 };
      if (!best || cut.splitGroups < best.splits) best = { groups, sizes: cut.sizes, splits: cut.splitGroups };
      if (best.splits === 0) break;
    }
    sequence = best!.groups.flat();
    sizes = best!.sizes;
    splitGroups = best!.splits;
    groupCount = best!.groups.length;
  }

  const order: ScheduledRun[] = [];
  let session = 1;
  let leftInSession = sizes[0] ?? 0;
  sequence.forEach((run, index) => {
    while (leftInSession === 0 && session < sizes.length) leftInSession = sizes[session++];
    order.push({ sequence: index + 1, point: run.point, purpose: run.purpose, session });
    leftInSession--;
  });

  const sessionCount = sizes.length;
  let hardToChange: Schedule['hardToChange'] = null;
  if (hardIds.length > 0) {
    const levelChanges = countLevelChanges(sequence, hardIds);
    const names = wordList(hardFactors.map((factor) => factor.name));
    const fewest = hardIds.length === 1 ? distinctSettings(runs, hardIds[0]) - 1 : null;
    const centres = runs.filter((run) => run.purpose === 'centre').length;
    hardToChange = {
      factors: hardIds,
      levelChanges,
      note:
        `${names} ${hardIds.length === 1 ? 'is' : 'are'} hard to change, so runs sharing ${hardIds.length === 1 ? 'its setting' : 'their settings'} ` +
        `are done together: ${groupCount} block${groupCount === 1 ? '' : 's'} in random order, runs inside each block in random order ` +
        `(restricted randomisation; analyse the blocks as whole plots). ` +
        `${levelChanges} setting change${levelChanges === 1 ? '' : 's'}${fewest !== null && fewest === levelChanges ? ' (the fewest possible)' : ''}, ` +
        `not counting the first set-up` +
        centreClause(sequence, hardIds, centres, levelChanges, fewest) +
        `${splitGroups > 0 ? `; ${splitGroups} block${splitGroups === 1 ? '' : 's'} had to continue into the next ${sessionLabel.toLowerCase()}` : ''}.`,
    };
  }

  return { seed, order, sessionCount, sessionLabel, hardToChange, note: orderNote(order, sizes, sessionLabel, seed, hardIds.length > 0, sessions?.maxRuns) };
}

function orderNote(order: ScheduledRun[], sizes: number[], label: string, seed: number, grouped: boolean, maxRuns: number | undefined): string {
  const centres = order.filter((run) => run.purpose === 'centre').map((run) => run.sequence);
  const parts: string[] = [];
  if (grouped) {
    const centreText = centres.length === 0 ? '' : `; centre ${centres.length === 1 ? 'repeat is run' : 'repeats are runs'} ${wordList(centres.map(String))}`;
    parts.push(`Run order drawn at random from seed ${seed}, with runs sharing a hard-to-change setting kept together${centreText}`);
  } else {
    const centreText =
      centres.length === 0
        ? ''
        : centres.length === 1
          ? `; the centre repeat is run ${centres[0]}, mid-campaign`
          : `; centre repeats are spread evenly (runs ${wordList(centres.map(String))}) to show any drift`;
    parts.push(`Run order drawn at random from seed ${seed}${centreText}`);
  }
  let text = `${parts.join('')}.`;
  if (maxRuns !== undefined && sizes.length > 1) {
    const plural = `${label.toLowerCase()}${label.toLowerCase().endsWith('s') ? '' : 's'}`;
    text += ` Split into ${sizes.length} ${plural} of at most ${maxRuns} runs (${sizes.join(', ')}); validation runs are mixed in among the others.`;
  } else if (order.some((run) => run.purpose === 'holdout')) {
    text += ' Validation runs are mixed in among the others.';
  }
  return text;
}

/**
 * What the grouping did with the centre replicates, for the hard-to-change note: spread as
 * one-run blocks (and what that costs in resets), or kept inside the block of their setting.
 */
function centreClause(sequence: GroupableRun[], hardIds: string[], centres: number, levelChanges: number, fewest: number | null): string {
  if (centres < 2) return '';
  if (!centresSpreadAlone(sequence, hardIds)) {
    return '; the centre repeats share their setting with other runs, so they stay in that block, spread inside it, and check drift only there';
  }
  const extra = fewest !== null ? levelChanges - fewest : 0;
  return (
    '; the centre repeats share no setting with other runs, so each is a block of its own, spread over the campaign to check drift' +
    (extra > 0 ? ` (${fewest} change${fewest === 1 ? '' : 's'} would do if they ran back to back; spreading them costs the other ${extra})` : '')
  );
}

/**
 * True when no other run shares the centre replicates' hard-to-change setting and the
 * replicates are not next to one another (moved apart as one-run blocks).
 */
function centresSpreadAlone(sequence: GroupableRun[], hardIds: string[]): boolean {
  const at = sequence.flatMap((run, index) => (run.purpose === 'centre' ? [index] : []));
  return at.length > 1 && at.every((index, k) => k === 0 || index - at[k - 1] > 1) && at.every((index) => {
    const key = sequence[index].settings;
    return sequence.every((other) => other.purpose === 'centre' || hardIds.some((id) => !sameSetting(other.settings[id], key[id])));
  });
}


/** A run of a laid-out plan with its layout whole plot and session (0-based, layout numbering). */
export interface LaidOutPlanRun {
  point: string;
  purpose: PlannedRun['purpose'];
  wholePlot: number;
  session: number;
}

/**
 * The run order of a plan laid out in whole plots and sessions (plan/laidOutDesign.ts): whole
 * plots in random order within their session, runs in random order within their whole plot
 * (wholePlotOrder.ts). Returns the schedule and, per point, the 1-based whole plot (numbered
 * in execution order) and session the plan's runs carry.
 */
export function scheduleLaidOut(
  plan: SchedulingInput,
  laid: readonly LaidOutPlanRun[],
  seed: number,
  split: boolean,
): { schedule: Schedule; placement: Map<string, { wholePlot: number; session: number }> } {
  const rng = createRandom(seed);
  const ordered = orderByWholePlots(laid, rng);
  const sessions = plan.study.sessions;
  const sessionLabel = sessions?.label?.trim() || DEFAULT_SESSION_LABEL;
  const order: ScheduledRun[] = ordered.map((run, index) => ({ sequence: index + 1, point: run.point, purpose: run.purpose, session: run.session }));
  const placement = new Map(ordered.map((run) => [run.point, { wholePlot: run.wholePlot, session: run.session }]));
  const sessionCount = Math.max(1, ...ordered.map((run) => run.session));
  const sizes = Array.from({ length: sessionCount }, (_, s) => ordered.filter((run) => run.session === s + 1).length);

  const variedIds = new Set(plan.levels.filter((level) => level.varied).map((level) => level.id));
  const hardFactors = plan.study.factors.filter((factor) => factor.hardToChange === true && variedIds.has(factor.id));
  const hardIds = hardFactors.map((factor) => factor.id);
  const byPoint = new Map(plan.runs.map((run) => [run.point, run]));
  const sequence = order.map((entry) => byPoint.get(entry.point)!);
  let hardToChange: Schedule['hardToChange'] = null;
  if (hardIds.length > 0) {
    // Every whole plot after the first is a reset, whether or not the value differs: the basis
    // the split-plot analysis and the costs count on.
    const resets = Math.max(0, new Set(ordered.map((run) => run.wholePlot)).size - 1);
    const differing = countLevelChanges(sequence, hardIds);
    const names = wordList(hardFactors.map((factor) => factor.name));
    const plots = new Set(ordered.filter((run) => run.purpose === 'fit').map((run) => run.wholePlot)).size;
    const fits = ordered.filter((run) => run.purpose === 'fit').length;
    hardToChange = {
      factors: hardIds,
      levelChanges: resets,
      note:
        `${names} ${hardIds.length === 1 ? 'is' : 'are'} hard to change, so the plan is a split-plot design: ` +
        (split
          ? `the ${fits} fitting runs form ${plots} whole plots, each run at one setting of ${hardIds.length === 1 ? 'it' : 'them'} reset before the whole plot starts`
          : `every fitting run is a whole plot of its own (${hardIds.length === 1 ? 'its setting is' : 'their settings are'} reset before every run)`) +
        `; every centre replicate and every validation run is a whole plot of its own. ` +
        `${resets} reset${resets === 1 ? '' : 's'} of the setting, one per whole plot after the first set-up (${differing} of them to a different value). ` +
        `Reset the setting at the start of every whole plot even when it repeats the previous one: the analysis counts on it.`,
    };
  }
  const centres = order.filter((run) => run.purpose === 'centre').map((run) => run.sequence);
  const plural = `${sessionLabel.toLowerCase()}${sessionLabel.toLowerCase().endsWith('s') ? '' : 's'}`;
  let note =
    `Run order drawn at random from seed ${seed}: ` +
    (hardIds.length > 0 ? `whole plots in random order within each ${sessionLabel.toLowerCase()}, runs in random order within each whole plot` : `runs in random order within each ${sessionLabel.toLowerCase()}`) +
    (centres.length === 0 ? '' : `; centre replicates at runs ${wordList(centres.map(String))}, spread over the campaign`) +
    '.';
  if (sessionCount > 1) {
    note += ` ${sessionCount} ${plural} of at most ${sessions?.maxRuns ?? Math.max(...sizes)} runs (${sizes.join(', ')}), each a block of the model; validation runs are mixed in among the others.`;
  } else if (order.some((run) => run.purpose === 'holdout')) {
    note += ' Validation runs are mixed in among the others.';
  }
  return { schedule: { seed, order, sessionCount, sessionLabel, hardToChange, note }, placement };
}
