/**
 * The whole planning pipeline, from a validated study to the plan document.
 *
 * study → tiers → levels → model terms → candidate region → exact design (+ bound) →
 * centre and holdout runs → run order → comparison. Each stage is its own module; this one
 * only passes results along and records, for every number, how it was reached.
 *
 * When a varied factor is hard to change or the study has sessions, the plan is laid out in
 * whole plots and sessions (plan/laidOutDesign.ts) and searched, judged and ordered under that
 * structure; otherwise the completely randomised search (design/exactDesign.ts) is used and
 * the runs are randomised freely.
 *
 * The checksum and plan id are left empty here: hashing belongs with the file it protects
 * (`src/io/planFile.ts`, `sealPlan`).
 */
import type { Study } from '../study.js';
import { InputError } from '../inputError.js';
import { aboveLimit, checkLimit, limitOf } from '../inputLimits.js';
import { decideTiers } from '../sensitivity/decideTiers.js';
import { impliedStepNotes, planLevels } from '../design/levels.js';
import { checkRegionSupport } from '../region/regionSupport.js';
import { deriveModel } from '../design/modelFromTiers.js';
import { buildCandidateRegion } from '../region/candidateRegion.js';
import { centrePoint } from '../design/centreRuns.js';
import { chooseHoldoutRuns, defaultHoldoutCount } from '../design/holdoutRuns.js';
import { settingsFor } from '../design/settings.js';
import { boundForRegion } from '../design/continuousBound.js';
import { potentialTerms } from '../design/potentialTerms.js';
import { potentialPrior } from '../design/potentialPrior.js';
import { randomFeasiblePoint } from '../region/gridSampling.js';
import { regionMoments } from '../evaluate/regionMoments.js';
import { compileModel, modelMatrix, subModel, type CompiledModel } from '../model/modelMatrix.js';
import { INTERCEPT_LABEL, termLabel, type ModelTerm } from '../model/modelTerm.js';
import { predictEffects } from '../precision/predictedEffects.js';
import { sizeCampaign } from './campaignSize.js';
import { createRandom } from '../random.js';
import { scheduleLaidOut, scheduleRuns, type LaidOutPlanRun } from '../schedule/scheduleRuns.js';
import { independentRuns } from '../model/glsInformation.js';
import { structuredPrecision } from '../evaluate/structuredPrecision.js';
import { DEFAULT_VARIANCE_RATIO } from '../study.js';
import { wordList } from '../wordList.js';
import type { LaidOutDesign } from './laidOutDesign.js';
import { compareGroupings } from './groupingChoices.js';
import { buildComparison } from '../compare/buildComparison.js';
import type { FactorLevels, PlannedRun, RunPurpose } from '../design/designTypes.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
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
  const region = buildCandidateRegion(study.factors, levels, study.constraints, { seed: design.seed });
  const potential = potentialTerms({ levels, tiers, policy: study.policy, interactions: study.interactions, primary: derived.terms, spec: design.potential });
  // The potential terms enter the search's model too: the limit covers both.
  checkLimit('modelTerms', derived.terms.length + potential.terms.length, { key: 'design.model' }, 'model terms');
  // The potential terms are adjusted over the candidates, which must first support the primary model.
  checkRegionSupport(compileModel(derived.terms, factorIds), region);
  const guarded = guardedModel(derived.terms, potential.terms, factorIds, region, design.seed);
  const { model, primaryColumns, prior } = guarded;
  const primary = subModel(model, primaryColumns);
  const primaryLabels = derived.terms.map((term) => termLabel(term, factorIds));
  const planModel: PlanModel = {
    intercept: true,
    terms: primaryLabels.filter((label) => label !== INTERCEPT_LABEL),
    explained: derived.terms.map((term) => ({ term: termLabel(term, factorIds), reason: term.reason })),
    source: derived.source,
    potential: guarded.potential.map((term) => termLabel(term, factorIds)),
    potentialExplained: guarded.potential.map((term) => ({ term: termLabel(term, factorIds), reason: term.reason })),
  };

  const centre = centrePoint(region, levels, study.factors, { seed: design.seed });
  const centrePoints = Array.from({ length: design.centreRuns }, () => centre.coded);
  const effects = predictEffects({ ...study, levels });
  const moments = regionMoments(model, region, design.seed);
  const eta = design.varianceRatio ?? DEFAULT_VARIANCE_RATIO;
  const hard = factorIds.map((id) => study.factors.find((factor) => factor.id === id)?.hardToChange === true);
  const anyHard = hard.some(Boolean);
  const laidOut = anyHard || study.sessions !== undefined;
  const structureNotes = structureWarnings(study, levels, anyHard, laidOut);
  const holdoutsFor = (fitRuns: number) => (design.holdoutRuns === 'auto' ? defaultHoldoutCount(fitRuns) : design.holdoutRuns);
  const sized = sizeCampaign({
    model,
    primaryColumns,
    primaryLabels,
    priorInformation: prior,
    region,
    moments: moments.matrix,
    criterion: design.criterion,
    seed: design.seed,
    starts: design.starts,
    runs: design.runs,
    maxRuns: design.maxRuns,
    centrePoints,
    effects,
    target: design.precision,
    runsSetBy: options.runsSetBy ?? 'the study (design.runs)',
    onProgress: progress,
    onSearchProgress: options.onSearchProgress,
    ...(laidOut
      ? {
          laidOut: {
            setup: {
              model,
              primary,
              primaryLabels,
              prior,
              region,
              hard,
              varianceRatio: eta,
              ...(study.sessions ? { maxRuns: study.sessions.maxRuns } : {}),
              centre: centre.coded,
              centreRuns: design.centreRuns,
              holdouts: holdoutsFor,
              effects,
              target: design.precision,
              seed: design.seed,
            },
            wholePlots: design.wholePlots ?? 'auto',
            anyHard,
            ...(study.costs ? { costs: study.costs } : {}),
          },
        }
      : {}),
  });
  const exact = sized.exact;
  const laid = sized.laid?.design ?? null;
  // Already in standard order (first factor slowest, ascending); the schedule randomises.
  const fitPoints = exact.points;

  progress('computing the continuous D-optimal bound');
  const bound = boundForRegion(primary, region, fitPoints, design.seed);

  const holdoutCount = holdoutsFor(fitPoints.length);
  const occupied = design.centreRuns > 0 ? [...fitPoints, centre.coded] : fitPoints;
  const holdoutPoints =
    holdoutCount > 0 ? chooseHoldoutRuns(region, occupied, holdoutCount, design.seed, { atMost: design.holdoutRuns === 'auto' }) : [];

  const runs: PlannedRun[] = [
    ...fitPoints.map((point, i) => plannedRun(`F${pad(i + 1, fitPoints.length)}`, 'fit', point, varied, levels, study)),
    ...centrePoints.map((point, i) => plannedRun(`C${i + 1}`, 'centre', point, varied, levels, study)),
    ...holdoutPoints.map((point, i) => plannedRun(`H${i + 1}`, 'holdout', point, varied, levels, study)),
  ];
  const laidRuns = laid ? laidOutRuns(laid, runs) : null;
  // The GLS figures of the fitted runs: the laid-out plan's own, or, for a completely randomised
  // plan, every run its own whole plot (V = (1 + η) I).
  const glsFigures = laid
    ? laid.evaluation
    : structuredPrecision(primary, [...fitPoints, ...centrePoints], { ...independentRuns(fitPoints.length + centrePoints.length), varianceRatio: eta }, hard);

  const metrics: PlanMetrics = {
    p: primary.p,
    N: fitPoints.length,
    logDetPerRun: exact.logDetPerRun,
    dEfficiency: exact.dEfficiency,
    boundEfficiency: bound.efficiency,
    boundNote: `${bound.note}; fitting runs only, centre replicates excluded`,
    iCriterion: exact.iCriterion,
    // A laid-out plan is searched under D whatever the study asks (a warning says so).
    criterion: laid ? 'D' : design.criterion,
    seed: design.seed,
    starts: design.starts,
    runsNote: `${sized.runsNote}; ${lackOfFit([...fitPoints, ...centrePoints], primary.p).note}`,
    lackOfFit: lackOfFit([...fitPoints, ...centrePoints], primary.p),
    gls: glsFigures.gls,
    blocks: glsFigures.blocks,
  };
  if (laid && design.criterion === 'I') {
    structureNotes.push('the I-criterion is not available for a plan laid out in whole plots or sessions: this plan is D-optimal for the structured model');
  }

  const { warnings, ...studyInput } = study;
  // The whole-plot count and η the plan used, echoed where the study gives them.
  const studyEcho = {
    ...studyInput,
    design: { ...studyInput.design, wholePlots: laid?.wholePlots ?? design.wholePlots ?? 'auto', varianceRatio: eta },
  };
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
    precision: sized.precision,
    warnings: [
      ...warnings,
      ...impliedStepNotes(study.factors),
      ...derived.notes,
      ...potential.notes,
      ...guarded.notes,
      ...(centre.note ? [centre.note] : []),
      ...structureNotes,
      `I-criterion region moments: ${moments.method}`,
    ],
  };

  if (laid && laidRuns) {
    const { schedule, placement } = scheduleLaidOut(plan, laidRuns.filter((run) => runs.some((r) => r.point === run.point)), design.seed, laid.layout.split);
    plan.schedule = schedule;
    for (const run of plan.runs) {
      const place = placement.get(run.point)!;
      run.session = place.session;
      if (anyHard) run.wholePlot = place.wholePlot;
    }
    if (anyHard) {
      progress('comparing the split-plot plan with a completely randomised one and with grouping after the fact');
      plan.splitPlot = compareGroupings({
        plan,
        laid,
        setBy: sized.laid?.wholePlotsSetBy ?? null,
        model,
        primary,
        primaryColumns,
        primaryLabels,
        prior,
        region,
        hard,
        effects,
        target: design.precision,
        seed: design.seed,
        starts: design.starts,
        centrePoints,
      });
    }
  } else {
    plan.schedule = scheduleRuns(plan, design.seed);
  }
  if (!options.skipComparison) {
    progress('building the comparison with classical plans');
    plan.comparison = buildComparison(plan);
  }
  return plan;
}

