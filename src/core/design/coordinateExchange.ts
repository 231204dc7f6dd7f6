/**
 * One pass of coordinate exchange over an exact design (Meyer & Nachtsheim, 1995, "The
 * coordinate-exchange algorithm for constructing exact optimal experimental designs",
 * Technometrics 37).
 *
 * For each design row and each factor in turn, every other coded level of that factor is
 * tried in place of the current one; the best trial that improves the criterion is made at
 * once. Trials whose point fails `region.isFeasible` are skipped, so the design never leaves
 * the region. Nothing is enumerated: a pass costs N·Σ(levels − 1) trials of O(p²) each, which
 * is what lets the search handle grids such as 3^10 or 4^10. A one-coordinate move changes
 * only the model terms containing that factor, so a trial costs O(p·t) with t those terms.
 */
import { expandInto, termValue, type CompiledModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import type { ExchangeState } from './exchangeState.js';

/** Runs one pass; returns the number of exchanges made. */
export function coordinateExchangePass(state: ExchangeState, model: CompiledModel, region: CandidateRegion): number {
  const { N, k, p } = state;
  const trial = new Float64Array(k);
  const fy = new Float64Array(p);
  const changedTerms = termsOfFactor(model);
  let exchanges = 0;
  for (let i = 0; i < N; i++) {
    state.prepareRow(i);
    for (let j = 0; j < k; j++) {
      for (let m = 0; m < k; m++) trial[m] = state.points[i * k + m];
      const current = trial[j];
      let bestScore = Number.NEGATIVE_INFINITY;
      let bestLevel = current;
      for (const level of region.levels[j]) {
        if (level === current) continue;
        trial[j] = level;
        if (!region.isFeasible(trial)) continue;
        expandChanged(model, trial, state.rows, i * p, changedTerms[j], fy);
        const score = state.scoreChanged(fy, changedTerms[j]);
        if (score > bestScore) {
          bestScore = score;
          bestLevel = level;
        }
      }
      if (bestLevel !== current && state.improves(bestScore)) {
        trial[j] = bestLevel;
        expandInto(model, trial, fy);
        state.exchange(i, trial, fy);
        state.prepareRow(i);
        exchanges++;
      }
    }
  }
  return exchanges;
}

/** For each factor, the indices of the model terms in which it appears. */
function termsOfFactor(model: CompiledModel): Int32Array[] {
  const k = model.factorIds.length;
  return Array.from({ length: k }, (_, j) => {
    const terms: number[] = [];
    for (let t = 0; t < model.p; t++) if (model.exponents[t * k + j] !== 0) terms.push(t);
    return Int32Array.from(terms);
  });
}

/**
 * f(trial) for a trial that differs from design row `rowStart` only in one factor: the
 * row's terms are copied and only the terms containing that factor are recomputed.
 */
function expandChanged(model: CompiledModel, trial: Float64Array, rows: Float64Array, rowStart: number, changed: Int32Array, out: Float64Array): void {
  for (let t = 0; t < model.p; t++) out[t] = rows[rowStart + t];
  for (let m = 0; m < changed.length; m++) out[changed[m]] = termValue(model, changed[m], trial);
}
