/**
 * Benchmark of the exact design search and the continuous bound (`npm run bench`).
 *
 * Per case: search time with the default number of starts (the time target covers the search
 * plus the bound, which the user waits for too), D-efficiency relative to the
 * continuous D-optimal bound over several seeds (min / median / max), and the ratio to the
 * best plan found by a search with 50 times as many starts. Prints a table and PASS/FAIL per
 * target. A benchmark, not a test: timings depend on the machine and on its load (printed).
 *
 * Flags: --thorough (also run the 50× search on the heavy 10-factor case; minutes),
 *        --seeds=N (default 5), --starts=N (default: DEFAULT_DESIGN.starts).
 */
import { loadavg } from 'node:os';
import { DEFAULT_DESIGN } from '../src/core/study.js';
import { findExactDesign } from '../src/core/design/exactDesign.js';
import { boundForRegion } from '../src/core/design/continuousBound.js';
import { informationMatrix } from '../src/core/model/modelMatrix.js';
import { benchCases, type BenchCase } from './benchCases.js';

const args = process.argv.slice(2);
const thorough = args.includes('--thorough');
const seeds = numberFlag('--seeds', 5);
const starts = numberFlag('--starts', DEFAULT_DESIGN.starts);
const LONGER = 50;

function numberFlag(name: string, fallback: number): number {
  const found = args.find((arg) => arg.startsWith(`${name}=`));
  return found ? Number(found.slice(name.length + 1)) : fallback;
}

interface Row {
  name: string;
  p: number;
  N: number;
  medianSeconds: number;
  maxSeconds: number;
  boundSeconds: number;
  relative: number[];
  boundNote: string;
  textbook: number;
  longRatio: { worst: number; median: number } | null;
  orthogonal: boolean | null;
  timeTarget: number;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

function isExactlyOrthogonal(benchCase: BenchCase, points: number[][]): boolean {
  const { p } = benchCase.model;
  const M = informationMatrix(benchCase.model, points);
  for (let a = 0; a < p; a++) {
    for (let b = 0; b < p; b++) {
      const expected = a === b ? points.length : 0;
      if (Math.abs(M[a * p + b] - expected) > 1e-9) return false;
    }
  }
  return true;
}

function runCase(benchCase: BenchCase): Row {
  const { model, region, runs } = benchCase;
  const { p } = model;
  const seconds: number[] = [];
  const plans = [];
  for (let seed = 1; seed <= seeds; seed++) {
    const started = performance.now();
    plans.push(findExactDesign({ model, region, runs, criterion: 'D', seed, starts }));
    seconds.push((performance.now() - started) / 1000);
  }
  const boundStarted = performance.now();
  const bound = boundForRegion(model, region, plans[0].points, 1);
  const boundSeconds = (performance.now() - boundStarted) / 1000;
  const boundLogDet = bound.bound?.logDet ?? Number.NaN;
  const relative = plans.map((plan) => 100 * Math.exp((plan.logDetPerRun - boundLogDet) / p));

  let longRatio: Row['longRatio'] = null;
  if (!benchCase.heavy || thorough) {
    const long = findExactDesign({ model, region, runs, criterion: 'D', seed: 1000, starts: LONGER * starts });
    const best = Math.max(long.logDetPerRun, ...plans.map((plan) => plan.logDetPerRun));
    const ratios = plans.map((plan) => 100 * Math.exp((plan.logDetPerRun - best) / p));
    longRatio = { worst: Math.min(...ratios), median: median(ratios) };
  }
  return {
    name: benchCase.name,
    p,
    N: runs,
    medianSeconds: median(seconds),
    maxSeconds: Math.max(...seconds),
    boundSeconds,
    relative,
    boundNote: bound.note,
    textbook: median(plans.map((plan) => plan.dEfficiency)),
    longRatio,
    orthogonal: benchCase.mustBeOrthogonal ? plans.every((plan) => isExactlyOrthogonal(benchCase, plan.points)) : null,
    timeTarget: benchCase.heavy ? 15 : 1,
  };
}

const pad = (text: string, width: number) => text.padEnd(width);
const lpad = (text: string, width: number) => text.padStart(width);

console.log(`tierplan exact-design benchmark: ${starts} starts per search, ${seeds} seeds per case, ${LONGER}× = ${LONGER * starts} starts for the long search`);
console.log(`load average at start: ${loadavg().map((value) => value.toFixed(1)).join(' ')} (timings scale with load)`);
console.log('');
const rows: Row[] = [];
for (const benchCase of benchCases()) {
  process.stderr.write(`running: ${benchCase.name}\n`);
  rows.push(runCase(benchCase));
}

console.log(
  [
    pad('case', 46),
    lpad('p', 3),
    lpad('N', 4),
    lpad('time med/max s', 15),
    lpad('bound s', 8),
    lpad('D-eff vs bound min/med/max %', 30),
    lpad('textbook %', 11),
    lpad('vs 50× worst/med %', 19),
  ].join(' '),
);
for (const row of rows) {
  const relative = [Math.min(...row.relative), median(row.relative), Math.max(...row.relative)].map((v) => v.toFixed(2)).join(' / ');
  console.log(
    [
      pad(row.name, 46),
      lpad(String(row.p), 3),
      lpad(String(row.N), 4),
      lpad(`${row.medianSeconds.toFixed(2)} / ${row.maxSeconds.toFixed(2)}`, 15),
      lpad(row.boundSeconds.toFixed(2), 8),
      lpad(relative, 30),
      lpad(row.textbook.toFixed(2), 11),
      lpad(row.longRatio ? `${row.longRatio.worst.toFixed(2)} / ${row.longRatio.median.toFixed(2)}` : 'skipped', 19),
    ].join(' '),
  );
}
console.log('');
console.log('bounds:');
for (const row of rows) console.log(`  ${row.name}: ${row.boundNote}`);
console.log('');
console.log('targets:');
let failures = 0;
const verdict = (ok: boolean | null, text: string) => {
  if (ok === null) {
    console.log(`  SKIP  ${text}`);
    return;
  }
  if (!ok) failures++;
  console.log(`  ${ok ? 'PASS' : 'FAIL'}  ${text}`);
};
for (const row of rows) {
  // The user waits for the search and the bound together, so the target covers both.
  const engineSeconds = row.medianSeconds + row.boundSeconds;
  verdict(
    engineSeconds < row.timeTarget,
    `${row.name}: median search + bound ${row.medianSeconds.toFixed(2)} + ${row.boundSeconds.toFixed(2)} = ${engineSeconds.toFixed(2)} s < ${row.timeTarget} s`,
  );
  verdict(
    row.longRatio ? row.longRatio.worst >= 99 : null,
    row.longRatio
      ? `${row.name}: every seed within 1 % of the best plan of the ${LONGER}× search (worst ${row.longRatio.worst.toFixed(2)} %)`
      : `${row.name}: ${LONGER}× comparison skipped (takes minutes; run npm run bench -- --thorough)`,
  );
  if (row.orthogonal !== null) verdict(row.orthogonal, `${row.name}: every seed's plan exactly orthogonal (X'X = N·I, 100 % textbook D-efficiency)`);
}
console.log('');
console.log(failures === 0 ? 'all targets met' : `${failures} target(s) missed`);