/** Warnings about the whole plots and sessions a study asks for (none is an error). */
function structureWarnings(study: Study, levels: FactorLevels[], anyHard: boolean, laidOut: boolean): string[] {
  const notes: string[] = [];
  const fixedHard = study.factors.filter((factor) => factor.hardToChange === true && levels.some((level) => level.id === factor.id && !level.varied));
  if (fixedHard.length > 0) {
    notes.push(
      `${wordList(fixedHard.map((factor) => factor.name))} ${fixedHard.length === 1 ? 'is' : 'are'} hard to change but held fixed by the plan, so ${fixedHard.length === 1 ? 'it needs' : 'they need'} no changes`,
    );
  }
  if (!anyHard && typeof study.design.wholePlots === 'number') {
    notes.push('design.wholePlots has no effect: no factor the plan varies is hard to change');
  }
  if (!laidOut && study.design.varianceRatio !== undefined && study.design.varianceRatio !== DEFAULT_VARIANCE_RATIO) {
    notes.push('design.varianceRatio has no effect on the search: no factor the plan varies is hard to change and the study has no sessions');
  }
  return notes;
}

/** The layout whole plot and session of every run of a laid-out plan (holdouts in the holdout slots). */
function laidOutRuns(laid: LaidOutDesign, runs: PlannedRun[]): LaidOutPlanRun[] {
  const byRole = { fit: runs.filter((run) => run.purpose === 'fit'), centre: runs.filter((run) => run.purpose === 'centre'), holdout: runs.filter((run) => run.purpose === 'holdout') };
  const next = { fit: 0, centre: 0, holdout: 0 };
  const out: LaidOutPlanRun[] = [];
  laid.layout.roles.forEach((role, slot) => {
    if (role === 'done') return;
    const run = byRole[role][next[role]++];
    if (!run) return; // a holdout slot left empty (fewer holdouts found than laid out)
    const wholePlot = laid.layout.wholePlotOf[slot];
    out.push({ point: run.point, purpose: run.purpose, wholePlot, session: laid.layout.sessionOfWholePlot[wholePlot] });
  });
  return out;
}

