/**
 * The precision of one design for the predicted effects: the power of every required
 * (factor, response) pair and every interaction term, and the weakest of them.
 *
 * - Factor i, response r: the joint F test of every primary model term in factor i alone
 *   (x_i, x_i², …) with b = (β, 0, …) — the predicted effect is a linear trend
 *   (predictedEffects.ts) — and σ = the response's noise (termBlockPower.ts).
 * - Interaction a·b in the model, response r: the single-term test of that term with β_ab.
 * C is the coefficient covariance over the fitted runs (fitting runs plus centre replicates;
 * holdouts excluded) and ν = fitted runs − p, unless the caller passes its own (e.g. GLS).
 * With `termDf` (a split-plot or blocked plan: the containment rule, containmentDf.ts) each
 * test takes the smallest df among its terms instead of ν.
 * A pair whose factor has no main-effect term in the model cannot be tested: power null.
 */
import type { CompiledModel } from '../model/modelMatrix.js';
import { informationMatrix } from '../model/modelMatrix.js';
import { symmetricInverse } from '../linalg/cholesky.js';
import type { PredictedEffects } from './predictedEffects.js';
import type { FactorPrecision, InteractionPrecision } from './precisionTypes.js';
import { covarianceBlock, termBlockPower } from './termBlockPower.js';
import { noncentralityForPower } from '../distribution/noncentralF.js';

export interface PrecisionRequest {
  /** The primary (fitted) model. */
  model: CompiledModel;
  /** Term labels in model column order (intercept included). */
  termLabels: readonly string[];
  /** Coefficient covariance in σ² = 1 units (p × p); null when the model cannot be fitted. */
  covariance: Float64Array | null;
  residualDf: number;
  /** Denominator df per model term (model order); replaces `residualDf` for the tests when given. */
  termDf?: readonly number[];
  effects: Pick<PredictedEffects, 'factors' | 'interactions'>;
  alpha: number;
  /** Target power, for `met`. */
  power: number;
  /** Fitted runs behind `covariance`; refines `shortfall` for the degrees of freedom a larger plan would have. */
  fittedRuns?: number;
}

export interface DesignPrecision {
  factors: FactorPrecision[];
  interactions: InteractionPrecision[];
  weakest: FactorPrecision | InteractionPrecision | null;
  /** Lowest power over every entry (null entries count as 0); null when there are no entries. */
  weakestPower: number | null;
  met: boolean;
  /**
   * Largest ratio λ needed / λ reached over the entries below the target (1 when met;
   * Infinity when an entry cannot be tested): how much more information the weakest needs.
   */
  shortfall: number;
}

