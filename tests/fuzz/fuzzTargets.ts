/**
 * What the fuzz harness feeds and what it runs: one entry per reader of user files. Each
 * target generates mutated files (fuzzInputs.ts) and runs the pipeline a user would — read
 * the study and its tables, decide the tiers, plan (with at most two search starts, so that
 * a case takes a fraction of a second) and compare; or, for `plan file`, read a plan.json
 * that was broken after planning (and sealed again, so that its checksum matches) and compare.
 *
 * `results sheet`: a filled runsheet.csv or runsheet.xlsx as tierplan writes it, broken
 * (resultsSheetInputs.ts), read and analysed as `tierplan analyze` does (readResultsSheet,
 * then analyzeCampaign).
 *
 * To fuzz a new reader: add an arbitrary that writes and breaks that file (a MutatedPart of
 * fuzzInputs.ts, or a module of its own like resultsSheetInputs.ts), and an entry here whose
 * `run` reads it the way the command does. fuzzCase.ts, the suite test and `npm run fuzz`
 * need no change.
 */
import { writeFileSync } from 'node:fs';
import type fc from 'fast-check';
import { loadStudy } from '../../src/io/studyFile.js';
import { buildPlan } from '../../src/core/plan/buildPlan.js';
import { buildComparison } from '../../src/core/compare/buildComparison.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';
import { checkedPlan, planJson, readPlanJson, sealPlan } from '../../src/io/planFile.js';
import { readResultsSheet } from '../../src/io/resultsSheet.js';
import { analyzeCampaign } from '../../src/core/results/campaignAnalysis.js';
import { fuzzFilesArbitrary, mutatePlan, type FuzzFiles } from './fuzzInputs.js';
import { describeMutation, resultsFuzzPlan, resultsSheetCaseArbitrary, writeResultsSheet } from './resultsSheetInputs.js';

export interface FuzzTarget {
  name: string;
  inputs: fc.Arbitrary<FuzzFiles>;
  /** Runs the pipeline on the files written to `folder`; resolves with a short summary. */
  run(folder: string, entry: string, input: FuzzFiles): Promise<string>;
}

/** Search starts the planner gets in a fuzz case, whatever the study asks for. */
export const FUZZ_STARTS = 2;

async function readAndPlan(folder: string, entry: string): Promise<string> {
  const study = await loadStudy(`${folder}/${entry}`);
  const plan = buildPlan({ ...study, design: { ...study.design, starts: Math.min(study.design.starts, FUZZ_STARTS) } }, { toolVersion: 'fuzz' });
  return `${plan.runs.length} runs, ${plan.comparison?.comparators.length ?? 0} comparison rows`;
}

/** Plans the (valid) study, breaks the plan document, seals it again and compares it, as `tierplan compare plan.json` does. */
async function planThenCompare(folder: string, entry: string, input: FuzzFiles): Promise<string> {
  const study = await loadStudy(`${folder}/${entry}`);
  const plan = buildPlan({ ...study, design: { ...study.design, starts: Math.min(study.design.starts, FUZZ_STARTS) } }, { toolVersion: 'fuzz', skipComparison: true });
  const document = JSON.parse(planJson(sealPlan(plan))) as Record<string, never>;
  mutatePlan(document, input.planMutations ?? []);
  const path = `${folder}/plan.json`;
  writeFileSync(path, planJson(sealPlan(document as unknown as PlanDocument)));
  const comparison = buildComparison(checkedPlan(await readPlanJson(path), path));
  return `${comparison.comparators.length} comparison rows`;
}

/** Writes the broken run sheet, then reads and analyses it as `tierplan analyze plan.json <sheet>` does. */
async function readAndAnalyze(folder: string, _entry: string, input: FuzzFiles): Promise<string> {
  const sheetCase = input.resultsSheet!;
  const plan = resultsFuzzPlan();
  const path = `${folder}/runsheet.${sheetCase.format}`;
  writeFileSync(path, await writeResultsSheet(plan, sheetCase));
  const sheet = await readResultsSheet(path, plan);
  const analysis = analyzeCampaign(plan, sheet, { file: path, sheet: sheet.sheet, toolVersion: 'fuzz' });
  return `${analysis.results.runs} runs read, verdicts ${analysis.responses.map((response) => response.verdict).join(', ')}`;
}

const resultsSheetInputs: fc.Arbitrary<FuzzFiles> = resultsSheetCaseArbitrary.map((sheetCase) => ({
  files: {},
  entry: `runsheet.${sheetCase.format}`,
  mutations: [`${sheetCase.format}`, ...sheetCase.mutations.map(describeMutation)],
  resultsSheet: sheetCase,
}));

export const FUZZ_TARGETS: readonly FuzzTarget[] = [
  { name: 'study file', inputs: fuzzFilesArbitrary('study'), run: readAndPlan },
  { name: 'index table', inputs: fuzzFilesArbitrary('indices'), run: readAndPlan },
  { name: 'interaction table', inputs: fuzzFilesArbitrary('interactions'), run: readAndPlan },
  { name: 'plan file', inputs: fuzzFilesArbitrary('plan'), run: planThenCompare },
  { name: 'results sheet', inputs: resultsSheetInputs, run: readAndAnalyze },
];
