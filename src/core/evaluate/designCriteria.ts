/**
 * Optimality criteria of an exact design in coded units.
 *
 * - logDetPerRun: ln det(X'X / N), the D-criterion per run, comparable across run counts.
 * - dEfficiency: the textbook D-efficiency 100·|X'X|^(1/p) / N (Montgomery, "Design and
 *   Analysis of Experiments", 2017, 9th ed., §11.4 on design optimality); 100 % for an
 *   orthogonal two-level design with ±1 coding and a first-order or interaction model.
 * - iCriterion: trace((X'X)⁻¹ W), the average prediction variance over the region in σ²
 *   units, W the region moment matrix (Atkinson, Donev & Tobias, 2007, "Optimum
 *   Experimental Designs, with SAS", §10.6).
 * A singular design gives logDetPerRun = −Infinity, dEfficiency = 0, iCriterion = Infinity.
 */
import { informationMatrix, type CompiledModel } from '../model/modelMatrix.js';
import { invertSymmetric } from '../linalg/cholesky.js';
import { traceOfProduct } from '../linalg/symmetricKernels.js';

/** ln det(X'X / N) of the points under the model; −Infinity when X'X is singular. */
export function logDetPerRun(model: CompiledModel, points: number[][]): number {
  if (points.length === 0) return Number.NEGATIVE_INFINITY;
  const p = model.p;
  const logDet = invertSymmetric(informationMatrix(model, points), p, new Float64Array(p * p));
  return logDet - p * Math.log(points.length);
}

/** 100·|X'X|^(1/p) / N, in percent. */
export function dEfficiency(model: CompiledModel, points: number[][]): number {
  const perRun = logDetPerRun(model, points);
  return perRun === Number.NEGATIVE_INFINITY ? 0 : 100 * Math.exp(perRun / model.p);
}

/** trace((X'X)⁻¹ W) with W the p × p row-major region moment matrix. */
export function iCriterion(model: CompiledModel, points: number[][], moments: Float64Array): number {
  const p = model.p;
  const inverse = new Float64Array(p * p);
  if (invertSymmetric(informationMatrix(model, points), p, inverse) === Number.NEGATIVE_INFINITY) {
    return Number.POSITIVE_INFINITY;
  }
  return traceOfProduct(inverse, moments);
}