export function designPrecision(request: PrecisionRequest): DesignPrecision {
  const { model, covariance, residualDf, alpha } = request;
  const { p } = model;
  const k = model.factorIds.length;
  const blocks = factorBlocks(model);
  let shortfall = 1;
  const dfOf = (terms: readonly number[]): number => (request.termDf ? Math.min(...terms.map((t) => request.termDf![t])) : residualDf);
  const track = (q: number, lambda: number, power: number | null, df: number = residualDf) => {
    if (power === null || !Number.isFinite(lambda)) {
      shortfall = Number.POSITIVE_INFINITY;
      return;
    }
    if (power >= request.power) return;
    if (!(lambda > 0)) {
      shortfall = Number.POSITIVE_INFINITY;
      return;
    }
    if (!(df >= 1)) {
      shortfall = Number.POSITIVE_INFINITY;
      return;
    }
    let ratio = noncentralityForPower(q, df, alpha, request.power) / lambda;
    // λ grows with the runs, and so does ν, which lowers the λ needed: one refinement step.
    const n = request.fittedRuns;
    if (n !== undefined && ratio > 1) ratio = noncentralityForPower(q, df + Math.round(n * (ratio - 1)), alpha, request.power) / lambda;
    shortfall = Math.max(shortfall, ratio);
  };

  const factors: FactorPrecision[] = request.effects.factors.map((effect) => {
    const j = model.factorIds.indexOf(effect.factor);
    const block = j < 0 ? null : blocks[j];
    const entry: FactorPrecision = {
      factor: effect.factor,
      response: effect.response,
      effect: effect.effect,
      effectInNoise: effect.effect / effect.noise,
      power: null,
      terms: block ? block.terms.map((t) => request.termLabels[t]) : [],
    };
    if (!block || block.linear < 0 || covariance === null) {
      track(1, Number.NaN, null);
      return entry;
    }
    const coefficients = block.terms.map((t) => (t === block.linear ? effect.effect : 0));
    const df = dfOf(block.terms);
    const tested = termBlockPower({
      covarianceBlock: covarianceBlock(covariance, p, block.terms),
      coefficients,
      sigma: effect.noise,
      residualDf: df,
      alpha,
    });
    entry.power = tested.power;
    track(tested.q, tested.noncentrality, tested.power, df);
    return entry;
  });

  const interactions: InteractionPrecision[] = [];
  for (const effect of request.effects.interactions) {
    const a = model.factorIds.indexOf(effect.factors[0]);
    const b = model.factorIds.indexOf(effect.factors[1]);
    if (a < 0 || b < 0) continue;
    let term = -1;
    for (let t = 0; t < p; t++) {
      let match = true;
      for (let m = 0; m < k; m++) {
        const e = model.exponents[t * k + m];
        if (e !== (m === a || m === b ? 1 : 0)) match = false;
      }
      if (match) term = t;
    }
    if (term < 0) continue;
    const df = dfOf([term]);
    const tested =
      covariance === null
        ? null
        : termBlockPower({ covarianceBlock: covarianceBlock(covariance, p, [term]), coefficients: [effect.effect], sigma: effect.noise, residualDf: df, alpha });
    const power = tested?.power ?? null;
    track(1, tested?.noncentrality ?? Number.NaN, power, df);
    interactions.push({ factors: [...effect.factors], response: effect.response, effect: effect.effect, effectInNoise: effect.effect / effect.noise, power });
  }

  let weakest: FactorPrecision | InteractionPrecision | null = null;
  let weakestPower: number | null = null;
  for (const entry of [...factors, ...interactions]) {
    const value = entry.power ?? 0;
    if (weakestPower === null || value < weakestPower) {
      weakestPower = value;
      weakest = entry;
    }
  }
  const met = weakestPower === null || weakestPower >= request.power - 1e-12;
  return { factors, interactions, weakest, weakestPower, met, shortfall: met ? 1 : shortfall };
}

/** (X'X)⁻¹ and ν = n − p from an information matrix over n fitted runs, or a null covariance when it is singular. */
export function informationCovariance(information: Float64Array, p: number, n: number): { covariance: Float64Array | null; residualDf: number } {
  return { covariance: n >= p ? symmetricInverse(information, p) : null, residualDf: n - p };
}

/** (X'X)⁻¹ and ν = n − p over the fitted points (fit + centre runs), or null when X'X is singular. */
export function leastSquaresCovariance(model: CompiledModel, fittedPoints: readonly ArrayLike<number>[]): { covariance: Float64Array | null; residualDf: number } {
  const covariance = fittedPoints.length >= model.p ? symmetricInverse(informationMatrix(model, fittedPoints), model.p) : null;
  return { covariance, residualDf: fittedPoints.length - model.p };
}

/** For each factor, the terms in that factor alone (column indices, by power) and which of them is linear (−1 if none). */
export function factorBlocks(model: CompiledModel): { terms: number[]; linear: number }[] {
  const k = model.factorIds.length;
  return Array.from({ length: k }, (_, j) => {
    const found: { t: number; power: number }[] = [];
    for (let t = 0; t < model.p; t++) {
      let alone = model.exponents[t * k + j] > 0;
      for (let m = 0; m < k && alone; m++) if (m !== j && model.exponents[t * k + m] !== 0) alone = false;
      if (alone) found.push({ t, power: model.exponents[t * k + j] });
    }
    found.sort((x, y) => x.power - y.power);
    const linear = found.find((entry) => entry.power === 1)?.t ?? -1;
    return { terms: found.map((entry) => entry.t), linear };
  });
}
