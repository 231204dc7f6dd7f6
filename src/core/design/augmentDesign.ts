/**
 * D-optimal augmentation: K added runs, chosen from a candidate set, that maximise
 * |X₀′X₀ + X′X| given the runs already done (X₀). Dykstra, 1971, "The augmentation of
 * experimental data to maximize |X′X|", Technometrics 13, 682–688: points are added one at
 * a time where the prediction variance f′M⁻¹f of the current design is largest (each such
 * step maximises the determinant, by the matrix determinant lemma); the sequential choice is
 * then improved by exchanging each added point for the candidate that raises the determinant
 * most (Fedorov, 1972, "Theory of Optimal Experiments"), until no exchange helps.
 *
 * Conventions fixed here:
 * - While M is singular (the runs done cannot estimate the model), both stages rank by the
 *   determinant of M + δI with δ = RIDGE × mean diagonal, so every added run goes where it
 *   adds the most new information; once M is regular the ridge changes no choice that matters.
 * - Ties go to the first candidate in candidate order, so the result is reproducible.
 * - Candidates may be chosen more than once (replication is allowed, as in the paper).
 */
import { choleskyFactor, choleskyLogDeterminant, symmetricInverse } from '../linalg/cholesky.js';
import { quadraticForm } from '../linalg/symmetricKernels.js';
import { expandInto, type CompiledModel } from '../model/modelMatrix.js';

/** Relative ridge that lets a singular information matrix rank candidates. */
const RIDGE = 1e-9;
/** Improvements in ln det below this are rounding, not progress. */
const IMPROVEMENT = 1e-10;
const MAX_PASSES = 100;

export interface AugmentationResult {
  /** Indices into the candidate list of the added runs, in the order chosen. */
  added: number[];
  /** ln det of the final information (ridge-free; −∞ when still singular). */
  logDet: number;
  /** Whether the runs done plus the added runs estimate every model term. */
  estimable: boolean;
}

export function augmentDesign(model: CompiledModel, existing: readonly ArrayLike<number>[], candidates: readonly ArrayLike<number>[], added: number): AugmentationResult {
  const p = model.p;
  const rows = new Float64Array(candidates.length * p);
  const row = new Float64Array(p);
  candidates.forEach((point, c) => {
    expandInto(model, point, row);
    rows.set(row, c * p);
  });
  const M = new Float64Array(p * p);
  for (const point of existing) {
    expandInto(model, point, row);
    addOuter(M, row, 0, p, 1);
  }
  const ridge = (M: Float64Array): number => {
    let trace = 0;
    for (let i = 0; i < p; i++) trace += M[i * p + i];
    return RIDGE * Math.max(trace / p, 1);
  };
  const ridged = (M: Float64Array, delta: number): Float64Array => {
    const copy = Float64Array.from(M);
    for (let i = 0; i < p; i++) copy[i * p + i] += delta;
    return copy;
  };

  // Sequential stage (Dykstra): the largest prediction variance of the current design.
  const chosen: number[] = [];
  for (let k = 0; k < added; k++) {
    const inverse = symmetricInverse(ridged(M, ridge(M)), p);
    if (!inverse) throw new Error('augmentDesign: ridged information matrix is not invertible');
    let best = 0;
    let bestVariance = Number.NEGATIVE_INFINITY;
    for (let c = 0; c < candidates.length; c++) {
      const variance = quadraticForm(inverse, p, rows, c * p);
      if (variance > bestVariance + IMPROVEMENT * Math.max(1, Math.abs(bestVariance))) {
        bestVariance = variance;
        best = c;
      }
    }
    chosen.push(best);
    addOuter(M, rows, best * p, p, 1);
  }

  // Exchange stage: each added run against every candidate, by the determinant itself.
  const delta = ridge(M);
  let current = logDetOf(ridged(M, delta), p);
  for (let pass = 0; pass < MAX_PASSES; pass++) {
    let improved = false;
    for (let i = 0; i < chosen.length; i++) {
      addOuter(M, rows, chosen[i] * p, p, -1);
      let best = chosen[i];
      let bestLogDet = current;
      for (let c = 0; c < candidates.length; c++) {
        if (c === chosen[i]) continue;
        addOuter(M, rows, c * p, p, 1);
        const value = logDetOf(ridged(M, delta), p);
        addOuter(M, rows, c * p, p, -1);
        if (value > bestLogDet + IMPROVEMENT) {
          bestLogDet = value;
          best = c;
        }
      }
      addOuter(M, rows, best * p, p, 1);
      if (best !== chosen[i]) {
        chosen[i] = best;
        current = bestLogDet;
        improved = true;
      }
    }
    if (!improved) break;
  }
  const factor = choleskyFactor(M, p);
  return { added: chosen, logDet: factor ? choleskyLogDeterminant(factor, p) : Number.NEGATIVE_INFINITY, estimable: factor !== null };
}

/** M += sign · f f′ for the row of `rows` at `offset`. */
function addOuter(M: Float64Array, rows: Float64Array, offset: number, p: number, sign: number): void {
  for (let a = 0; a < p; a++) {
    const fa = sign * rows[offset + a];
    if (fa === 0) continue;
    for (let b = 0; b < p; b++) M[a * p + b] += fa * rows[offset + b];
  }
}

function logDetOf(M: Float64Array, p: number): number {
  const factor = choleskyFactor(M, p, 0);
  return factor ? choleskyLogDeterminant(factor, p) : Number.NEGATIVE_INFINITY;
}
