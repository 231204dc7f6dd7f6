/**
 * Moment matrix W = ∫ f(x) f(x)' dx / vol of a model over a box Π [lower_j, upper_j] in coded
 * units, in closed form; `cubeMoments` is the usual case, the coded cube [−1, 1]^k.
 *
 * For a uniform measure on a box the moments factorise by coordinate: for x uniform on
 * [a, b], E[x^n] = (b^(n+1) − a^(n+1)) / ((n + 1)(b − a)), which on [−1, 1] is 0 for odd n
 * and 1/(n + 1) for even n (Atkinson, Donev & Tobias, 2007, "Optimum Experimental Designs,
 * with SAS", §10.6, the I-optimality moment matrix). A box of zero width in a coordinate
 * (a = b) is the point mass there.
 */
import type { CompiledModel } from '../model/modelMatrix.js';

/** Row-major p × p moment matrix of the model over the box Π [lower_j, upper_j]. */
export function boxMoments(model: CompiledModel, lower: readonly number[], upper: readonly number[]): Float64Array {
  const { p, exponents } = model;
  const k = model.factorIds.length;
  const W = new Float64Array(p * p);
  for (let a = 0; a < p; a++) {
    for (let b = a; b < p; b++) {
      let moment = 1;
      for (let j = 0; j < k && moment !== 0; j++) {
        moment *= powerMoment(exponents[a * k + j] + exponents[b * k + j], lower[j], upper[j]);
      }
      W[a * p + b] = moment;
      W[b * p + a] = moment;
    }
  }
  return W;
}

/** Row-major p × p moment matrix of the model over the coded cube [−1, 1]^k. */
export function cubeMoments(model: CompiledModel): Float64Array {
  const k = model.factorIds.length;
  return boxMoments(model, new Array<number>(k).fill(-1), new Array<number>(k).fill(1));
}

/** E[x^n] for x uniform on [a, b]. */
function powerMoment(n: number, a: number, b: number): number {
  if (n === 0) return 1;
  if (b === a) return a ** n;
  return (b ** (n + 1) - a ** (n + 1)) / ((n + 1) * (b - a));
}
