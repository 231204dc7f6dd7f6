/**
 * Comparison at equal precision: how many runs each classical plan needs to see every
 * effect the analysis predicts with the same power as the proposed plan's target, on the
 * same model and the same predicted effects — or that it cannot, and why.
 *
 * Each family grows the way it is used in practice: the factorial, fractional,
 * Plackett–Burman, central composite and Box–Behnken plans by whole replicates of their
 * non-centre runs and by added centre runs; the full grid of planned levels by whole
 * replicates. For each replicate count r = 1…MAX_REPLICATES the fewest added centre runs
 * m = 0…MAX_ADDED_CENTRES that meet the target is found; the plan needs the smallest total.
 * Information is additive over runs, M(r, m) = r·M_core + (c + m)·f(0)f(0)', so no plan is
 * rebuilt. Power is the same joint test as the proposed plan's (designPrecision.ts), on all
 * the runs of the plan (a comparator has no holdout runs).
 * A plan that cannot estimate the model, or whose runs break the study's constraints or
 * equipment limits, cannot reach the precision (runs null, with the reason).
 */
import type { CompiledModel } from '../model/modelMatrix.js';
import { modelMatrix } from '../model/modelMatrix.js';
import { crossProduct } from '../linalg/crossProduct.js';
import type { PredictedEffects } from '../precision/predictedEffects.js';
import { designPrecision, informationCovariance } from '../precision/designPrecision.js';
import type { ComparatorId } from './comparisonTypes.js';

export const MAX_REPLICATES = 20;
export const MAX_ADDED_CENTRES = 20;

export interface EqualPrecisionCandidate {
  id: ComparatorId;
  /** Every run of the plan as built, coded; null when it was not built. */
  points: number[][] | null;
  /** Why it was not built, or why it cannot estimate the model. */
  cannot?: string;
  /** The plan can take added centre runs (false for the full grid). */
  addCentres: boolean;
  offLimitsRuns: number;
}

export interface EqualPrecisionEntry {
  plan: ComparatorId;
  /** Runs needed to meet the target (all fitted), or null when it cannot. */
  runs: number | null;
  /** Weakest power at `runs`, or at the plan as built when it cannot. */
  weakestPower: number | null;
  /** Why it cannot (addition). */
  reason?: string;
  /** How it gets there: whole replicates of its non-centre runs and added centre runs (addition). */
  replicates?: number;
  addedCentreRuns?: number;
}

export interface EqualPrecisionRequest {
  model: CompiledModel;
  termLabels: readonly string[];
  effects: Pick<PredictedEffects, 'factors' | 'interactions'>;
  power: number;
  alpha: number;
  candidates: readonly EqualPrecisionCandidate[];
}

export function equalPrecision(request: EqualPrecisionRequest): EqualPrecisionEntry[] {
  return request.candidates.map((candidate) => entryFor(request, candidate));
}

function entryFor(request: EqualPrecisionRequest, candidate: EqualPrecisionCandidate): EqualPrecisionEntry {
  const { model } = request;
  const { p } = model;
  const plan = candidate.id;
  if (candidate.points === null || candidate.cannot) return { plan, runs: null, weakestPower: null, reason: candidate.cannot ?? 'not built' };
  const isCentre = (x: number[]) => candidate.addCentres && x.every((value) => value === 0);
  const core = candidate.points.filter((x) => !isCentre(x));
  const centres = candidate.points.length - core.length;
  const coreInformation = crossProduct(modelMatrix(model, core), core.length, p);
  const centreRow = modelMatrix(model, [new Array<number>(model.factorIds.length).fill(0)]);
  const centreInformation = crossProduct(centreRow, 1, p);
  const evaluate = (r: number, m: number) => {
    const M = new Float64Array(p * p);
    for (let i = 0; i < p * p; i++) M[i] = r * coreInformation[i] + (centres + m) * centreInformation[i];
    const n = r * core.length + centres + m;
    const { covariance, residualDf } = informationCovariance(M, p, n);
    return designPrecision({ model, termLabels: request.termLabels, covariance, residualDf, effects: request.effects, alpha: request.alpha, power: request.power });
  };
  if (candidate.offLimitsRuns > 0) {
    const asBuilt = evaluate(1, 0);
    const count = candidate.offLimitsRuns;
    return {
      plan,
      runs: null,
      weakestPower: asBuilt.weakestPower,
      reason: `${count} of its ${candidate.points.length} runs ${count === 1 ? 'breaks' : 'break'} the study's constraints or equipment limits, so it cannot be run as listed`,
    };
  }
  let best: { runs: number; r: number; m: number; weakest: number | null } | null = null;
  for (let r = 1; r <= MAX_REPLICATES; r++) {
    const base = r * core.length + centres;
    if (best && base >= best.runs) break;
    const limit = candidate.addCentres ? MAX_ADDED_CENTRES : 0;
    for (let m = 0; m <= limit; m++) {
      if (best && base + m >= best.runs) break;
      const result = evaluate(r, m);
      if (result.met) {
        best = { runs: base + m, r, m, weakest: result.weakestPower };
        break;
      }
    }
  }
  if (best) return { plan, runs: best.runs, weakestPower: best.weakest, replicates: best.r, addedCentreRuns: best.m };
  const largest = evaluate(MAX_REPLICATES, candidate.addCentres ? MAX_ADDED_CENTRES : 0);
  return {
    plan,
    runs: null,
    weakestPower: largest.weakestPower,
    reason:
      `even ${MAX_REPLICATES} replicates${candidate.addCentres ? ` and ${MAX_ADDED_CENTRES} added centre runs` : ''} ` +
      `(${MAX_REPLICATES * core.length + centres + (candidate.addCentres ? MAX_ADDED_CENTRES : 0)} runs) fall short of the target`,
  };
}
