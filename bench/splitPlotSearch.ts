/**
 * Benchmark of the structured (split-plot, blocked) exact search,
 * src/core/design/structuredExchange.ts, on two cases:
 * - the bundled sample's model and candidate region (inlet temperature hard to change), 21
 *   fitting runs, 3 centre replicates and 4 holdouts in sessions of 6 (the sample plan's
 *   layout), for 7, 9 (the sample plan's count) and 12 whole plots;
 * - an invented 6-factor case, 2 of them hard to change, full quadratic model (28 terms),
 *   40 runs in 10 whole plots of 4 runs, 2 sessions.
 * Per case: time with the default number of starts and the D-efficiency of its plan relative
 * to the best plan a search with 50 times as many starts finds (exp of the ln det gap over the
 * size of the information matrix). Targets: under 3 s for the sample, within 1 %.
 * A benchmark, not a test: timings depend on the machine and its load (printed).
 * Last measured (2 cores, load about 2.5): sample 0.43–0.85 s at 98.4–99.7 % (the 1 % target
 * missed with 9 and 12 whole plots); 6-factor case 7.5 s at 99.2 %.
 *
 * Run alone with `npx tsx bench/splitPlotSearch.ts` (a few minutes: the 50× searches).
 */
import { loadavg } from 'node:os';
import { loadStudy } from '../src/io/studyFile.js';
import { decideTiers } from '../src/core/sensitivity/decideTiers.js';
import { planLevels } from '../src/core/design/levels.js';
import { deriveModel } from '../src/core/design/modelFromTiers.js';
import { buildCandidateRegion, type CandidateRegion } from '../src/core/region/candidateRegion.js';
import { compileModel, type CompiledModel } from '../src/core/model/modelMatrix.js';
import { fittedStructure, layoutRuns } from '../src/core/design/runLayout.js';
import type { ErrorStructure } from '../src/core/model/glsInformation.js';
import { findStructuredDesign } from '../src/core/design/structuredExchange.js';
import { DEFAULT_DESIGN } from '../src/core/study.js';

const LONGER = 50;

interface SearchCase {
  name: string;
  model: CompiledModel;
  region: CandidateRegion;
  structure: ErrorStructure;
  fixed: (readonly number[] | null)[];
  hard: boolean[];
}

async function sampleCases(): Promise<SearchCase[]> {
  const study = await loadStudy(new URL('../samples/spray-dryer/study.yaml', import.meta.url).pathname);
  const tiers = decideTiers(study);
  const levels = planLevels(study.factors, tiers, study.design.levels);
  const ids = levels.filter((l) => l.varied).map((l) => l.id);
  const derived = deriveModel(levels, tiers, study.policy, study.design.model, { interactionTable: true });
  const model = compileModel(derived.terms, ids);
  const region = buildCandidateRegion(study.factors, levels, study.constraints, { seed: 1 });
  const hard = ids.map((id) => study.factors.find((f) => f.id === id)?.hardToChange === true);
  return [7, 9, 12].map((wholePlots) => {
    const layout = layoutRuns({ fitRuns: 21, centreRuns: 3, holdoutRuns: 4, maxRuns: 6, wholePlots });
    const { structure, slots } = fittedStructure(layout, 1);
    return {
      name: `sample, ${wholePlots} whole plots, ${layout.sessions} sessions`,
      model,
      region,
      structure,
      fixed: slots.map((i) => (layout.roles[i] === 'centre' ? ids.map(() => 0) : null)),
      hard,
    };
  });
}

function sixFactorCase(): SearchCase {
  const ids = ['a', 'b', 'c', 'd', 'e', 'f'];
  const terms: { powers: Record<string, number> }[] = [{ powers: {} }];
  for (const id of ids) terms.push({ powers: { [id]: 1 } });
  for (let i = 0; i < ids.length; i++) for (let j = i + 1; j < ids.length; j++) terms.push({ powers: { [ids[i]]: 1, [ids[j]]: 1 } });
  for (const id of ids) terms.push({ powers: { [id]: 2 } });
  const levels = ids.map(() => [-1, 0, 1]);
  const region: CandidateRegion = { factorIds: ids, levels, isFeasible: () => true, gridSize: 3 ** 6, points: null };
  return {
    name: '6 factors (2 hard to change), quadratic, 10 whole plots of 4, 2 sessions',
    model: compileModel(terms, ids),
    region,
    structure: {
      wholePlotOf: Int32Array.from({ length: 40 }, (_, i) => Math.floor(i / 4)),
      sessionOfWholePlot: Int32Array.from({ length: 10 }, (_, w) => (w < 5 ? 0 : 1)),
      wholePlots: 10,
      sessions: 2,
      varianceRatio: 1,
    },
    fixed: Array.from({ length: 40 }, () => null),
    hard: [true, true, false, false, false, false],
  };
}

const starts = DEFAULT_DESIGN.starts;
console.log(`structured search: ${starts} starts against ${LONGER * starts}; load ${loadavg().map((v) => v.toFixed(2)).join(' ')}`);
for (const item of [...(await sampleCases()), sixFactorCase()]) {
  const request = { model: item.model, region: item.region, structure: item.structure, fixed: item.fixed, hard: item.hard, seed: 5 };
  const t0 = performance.now();
  const quick = findStructuredDesign({ ...request, starts });
  const seconds = (performance.now() - t0) / 1000;
  const long = findStructuredDesign({ ...request, starts: LONGER * starts, seed: 11 });
  const best = Math.max(quick.logDet, long.logDet);
  const relative = Math.exp((quick.logDet - best) / quick.size);
  const verdict = relative >= 0.99 ? 'PASS' : 'FAIL';
  console.log(`${item.name}: ${seconds.toFixed(2)} s, D relative to ${LONGER}× starts ${(100 * relative).toFixed(2)} % ${verdict}`);
}
