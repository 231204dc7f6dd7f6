/**
 * How many fitting runs the campaign needs, and the optimal plan of that size: the stage
 * that joins the exact search (design/exactDesign.ts) to the precision target
 * (precision/designPrecision.ts).
 *
 * - `design.runs` a number: that many runs; the precision block says whether they suffice.
 * - `auto` with a judged response (one giving `noise`): the smallest N whose re-optimised plan
 *   meets the target for every required pair and interaction (precision/runCountSearch.ts),
 *   from the floor max(p, p + 1 − c) — the fewest runs that estimate the p primary terms and,
 *   with the c centre replicates, leave one residual degree of freedom (after the session
 *   effects too, in a plan laid out in sessions) — up to `design.maxRuns`
 *   (default 4p, `defaultMaxRuns`). Out of reach: the best plan found, and one sentence with
 *   its power and what would change it.
 * - `auto` without any `noise`: the rule of thumb of runCount.ts, and one sentence saying that
 *   precision cannot be judged.
 * Powers are computed on the fitted runs: the fitting runs plus the centre replicates.
 *
 * Laid out (`laidOut`: a varied factor is hard to change, or the runs fill more than one
 * session): each probe is a plan laid out in whole plots and sessions, its whole-plot count
 * chosen by wholePlotCount.ts, searched with the structured criterion and judged under the
 * same structure (plan/laidOutDesign.ts) with a share of the starts; the chosen run count is
 * then searched again with every start. The I-criterion is not available for laid-out plans:
 * they are D-optimal for the structured model (the caller warns).
 */
