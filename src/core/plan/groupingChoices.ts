/**
 * What the whole plots of a plan with hard-to-change factors cost and buy: the split-plot plan
 * side by side with the two other ways a lab could run the same campaign, each judged under
 * the error structure it really has (V = I + ηZZ', sessions as fixed blocks;
 * evaluate/structuredPrecision.ts, precision/designPrecision.ts):
 * - completely randomised: the D-optimal plan of the same size without whole plots, in a random
 *   order cut into sessions, the hard-to-change settings reset before every run;
 * - grouped then cut: the same randomised plan with its runs sorted into groups sharing the
 *   hard-to-change settings and the sequence cut into sessions (schedule/hardToChangeGrouping.ts
 *   and sessionPlan.ts). The groups are whole plots whether or not the plan says so, and a
 *   session that holds only some settings confounds them with the day;
 * - the split-plot plan itself.
 * One basis for every choice: resets = the whole plots of all the runs (centre and holdout
 * runs included) less the first set-up; cost = runs × perRun + resets × perLevelChange.cost,
 * hours likewise. Efficiency: (det X'V⁻¹X of the choice / det of the completely randomised
 * plan)^(1/p) over the fitted runs, session effects left out (metrics.gls.logDetPerRun).
 */
import type { PlanDocument } from './planDocument.js';
import type { LaidOutDesign, LaidOutSetup } from './laidOutDesign.js';
import { judgeLaidOut } from './laidOutDesign.js';
import type { CompiledModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import type { PredictedEffects } from '../precision/predictedEffects.js';
import type { PrecisionTarget } from '../study.js';
import type { ErrorStructure } from '../model/glsInformation.js';
import type { DesignPrecision } from '../precision/designPrecision.js';
import type { StructuredPrecision } from '../evaluate/structuredPrecision.js';
import { findExactDesign } from '../design/exactDesign.js';
import { createRandom } from '../random.js';
import { groupByHardToChange, orderWithCentresSpread, sameSetting, type GroupableRun } from '../schedule/hardToChangeGrouping.js';
import { cutIntoSessions, equalSessionSizes, sessionCountFor } from '../schedule/sessionPlan.js';
import { settingsFor } from '../design/settings.js';
import { wordList } from '../wordList.js';
import { quickStarts } from './wholePlotCount.js';
import { powerPercent } from '../precision/powerWording.js';
import { campaignCost } from '../compare/campaignCost.js';

export type GroupingName = 'randomised' | 'splitPlot' | 'groupedThenCut';

export interface GroupingChoice {
  plan: GroupingName;
  /** Every run: fitting, centre and holdout. */
  runs: number;
  /** Whole plots of all the runs, as the analysis must treat them. */
  wholePlots: number;
  /** Resets of the hard-to-change settings: whole plots less the first set-up. */
  resets: number;
  sessions: number;
  cost: number | null;
  hours: number | null;
  /** Lowest power over the predicted effects (null when precision cannot be judged). */
  weakestPower: number | null;
  /** Lowest power over the hard-to-change factors' effects. */
  hardFactorPower: number | null;
  /** Whole-plot error df of the containment rule (the run df when there is one stratum). */
  wholePlotDf: number;
  /** metrics.blocks.informationKept of this choice. */
  informationKept: number | null;
  /** D-efficiency against the completely randomised plan, GLS information (1 for that plan). */
  efficiency: number | null;
}

export interface SplitPlotSummary {
  /** Hard-to-change factors the plan varies. */
  hardToChange: string[];
  /** Whole plots of the fitting runs. */
  wholePlots: number;
  varianceRatio: number;
  /** How the whole-plot count was reached. */
  wholePlotsSetBy: string;
  /** How the results must be analysed, in one sentence. */
  analysis: string;
  choices: GroupingChoice[];
  /** What the grouping costs and saves, in one or two sentences. */
  statement: string;
}

export interface GroupingRequest {
  plan: PlanDocument;
  laid: LaidOutDesign;
  setBy: string | null;
  model: CompiledModel;
  primary: CompiledModel;
  primaryColumns: readonly number[];
  primaryLabels: readonly string[];
  prior: Float64Array | null;
  region: CandidateRegion;
  hard: readonly boolean[];
  effects: PredictedEffects;
  target: PrecisionTarget;
  seed: number;
  starts: number;
  centrePoints: readonly number[][];
}

export function compareGroupings(request: GroupingRequest): SplitPlotSummary {
  const { plan, laid } = request;
  const eta = laid.fitted.structure.varianceRatio;
  const factorIds = request.primary.factorIds;
  const hardIds = factorIds.filter((_, j) => request.hard[j]);
  const judge: Pick<LaidOutSetup, 'primary' | 'primaryLabels' | 'hard' | 'effects' | 'target'> = request;
  const sessionLabel = (plan.study.sessions?.label?.trim() || 'Session').toLowerCase();

  // The split-plot plan, as laid out.
  const fittedPoints = laid.fitted.slots.map((slot) => laid.slotPoints[slot]!);
  const splitPlot = choice('splitPlot', plan.runs.length, plotsOfAll(plan), laid.layout.sessions, laid.evaluation, laid.precision);

  // The completely randomised plan of the same size.
  const crd = findExactDesign({
    model: request.model,
    region: request.region,
    runs: laid.fitRuns,
    criterion: 'D',
    seed: request.seed,
    starts: quickStarts(request.starts),
    ...(request.prior ? { priorInformation: request.prior, primaryColumns: request.primaryColumns } : {}),
  });
  const holdouts = plan.runs.filter((run) => run.purpose === 'holdout');
  const levels = plan.levels;
  const crdRuns: GroupableRun[] = [
    ...crd.points.map((point, i) => groupable(`F${i}`, 'fit', point)),
    ...request.centrePoints.map((point, i) => groupable(`C${i}`, 'centre', point)),
    ...holdouts.map((run) => ({ point: run.point, purpose: run.purpose, settings: run.settings })),
  ];
  const codedOf = new Map<string, number[]>([
    ...crd.points.map((point, i) => [`F${i}`, point] as [string, number[]]),
    ...request.centrePoints.map((point, i) => [`C${i}`, point] as [string, number[]]),
  ]);
  const maxRuns = plan.study.sessions?.maxRuns;
  const rng = createRandom(request.seed);

  const randomOrder = orderWithCentresSpread(crdRuns, rng);
  const randomSizes = maxRuns !== undefined ? equalSessionSizes(randomOrder.length, sessionCountFor(randomOrder.length, maxRuns)) : [randomOrder.length];
  const randomised = judgeSequence('randomised', randomOrder, randomSizes, (run, index) => index);

  const groups = groupByHardToChange(crdRuns, hardIds, rng);
  const cut = maxRuns !== undefined ? cutIntoSessions(groups.map((group) => group.length), maxRuns) : { sizes: [crdRuns.length], splitGroups: 0 };
  const grouped = judgeSequence('groupedThenCut', groups.flat(), cut.sizes, null);

  const choices = [randomised, splitPlot, grouped];
  const base = randomised.logDet;
  const result = choices.map(({ logDet, ...entry }) => ({
    ...entry,
    efficiency: logDet === null || base === null ? null : Math.exp((logDet - base) / request.primary.p),
  }));
  const names = wordList(plan.levels.filter((level) => hardIds.includes(level.id)).map((level) => level.name));
  const analysis =
    `Analyse the results as a split-plot experiment: a model with a random effect for each whole plot` +
    (laid.layout.sessions > 1 ? ` and fixed ${sessionLabel} effects` : '') +
    `, fitted by REML, the ${names} effects tested against the whole-plot error (tierplan analyze does this).`;
  return {
    hardToChange: hardIds,
    wholePlots: laid.wholePlots ?? laid.fitRuns,
    varianceRatio: eta,
    wholePlotsSetBy: request.setBy ?? 'set by the study (design.wholePlots)',
    analysis,
    choices: result,
    statement: statement(result, names, plan.study.costs?.currency ?? null, sessionLabel),
  };

  function groupable(point: string, purpose: 'fit' | 'centre', coded: number[]): GroupableRun {
    const codedMap: Record<string, number> = {};
    factorIds.forEach((id, j) => {
      codedMap[id] = coded[j];
    });
    return { point, purpose, settings: settingsFor(codedMap, levels, plan.study.factors) };
  }

  /**
   * The structure a sequence cut into sessions really has: with `unit` null, consecutive runs
   * sharing the hard-to-change settings inside a session form a whole plot; otherwise each run
   * is its own whole plot.
   */
  function judgeSequence(name: GroupingName, sequence: GroupableRun[], sizes: number[], unit: ((run: GroupableRun, index: number) => number) | null) {
    const sessionOf: number[] = [];
    sizes.forEach((size, s) => {
      for (let i = 0; i < size; i++) sessionOf.push(s);
    });
    const plotOf: number[] = [];
    sequence.forEach((run, index) => {
      if (unit !== null || index === 0) {
        plotOf.push(index === 0 ? 0 : plotOf[index - 1] + 1);
        return;
      }
      const before = sequence[index - 1];
      const same = sessionOf[index] === sessionOf[index - 1] && hardIds.every((id) => sameSetting(run.settings[id], before.settings[id]));
      plotOf.push(same ? plotOf[index - 1] : plotOf[index - 1] + 1);
    });
    const fittedIndex = sequence.map((run, i) => i).filter((i) => sequence[i].purpose !== 'holdout');
    const structure = renumbered(
      fittedIndex.map((i) => plotOf[i]),
      fittedIndex.map((i) => sessionOf[i]),
      eta,
    );
    const points = fittedIndex.map((i) => codedOf.get(sequence[i].point)!);
    const { evaluation, precision } = judgeLaidOut(judge, points, structure);
    return choice(name, sequence.length, plotOf[plotOf.length - 1] + 1, sizes.filter((size) => size > 0).length, evaluation, precision);
  }

  function choice(name: GroupingName, runs: number, wholePlots: number, sessions: number, evaluation: StructuredPrecision, precision: DesignPrecision) {
    const costs = plan.study.costs;
    const resets = Math.max(0, wholePlots - 1);
    const hardPowers = precision.factors.filter((entry) => hardIds.includes(entry.factor)).map((entry) => entry.power ?? 0);
    return {
      plan: name,
      runs,
      wholePlots,
      resets,
      sessions,
      ...campaignCost(runs, resets, costs),
      weakestPower: precision.weakestPower,
      hardFactorPower: hardPowers.length > 0 ? Math.min(...hardPowers) : null,
      wholePlotDf: evaluation.df.wholePlot,
      informationKept: evaluation.blocks.informationKept,
      logDet: evaluation.gls.logDetPerRun,
    };
  }
}

/** Whole plots of all the runs of a laid-out plan (fitted and holdout). */
function plotsOfAll(plan: PlanDocument): number {
  return new Set(plan.runs.map((run) => run.wholePlot ?? run.point)).size;
}

/** An error structure from per-run whole-plot and session labels, renumbered from 0. */
function renumbered(plots: number[], sessions: number[], varianceRatio: number): ErrorStructure {
  const plotIndex = new Map<number, number>();
  const sessionIndex = new Map<number, number>();
  const sessionOfPlot: number[] = [];
  const wholePlotOf = Int32Array.from(plots, (w, i) => {
    if (!plotIndex.has(w)) {
      plotIndex.set(w, plotIndex.size);
      if (!sessionIndex.has(sessions[i])) sessionIndex.set(sessions[i], sessionIndex.size);
      sessionOfPlot.push(sessionIndex.get(sessions[i])!);
    }
    return plotIndex.get(w)!;
  });
  return { wholePlotOf, sessionOfWholePlot: Int32Array.from(sessionOfPlot), wholePlots: plotIndex.size, sessions: Math.max(1, sessionIndex.size), varianceRatio };
}

function percent(value: number | null): string {
  return value === null ? 'not judged' : powerPercent(value);
}

function statement(choices: GroupingChoice[], names: string, currency: string | null, sessionLabel: string): string {
  const [randomised, splitPlot, grouped] = choices;
  const money = (a: GroupingChoice, b: GroupingChoice) =>
    a.cost !== null && b.cost !== null && currency ? ` (${Math.round(Math.abs(b.cost - a.cost))} ${currency} ${b.cost >= a.cost ? 'less' : 'more'})` : '';
  const kept = grouped.informationKept;
  const groupedText =
    kept !== null && kept < 0.999
      ? `; grouping the randomised plan's runs by ${names} and cutting them into ${sessionLabel}s would need ${grouped.resets} resets but keeps only ${percent(kept)} of the information after the ${sessionLabel} effects, ` +
        `and the ${names} effects reach ${percent(grouped.hardFactorPower)} power`
      : `; grouping the randomised plan's runs by ${names} after the fact would need ${grouped.resets} resets and leaves ${grouped.wholePlotDf} whole-plot error degree${grouped.wholePlotDf === 1 ? '' : 's'} of freedom, ` +
        `so the ${names} effects reach ${percent(grouped.hardFactorPower)} power`;
  return (
    `The split-plot plan resets ${names} ${splitPlot.resets} times against ${randomised.resets} for a completely randomised plan of the same runs${money(splitPlot, randomised)}, ` +
    `with the weakest predicted effect at ${percent(splitPlot.weakestPower)} power against ${percent(randomised.weakestPower)}` +
    `${groupedText}.`
  );
}
