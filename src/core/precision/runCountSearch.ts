/**
 * The smallest run count whose re-optimised plan meets the precision target.
 *
 * Power is not a closed function of N here — each N gets its own optimal plan — so the
 * search probes run counts, each probe re-optimising the plan (warm-started from the nearest
 * plan already found):
 * 1. the floor (the smallest N that can estimate the model and leave a residual degree of
 *    freedom); if it meets the target, that is N;
 * 2. otherwise jump to the N the probe's own figures predict: the noncentrality of a test
 *    grows about in proportion to the runs, so N·(λ needed / λ reached) of the weakest
 *    entry (at least one more run, at most the cap); repeat until a probe meets the target
 *    or the cap fails it;
 * 3. bisect between the largest failing and the smallest meeting N until they are adjacent.
 * The answer therefore always comes with "one run fewer, re-optimised, does not meet it",
 * and the probes form the run curve. When even the cap fails, the best probe is returned with
 * `met` false. Monotonicity is assumed between probes (more runs never hurt an optimal plan
 * much); the bisection is exact for a monotone curve.
 */
import type { RunCurvePoint } from './precisionTypes.js';

export interface RunCountProbe<T> {
  result: T;
  weakestPower: number | null;
  met: boolean;
  /** λ needed / λ reached of the weakest entry (≥ 1 when not met); guides the jump of step 2. */
  shortfall?: number;
}

export interface RunCountSearch<T> {
  floor: number;
  cap: number;
  /** Re-optimises at `runs`, warm-started from `warm` (the nearest plan found so far) when given. */
  probe: (runs: number, warm: T | null) => RunCountProbe<T>;
}

export interface RunCountOutcome<T> {
  runs: number;
  result: T;
  met: boolean;
  weakestPower: number | null;
  /** Every probe, by run count. */
  curve: RunCurvePoint[];
}

export function smallestRunCount<T>(search: RunCountSearch<T>): RunCountOutcome<T> {
  const { floor, cap } = search;
  if (!(floor >= 1) || cap < floor) throw new RangeError(`run-count search needs 1 ≤ floor ≤ cap (got ${floor}, ${cap})`);
  const probes = new Map<number, RunCountProbe<T>>();
  const at = (runs: number): RunCountProbe<T> => {
    const known = probes.get(runs);
    if (known) return known;
    const probe = search.probe(runs, nearest(probes, runs)?.result ?? null);
    probes.set(runs, probe);
    return probe;
  };

  let low = floor;
  let current = at(floor);
  let high: number | null = current.met ? floor : null;
  while (high === null && low < cap) {
    const ratio = current.shortfall !== undefined && Number.isFinite(current.shortfall) ? current.shortfall : 2;
    const next = Math.min(cap, Math.max(low + 1, Math.ceil(low * Math.max(1, ratio))));
    current = at(next);
    if (current.met) high = next;
    else low = next;
  }
  if (high !== null) {
    while (high - low > 1) {
      const middle = Math.floor((low + high) / 2);
      if (at(middle).met) high = middle;
      else low = middle;
    }
  }
  const curve = [...probes.entries()].sort((a, b) => a[0] - b[0]).map(([runs, probe]) => ({ runs, weakestPower: probe.weakestPower }));
  if (high !== null) {
    const chosen = probes.get(high)!;
    return { runs: high, result: chosen.result, met: true, weakestPower: chosen.weakestPower, curve };
  }
  let best = floor;
  for (const [runs, probe] of probes) if ((probe.weakestPower ?? -1) > (probes.get(best)!.weakestPower ?? -1)) best = runs;
  const chosen = probes.get(best)!;
  return { runs: best, result: chosen.result, met: false, weakestPower: chosen.weakestPower, curve };
}

function nearest<T>(probes: Map<number, RunCountProbe<T>>, runs: number): RunCountProbe<T> | null {
  let best: number | null = null;
  for (const known of probes.keys()) if (best === null || Math.abs(known - runs) < Math.abs(best - runs)) best = known;
  return best === null ? null : probes.get(best)!;
}
