/**
 * One pass of the modified Fedorov exchange over an enumerated candidate set (Fedorov, 1972,
 * "Theory of Optimal Experiments"; the modification — one best exchange per design row per
 * pass rather than the single best pair over the whole design — is Cook & Nachtsheim, 1980,
 * "A comparison of algorithms for constructing exact D-optimal designs", Technometrics 22).
 *
 * Used after coordinate exchange when the feasible grid is small enough to list: a point
 * exchange can move several coordinates at once, which coordinate exchange cannot, and in
 * a region cut by constraints it reaches points that no feasible one-coordinate path leads to.
 *
 * For the D-criterion the variances d(c) = f(c)'M⁻¹f(c) of all candidates are cached and
 * kept current after each exchange from its rank-two form, so a trial costs O(p) (only
 * d(x,c) is new) instead of O(p²).
 */
import { exchangeRatio } from '../linalg/inverseUpdate.js';
import { dot, quadraticForm } from '../linalg/symmetricKernels.js';
import type { ExchangeState } from './exchangeState.js';

export interface CandidateSet {
  /** Coded candidate points. */
  points: readonly ArrayLike<number>[];
  /** Model rows f(x) of the candidates, row-major n × p. */
  rows: Float64Array;
}

/** Runs one pass; returns the number of exchanges made. */
export function fedorovExchangePass(state: ExchangeState, candidates: CandidateSet): number {
  return state.activeCriterion === 'D' ? determinantPass(state, candidates) : generalPass(state, candidates);
}

function determinantPass(state: ExchangeState, candidates: CandidateSet): number {
  const { N, p } = state;
  const { rows } = candidates;
  const n = candidates.points.length;
  const variance = new Float64Array(n);
  for (let c = 0; c < n; c++) variance[c] = quadraticForm(state.inverse, p, rows, c * p);
  let exchanges = 0;
  for (let i = 0; i < N; i++) {
    state.prepareRow(i);
    const dx = state.preparedVariance;
    const gx = state.preparedDirection;
    let bestRatio = Number.NEGATIVE_INFINITY;
    let best = -1;
    for (let c = 0; c < n; c++) {
      const dxy = dot(gx, rows, p, 0, c * p);
      const ratio = exchangeRatio(dx, variance[c], dxy);
      if (ratio > bestRatio) {
        bestRatio = ratio;
        best = c;
      }
    }
    if (best < 0 || !state.improves(bestRatio)) continue;
    state.exchange(i, candidates.points[best], rows.slice(best * p, (best + 1) * p));
    exchanges++;
    const { g, h, gScale, hScale } = state.lastUpdate;
    if (Number.isNaN(gScale)) return exchanges;
    for (let c = 0; c < n; c++) {
      const gf = dot(g, rows, p, 0, c * p);
      const hf = dot(h, rows, p, 0, c * p);
      variance[c] += hScale * hf * hf - gScale * gf * gf;
    }
  }
  return exchanges;
}

function generalPass(state: ExchangeState, candidates: CandidateSet): number {
  const { N, p } = state;
  const n = candidates.points.length;
  let exchanges = 0;
  for (let i = 0; i < N; i++) {
    state.prepareRow(i);
    let bestScore = Number.NEGATIVE_INFINITY;
    let best = -1;
    for (let c = 0; c < n; c++) {
      const score = state.score(candidates.rows, c * p);
      if (score > bestScore) {
        bestScore = score;
        best = c;
      }
    }
    if (best >= 0 && state.improves(bestScore)) {
      state.exchange(i, candidates.points[best], candidates.rows.slice(best * p, (best + 1) * p));
      exchanges++;
    }
  }
  return exchanges;
}
