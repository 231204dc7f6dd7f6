/**
 * How many whole plots N fitting runs get when a varied factor is hard to change.
 *
 * Every whole plot is one reset of the hard-to-change settings, so whole plots cost what a
 * level change costs (`costs.perLevelChange`), while each added whole plot buys whole-plot
 * error degrees of freedom and precision for the hard-to-change factors' effects. Rule:
 * - `design.wholePlots` a number: that many (refused when it exceeds the fitting runs);
 * - a split-plot plan needs error degrees of freedom in both strata (containment rule,
 *   evaluate/containmentDf.ts): W from the fewest that fit the sessions and leave one
 *   whole-plot df to the most that leave one run-stratum df (`splitRange`). Outside it the
 *   only sound plan has one whole plot per run;
 * - the precision can be judged (a response gives `noise`): inside that range the
 *   hard-to-change factors' powers grow with W and the others' fall (their stratum loses df),
 *   so the cheapest W meeting the target is the fewest whose hard-to-change effects meet it,
 *   found by bisection, provided the other effects still meet it there; else one whole plot per
 *   run, and the run-count search goes on to a larger N when even that misses;
 * - not judged: the fewest whole plots that leave MIN_WHOLE_PLOT_DF whole-plot error degrees
 *   of freedom (our rule, "common practice": a variance estimated on fewer degrees of freedom
 *   makes the hard-to-change factors' tests nearly powerless), or one per run when that leaves
 *   the run stratum none.
 * The bisection's probes use QUICK_SHARE of the starts; the chosen plan is searched again with
 * all of them by the caller.
 *
 * Across run counts (campaignSize.ts), when the study gives `costs.perLevelChange`: a few more
 * runs in fewer whole plots can cost less than the fewest runs in many. A reset is valued at
 * perLevelChange.cost plus its hours at the bench rate perRun / hoursPerRun (`resetValue`), and
 * the cheapest plan meeting the target over the fewest runs N* and up to MAX_EXTRA_RUNS more
 * is kept (`laidOutCost`: all runs × perRun + resets × the reset value, resets = whole plots of
 * all the runs − 1).
 */
import { InputError } from '../inputError.js';
import type { CostSettings } from '../study.js';
import { fittedStructure } from '../design/runLayout.js';
import { containmentDf } from '../evaluate/containmentDf.js';
import { wholePlotTerms } from '../evaluate/structuredPrecision.js';
import { layoutOf, searchLaidOut, type LaidOutDesign, type LaidOutSetup } from './laidOutDesign.js';

/** Whole-plot error df the rule asks for when precision cannot be judged ("common practice"). */
export const MIN_WHOLE_PLOT_DF = 3;
/** Share of the starts a bisection probe uses (our tuning: the ranking of W rarely changes with more). */
const QUICK_SHARE = 0.25;

/** Most runs beyond the fewest that meet the target the cost comparison tries (our choice). */
export const MAX_EXTRA_RUNS = 4;

/** What one reset of the hard-to-change settings costs, its bench hours valued at the run rate; null without perLevelChange. */
export function resetValue(costs: CostSettings | undefined): number | null {
  if (!costs?.perLevelChange) return null;
  const hourly = costs.hoursPerRun > 0 ? costs.perRun / costs.hoursPerRun : 0;
  return costs.perLevelChange.cost + costs.perLevelChange.hours * hourly;
}

/** Cost of a laid-out campaign for the whole-plot rule: runs × perRun + resets × resetValue. */
export function laidOutCost(design: LaidOutDesign, costs: CostSettings, value: number): number {
  const runs = design.layout.roles.length;
  return runs * costs.perRun + Math.max(0, design.layout.wholePlots - 1) * value;
}

export interface WholePlotChoice {
  design: LaidOutDesign;
  /** How the count was reached, in a few words. */
  setBy: string;
}

/** Quick-search starts for the bisection probes. */
export function quickStarts(starts: number): number {
  return Math.max(2, Math.ceil(starts * QUICK_SHARE));
}

/**
 * @param requested design.wholePlots (a number) or 'auto'
 * @param judged whether the precision target can be judged
 */
