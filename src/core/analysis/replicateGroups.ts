/**
 * Replicate groups: runs made at the same coded point (and in the same session, when the
 * sessions are blocks) form one group. The spread within groups is pure error; the number
 * of groups is the number of distinct fitted points that lack of fit is counted from
 * (Montgomery, 2017, "Design and Analysis of Experiments", 9th ed., §11.3: pure error from
 * replicated points, lack-of-fit df = distinct points − parameters).
 *
 * Points are compared coordinate by coordinate with an absolute tolerance of
 * `SAME_POINT_TOLERANCE` in coded units, so a run whose as-run value deviates from its
 * set-point is its own point, while binary noise from coding does not split a replicate.
 * Groups are numbered in order of first appearance.
 */

/** Two coded coordinates closer than this are the same setting. */
export const SAME_POINT_TOLERANCE = 1e-9;

export interface ReplicateGroups {
  /** Group of each run, 0-based. */
  group: Int32Array;
  /** Number of groups (distinct points, or distinct point–session cells). */
  count: number;
  /** Runs in each group. */
  sizes: Int32Array;
}

export function replicateGroups(points: readonly (readonly number[])[], sessions?: readonly number[]): ReplicateGroups {
  const group = new Int32Array(points.length);
  const representatives: number[] = [];
  points.forEach((point, i) => {
    const found = representatives.findIndex((r) => samePoint(points[r], point) && (!sessions || sessions[r] === sessions[i]));
    if (found >= 0) {
      group[i] = found;
    } else {
      group[i] = representatives.length;
      representatives.push(i);
    }
  });
  const sizes = new Int32Array(representatives.length);
  for (const g of group) sizes[g] += 1;
  return { group, count: representatives.length, sizes };
}

function samePoint(a: readonly number[], b: readonly number[]): boolean {
  if (a.length !== b.length) return false;
  for (let j = 0; j < a.length; j++) if (Math.abs(a[j] - b[j]) > SAME_POINT_TOLERANCE) return false;
  return true;
}
