/**
 * How many fitting runs the campaign needs, and the optimal plan of that size: the stage
 * that joins the exact search (design/exactDesign.ts) to the precision target
 * (precision/designPrecision.ts).
 *
 * - `design.runs` a number: that many runs; the precision block says whether they suffice.
 * - `auto` with a judged response (one giving `noise`): the smallest N whose re-optimised plan
 *   meets the target for every required pair and interaction (precision/runCountSearch.ts),
 *   from the floor max(p, p + 1 − c) — the fewest runs that estimate the p primary terms and,
 *   with the c centre replicates, leave one residual degree of freedom — up to `design.maxRuns`
 *   (default 4p, `defaultMaxRuns`). Out of reach: the best plan found, and one sentence with
 *   its power and what would change it.
 * - `auto` without any `noise`: the rule of thumb of runCount.ts, and one sentence saying that
 *   precision cannot be judged.
 * Powers are computed on the fitted runs: the fitting runs plus the centre replicates.
 */
import { InputError } from '../inputError.js';
import type { CompiledModel } from '../model/modelMatrix.js';
import { subModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { findExactDesign, type ExactDesignResult } from '../design/exactDesign.js';
import { defaultRunCount } from '../design/runCount.js';
import type { Criterion, PrecisionTarget } from '../study.js';
import type { PredictedEffects } from '../precision/predictedEffects.js';
import { designPrecision, leastSquaresCovariance, type DesignPrecision } from '../precision/designPrecision.js';
import { smallestRunCount } from '../precision/runCountSearch.js';
import type { FactorPrecision, InteractionPrecision, PlanPrecision, RunCurvePoint } from '../precision/precisionTypes.js';

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
}

export interface CampaignSize {
  exact: ExactDesignResult;
  precision: PlanPrecision;
  runsNote: string;
}

interface Probe {
  exact: ExactDesignResult;
  precision: DesignPrecision;
}

export function sizeCampaign(request: CampaignSizeRequest): CampaignSize {
  const primary = subModel(request.model, request.primaryColumns);
  const p = primary.p;
  const c = request.centrePoints.length;
  const { effects, target } = request;
  const judged = effects.basis !== 'none';

  const probe = (runs: number, warm: Probe | null): Probe => {
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
  if (request.runs !== 'auto') {
    chosen = probe(request.runs, null);
    curve = [{ runs: request.runs, weakestPower: chosen.precision.weakestPower }];
    met = judged && chosen.precision.met;
    runsNote = `set by ${request.runsSetBy}`;
    statement = judged ? fixedStatement(request.runs, c, chosen.precision, target, request.runsSetBy) : noNoiseStatement(`${request.runs} fitting runs set by ${request.runsSetBy}`);
  } else if (!judged) {
    const rule = defaultRunCount(p, c);
    chosen = probe(rule.runs, null);
    curve = [{ runs: rule.runs, weakestPower: null }];
    met = false;
    runsNote = rule.note;
    statement = noNoiseStatement(`the rule of thumb p + max(3, ⌈p/4⌉) = ${rule.runs} fitting runs`);
  } else {
    const floor = Math.max(p, p + 1 - c);
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
    chosen = outcome.result;
    curve = outcome.curve;
    met = outcome.met;
    const fewer = curve.find((point) => point.runs === outcome.runs - 1);
    if (outcome.met) {
      runsNote =
        outcome.runs === floor
          ? `the fewest runs that estimate the ${p} model parameters already meet the precision target`
          : `the smallest run count whose re-optimised plan meets the precision target (${curve.length} run counts tried)`;
      statement = metStatement(outcome.runs, c, chosen.precision, target, fewer?.weakestPower ?? null, outcome.runs === floor);
    } else {
      runsNote = `the precision target is out of reach within ${cap} fitting runs${request.maxRuns === undefined ? ' (4p, the default of design.maxRuns)' : ' (design.maxRuns)'}; the plan with the best weakest power is kept`;
      statement = unreachableStatement(cap, chosen.precision, target, effects, request.maxRuns === undefined);
    }
  }

  const fitted = chosen.exact.points.length + c;
  return {
    exact: chosen.exact,
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
      residualDf: fitted - p,
    },
  };
}

function percent(power: number | null): string {
  return power === null ? 'cannot be tested' : `${(Math.floor(power * 1000) / 10).toFixed(1)} %`;
}

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
