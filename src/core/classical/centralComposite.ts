/**
 * Central composite designs in coded units: a two-level cube portion, 2k axial points at
 * distance α on each axis, and centre runs.
 *
 * Box & Wilson (1951), "On the experimental attainment of optimum conditions", Journal of the
 * Royal Statistical Society B 13. Rotatability (Box & Hunter 1957, "Multi-factor experimental
 * designs for exploring response surfaces", Annals of Mathematical Statistics 28) needs the pure
 * fourth moment to be three times the mixed one, Σx_i⁴ = 3 Σx_i²x_j²; with n_F cube runs that is
 * n_F + 2α⁴ = 3 n_F, so α = n_F^(1/4). The face-centred design puts the axial points on the
 * faces of the cube (α = 1) and so needs only three levels per factor.
 *
 * Conventions fixed here:
 * - Cube portion: the full 2^k factorial unless a fraction is passed, or `cube:
 *   'smallest-resolution-v'` asks for the smallest minimum-aberration fraction of resolution
 *   ≥ V (the full factorial itself for k ≤ 4). The default stays the full cube so that α matches
 *   the textbook tables (k = 5 → 2.378); a fraction must have resolution ≥ V, or two-factor
 *   interactions would be aliased with each other. α always follows the cube portion's size.
 * - Order: cube runs (standard order), then the axial pairs factor by factor (−α then +α),
 *   then the centre runs; unrandomised.
 */
import { twoLevelFullFactorial } from './fullFactorial.js';
import { minimumAberrationFraction, type FractionalFactorial } from './fractionalFactorial.js';

export type CentralCompositeKind = 'face' | 'rotatable';

export interface CentralCompositeOptions {
  /** Cube portion to use instead of the full factorial; must have this k and resolution ≥ V. */
  fraction?: FractionalFactorial;
  /** 'full' (default) or 'smallest-resolution-v'. Ignored when `fraction` is given. (Optional addition to the contract.) */
  cube?: 'full' | 'smallest-resolution-v';
}

export interface CentralCompositeDesign {
  points: number[][];
  alpha: number;
  factorialRuns: number;
  axialRuns: number;
  centreRuns: number;
}

export function centralComposite(
  k: number,
  kind: CentralCompositeKind,
  centreRuns: number,
  options: CentralCompositeOptions = {},
): CentralCompositeDesign {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`a central composite design needs at least one factor, got ${k}`);
  if (!Number.isInteger(centreRuns) || centreRuns < 0) throw new RangeError(`centre runs must be a whole number ≥ 0, got ${centreRuns}`);
  if (kind !== 'face' && kind !== 'rotatable') throw new RangeError(`unknown central composite kind "${kind as string}"`);

  const cube = cubePortion(k, options);
  const factorialRuns = cube.length;
  const alpha = kind === 'face' ? 1 : factorialRuns ** 0.25;

  const points = cube.map((point) => [...point]);
  for (let j = 0; j < k; j++) {
    for (const sign of [-1, 1]) {
      const point = new Array<number>(k).fill(0);
      point[j] = sign * alpha;
      points.push(point);
    }
  }
  for (let c = 0; c < centreRuns; c++) points.push(new Array<number>(k).fill(0));
  return { points, alpha, factorialRuns, axialRuns: 2 * k, centreRuns };
}

function cubePortion(k: number, options: CentralCompositeOptions): number[][] {
  const { fraction } = options;
  if (fraction) {
    if (fraction.k !== k) throw new RangeError(`the cube fraction has ${fraction.k} factors, the design ${k}`);
    if (fraction.resolution < 5) {
      throw new RangeError(`a cube fraction of resolution ${fraction.resolution} aliases two-factor interactions; use resolution V or higher`);
    }
    return fraction.points;
  }
  if (options.cube === 'smallest-resolution-v' && k >= 2) {
    const smallest = minimumAberrationFraction(k, 5);
    if (smallest) return smallest.points;
  }
  return twoLevelFullFactorial(k);
}