/**
 * Primary and potential terms compiled together (primary first), with the potential-term
 * prior over the candidate set (the enumerated feasible grid, or a seeded sample of
 * POTENTIAL_SAMPLE feasible points of a grid too large to list). A potential term the primary
 * ones explain over the candidates cannot be guarded against and is dropped with a note.
 */
function guardedModel(
  primaryTerms: ModelTerm[],
  potentialTerms: ModelTerm[],
  factorIds: string[],
  region: CandidateRegion,
  seed: number,
): { model: CompiledModel; primaryColumns: number[]; prior: Float64Array | null; potential: ModelTerm[]; notes: string[] } {
  const primaryColumns = primaryTerms.map((_, t) => t);
  if (potentialTerms.length === 0) return { model: compileModel(primaryTerms, factorIds), primaryColumns, prior: null, potential: [], notes: [] };
  const candidates = region.points ?? sampledCandidates(region, seed);
  const notes: string[] = [];
  let potential = potentialTerms;
  for (;;) {
    const model = compileModel([...primaryTerms, ...potential], factorIds);
    const flags = Array.from({ length: model.p }, (_, t) => t >= primaryTerms.length);
    const prior = potentialPrior(modelMatrix(model, candidates), candidates.length, model.p, flags);
    if (prior.aliased.length === 0) return { model, primaryColumns, prior: prior.priorInformation, potential, notes };
    const dropped = new Set(prior.aliased.map((c) => c - primaryTerms.length));
    for (const t of dropped) {
      notes.push(`potential term ${termLabel(potential[t], factorIds)} is dropped: over the feasible settings the primary terms already explain it`);
    }
    potential = potential.filter((_, t) => !dropped.has(t));
    if (potential.length === 0) return { model: compileModel(primaryTerms, factorIds), primaryColumns, prior: null, potential: [], notes };
  }
}

