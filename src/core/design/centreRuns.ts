/**
 * The centre point: where the replicate centre runs go.
 *
 * Replicated centre runs estimate pure error and check for curvature the model lacks
 * (Montgomery, 2017, *Design and Analysis of Experiments*, 9th ed., §6.8 "Addition of
 * center points to the 2^k design"). The centre is coded 0 on every varied factor, set in
 * engineering units rounded to the factor's precision — so its coded value may sit slightly
 * off 0 (e.g. a 160–201 °C range with 1 °C steps has its settable centre at 181 °C, coded
 * 0.024), and the note says so. The note is empty when the centre is exactly coded 0.
 *
 * When the constraints or equipment limits exclude the centre, the runs move to the nearest
 * feasible point in coded Euclidean distance, searched over the levels and the midpoints
 * between adjacent levels (rounded to settable values); for fine grids too large to
 * enumerate, a seeded random sample followed by coordinate descent (common practice).
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { InputError } from '../inputError.js';
import type { Factor } from '../study.js';
import type { FactorLevels } from './designTypes.js';
import { ENUMERATION_LIMIT, type CandidateRegion } from '../region/candidateRegion.js';
import { settableCoded, settableValue } from './levels.js';
import { toEngineering } from '../region/codedUnits.js';
import { gridPoints } from '../region/gridPoints.js';
import { createRandom } from '../random.js';

export interface CentrePointOptions {
  /** Seed of the search on fine grids too large to enumerate (default 1). */
  seed?: number;
}

export function centrePoint(
  region: CandidateRegion,
  levels: FactorLevels[],
  factors: Factor[],
  options: CentrePointOptions = {},
): { coded: number[]; note: string } {
  const axes = region.factorIds.map((id) => {
    const factor = factors.find((f) => f.id === id);
    if (!factor) throw new Error(`region names ${id}, which is not a study factor`);
    return factor;
  });
  const k = axes.length;
  if (k === 0) return { coded: [], note: 'no factor is varied: the centre runs repeat the fixed settings' };

  const settable = (j: number, coded: number): number => settableCoded(axes[j], coded);
  const centre = axes.map((_, j) => settable(j, 0));

  if (region.isFeasible(centre)) {
    const shifted = axes
      .map((f, j) => ({ f, c: centre[j] }))
      .filter(({ c }) => Math.abs(c) > 1e-12)
      .map(({ f, c }) => `${f.id} at coded ${c.toFixed(3)}`);
    // Nothing to report when the centre is exactly coded 0.
    const note = shifted.length
      ? `centre runs at ${describe(axes, centre)}: rounding to the settable precision puts ${shifted.join(', ')} instead of 0`
      : '';
    return { coded: centre, note };
  }

  // Fine sets: the levels, the midpoints between adjacent levels and the settable centre.
  const fine = region.levels.map((set, j) => {
    const values = new Set<number>([centre[j]]);
    set.forEach((c, i) => {
      values.add(settable(j, c));
      if (i > 0) values.add(settable(j, (set[i - 1] + c) / 2));
    });
    return [...values].sort((a, b) => a - b);
  });
  let size = 1;
  for (const set of fine) size *= set.length;

  const best = size <= ENUMERATION_LIMIT ? nearestByEnumeration(region, fine) : nearestBySearch(region, fine, options.seed ?? 1);
  if (!best) {
    throw new InputError('no settable point near the centre satisfies the constraints; loosen a constraint', {
      key: 'constraints',
    });
  }
  const distance = Math.sqrt(best.reduce((s, x) => s + x * x, 0));
  return {
    coded: best,
    note:
      `the centre (${describe(axes, centre)}) is excluded by the constraints or equipment limits, ` +
      `so the centre runs move to the nearest feasible point, coded distance ${distance.toFixed(3)}: ${describe(axes, best)}`,
  };
}

function describe(axes: Factor[], coded: number[]): string {
  return axes
    .map((f, j) => {
      const value = settableValue(f, toEngineering(f, coded[j]));
      return f.unit && f.unit !== '-' ? `${f.id} ${value} ${f.unit}` : `${f.id} ${value}`;
    })
    .join(', ');
}

function squaredNorm(x: ArrayLike<number>): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += x[j] * x[j];
  return s;
}

/** Nearest feasible point to coded 0 on the fine grid; ties go to the first in grid order. */
function nearestByEnumeration(region: CandidateRegion, fine: number[][]): number[] | null {
  let best: number[] | null = null;
  let bestNorm = Infinity;
  for (const point of gridPoints(fine)) {
    const norm = squaredNorm(point);
    if (norm < bestNorm - 1e-12 && region.isFeasible(point)) {
      best = point;
      bestNorm = norm;
    }
  }
  return best;
}

/** Seeded random sample of the fine grid, then coordinate descent towards coded 0. */
function nearestBySearch(region: CandidateRegion, fine: number[][], seed: number): number[] | null {
  const k = fine.length;
  const rng = createRandom(seed);
  let best: number[] | null = null;
  let bestNorm = Infinity;
  const point = new Array<number>(k);
  for (let s = 0; s < 20_000; s++) {
    for (let j = 0; j < k; j++) point[j] = fine[j][uniformInt(rng, 0, fine[j].length - 1)];
    const norm = squaredNorm(point);
    if (norm < bestNorm && region.isFeasible(point)) {
      best = [...point];
      bestNorm = norm;
    }
  }
  if (!best) return null;
  let current: number[] = best;
  let improved = true;
  while (improved) {
    improved = false;
    for (let j = 0; j < k; j++) {
      for (const value of fine[j]) {
        const trial: number[] = [...current];
        trial[j] = value;
        const norm = squaredNorm(trial);
        if (norm < bestNorm - 1e-12 && region.isFeasible(trial)) {
          current = trial;
          bestNorm = norm;
          improved = true;
        }
      }
    }
  }
  return current;
}
