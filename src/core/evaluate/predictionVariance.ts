/**
 * Prediction variance over the region and its fraction-of-design-space (FDS) curve.
 *
 * The variance of the fitted response at x is σ² f(x)'(X'X)⁻¹f(x) (unscaled, σ² units);
 * the scaled prediction variance multiplies it by the number of fitting runs N so that plans
 * of different size are compared per run. The FDS curve (Zahran, Anderson-Cook & Myers,
 * 2003, "Fraction of design space to assess prediction capability of response surface
 * designs", J. Quality Technology 35) plots, for each fraction q of the region, the variance
 * that a fraction q of the region does not exceed.
 *
 * Conventions fixed here: the region is represented by a fixed Halton sample of the coded
 * cube (`PREDICTION_SAMPLE_SIZE` points, see haltonPoints.ts), thinned to the feasible points
 * when a constrained region is given; the curve is read at `FDS_FRACTIONS` equally spaced
 * fractions 0, 0.02, …, 1 with linear interpolation between order statistics (the default
 * quantile rule of numpy), so the value at 0.5 is the sample median.
 */
import { expandInto, type CompiledModel } from '../model/modelMatrix.js';
import { quadraticForm } from '../linalg/symmetricKernels.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { haltonPoints } from './haltonPoints.js';

export const PREDICTION_SAMPLE_SIZE = 4096;
export const FDS_FRACTIONS = 51;

export interface FdsCurve {
  fraction: number[];
  /** Scaled prediction variance N·f'(X'X)⁻¹f at each fraction. */
  scaledVariance: number[];
  /** Unscaled prediction variance f'(X'X)⁻¹f (σ² units) at each fraction. */
  variance: number[];
}

/**
 * The fixed sample of the prediction region: Halton points of the coded cube, kept when the
 * region (if given) calls them feasible. `dimension` is the number of design factors.
 */
export function predictionSample(dimension: number, region?: CandidateRegion): number[][] {
  const points = haltonPoints(PREDICTION_SAMPLE_SIZE, dimension);
  if (!region) return points;
  const feasible = points.filter((x) => region.isFeasible(x));
  return feasible.length > 0 ? feasible : points;
}

/** Unscaled prediction variance f(x)'Cf(x) at each point, C = (X'X)⁻¹ row-major p × p. */
export function predictionVariances(model: CompiledModel, inverse: Float64Array, points: readonly ArrayLike<number>[]): Float64Array {
  const p = model.p;
  const f = new Float64Array(p);
  const out = new Float64Array(points.length);
  points.forEach((x, i) => {
    expandInto(model, x, f);
    out[i] = quadraticForm(inverse, p, f);
  });
  return out;
}

/** Quantile of ascending `sorted` at fraction q, linear between order statistics. */
function sortedQuantile(sorted: ArrayLike<number>, q: number): number {
  const position = q * (sorted.length - 1);
  const below = Math.floor(position);
  const above = Math.min(sorted.length - 1, below + 1);
  return sorted[below] + (position - below) * (sorted[above] - sorted[below]);
}

/** FDS curve of a design with inverse information `inverse` and `runs` fitting runs. */
export function fdsCurve(model: CompiledModel, inverse: Float64Array, runs: number, sample: readonly ArrayLike<number>[]): FdsCurve {
  const sorted = predictionVariances(model, inverse, sample).sort();
  const fraction: number[] = [];
  const variance: number[] = [];
  const scaledVariance: number[] = [];
  for (let i = 0; i < FDS_FRACTIONS; i++) {
    const q = i / (FDS_FRACTIONS - 1);
    const value = sortedQuantile(sorted, q);
    fraction.push(q);
    variance.push(value);
    scaledVariance.push(runs * value);
  }
  return { fraction, scaledVariance, variance };
}