import { InputError } from '../inputError.js';
import type { CompiledModel } from '../model/modelMatrix.js';
import { subModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { findExactDesign, type ExactDesignResult } from '../design/exactDesign.js';
import { defaultRunCount } from '../design/runCount.js';
import type { CostSettings, Criterion, PrecisionTarget } from '../study.js';
import type { PredictedEffects } from '../precision/predictedEffects.js';
import { designPrecision, leastSquaresCovariance, type DesignPrecision } from '../precision/designPrecision.js';
import { smallestRunCount } from '../precision/runCountSearch.js';
import type { FactorPrecision, InteractionPrecision, PlanPrecision, RunCurvePoint } from '../precision/precisionTypes.js';
import { subMatrix } from '../model/modelMatrix.js';
import { powerPercent } from '../precision/powerWording.js';
import { dEfficiency, iCriterion, logDetPerRun } from '../evaluate/designCriteria.js';
import { layoutOf, searchLaidOut, type LaidOutDesign, type LaidOutSetup } from './laidOutDesign.js';
import { chooseWholePlots, fewestWholePlots, laidOutCost, MAX_EXTRA_RUNS, quickStarts, resetValue } from './wholePlotCount.js';

/** Default cap on the fitting runs `auto` may choose: four runs per primary parameter (our choice). */
export function defaultMaxRuns(p: number): number {
  return 4 * p;
}

export interface CampaignSizeRequest {
  /** Primary and potential terms; the primary ones are `primaryColumns`. */
  model: CompiledModel;
  primaryColumns: readonly number[];
  /** Labels of the primary terms, intercept first. */
  primaryLabels: readonly string[];
  priorInformation: Float64Array | null;
  region: CandidateRegion;
  moments: Float64Array;
  criterion: Criterion;
  seed: number;
  starts: number;
  runs: number | 'auto';
  maxRuns?: number;
  /** Coded centre replicates (fitted with the fitting runs). */
  centrePoints: readonly number[][];
  effects: PredictedEffects;
  target: PrecisionTarget;
  /** Where a fixed run count came from, for the note. */
  runsSetBy: string;
  onProgress?: (message: string) => void;
  onSearchProgress?: (done: number, total: number) => void;
  /** Whole plots and sessions: the plan is laid out and searched with the structured criterion. */
  laidOut?: { setup: LaidOutSetup; wholePlots: number | 'auto'; anyHard: boolean; costs?: CostSettings };
}

export interface CampaignSize {
  exact: ExactDesignResult;
  precision: PlanPrecision;
  runsNote: string;
  /** The laid-out plan and how its whole-plot count was reached, when `laidOut` was given. */
  laid?: { design: LaidOutDesign; wholePlotsSetBy: string | null };
}

interface Probe {
  exact: ExactDesignResult;
  precision: DesignPrecision;
  laid?: LaidOutDesign;
  setBy?: string | null;
}

export function sizeCampaign(request: CampaignSizeRequest): CampaignSize {
  const primary = subModel(request.model, request.primaryColumns);
  const p = primary.p;
  const c = request.centrePoints.length;
  const { effects, target } = request;
  const judged = effects.basis !== 'none';

  const laidProbe = (runs: number): Probe => {
    const laidOut = request.laidOut!;
    request.onProgress?.(`searching ${runs}-run plans laid out in whole plots and sessions (${quickStarts(request.starts)} starts each)`);
    if (!laidOut.anyHard) {
      const design = searchLaidOut(laidOut.setup, runs, undefined, quickStarts(request.starts));
      return { exact: exactOf(design), precision: design.precision, laid: design, setBy: null };
    }
    const choice = chooseWholePlots(laidOut.setup, runs, laidOut.wholePlots, judged, request.starts);
    return { exact: exactOf(choice.design), precision: choice.design.precision, laid: choice.design, setBy: choice.setBy };
  };
  const exactOf = (design: LaidOutDesign): ExactDesignResult => {
    const primaryMoments = subMatrix(request.moments, request.model.p, request.primaryColumns);
    const perRun = logDetPerRun(primary, design.fitPoints);
    return {
      points: design.fitPoints,
      logDetPerRun: perRun,
      searchLogDetPerRun: design.logDet - design.size * Math.log(design.fitted.slots.length),
      searchICriterion: Number.NaN,
      dEfficiency: dEfficiency(primary, design.fitPoints),
      iCriterion: iCriterion(primary, design.fitPoints, primaryMoments),
      perStart: design.perStart,
      algorithm: 'coordinate exchange with whole-plot and within-plot moves (Jones & Goos, 2007), D-optimal for the GLS information adjusted for the sessions',
    };
  };

  const probe = (runs: number, warm: Probe | null): Probe => {
    if (request.laidOut) return laidProbe(runs);
    request.onProgress?.(`searching for a ${request.criterion}-optimal ${runs}-run plan (${request.starts} starts)`);
    const exact = findExactDesign({
      model: request.model,
      region: request.region,
      runs,
      criterion: request.criterion,
      seed: request.seed,
      starts: request.starts,
      moments: request.moments,
      ...(request.priorInformation ? { priorInformation: request.priorInformation, primaryColumns: request.primaryColumns } : {}),
      ...(warm ? { warmStart: warm.exact.points } : {}),
      onProgress: request.onSearchProgress,
    });
    const fitted = [...exact.points, ...request.centrePoints];
    const { covariance, residualDf } = leastSquaresCovariance(primary, fitted);
    const precision = designPrecision({
      model: primary,
      termLabels: request.primaryLabels,
      covariance,
      residualDf,
      effects,
      alpha: target.alpha,
      power: target.power,
      fittedRuns: fitted.length,
    });
    return { exact, precision };
  };

  let chosen: Probe;
  let curve: RunCurvePoint[];
  let met: boolean;
  let statement: string;
  let runsNote: string;
  /**
   * A laid-out probe searched again with every start; the quick plan stays when it was better
   * or when only it meets the target (the search maximises D, not the weakest power).
   */
  const finish = (quick: Probe): Probe => {
    if (!quick.laid) return quick;
    request.onProgress?.(`searching the ${quick.laid.fitRuns}-run plan again with all ${request.starts} starts`);
    const full = searchLaidOut(request.laidOut!.setup, quick.laid.fitRuns, quick.laid.wholePlots, request.starts, request.onSearchProgress);
    const better = full.logDet > quick.laid.logDet && (full.precision.met || !quick.precision.met);
    return better ? { ...quick, exact: exactOf(full), precision: full.precision, laid: full } : quick;
  };

  if (request.runs !== 'auto') {
    chosen = finish(probe(request.runs, null));
    curve = [{ runs: request.runs, weakestPower: chosen.precision.weakestPower }];
    met = judged && chosen.precision.met;
    runsNote = `set by ${request.runsSetBy}`;
    statement = judged ? fixedStatement(request.runs, c, chosen.precision, target, request.runsSetBy) : noNoiseStatement(`${request.runs} fitting runs set by ${request.runsSetBy}`);
  } else if (!judged) {
    const rule = defaultRunCount(p, c);
    chosen = finish(probe(rule.runs, null));
    curve = [{ runs: rule.runs, weakestPower: null }];
    met = false;
    runsNote = rule.note;
    statement = noNoiseStatement(`the rule of thumb p + max(3, ⌈p/4⌉) = ${rule.runs} fitting runs`);
  } else {
    const fixedPlots = request.laidOut?.anyHard && request.laidOut.wholePlots !== 'auto' ? request.laidOut.wholePlots : 0;
    let floor = Math.max(p, p + 1 - c, fixedPlots);
    // Sessions take a degree of freedom each beyond the first: the floor leaves one residual df after them too.
    if (request.laidOut) {
      while (floor + c - p - (layoutOf(request.laidOut.setup, floor, undefined).sessions - 1) < 1) floor++;
    }
    const cap = request.maxRuns ?? defaultMaxRuns(p);
    if (cap < floor) {
      throw new InputError(`maxRuns ${cap} is below the ${floor} fitting runs needed to estimate the ${p} model parameters`, { key: 'design.maxRuns' });
    }
    const outcome = smallestRunCount<Probe>({
      floor,
      cap,
      probe: (runs, warm) => {
        const result = probe(runs, warm);
        return { result, weakestPower: result.precision.weakestPower, met: result.precision.met, shortfall: result.precision.shortfall };
      },
    });
    chosen = finish(outcome.result);
    curve = outcome.curve;
    met = outcome.met;
    let chosenRuns = outcome.runs;
    if (chosen.laid && outcome.met && outcome.runs > floor) {
      // Laid-out probes used a share of the starts: one run fewer is searched again with all of
      // them before the plan claims that it falls short.
      const fewerPlan = finish(probe(outcome.runs - 1, null));
      if (fewerPlan.precision.met) {
        chosen = fewerPlan;
        chosenRuns = outcome.runs - 1;
      }
      curve = curve.map((point) => (point.runs === outcome.runs - 1 ? { runs: point.runs, weakestPower: fewerPlan.precision.weakestPower } : point));
    }
    curve = curve.map((point) => (point.runs === chosenRuns ? { runs: point.runs, weakestPower: chosen.precision.weakestPower } : point));
    const fewer = curve.find((point) => point.runs === chosenRuns - 1);
    const cheaper = outcome.met ? cheaperWithMoreRuns(chosen, chosenRuns, cap) : null;
    if (cheaper) {
      const fewestRuns = chosenRuns;
      curve = [...curve.filter((point) => point.runs !== cheaper.probe.laid!.fitRuns), { runs: cheaper.probe.laid!.fitRuns, weakestPower: cheaper.probe.precision.weakestPower }].sort((a, b) => a.runs - b.runs);
      chosen = cheaper.probe;
      chosenRuns = cheaper.probe.laid!.fitRuns;
      runsNote = `the cheapest plan found that meets the precision target: ${chosenRuns} fitting runs in ${chosen.laid!.wholePlots} whole plots cost less than the fewest that meet it, ${fewestRuns} runs in ${cheaper.fewestPlots} whole plots`;
      statement =
        `Every effect the sensitivity analysis predicts is detected with ${targetText(target)} by ${chosenRuns} fitting runs in ${chosen.laid!.wholePlots} whole plots plus ${c} centre replicate${c === 1 ? '' : 's'} ` +
        `(weakest: ${chosen.precision.weakest ? entryName(chosen.precision.weakest) : '–'}, ${percent(chosen.precision.weakestPower)}); ` +
        `${fewestRuns} runs would do, but only in ${cheaper.fewestPlots} whole plots, and their resets cost ${Math.round(cheaper.saving)} ${request.laidOut!.costs!.currency} more than the ${chosenRuns - fewestRuns} extra run${chosenRuns - fewestRuns === 1 ? '' : 's'} do.`;
    } else if (outcome.met) {
      runsNote =
        chosenRuns === floor
          ? `the fewest runs that estimate the ${p} model parameters already meet the precision target`
          : `the smallest run count whose re-optimised plan meets the precision target (${curve.length} run counts tried)`;
      statement = metStatement(chosenRuns, c, chosen.precision, target, fewer?.weakestPower ?? null, chosenRuns === floor);
    } else {
      runsNote = `the precision target is out of reach within ${cap} fitting runs${request.maxRuns === undefined ? ' (4p, the default of design.maxRuns)' : ' (design.maxRuns)'}; the plan with the best weakest power is kept`;
      statement = unreachableStatement(cap, chosen.precision, target, effects, request.maxRuns === undefined);
    }
  }

  const fitted = chosen.exact.points.length + c;
  const df = chosen.laid?.evaluation.df;

  /**
   * With reset costs: the cheapest plan meeting the target over the fewest runs and up to
   * MAX_EXTRA_RUNS more (wholePlotCount.ts), stopping once the extra runs alone cost more than
   * every reset fewer plots could save.
   */
  function cheaperWithMoreRuns(best: Probe, runs: number, cap: number): { probe: Probe; saving: number; fewestPlots: number } | null {
    const laidOut = request.laidOut;
    const costs = laidOut?.costs;
    const value = resetValue(costs);
    if (!laidOut?.anyHard || laidOut.wholePlots !== 'auto' || !costs || value === null || !best.laid || value <= 0) return null;
    const bestCost = laidOutCost(best.laid, costs, value);
    let found: { probe: Probe; cost: number } | null = null;
    for (let extra = 1; extra <= MAX_EXTRA_RUNS && runs + extra <= cap; extra++) {
      const fewest = fewestWholePlots(laidOut.setup, runs + extra, 1);
      // No plan of this size can cost less than its runs and the resets of the fewest whole plots.
      const otherPlots = best.laid.layout.wholePlots - (best.laid.wholePlots ?? runs);
      const floorCost = (best.laid.layout.roles.length + extra) * costs.perRun + Math.max(0, otherPlots + fewest - 1) * value;
      if (floorCost >= (found?.cost ?? bestCost)) break;
      const candidate = probe(runs + extra, null);
      if (!candidate.precision.met) continue;
      const cost = laidOutCost(candidate.laid!, costs, value);
      if (cost < (found?.cost ?? bestCost)) found = { probe: candidate, cost };
    }
    if (!found) return null;
    const finished = finish(found.probe);
    if (!finished.precision.met) return null;
    return { probe: finished, saving: bestCost - laidOutCost(finished.laid!, costs, value), fewestPlots: best.laid.wholePlots ?? runs };
  }
  return {
    exact: chosen.exact,
    ...(chosen.laid ? { laid: { design: chosen.laid, wholePlotsSetBy: chosen.setBy ?? null } } : {}),
    runsNote,
    precision: {
      power: target.power,
      alpha: target.alpha,
      met,
      basis: effects.basis,
      factors: judged ? chosen.precision.factors : [],
      interactions: judged ? chosen.precision.interactions : [],
      weakest: judged ? chosen.precision.weakest : null,
      runCurve: curve,
      fixed: effects.fixed.map((entry) => ({ factor: entry.factor, response: entry.response, largestEffectInNoise: entry.largestEffectInNoise })),
      statement,
      // Not judged at all: the statement's one sentence says it; per-response notes would repeat it.
      notes: judged ? effects.notes : [],
      fittedRuns: fitted,
      residualDf: df ? df.subplot : fitted - p,
      ...(df?.split ? { wholePlotDf: df.wholePlot } : {}),
    },
  };
}

const percent = powerPercent;

function targetText(target: PrecisionTarget): string {
  return `at least ${Math.round(target.power * 100)} % power (α = ${target.alpha})`;
}

function entryName(entry: FactorPrecision | InteractionPrecision): string {
  return 'factor' in entry ? `${entry.factor} on ${entry.response}` : `${entry.factors[0]}×${entry.factors[1]} on ${entry.response}`;
}

function noNoiseStatement(how: string): string {
  return `No response gives noise (the standard deviation of one lab result), so precision cannot be judged: the plan uses ${how}.`;
}

function metStatement(runs: number, c: number, precision: DesignPrecision, target: PrecisionTarget, fewer: number | null, atFloor: boolean): string {
  const base = `Every effect the sensitivity analysis predicts is detected with ${targetText(target)} by ${runs} fitting runs plus ${c} centre replicate${c === 1 ? '' : 's'} (weakest: ${precision.weakest ? entryName(precision.weakest) : '–'}, ${percent(precision.weakestPower)})`;
  if (atFloor) return `${base}; no smaller plan can estimate the model.`;
  return `${base}; with one run fewer, re-optimised, the weakest falls to ${percent(fewer)}.`;
}

function fixedStatement(runs: number, c: number, precision: DesignPrecision, target: PrecisionTarget, setBy: string): string {
  if (precision.met) {
    return `The ${runs} fitting runs set by ${setBy} (plus ${c} centre replicates) detect every predicted effect with ${targetText(target)}; the weakest, ${precision.weakest ? entryName(precision.weakest) : '–'}, reaches ${percent(precision.weakestPower)}.`;
  }
  return `The ${runs} fitting runs set by ${setBy} fall short of ${targetText(target)}: the weakest effect, ${precision.weakest ? entryName(precision.weakest) : '–'}, reaches ${percent(precision.weakestPower)}; runs: auto finds the run count that meets the target.`;
}

function unreachableStatement(cap: number, precision: DesignPrecision, target: PrecisionTarget, effects: PredictedEffects, defaultCap: boolean): string {
  const weakest = precision.weakest;
  const capText = `${cap} fitting runs${defaultCap ? ' (the default cap, 4p)' : ' (design.maxRuns)'}`;
  if (!weakest || weakest.power === null) {
    const what = weakest ? entryName(weakest) : 'an effect';
    return `The target of ${targetText(target)} cannot be met: ${what} cannot be tested with this model (it has no main effect of that factor); add the main effect to the model.`;
  }
  const noise = 'factor' in weakest
    ? effects.factors.find((e) => e.factor === weakest.factor && e.response === weakest.response)?.noise
    : effects.interactions.find((e) => e.factors[0] === weakest.factors[0] && e.factors[1] === weakest.factors[1] && e.response === weakest.response)?.noise;
  const needed = noise !== undefined && Number.isFinite(precision.shortfall) ? noise / Math.sqrt(precision.shortfall) : null;
  const assay = needed !== null ? `a more repeatable ${weakest.response} result (noise about ${round(needed)} instead of ${round(noise!)})` : `a more repeatable ${weakest.response} result`;
  const factor = 'factor' in weakest ? weakest.factor : weakest.factors.join(' and ');
  return (
    `The target of ${targetText(target)} is out of reach within ${capText}: the weakest effect, ${entryName(weakest)}, reaches ${percent(weakest.power)} at best; ` +
    `${assay}, fewer model terms, more levels of ${factor} or a larger design.maxRuns would change that.`
  );
}

function round(value: number): string {
  return String(Number(value.toPrecision(2)));
}