/** Feasible points of the potential-term candidate sample of a grid too large to list. */
const POTENTIAL_SAMPLE = 4000;

function sampledCandidates(region: CandidateRegion, seed: number): number[][] {
  const rng = createRandom(seed);
  const point = new Float64Array(region.levels.length);
  const points: number[][] = [];
  for (let i = 0; i < POTENTIAL_SAMPLE && randomFeasiblePoint(region, rng, point); i++) points.push(Array.from(point));
  return points;
}

/**
 * Lack-of-fit and pure-error degrees of freedom of the fitted runs (fitting runs plus centre
 * replicates): distinct points − p for lack of fit, runs − distinct points for pure error
 * (Montgomery, 2017, "Design and Analysis of Experiments", 9th ed., §11.2).
 */
function lackOfFit(points: readonly number[][], p: number): NonNullable<PlanMetrics['lackOfFit']> {
  const distinct = new Set(points.map((x) => x.map((value) => value.toPrecision(12)).join(','))).size;
  const df = distinct - p;
  const pureErrorDf = points.length - distinct;
  const note =
    `the ${points.length} fitted runs sit at ${distinct} distinct points: ${Math.max(df, 0)} degree${df === 1 ? '' : 's'} of freedom for lack of fit ` +
    `and ${pureErrorDf} for pure error` +
    (df > 0 && pureErrorDf > 0 ? ', so lack of fit can be tested' : pureErrorDf === 0 ? ' (no replicated point), so lack of fit cannot be tested' : ', so lack of fit cannot be tested');
  return { distinctPoints: distinct, df: Math.max(df, 0), pureErrorDf, note };
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
