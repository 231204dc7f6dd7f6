/**
 * Benchmark of the minimum-aberration fraction search (src/core/classical/fractionalFactorial.ts).
 *
 * Prints, for 5 to 16 factors at resolution ≥ IV and ≥ V, the run size found, the words formed
 * (the search's unit of work), whether the search was exhaustive, and the wall time. Target:
 * every case up to 12 factors exhaustive and well under a second; beyond that the default budget
 * (about a second) may stop the resolution V search early, which the flag shows.
 *
 * Run alone with `npx tsx bench/fractionSearch.ts`, or call `benchFractionSearch()` from a runner.
 */
import { minimumAberrationFraction } from '../src/core/classical/fractionalFactorial.js';

export interface FractionSearchTiming {
  k: number;
  minResolution: number;
  runs: number | null;
  resolution: number | null;
  wordsFormed: number;
  exhaustive: boolean;
  milliseconds: number;
}

export function benchFractionSearch(maxFactors = 16): FractionSearchTiming[] {
  const timings: FractionSearchTiming[] = [];
  for (const minResolution of [4, 5]) {
    for (let k = 5; k <= maxFactors; k++) {
      const start = performance.now();
      const fraction = minimumAberrationFraction(k, minResolution);
      const milliseconds = performance.now() - start;
      timings.push({
        k,
        minResolution,
        runs: fraction?.runs ?? null,
        resolution: fraction?.resolution ?? null,
        wordsFormed: fraction?.search?.wordsFormed ?? 0,
        exhaustive: fraction?.search?.exhaustive ?? true,
        milliseconds,
      });
    }
  }
  return timings;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.log('factors  res≥  runs  res  words formed  exhaustive      ms');
  for (const t of benchFractionSearch()) {
    console.log(
      `${String(t.k).padStart(7)}  ${String(t.minResolution).padStart(4)}  ${String(t.runs).padStart(4)}  ${String(t.resolution).padStart(3)}` +
        `  ${String(t.wordsFormed).padStart(12)}  ${String(t.exhaustive).padStart(10)}  ${t.milliseconds.toFixed(1).padStart(6)}`,
    );
  }
}
