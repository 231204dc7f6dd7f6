/**
 * Benchmark of the split-plot REML fit (src/core/analysis/wholePlotReml.ts) and of the whole
 * analysis of one response (src/core/analysis/analyzeResponse.ts) on a large invented plan:
 * six factors, two of them hard to change, full quadratic model (28 terms), 60 whole plots
 * of 5 runs (300 runs) in 4 sessions, 10 holdouts. Each REML fit evaluates the restricted
 * likelihood about 120 times (grid plus golden section), one Householder QR each.
 * Target: the analysis of one response under half a second, so a results workbook with a
 * handful of responses analyses in a few seconds.
 *
 * Run alone with `npx tsx bench/remlFit.ts`, or call `benchRemlFit()` from a runner.
 */
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { compileModel, modelMatrix } from '../src/core/model/modelMatrix.js';
import { termLabel } from '../src/core/model/modelTerm.js';
import { fitWholePlotReml } from '../src/core/analysis/wholePlotReml.js';
import { analyzeResponse } from '../src/core/analysis/analyzeResponse.js';
import type { AnalysisRun } from '../src/core/analysis/analysisTypes.js';

export interface RemlTiming {
  runs: number;
  terms: number;
  wholePlots: number;
  remlMilliseconds: number;
  analysisMilliseconds: number;
  targetMilliseconds: number;
}

const TARGET_MILLISECONDS = 500;

export function benchRemlFit(repeats = 5): RemlTiming {
  const ids = ['a', 'b', 'c', 'd', 'e', 'f'];
  const powers: Record<string, number>[] = [{}];
  ids.forEach((id) => powers.push({ [id]: 1 }));
  ids.forEach((id) => powers.push({ [id]: 2 }));
  ids.forEach((a, i) => ids.slice(i + 1).forEach((b) => powers.push({ [a]: 1, [b]: 1 })));
  const model = compileModel(powers.map((p) => ({ powers: p })), ids);
  const terms = powers.map((p) => termLabel({ powers: p }, ids));
  const rng = xoroshiro128plus(20240611);
  const uniform = (): number => uniformInt(rng, 0, 1_000_000) / 1_000_000;
  const level = () => [-1, 0, 1][Math.floor(uniform() * 3)];
  const normal = () => Math.sqrt(-2 * Math.log(uniform() + 1e-12)) * Math.cos(2 * Math.PI * uniform());
  const runs: AnalysisRun[] = [];
  const wholePlots = 60;
  for (let w = 0; w < wholePlots; w++) {
    const hard = [level(), level()];
    const shift = 0.8 * normal();
    for (let r = 0; r < 5; r++) {
      const coded = [...hard, level(), level(), level(), level()];
      const observed = 10 + coded.reduce((s, x, j) => s + (j + 1) * 0.3 * x - 0.2 * x * x, 0) + shift + 0.3 * normal();
      runs.push({ run: runs.length + 1, point: `F${runs.length + 1}`, coded, observed, wholePlot: w + 1, session: 1 + Math.floor(w / 15) });
    }
  }
  const holdouts: AnalysisRun[] = Array.from({ length: 10 }, (_, i) => ({
    run: 1000 + i,
    point: `H${i + 1}`,
    coded: ids.map(() => 0.5 * level()),
    observed: 10 + normal(),
  }));
  const X = modelMatrix(model, runs.map((r) => r.coded));
  const y = runs.map((r) => r.observed as number);
  const ranges = ids.map(() => ({ low: -1, high: 1 }));
  const remlTimes: number[] = [];
  const analysisTimes: number[] = [];
  for (let k = 0; k < repeats; k++) {
    let started = performance.now();
    fitWholePlotReml(X, y, runs.length, model.p, runs.map((r) => r.wholePlot!));
    remlTimes.push(performance.now() - started);
    started = performance.now();
    analyzeResponse({ id: 'y', model, terms, ranges, runs, holdouts });
    analysisTimes.push(performance.now() - started);
  }
  const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
  return {
    runs: runs.length,
    terms: model.p,
    wholePlots,
    remlMilliseconds: median(remlTimes),
    analysisMilliseconds: median(analysisTimes),
    targetMilliseconds: TARGET_MILLISECONDS,
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const t = benchRemlFit();
  console.log(`split-plot REML: ${t.runs} runs, ${t.terms} terms, ${t.wholePlots} whole plots`);
  console.log(`  REML fit (median of 5):          ${t.remlMilliseconds.toFixed(1)} ms`);
  console.log(`  analysis of one response:        ${t.analysisMilliseconds.toFixed(1)} ms`);
  console.log(`  target for the analysis:         < ${t.targetMilliseconds} ms  ${t.analysisMilliseconds < t.targetMilliseconds ? 'PASS' : 'FAIL'}`);
}