export function chooseWholePlots(
  setup: LaidOutSetup,
  fitRuns: number,
  requested: number | 'auto',
  judged: boolean,
  starts: number,
): WholePlotChoice {
  if (requested !== 'auto') {
    if (requested > fitRuns) {
      throw new InputError(`${requested} whole plots cannot be made from ${fitRuns} fitting runs; use at most ${fitRuns} whole plots, or more runs`, {
        key: 'design.wholePlots',
      });
    }
    return { design: searchLaidOut(setup, fitRuns, requested, quickStarts(starts)), setBy: 'set by the study (design.wholePlots)' };
  }
  const range = splitRange(setup, fitRuns);
  const quick = (w: number) => attempt(() => searchLaidOut(setup, fitRuns, w, quickStarts(starts)));
  const randomised = (why: string): WholePlotChoice => {
    const design = quick(fitRuns);
    if (!design) {
      throw new InputError(`even one whole plot per fitting run cannot support the model with ${fitRuns} fitting runs; use more runs or a smaller model`, {
        key: 'design.runs',
      });
    }
    return { design, setBy: why };
  };
  if (!judged) {
    const wanted = range ? fewestWholePlots(setup, fitRuns, MIN_WHOLE_PLOT_DF) : null;
    const design = wanted !== null && wanted <= range!.most ? quick(wanted) : null;
    if (design) return { design, setBy: `the fewest that leave ${MIN_WHOLE_PLOT_DF} whole-plot error degrees of freedom (precision cannot be judged)` };
    return randomised('one per fitting run: too few runs to leave error degrees of freedom in both strata of a split-plot plan');
  }
  if (range) {
    // Bisection on the hard-to-change factors' effects, whose power grows with the whole plots.
    const tried = new Map<number, LaidOutDesign | null>();
    const at = (w: number) => {
      if (!tried.has(w)) tried.set(w, quick(w));
      return tried.get(w)!;
    };
    let low = range.fewest - 1;
    let high = range.most + 1;
    while (high - low > 1) {
      const middle = Math.floor((low + high) / 2);
      const design = at(middle);
      if (design && hardEffectsMet(design, setup)) high = middle;
      else low = middle;
    }
    const design = high <= range.most ? at(high) : null;
    if (design?.precision.met) return { design, setBy: 'the fewest whole plots whose plan meets the precision target' };
  }
  return randomised('one per fitting run: no split-plot plan of this run count meets the precision target');
}

/**
 * The whole-plot counts of N fitting runs that make a true split-plot plan: from the fewest
 * whose layout fits the sessions and leaves one whole-plot error degree of freedom to the most
 * that leave one run-stratum degree of freedom (containment rule); null when there are none.
 * Outside that range the only sound choice is one whole plot per run (a single stratum).
 */
export function splitRange(setup: LaidOutSetup, fitRuns: number): { fewest: number; most: number } | null {
  const isWhole = wholePlotTerms(setup.primary, setup.hard);
  let fewest = 0;
  let most = 0;
  for (let w = 1; w < fitRuns; w++) {
    const strata = strataOf(setup, isWhole, fitRuns, w);
    if (!strata || strata.wholePlot < 1 || strata.subplot < 1) continue;
    if (fewest === 0) fewest = w;
    most = w;
  }
  return fewest === 0 ? null : { fewest, most };
}

/**
 * The fewest whole plots of N fitting runs whose layout fits the sessions and leaves at least
 * `df` whole-plot error degrees of freedom (N when none does).
 */
export function fewestWholePlots(setup: LaidOutSetup, fitRuns: number, df: number): number {
  const isWhole = wholePlotTerms(setup.primary, setup.hard);
  for (let w = 1; w <= fitRuns; w++) {
    const strata = strataOf(setup, isWhole, fitRuns, w);
    if (strata && strata.wholePlot >= df) return w;
  }
  return fitRuns;
}

function strataOf(setup: LaidOutSetup, isWhole: boolean[], fitRuns: number, wholePlots: number) {
  const layout = attempt(() => layoutOf(setup, fitRuns, wholePlots));
  if (!layout) return null;
  const { structure } = fittedStructure(layout, setup.varianceRatio);
  return containmentDf(isWhole, structure.wholePlotOf.length, structure.wholePlots, structure.sessions);
}

/** Whether every predicted effect of a hard-to-change factor reaches the target. */
function hardEffectsMet(design: LaidOutDesign, setup: LaidOutSetup): boolean {
  const ids = setup.primary.factorIds;
  const target = setup.target.power - 1e-12;
  return design.precision.factors.every((entry) => {
    const j = ids.indexOf(entry.factor);
    return j < 0 || !setup.hard[j] || (entry.power ?? 0) >= target;
  });
}

/** The result, or null when the layout or the search refuses this case (an InputError). */
function attempt<T>(run: () => T): T | null {
  try {
    return run();
  } catch (error) {
    if (error instanceof InputError) return null;
    throw error;
  }
}
