/**
 * The candidate region: where design points may go. It is the grid of coded levels of the
 * varied factors, cut by the study's constraints and the equipment limits — the finite
 * candidate set of exchange algorithms for exact optimal designs (Fedorov, 1972, *Theory of
 * Optimal Experiments*; Atkinson, Donev & Tobias, 2007, *Optimum Experimental Designs, with
 * SAS*, ch. 12).
 *
 * Conventions fixed here:
 * - coded units as in codedUnits.ts (low → −1, high → +1);
 * - constraints are written over factor ids in ENGINEERING units in the language of
 *   constraintLanguage.ts, each compiled once. Fixed factors may appear, at their fixed
 *   setting; model parameters may not (they are not settings);
 * - `isFeasible` accepts any coded point, not only grid points: a coordinate within 1e-9 of
 *   a level is read as that level's rounded engineering setting, anything else is converted
 *   without rounding. It checks equipment limits and constraints but not the [−1, 1] box, so
 *   axial points of classical designs can be checked too;
 * - grids larger than `ENUMERATION_LIMIT` (250 000 points; the one limit on grids that any
 *   stage lists point by point) are never enumerated: `points` is null and feasibility is only
 *   spot-checked on a seeded random sample of grid points.
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { InputError } from '../inputError.js';
import type { Factor } from '../study.js';
import { toEngineering } from './codedUnits.js';
import { gridPoints } from './gridPoints.js';
import { compileConstraint, constraintHolds } from './constraintLanguage.js';
import { createRandom } from '../random.js';

/** Largest grid that is listed point by point: the region's `points`, centre and holdout candidates, the full-grid comparator. */
export const ENUMERATION_LIMIT = 250_000;

/**
 * Where design points may go: a grid of coded levels per design factor, cut by constraints
 * and equipment limits. Large grids are never enumerated; `points` is null for them and the
 * search works factor by factor through `levels` and `isFeasible`.
 */
export interface CandidateRegion {
  factorIds: string[];
  /** Coded level values of each design factor, ascending. */
  levels: number[][];
  /** True when the coded point satisfies every constraint and equipment limit. */
  isFeasible(coded: ArrayLike<number>): boolean;
  /** Size of the full grid (product of level counts). */
  gridSize: number;
  /** Every feasible grid point, when the grid is small enough to enumerate; else null. */
  points: number[][] | null;
}

/** What the region reads of one operating factor's levels (the levels stage adds the why). */
export interface AxisLevels {
  id: string;
  /** Varied in the plan (critical or moderate operating factor), or fixed. */
  varied: boolean;
  /** Level settings in engineering units, rounded to the factor's precision (empty when fixed). */
  values: number[];
  /** The same levels in coded units. */
  coded: number[];
  /** The engineering setting a fixed factor is held at (its nominal), else null. */
  fixedAt: number | null;
}

/** One design factor of the region, with what is needed to turn coded values into settable ones. */
export interface RegionAxis {
  id: string;
  low: number;
  high: number;
  precision?: number;
  /** Level settings (engineering units, rounded) and their coded values, ascending. */
  values: number[];
  coded: number[];
}

/** A candidate region that also knows how to round a coded point to settable values. */
export interface SettableRegion extends CandidateRegion {
  axes: RegionAxis[];
}

export interface CandidateRegionOptions {
  /** Largest grid that is enumerated into `points` (default ENUMERATION_LIMIT). */
  enumerateLimit?: number;
  /** Seed of the spot check of large grids (default 1). */
  seed?: number;
  /** Grid points drawn in the spot check of a large grid (default 4000). */
  sampleSize?: number;
}

const SNAP = 1e-9;

export function buildCandidateRegion(
  factors: Factor[],
  levels: AxisLevels[],
  constraints: string[],
  options: CandidateRegionOptions = {},
): SettableRegion {
  const enumerateLimit = options.enumerateLimit ?? ENUMERATION_LIMIT;
  const factorOf = new Map(factors.map((f) => [f.id, f]));
  const varied = levels.filter((l) => l.varied);
  const axes: RegionAxis[] = varied.map((l) => {
    const f = factorOf.get(l.id);
    if (!f) throw new Error(`levels name ${l.id}, which is not a study factor`);
    const order = l.coded.map((_, i) => i).sort((a, b) => l.coded[a] - l.coded[b]);
    return {
      id: l.id,
      low: f.low,
      high: f.high,
      precision: f.precision,
      values: order.map((i) => l.values[i]),
      coded: order.map((i) => l.coded[i]),
    };
  });
  const k = axes.length;
  const limits = axes.map((a) => factorOf.get(a.id)!.limits);

  const scope = new Map<string, unknown>();
  for (const l of levels) if (!l.varied && l.fixedAt !== null) scope.set(l.id, l.fixedAt);
  const operatingIds = levels.map((l) => l.id);
  const modelParameterIds = new Set(factors.filter((f) => f.role === 'model').map((f) => f.id));
  const compiled = constraints.map((text, i) => compileConstraint(text, i, operatingIds, modelParameterIds));

  const engineering = new Float64Array(k);
  const evaluateAll = (): boolean => {
    for (let j = 0; j < k; j++) scope.set(axes[j].id, engineering[j]);
    for (let c = 0; c < compiled.length; c++) if (!constraintHolds(compiled[c], scope)) return false;
    return true;
  };

  // Type check once, at the middle of the box, so a non-boolean expression is reported even
  // when the grid happens to be small.
  for (let j = 0; j < k; j++) engineering[j] = (axes[j].low + axes[j].high) / 2;
  evaluateAll();

  const isFeasible = (coded: ArrayLike<number>): boolean => {
    for (let j = 0; j < k; j++) {
      const axis = axes[j];
      const x = coded[j];
      let value = NaN;
      for (let i = 0; i < axis.coded.length; i++) {
        if (Math.abs(axis.coded[i] - x) <= SNAP) {
          value = axis.values[i];
          break;
        }
      }
      if (Number.isNaN(value)) value = toEngineering(axis, x);
      const lim = limits[j];
      if (lim) {
        const tol = 1e-9 * Math.max(1, Math.abs(lim.low), Math.abs(lim.high));
        if (value < lim.low - tol || value > lim.high + tol) return false;
      }
      engineering[j] = value;
    }
    return compiled.length === 0 ? true : evaluateAll();
  };

  const levelSets = axes.map((a) => a.coded);
  let gridSize = 1;
  for (const set of levelSets) gridSize *= set.length;

  let points: number[][] | null = null;
  if (gridSize <= enumerateLimit) {
    points = [];
    for (const point of gridPoints(levelSets)) if (isFeasible(point)) points.push(point);
    if (points.length === 0) {
      throw new InputError(
        `the constraints exclude every one of the ${gridSize} grid points; loosen a constraint or change the factor ranges`,
        { key: 'constraints' },
      );
    }
  } else {
    const rng = createRandom(options.seed ?? 1);
    const draws = options.sampleSize ?? 4000;
    const point = new Array<number>(k);
    let found = false;
    for (let s = 0; s < draws && !found; s++) {
      for (let j = 0; j < k; j++) point[j] = levelSets[j][uniformInt(rng, 0, levelSets[j].length - 1)];
      found = isFeasible(point);
    }
    if (!found) {
      throw new InputError(
        `none of ${draws} grid points drawn at random satisfies the constraints; loosen a constraint or change the factor ranges`,
        { key: 'constraints' },
      );
    }
  }

  return { factorIds: axes.map((a) => a.id), levels: levelSets, isFeasible, gridSize, points, axes };
}
