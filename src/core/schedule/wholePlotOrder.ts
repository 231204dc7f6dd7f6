/**
 * The run order of a campaign laid out in whole plots and sessions: the randomisation that a
 * split-plot design analysed with a random whole-plot effect and fixed session effects assumes.
 *
 * Method: whole plots in random order within their session, runs in random order within their
 * whole plot (Goos, 2002, "The Optimal Design of Blocked and Split-Plot Experiments", ch. 7;
 * Montgomery, "Design and Analysis of Experiments", the split-plot chapter). Sessions keep the
 * order of the layout: their effects are fixed terms of the model, so whatever differs from
 * one day to the next (drift included) is absorbed rather than randomised over.
 *
 * Conventions fixed here:
 * - A centre replicate is a whole plot of its own (runLayout.ts). Within a session its slot
 *   follows the session's place in the campaign, so that the replicates open, halve and close
 *   it: in session b of S the replicate goes at the fraction b/(S − 1) of the session's whole
 *   plots (the middle when S = 1); several replicates in one session are spread evenly
 *   (centreSpread.ts). Other whole plots fill the remaining slots at random.
 * - Whole plots are numbered 1, 2, … in execution order; sessions 1, 2, … likewise.
 */
import { spreadSlots } from './centreSpread.js';
import { shuffled } from './randomOrder.js';
import type { RandomGenerator } from '../random.js';
import type { RunPurpose } from '../design/designTypes.js';

export interface LaidOutRun {
  point: string;
  purpose: RunPurpose;
  /** Whole plot in the layout (any distinct integers). */
  wholePlot: number;
  /** Session in the layout, 0-based, in campaign order. */
  session: number;
}

export interface OrderedRun {
  point: string;
  purpose: RunPurpose;
  /** 1-based, consecutive in execution order. */
  wholePlot: number;
  /** 1-based. */
  session: number;
}

/** The execution order of laid-out runs. */
export function orderByWholePlots(runs: readonly LaidOutRun[], rng: RandomGenerator): OrderedRun[] {
  const sessions = Math.max(0, ...runs.map((run) => run.session)) + 1;
  const out: OrderedRun[] = [];
  let plotNumber = 0;
  for (let session = 0; session < sessions; session++) {
    const plots = new Map<number, LaidOutRun[]>();
    for (const run of runs) {
      if (run.session !== session) continue;
      const members = plots.get(run.wholePlot);
      if (members) members.push(run);
      else plots.set(run.wholePlot, [run]);
    }
    const all = [...plots.values()];
    const centres = all.filter((members) => members.every((run) => run.purpose === 'centre'));
    const others = shuffled(
      all.filter((members) => !centres.includes(members)),
      rng,
    );
    const slots = centreSlots(centres.length, all.length, session, sessions);
    let nextCentre = 0;
    let nextOther = 0;
    for (let slot = 0; slot < all.length; slot++) {
      const members = slots.has(slot) ? centres[nextCentre++] : others[nextOther++];
      plotNumber++;
      for (const run of shuffled(members, rng)) out.push({ point: run.point, purpose: run.purpose, wholePlot: plotNumber, session: session + 1 });
    }
  }
  return out;
}

function centreSlots(count: number, plots: number, session: number, sessions: number): Set<number> {
  if (count === 0) return new Set();
  if (count > 1 || sessions === 1) return new Set(spreadSlots(count, plots));
  return new Set([Math.round((session / (sessions - 1)) * (plots - 1))]);
}
