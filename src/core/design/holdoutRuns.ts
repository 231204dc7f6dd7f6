/**
 * Holdout validation runs: extra runs kept out of the fit, used to check the fitted model's
 * predictions where it was not fitted.
 *
 * Method: candidates are interior points of the region — every varied coordinate strictly
 * inside (−1, 1), taken from the interior levels and the midpoints between adjacent levels
 * (rounded to settable values when the region knows the precisions), feasible, and not on a
 * constraint face (every neighbour ±1e-6 along each axis is feasible too). They are chosen
 * greedily to maximise the minimum coded Euclidean distance to the occupied points (fitting
 * and centre runs) and to the holdouts already chosen: the maximin distance criterion of
 * Johnson, Moore & Ylvisaker (1990), "Minimax and maximin distance designs", J. Statist.
 * Plann. Inference 26, 131–148, applied one point at a time. Ties are broken by a seeded
 * generator (../random.ts), so the same seed gives the same holdouts.
 *
 * Holding out about 20 % of the runs for validation is common practice; at least 2 so that
 * one odd run does not decide whether the model is trusted.
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { InputError } from '../inputError.js';
import { ENUMERATION_LIMIT, type CandidateRegion, type RegionAxis } from '../region/candidateRegion.js';
import { counted } from '../countedNoun.js';
import { settableCoded } from './levels.js';
import { gridPoints } from '../region/gridPoints.js';
import { createRandom, type RandomGenerator } from '../random.js';

const SAMPLE_SIZE = 5000;
const FACE_STEP = 1e-6;
const EDGE = 1 - 1e-9;

/** About 20 % of the fitting runs, at least 2. */
export function defaultHoldoutCount(fitRuns: number): number {
  return Math.max(2, Math.round(0.2 * fitRuns));
}

/**
 * `count` interior feasible points (coded, region factor order), chosen by greedy maximin
 * distance from `occupied`. Throws InputError (key `design.holdoutRuns`) when the region has
 * fewer free interior candidates than asked, unless `atMost` is set (then fewer come back).
 */
export interface HoldoutOptions {
  /** Return fewer holdouts instead of failing when the region has too few candidates (for `auto` counts). */
  atMost?: boolean;
}

export function chooseHoldoutRuns(
  region: CandidateRegion,
  occupied: number[][],
  count: number,
  seed: number,
  options: HoldoutOptions = {},
): number[][] {
  if (count <= 0) return [];
  const k = region.factorIds.length;
  if (k === 0) throw new InputError('holdout runs need at least one varied factor', { key: 'design.holdoutRuns' });
  const axes = 'axes' in region ? ((region as { axes: RegionAxis[] }).axes) : null;
  const snapOne = (j: number, c: number): number => (axes ? settableCoded(axes[j], c) : c);

  const interior = region.levels.map((set, j) => {
    const values = new Set<number>();
    set.forEach((c, i) => {
      values.add(snapOne(j, c));
      if (i > 0) values.add(snapOne(j, (set[i - 1] + c) / 2));
    });
    return [...values].filter((c) => Math.abs(c) < EDGE).sort((a, b) => a - b);
  });
  const flat = interior.findIndex((set) => set.length === 0);
  if (flat >= 0) {
    if (options.atMost) return [];
    throw new InputError(`${region.factorIds[flat]} has no settable value strictly between its low and high levels`, {
      key: 'design.holdoutRuns',
    });
  }

  const rng = createRandom(seed);
  let size = 1;
  for (const set of interior) size *= set.length;
  const raw = size <= ENUMERATION_LIMIT ? gridPoints(interior) : sample(interior, rng);
  const candidates: number[][] = [];
  for (const point of raw) if (region.isFeasible(point) && offFaces(region, point)) candidates.push(point);
  if (candidates.length < count && !options.atMost) {
    throw new InputError(
      `only ${counted(candidates.length, 'interior feasible point')} ${candidates.length === 1 ? 'is' : 'are'} available for ${counted(count, 'holdout run')}; ask for fewer`,
      { key: 'design.holdoutRuns' },
    );
  }

  const nearest = new Float64Array(candidates.length).fill(Infinity);
  const update = (from: ArrayLike<number>) => {
    for (let c = 0; c < candidates.length; c++) {
      const d = squaredDistance(candidates[c], from);
      if (d < nearest[c]) nearest[c] = d;
    }
  };
  for (const point of occupied) update(point);

  const chosen: number[][] = [];
  const taken = new Uint8Array(candidates.length);
  for (let h = 0; h < count; h++) {
    let best = -Infinity;
    for (let c = 0; c < candidates.length; c++) if (!taken[c] && nearest[c] > best) best = nearest[c];
    // A candidate on top of an occupied point adds nothing as a check.
    if (!(best > 1e-18)) {
      if (options.atMost) break;
      throw new InputError(`only ${h} interior points are free of fitting and centre runs; ask for fewer holdout runs`, {
        key: 'design.holdoutRuns',
      });
    }
    const tied: number[] = [];
    for (let c = 0; c < candidates.length; c++) {
      if (!taken[c] && nearest[c] >= best - 1e-9 * Math.max(1, best)) tied.push(c);
    }
    const pick = tied[tied.length === 1 ? 0 : uniformInt(rng, 0, tied.length - 1)];
    taken[pick] = 1;
    chosen.push(candidates[pick]);
    update(candidates[pick]);
  }
  return chosen;
}

function squaredDistance(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0;
  for (let j = 0; j < a.length; j++) {
    const d = a[j] - b[j];
    s += d * d;
  }
  return s;
}

/** True when a small step along every axis, either way, stays feasible. */
function offFaces(region: CandidateRegion, point: number[]): boolean {
  const probe = [...point];
  for (let j = 0; j < point.length; j++) {
    for (const step of [-FACE_STEP, FACE_STEP]) {
      probe[j] = point[j] + step;
      if (!region.isFeasible(probe)) return false;
    }
    probe[j] = point[j];
  }
  return true;
}

/** Seeded draw of distinct grid points, for grids too large to enumerate. */
function sample(sets: number[][], rng: RandomGenerator): number[][] {
  const seen = new Set<string>();
  const out: number[][] = [];
  for (let s = 0; s < SAMPLE_SIZE; s++) {
    const point = sets.map((set) => set[uniformInt(rng, 0, set.length - 1)]);
    const id = point.join(',');
    if (seen.has(id)) continue;
    seen.add(id);
    out.push(point);
  }
  return out;
}
