/**
 * One campaign laid out in whole plots and sessions, searched and judged: the probe the run
 * count and the whole-plot count are chosen with when a varied factor is hard to change or the
 * runs fill more than one session.
 *
 * Steps, for N fitting runs in W whole plots (W undefined: no factor is hard to change):
 * 1. the layout (design/runLayout.ts): fitting whole plots, centre replicates and holdouts as
 *    whole plots of their own, packed into the fewest sessions of at most `maxRuns` runs;
 * 2. the structured D-optimal search (design/structuredExchange.ts) over the fitted runs
 *    (fitting runs and centre replicates, the replicates fixed at the centre), with the
 *    potential-term prior;
 * 3. the precision of the primary model under the same structure
 *    (evaluate/structuredPrecision.ts: GLS covariance in noise² units, containment df per
 *    term) and the powers of the predicted effects (precision/designPrecision.ts).
 * The holdout slots stay empty here: the holdouts are chosen after the search, away from the
 * fitted points (design/holdoutRuns.ts), and each is a whole plot of its own.
 */
import { layoutRuns, fittedStructure, type FittedStructure, type RunLayout } from '../design/runLayout.js';
import { findStructuredDesign, informationSize } from '../design/structuredExchange.js';
import { structuredPrecision, type StructuredPrecision } from '../evaluate/structuredPrecision.js';
import { designPrecision, type DesignPrecision } from '../precision/designPrecision.js';
import type { CompiledModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import type { PredictedEffects } from '../precision/predictedEffects.js';
import type { PrecisionTarget } from '../study.js';
import type { ErrorStructure } from '../model/glsInformation.js';

export interface LaidOutSetup {
  /** Primary and potential terms (primary first). */
  model: CompiledModel;
  /** The primary (fitted) model. */
  primary: CompiledModel;
  primaryLabels: readonly string[];
  /** Potential-term prior over `model` (P × P), or null. */
  prior: Float64Array | null;
  region: CandidateRegion;
  /** Per design factor: hard to change. */
  hard: readonly boolean[];
  varianceRatio: number;
  /** sessions.maxRuns, or undefined for one session. */
  maxRuns?: number;
  /** Coded centre point and how many replicates. */
  centre: readonly number[];
  centreRuns: number;
  /** Holdout runs for N fitting runs. */
  holdouts: (fitRuns: number) => number;
  effects: PredictedEffects;
  target: PrecisionTarget;
  seed: number;
}

export interface LaidOutDesign {
  fitRuns: number;
  /** Whole plots of the fitting runs; undefined when no factor is hard to change. */
  wholePlots: number | undefined;
  layout: RunLayout;
  fitted: FittedStructure;
  /** Coded point of each layout slot; null for a holdout slot (chosen later). */
  slotPoints: (number[] | null)[];
  /** The fitting runs' points, in layout order. */
  fitPoints: number[][];
  /** The searched criterion: ln det of the session-adjusted GLS information with the prior. */
  logDet: number;
  /** Size of that information (p, or p − 1 when the sessions absorb the intercept). */
  size: number;
  perStart: number[];
  evaluation: StructuredPrecision;
  precision: DesignPrecision;
  starts: number;
}

/** Lays out, searches and judges N fitting runs in W whole plots with the given starts. */
export function searchLaidOut(
  setup: LaidOutSetup,
  fitRuns: number,
  wholePlots: number | undefined,
  starts: number,
  onProgress?: (done: number, total: number) => void,
): LaidOutDesign {
  const layout = layoutOf(setup, fitRuns, wholePlots);
  const fitted = fittedStructure(layout, setup.varianceRatio);
  const fixed = fitted.slots.map((slot) => (layout.roles[slot] === 'centre' ? [...setup.centre] : null));
  const size = informationSize(setup.model.p, fitted.structure);
  const result = findStructuredDesign({
    model: setup.model,
    region: setup.region,
    structure: fitted.structure,
    fixed,
    hard: setup.hard,
    ...(setup.prior ? { prior: priorFor(setup.prior, setup.model.p, size) } : {}),
    seed: setup.seed,
    starts,
    onProgress,
  });
  const slotPoints: (number[] | null)[] = layout.roles.map(() => null);
  fitted.slots.forEach((slot, i) => {
    slotPoints[slot] = result.points[i];
  });
  const fitPoints = fitted.slots.filter((slot) => layout.roles[slot] === 'fit').map((slot) => slotPoints[slot]!);
  const judged = judgeLaidOut(setup, result.points, fitted.structure);
  return {
    fitRuns,
    wholePlots,
    layout,
    fitted,
    slotPoints,
    fitPoints,
    logDet: result.logDet,
    size,
    perStart: result.perStart,
    ...judged,
    starts,
  };
}

/** The layout alone (cheap): for the whole-plot count rule. */
export function layoutOf(setup: Pick<LaidOutSetup, 'centreRuns' | 'holdouts' | 'maxRuns'>, fitRuns: number, wholePlots: number | undefined): RunLayout {
  return layoutRuns({
    fitRuns,
    centreRuns: setup.centreRuns,
    holdoutRuns: setup.holdouts(fitRuns),
    ...(setup.maxRuns !== undefined ? { maxRuns: setup.maxRuns } : {}),
    ...(wholePlots !== undefined ? { wholePlots } : {}),
  });
}

/** Precision of the primary model on fitted points under a structure. */
export function judgeLaidOut(
  setup: Pick<LaidOutSetup, 'primary' | 'primaryLabels' | 'hard' | 'effects' | 'target'>,
  fittedPoints: readonly ArrayLike<number>[],
  structure: ErrorStructure,
): { evaluation: StructuredPrecision; precision: DesignPrecision } {
  const evaluation = structuredPrecision(setup.primary, fittedPoints, structure, setup.hard);
  const precision = designPrecision({
    model: setup.primary,
    termLabels: setup.primaryLabels,
    covariance: evaluation.covariance,
    residualDf: evaluation.df.subplot,
    termDf: evaluation.df.perTerm,
    effects: setup.effects,
    alpha: setup.target.alpha,
    power: setup.target.power,
    fittedRuns: fittedPoints.length,
  });
  return { evaluation, precision };
}

/** The prior over the terms the session-adjusted information keeps (the intercept dropped with sessions). */
function priorFor(prior: Float64Array, p: number, size: number): Float64Array {
  if (size === p) return prior;
  const from = p - size;
  const out = new Float64Array(size * size);
  for (let a = 0; a < size; a++) for (let b = 0; b < size; b++) out[a * size + b] = prior[(a + from) * p + b + from];
  return out;
}
