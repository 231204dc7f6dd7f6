/**
 * The candidate region: where design points may go. It is the grid of coded levels of the
 * varied factors, cut by the study's constraints and the equipment limits — the finite
 * candidate set of exchange algorithms for exact optimal designs (Fedorov, 1972, *Theory of
 * Optimal Experiments*; Atkinson, Donev & Tobias, 2007, *Optimum Experimental Designs, with
 * SAS*, ch. 12).
 *
 * Conventions fixed here:
 * - constraints are written over factor ids in ENGINEERING units and parsed and evaluated
 *   with mathjs (`feed_rate <= 0.2 * inlet_temp - 18`; `and`, `or`, `not`, chained
 *   comparisons such as `8 <= feed_rate <= 14` and mathjs functions like `sqrt` work). Each
 *   expression is compiled once. Fixed factors may appear, at their fixed setting; model
 *   parameters may not (they are not settings). Comparisons use mathjs' default relative
 *   tolerance (1e-12), so a grid point exactly on a boundary is not lost to binary noise;
 * - `isFeasible` accepts any coded point, not only grid points: a coordinate within 1e-9 of
 *   a level is read as that level's rounded engineering setting, anything else is converted
 *   without rounding. It checks equipment limits and constraints but not the [−1, 1] box, so
 *   axial points of classical designs can be checked too;
 * - grids larger than `enumerateLimit` (default 250 000) are never enumerated: `points` is
 *   null and feasibility is only spot-checked on a seeded random sample of grid points.
 */
import * as math from 'mathjs';
import type { EvalFunction, MathNode } from 'mathjs';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { InputError } from '../inputError.js';
import type { Factor } from '../study.js';
import type { CandidateRegion, FactorLevels } from './designTypes.js';
import { toEngineering } from './levels.js';
import { didYouMean } from '../suggestKey.js';
import { gridPoints } from './gridPoints.js';

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
  /** Largest grid that is enumerated into `points` (default 250 000). */
  enumerateLimit?: number;
  /** Seed of the spot check of large grids (default 1). */
  seed?: number;
  /** Grid points drawn in the spot check of a large grid (default 4000). */
  sampleSize?: number;
}

const DEFAULT_ENUMERATE_LIMIT = 250_000;
const SNAP = 1e-9;
const CONSTANTS = new Set(['pi', 'e', 'true', 'false', 'Infinity', 'PI', 'E']);

export function buildCandidateRegion(
  factors: Factor[],
  levels: FactorLevels[],
  constraints: string[],
  options: CandidateRegionOptions = {},
): SettableRegion {
  const enumerateLimit = options.enumerateLimit ?? DEFAULT_ENUMERATE_LIMIT;
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
  const compiled = constraints.map((text, i) => compileConstraint(text, i, factors, levels));

  const engineering = new Float64Array(k);
  const evaluateAll = (): boolean => {
    for (let j = 0; j < k; j++) scope.set(axes[j].id, engineering[j]);
    for (let c = 0; c < compiled.length; c++) {
      const result = runConstraint(compiled[c], scope, constraints[c], c);
      if (typeof result !== 'boolean') {
        throw new InputError(
          `constraint "${constraints[c]}" does not yield true or false (got ${math.format(result as never, { precision: 6 })}); ` +
            'write a comparison such as a <= b',
          { key: `constraints[${c}]` },
        );
      }
      if (!result) return false;
    }
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
    const rng = xoroshiro128plus(options.seed ?? 1);
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

function compileConstraint(text: string, i: number, factors: Factor[], levels: FactorLevels[]): EvalFunction {
  const key = `constraints[${i}]`;
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (error) {
    throw new InputError(`cannot read constraint "${text}": ${(error as Error).message}`, { key });
  }
  const operating = levels.map((l) => l.id);
  const modelParams = new Set(factors.filter((f) => f.role === 'model').map((f) => f.id));
  node.traverse((n, path, parent) => {
    if (n.type === 'AssignmentNode' || n.type === 'FunctionAssignmentNode') {
      throw new InputError(`constraint "${text}" assigns a value; compare with ==, <= or >= instead of =`, { key });
    }
    if (n.type !== 'SymbolNode') return;
    const name = (n as math.SymbolNode).name;
    if (parent && parent.type === 'FunctionNode' && path === 'fn') {
      if (typeof (math as unknown as Record<string, unknown>)[name] !== 'function') {
        throw new InputError(`constraint "${text}" calls an unknown function ${name}`, { key });
      }
      return;
    }
    if (operating.includes(name) || CONSTANTS.has(name)) return;
    if (modelParams.has(name)) {
      throw new InputError(
        `constraint "${text}" uses ${name}, a model parameter; constraints may only use operating settings`,
        { key },
      );
    }
    throw new InputError(`constraint "${text}" uses an unknown name "${name}"${didYouMean(name, operating)}`, { key });
  });
  return node.compile();
}

function runConstraint(fn: EvalFunction, scope: Map<string, unknown>, text: string, c: number): unknown {
  try {
    return fn.evaluate(scope);
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError(`cannot evaluate constraint "${text}": ${(error as Error).message}`, { key: `constraints[${c}]` });
  }
}
