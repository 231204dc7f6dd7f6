/**
 * Everything one design says about one model: estimability and aliases, the textbook
 * criteria, standard errors, power per term, variance inflation and prediction variance.
 *
 * Conventions fixed here (coded units throughout, σ = residual standard deviation):
 * - D-efficiency = 100·|X'X|^(1/p) / N (Myers, Montgomery & Anderson-Cook, 2016, "Response
 *   Surface Methodology", 4th ed., §8.2); 100 % for an orthogonal two-level design of a
 *   first-order model.
 * - A-criterion = trace((X'X)⁻¹) / p: the average coefficient variance in σ² units (not
 *   multiplied by N).
 * - I-criterion = trace((X'X)⁻¹W): the average prediction variance over the region in σ²
 *   units, W the region moment matrix passed in (cubeMoments.ts or regionMoments.ts).
 * - G-efficiency: see gEfficiency.ts; power: see termPower.ts; VIF: varianceInflation.ts.
 * Only `points` are judged: pass the runs used for fitting (fit and centre runs).
 */
import { modelMatrix, type CompiledModel } from '../model/modelMatrix.js';
import { crossProduct } from '../linalg/crossProduct.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { choleskyFactor, choleskyInverse, choleskyLogDeterminant } from '../linalg/cholesky.js';
import { traceOfProduct } from '../linalg/symmetricKernels.js';
import { estimability, type NonEstimableTerm } from './estimability.js';
import { termPower, termRange } from './termPower.js';
import { varianceInflationFactors } from './varianceInflation.js';
import { fdsCurve, predictionSample, type FdsCurve } from './predictionVariance.js';
import { gEfficiency as gEfficiencyOf } from './gEfficiency.js';

export const DEFAULT_DELTA = 2;
export const DEFAULT_ALPHA = 0.05;

export interface TermQuality {
  term: string;
  /** Standard error of the coefficient in σ units, √((X'X)⁻¹)_jj. */
  standardError: number;
  /** Null for the intercept. */
  vif: number | null;
  /** Power to detect an effect of δσ; null for the intercept or when N − p = 0. */
  power: number | null;
}

export interface DesignQuality {
  runs: number;
  p: number;
  rank: number;
  /** N − p when the model can be fitted, else N − rank. */
  residualDf: number;
  fitsModel: boolean;
  nonEstimable: NonEstimableTerm[];
  /** ln det(X'X / N); null when the model cannot be fitted (same for every figure below). */
  logDetPerRun: number | null;
  /** ln det(X'X). */
  logDet: number | null;
  dEfficiency: number | null;
  aCriterion: number | null;
  iCriterion: number | null;
  gEfficiency: number | null;
  maxScaledPredictionVariance: number | null;
  gEfficiencyNote: string | null;
  maxVif: number | null;
  terms: TermQuality[];
  /** Smallest power over the non-intercept terms. */
  minPower: number | null;
  /** Why power is not given, when it is not. */
  powerNote: string | null;
  delta: number;
  alpha: number;
  fds: FdsCurve | null;
}

export interface DesignQualityOptions {
  /** Region moment matrix W (p × p, row-major) for the I-criterion. */
  moments: Float64Array;
  /** Constrained region: thins the prediction sample, supplies candidates for G-efficiency. */
  region?: CandidateRegion;
  delta?: number;
  alpha?: number;
  /** One label per model column, intercept included, in column order. */
  termLabels: string[];
  /** Points at which prediction variance is sampled (default: predictionSample(k, region)). */
  sample?: number[][];
}

export function assessDesignQuality(model: CompiledModel, points: number[][], options: DesignQualityOptions): DesignQuality {
  const { p } = model;
  const k = model.factorIds.length;
  const N = points.length;
  const delta = options.delta ?? DEFAULT_DELTA;
  const alpha = options.alpha ?? DEFAULT_ALPHA;
  const { termLabels } = options;
  if (termLabels.length !== p) throw new Error(`assessDesignQuality needs ${p} term labels, got ${termLabels.length}`);

  const X = modelMatrix(model, points);
  const estimable = estimability(X, N, p, termLabels);
  const fitsModel = estimable.rank === p && N >= p;
  const base = {
    runs: N,
    p,
    rank: estimable.rank,
    residualDf: N - (fitsModel ? p : estimable.rank),
    fitsModel,
    nonEstimable: estimable.nonEstimable,
    delta,
    alpha,
  };
  const unfit: DesignQuality = {
    ...base,
    logDetPerRun: null,
    logDet: null,
    dEfficiency: null,
    aCriterion: null,
    iCriterion: null,
    gEfficiency: null,
    maxScaledPredictionVariance: null,
    gEfficiencyNote: null,
    maxVif: null,
    terms: [],
    minPower: null,
    powerNote: 'the design cannot fit the model',
    fds: null,
  };
  if (!fitsModel) return unfit;

  const L = choleskyFactor(crossProduct(X, N, p), p);
  if (!L) return unfit;
  const inverse = choleskyInverse(L, p);
  const logDet = choleskyLogDeterminant(L, p);

  let trace = 0;
  for (let a = 0; a < p; a++) trace += inverse[a * p + a];
  const iCriterion = traceOfProduct(inverse, options.moments);

  const interceptColumn = findIntercept(model);
  const vifs = varianceInflationFactors(X, N, p, interceptColumn);
  const residualDf = N - p;
  const terms: TermQuality[] = [];
  let nonIntercept = 0;
  for (let c = 0; c < p; c++) {
    const standardError = Math.sqrt(inverse[c * p + c]);
    if (c === interceptColumn) {
      terms.push({ term: termLabels[c], standardError, vif: null, power: null });
      continue;
    }
    const range = termRange(model.exponents.subarray(c * k, (c + 1) * k));
    terms.push({
      term: termLabels[c],
      standardError,
      vif: vifs ? vifs[nonIntercept] : null,
      power: termPower(standardError, range, delta, alpha, residualDf),
    });
    nonIntercept++;
  }
  const powers = terms.filter((t, c) => c !== interceptColumn).map((t) => t.power);
  const minPower = residualDf > 0 && powers.length > 0 ? Math.min(...(powers as number[])) : null;
  const maxVif = vifs && vifs.length > 0 ? Math.max(...vifs) : null;

  const sample = options.sample ?? predictionSample(k, options.region);
  const g = gEfficiencyOf(model, inverse, points, sample, options.region);

  return {
    ...base,
    logDetPerRun: logDet - p * Math.log(N),
    logDet,
    dEfficiency: (100 * Math.exp(logDet / p)) / N,
    aCriterion: trace / p,
    iCriterion,
    gEfficiency: g.gEfficiency,
    maxScaledPredictionVariance: g.maxScaledVariance,
    gEfficiencyNote: g.note,
    maxVif,
    terms,
    minPower,
    powerNote: residualDf > 0 ? null : 'no residual degrees of freedom (N = p): the terms cannot be tested',
    fds: fdsCurve(model, inverse, N, sample),
  };
}

function findIntercept(model: CompiledModel): number {
  const k = model.factorIds.length;
  for (let c = 0; c < model.p; c++) {
    let degree = 0;
    for (let j = 0; j < k; j++) degree += model.exponents[c * k + j];
    if (degree === 0) return c;
  }
  return -1;
}
