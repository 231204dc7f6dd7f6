/**
 * The whole planning pipeline, from a validated study to the plan document.
 *
 * study → tiers → levels → model terms → candidate region → exact design (+ bound) →
 * centre and holdout runs → run order → comparison. Each stage is its own module; this one
 * only passes results along and records, for every number, how it was reached.
 *
 * The checksum and plan id are left empty here: hashing belongs with the file it protects
 * (`src/io/planFile.ts`, `sealPlan`).
 */
import type { Study } from '../study.js';
import { InputError } from '../inputError.js';
import { aboveLimit, checkLimit, limitOf } from '../inputLimits.js';
import { decideTiers } from '../sensitivity/decideTiers.js';
import { impliedStepNotes, planLevels } from '../design/levels.js';
import { deriveModel } from '../design/modelFromTiers.js';
import { buildCandidateRegion } from '../region/candidateRegion.js';
import { centrePoint } from '../design/centreRuns.js';
import { chooseHoldoutRuns, defaultHoldoutCount } from '../design/holdoutRuns.js';
import { settingsFor } from '../design/settings.js';
import { checkSearchWork, findExactDesign } from '../design/exactDesign.js';
import { boundForRegion } from '../design/continuousBound.js';
import { defaultRunCount } from '../design/runCount.js';
import { regionMoments } from '../evaluate/regionMoments.js';
import { compileModel } from '../model/modelMatrix.js';
import { termLabel } from '../model/modelTerm.js';
import { scheduleRuns } from '../schedule/scheduleRuns.js';
import { buildComparison } from '../compare/buildComparison.js';
import type { FactorLevels, PlannedRun, RunPurpose } from '../design/designTypes.js';
import type { PlanDocument, PlanMetrics, PlanModel } from './planDocument.js';

export interface BuildPlanOptions {
  toolVersion: string;
  /** Called with a short message before each stage that may take more than a moment. */
  onProgress?: (message: string) => void;
  /** Progress of the exact search, starts done out of starts total. */
  onSearchProgress?: (done: number, total: number) => void;
  /** Skip the comparison (it is the slowest stage after the search). */
  skipComparison?: boolean;
  /** Where a fixed run count came from, for the note (default `the study (design.runs)`). */
  runsSetBy?: string;
}

