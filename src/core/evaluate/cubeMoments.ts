/**
 * Moment matrix W = ∫ f(x) f(x)' dx / vol over the coded cube [−1, 1]^k, in closed form.
 *
 * For a uniform measure on the cube the moments factorise by coordinate:
 * E[x^n] = 0 for odd n and 1/(n + 1) for even n (Atkinson, Donev & Tobias, 2007,
 * "Optimum Experimental Designs, with SAS", §10.6, the I-optimality moment matrix).
 * Used for the average prediction variance when no constrained-region moments are given.
 */
import type { CompiledModel } from '../model/modelMatrix.js';

/** Row-major p × p moment matrix of the model over the coded cube. */
export function cubeMoments(model: CompiledModel): Float64Array {
  const { p, exponents } = model;
  const k = model.factorIds.length;
  const W = new Float64Array(p * p);
  for (let a = 0; a < p; a++) {
    for (let b = a; b < p; b++) {
      let moment = 1;
      for (let j = 0; j < k && moment !== 0; j++) {
        const n = exponents[a * k + j] + exponents[b * k + j];
        moment *= n % 2 === 1 ? 0 : 1 / (n + 1);
      }
      W[a * p + b] = moment;
      W[b * p + a] = moment;
    }
  }
  return W;
}
