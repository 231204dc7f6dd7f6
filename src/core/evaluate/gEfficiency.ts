/**
 * G-efficiency: how the worst prediction variance over the region compares with its
 * theoretical floor, G = 100 · p / (N · max_x f(x)'(X'X)⁻¹f(x)) (Kiefer & Wolfowitz, 1960,
 * "The equivalence of two extremum problems", Canadian J. Mathematics 12; Myers, Montgomery &
 * Anderson-Cook, 2016, "Response Surface Methodology", 4th ed., §8.2).
 *
 * The maximum is taken over the enumerated candidate points when the region lists at most
 * `MAX_CANDIDATES` of them; otherwise over the fixed Halton sample of predictionVariance.ts,
 * the design points and the feasible vertices of the coded cube (where polynomial prediction
 * variance usually peaks).
 * A maximum over a finite set can only miss the true maximum from below, so the figure is an
 * upper bound on the true G-efficiency; the note says which set was used.
 */
import type { CompiledModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { gridPoints } from '../region/gridPoints.js';
import { predictionVariances } from './predictionVariance.js';

/** Largest candidate list searched point by point (each point costs p² operations). */
const MAX_CANDIDATES = 20_000;
/** Cube vertices are added only up to this many factors (2^12 = 4096 points). */
const MAX_VERTEX_FACTORS = 12;

export interface GEfficiency {
  gEfficiency: number;
  /** Largest scaled prediction variance N·f'(X'X)⁻¹f found. */
  maxScaledVariance: number;
  note: string;
}

export function gEfficiency(
  model: CompiledModel,
  inverse: Float64Array,
  designPoints: readonly ArrayLike<number>[],
  sample: readonly ArrayLike<number>[],
  region?: CandidateRegion,
): GEfficiency {
  const N = designPoints.length;
  const k = model.factorIds.length;
  let points: ArrayLike<number>[];
  let note: string;
  if (region?.points && region.points.length <= MAX_CANDIDATES) {
    points = region.points;
    note = `maximum over all ${region.points.length} candidate points`;
  } else {
    const corners = new Array<number[]>(k).fill([-1, 1]);
    const vertices = k <= MAX_VERTEX_FACTORS ? [...gridPoints(corners)].filter((x) => !region || region.isFeasible(x)) : [];
    points = [...sample, ...designPoints, ...vertices];
    note = `maximum over ${sample.length} quasi-random points, the design points and ${vertices.length} cube vertices (an upper bound on G-efficiency)`;
  }
  let maxVariance = 0;
  for (const value of predictionVariances(model, inverse, points)) if (value > maxVariance) maxVariance = value;
  const maxScaledVariance = N * maxVariance;
  return { gEfficiency: (100 * model.p) / maxScaledVariance, maxScaledVariance, note };
}