export function buildPlan(study: Study, options: BuildPlanOptions): PlanDocument {
  const progress = options.onProgress ?? (() => {});
  const { design } = study;

  const tiers = decideTiers(study);
  const levels = planLevels(study.factors, tiers, design.levels);
  const varied = levels.filter((level) => level.varied);
  if (varied.length === 0) {
    throw new InputError(
      'no operating factor is varied: every one is negligible under the current thresholds; lower policy.moderate or give a factor explicit levels',
      { key: 'policy.moderate' },
    );
  }
  if (varied.length > limitOf('variedFactors')) {
    throw new InputError(
      `${varied.length} operating factors would be varied, ${aboveLimit('variedFactors')}; fix the least important at their nominal (raise policy.moderate) or screen them first`,
      { key: 'factors' },
    );
  }
  const factorIds = varied.map((level) => level.id);

  const derived = deriveModel(levels, tiers, study.policy, design.model, { interactionTable: study.interactions.length > 0 });
  // A derived model grows with the interacting pairs; refuse it before any matrix is built.
  checkLimit('modelTerms', derived.terms.length, { key: 'design.model' }, 'model terms');
  const model = compileModel(derived.terms, factorIds);
  const planModel: PlanModel = {
    intercept: true,
    terms: derived.terms.filter((term) => Object.keys(term.powers).length > 0).map((term) => termLabel(term, factorIds)),
    explained: derived.terms.map((term) => ({ term: termLabel(term, factorIds), reason: term.reason })),
    source: derived.source,
  };

  const region = buildCandidateRegion(study.factors, levels, study.constraints, { seed: design.seed });

  const runCount =
    design.runs === 'auto'
      ? defaultRunCount(model.p, design.centreRuns)
      : { runs: design.runs, note: `set by ${options.runsSetBy ?? 'the study (design.runs)'}` };
  if (runCount.runs < model.p) {
    throw new InputError(
      `${runCount.runs} fitting runs cannot estimate ${model.p} model parameters; use at least ${model.p} or a smaller model`,
      { key: 'design.runs' },
    );
  }

  // Refuse a search past its work limit before the region moments and the search itself.
  checkSearchWork(model, region, runCount.runs, design.starts);
  const moments = regionMoments(model, region, design.seed);
  progress(`searching for a ${design.criterion}-optimal ${runCount.runs}-run plan (${design.starts} starts)`);
  const exact = findExactDesign({
    model,
    region,
    runs: runCount.runs,
    criterion: design.criterion,
    seed: design.seed,
    starts: design.starts,
    moments: moments.matrix,
    onProgress: options.onSearchProgress,
  });
  // Already in standard order (first factor slowest, ascending); the schedule randomises.
  const fitPoints = exact.points;

  progress('computing the continuous D-optimal bound');
  const bound = boundForRegion(model, region, fitPoints, design.seed);

  const centre = centrePoint(region, levels, study.factors, { seed: design.seed });
  const centrePoints = Array.from({ length: design.centreRuns }, () => centre.coded);
  const holdoutCount = design.holdoutRuns === 'auto' ? defaultHoldoutCount(fitPoints.length) : design.holdoutRuns;
  const occupied = design.centreRuns > 0 ? [...fitPoints, centre.coded] : fitPoints;
  const holdoutPoints =
    holdoutCount > 0 ? chooseHoldoutRuns(region, occupied, holdoutCount, design.seed, { atMost: design.holdoutRuns === 'auto' }) : [];

  const runs: PlannedRun[] = [
    ...fitPoints.map((point, i) => plannedRun(`F${pad(i + 1, fitPoints.length)}`, 'fit', point, varied, levels, study)),
    ...centrePoints.map((point, i) => plannedRun(`C${i + 1}`, 'centre', point, varied, levels, study)),
    ...holdoutPoints.map((point, i) => plannedRun(`H${i + 1}`, 'holdout', point, varied, levels, study)),
  ];

  const metrics: PlanMetrics = {
    p: model.p,
    N: fitPoints.length,
    logDetPerRun: exact.logDetPerRun,
    dEfficiency: exact.dEfficiency,
    boundEfficiency: bound.efficiency,
    boundNote: bound.note,
    iCriterion: exact.iCriterion,
    criterion: design.criterion,
    seed: design.seed,
    starts: design.starts,
    runsNote: runCount.note,
  };

  const { warnings, ...studyEcho } = study;
  const plan: PlanDocument = {
    formatVersion: 1,
    tool: { name: 'tierplan', version: options.toolVersion },
    planId: '',
    checksum: '',
    createdAt: '',
    study: studyEcho,
    tiers,
    levels,
    model: planModel,
    runs,
    metrics,
    warnings: [...warnings, ...impliedStepNotes(study.factors), ...derived.notes, ...(centre.note ? [centre.note] : []), `I-criterion region moments: ${moments.method}`],
  };

  plan.schedule = scheduleRuns(plan, design.seed);
  if (!options.skipComparison) {
    progress('building the comparison with classical plans');
    plan.comparison = buildComparison(plan);
  }
  return plan;
}

function plannedRun(
  point: string,
  purpose: RunPurpose,
  coded: number[],
  varied: FactorLevels[],
  levels: FactorLevels[],
  study: Study,
): PlannedRun {
  const codedMap: Record<string, number> = {};
  varied.forEach((level, j) => {
    codedMap[level.id] = coded[j];
  });
  return { point, purpose, coded: codedMap, settings: settingsFor(codedMap, levels, study.factors) };
}

function pad(n: number, total: number): string {
  return String(n).padStart(String(total).length < 2 ? 2 : String(total).length, '0');
}
