/**
 * A new plan revision that adds K runs to a campaign whose results are in: D-optimal given
 * the runs already done (augmentDesign.ts, Dykstra 1971), for the same or an extended model.
 *
 * Conventions fixed here:
 * - Runs done (X₀): every run of the parent plan except those marked not done on its sheet,
 *   holdouts included (once analysed, their results are data like any other), where they
 *   were actually made: at the as-run values the sheet records, else at the planned point
 *   (asRunPoint.ts, the rule the analysis fits by). The revision's `runs` keep the planned
 *   points, as the parent's sheet and plan.json show them.
 * - Candidates: the parent's candidate grid (levels, constraints, equipment limits); a grid
 *   too large to enumerate is refused.
 * - Default model extension (our rule, stated in the note): a response with significant
 *   lack of fit adds every missing square of a factor with three or more levels and every
 *   missing two-factor interaction; a factor on which the lab and the process model disagree
 *   adds its missing square and its missing interactions. Without either the model stays.
 *   An explicit term list (`--model`) replaces the rule.
 * - The revision keeps the parent's runs and appends the added ones (point ids A01, A02, …,
 *   purpose `fit`); its schedule holds the added runs only, ordered as `tierplan plan` orders
 *   runs (scheduleRuns.ts: hard-to-change grouping, sessions), numbered after the parent's last
 *   run and session, so run sheets list the added runs only and run numbers never repeat.
 *   A parent laid out in whole plots (a split-plot plan) gives every added run a whole plot
 *   of its own (its hard-to-change settings reset before it) in sessions of their own after
 *   the parent's (scheduleLaidOut), so the revision is analysed with the same random
 *   whole-plot effect and fixed sessions; its `metrics.gls` and `metrics.blocks` are recomputed
 *   over all the fitted runs (evaluate/structuredPrecision.ts) and `splitPlot` is not carried over.
 * - `parent: { id, checksum }` names the parent plan; the comparison is not carried over.
 */
import { InputError } from '../inputError.js';
import type { AnalysisDocument, SheetResults } from './campaignAnalysis.js';
import { asRunCoded } from './asRunPoint.js';
import { augmentDesign } from '../design/augmentDesign.js';
import type { PlannedRun } from '../design/designTypes.js';
import { settingsFor } from '../design/settings.js';
import { dEfficiency, iCriterion, logDetPerRun } from '../evaluate/designCriteria.js';
import { regionMoments } from '../evaluate/regionMoments.js';
import { compileModel } from '../model/modelMatrix.js';
import { termLabel } from '../model/modelTerm.js';
import { parseTerm } from '../model/termSyntax.js';
import { buildCandidateRegion } from '../region/candidateRegion.js';
import { scheduleLaidOut, scheduleRuns } from '../schedule/scheduleRuns.js';
import { equalSessionSizes, sessionCountFor } from '../schedule/sessionPlan.js';
import { structuredPrecision } from '../evaluate/structuredPrecision.js';
import { DEFAULT_VARIANCE_RATIO } from '../study.js';
import type { PlanDocument } from '../plan/planDocument.js';

export interface AugmentRequest {
  /** Runs to add. */
  runs: number;
  /** Explicit model terms (study syntax, intercept implied); default: the extension rule. */
  model?: string[];
}

export interface AugmentResult {
  plan: PlanDocument;
  /** Which terms were added to the model and why (or that the model stays). */
  modelNote: string;
}

/** Largest number of runs one augmentation adds (a documented limit). */
export const MAX_ADDED_RUNS = 500;

/** Refuses to augment a revision: its added runs would repeat point ids, and its analysis needs every ancestor's sheet. */
export function checkAugmentable(plan: PlanDocument): void {
  if (plan.parent) {
    throw new InputError(
      `plan ${plan.planId} is itself a revision of plan ${plan.parent.id}: augmenting a revision is not supported; augment plan ${plan.parent.id} again with more --runs instead`,
      { key: 'parent' },
    );
  }
}

export function augmentPlan(parent: PlanDocument, sheet: SheetResults, analysis: AnalysisDocument, request: AugmentRequest): AugmentResult {
  if (!Number.isInteger(request.runs) || request.runs < 1 || request.runs > MAX_ADDED_RUNS) {
    throw new InputError(`--runs must be a whole number from 1 to ${MAX_ADDED_RUNS}, not ${request.runs}`);
  }
  checkAugmentable(parent);
  const varied = parent.levels.filter((level) => level.varied);
  const factorIds = varied.map((level) => level.id);
  const { terms, note } = request.model ? explicitTerms(request.model, factorIds) : extendedTerms(parent, analysis, factorIds);
  const labels = terms.map((powers) => termLabel({ powers }, factorIds));
  const model = compileModel([{ powers: {} }, ...terms.map((powers) => ({ powers }))], factorIds);

  const region = buildCandidateRegion(parent.study.factors, parent.levels, parent.study.constraints, { seed: parent.metrics.seed });
  if (!region.points) throw new InputError(`the candidate grid of plan ${parent.planId} has ${region.gridSize} points, too many to augment from; use fewer levels`);
  // By point, from the sheet: a revision's schedule numbers its added runs only.
  const notDone = new Set(sheet.runs.filter((run) => run.notDone).map((run) => run.point));
  const done = parent.runs.filter((run) => !notDone.has(run.point));
  const factorOf = new Map(parent.study.factors.map((factor) => [factor.id, factor]));
  const asRunOf = new Map(sheet.runs.map((run) => [run.point, run.asRun]));
  const existing = done.map((run) => asRunCoded(run, asRunOf.get(run.point) ?? {}, factorIds, factorOf));
  const result = augmentDesign(model, existing, region.points, request.runs);
  if (!result.estimable) {
    throw new InputError(
      `${request.runs} added run${request.runs === 1 ? '' : 's'} cannot make the ${model.p} terms of the model estimable with the ${done.length} runs done; add more runs or give a smaller --model`,
      { key: 'runs' },
    );
  }
  const width = String(request.runs).length < 2 ? 2 : String(request.runs).length;
  const added: PlannedRun[] = result.added.map((c, i) => {
    const coded: Record<string, number> = {};
    factorIds.forEach((id, j) => (coded[id] = region.points![c][j]));
    return { point: `A${String(i + 1).padStart(width, '0')}`, purpose: 'fit', coded, settings: settingsFor(coded, parent.levels, parent.study.factors) };
  });

  const runs = [...parent.runs, ...added];
  const fitted = runs.filter((run) => run.purpose !== 'holdout' && !notDone.has(run.point)).map((run) => factorIds.map((id) => run.coded[id]));
  const fitRuns = runs.filter((run) => run.purpose === 'fit').map((run) => factorIds.map((id) => run.coded[id]));
  const moments = regionMoments(model, region, parent.metrics.seed);
  const lastSequence = Math.max(0, ...(parent.schedule?.order ?? []).map((run) => run.sequence));
  const lastSession = parent.schedule?.sessionCount ?? 0;
  const laidOut = parent.runs.some((run) => run.session !== undefined);
  const ordered = laidOut
    ? laidOutAddition(parent, added)
    : scheduleRuns({ runs: added, levels: parent.levels, study: parent.study }, parent.metrics.seed + 1);
  const schedule = {
    ...ordered,
    order: ordered.order.map((run) => ({ ...run, sequence: run.sequence + lastSequence, session: run.session + lastSession })),
    note: `Added runs of the augmentation of plan ${parent.planId}, numbered after its run ${lastSequence}. ${ordered.note}`,
  };
  schedule.sessionCount = lastSession + ordered.sessionCount;

  const explained = [
    { term: '1', reason: 'intercept' },
    ...labels.map((label) => ({
      term: label,
      reason: parent.model.terms.includes(label) ? 'in the parent plan' : request.model ? 'given with --model' : 'added by the augmentation rule: see the note',
    })),
  ];
  const plan: PlanDocument = {
    ...parent,
    planId: '',
    checksum: '',
    createdAt: '',
    parent: { id: parent.planId, checksum: parent.checksum },
    model: { intercept: true, terms: labels, explained, source: 'explicit', potential: [] },
    runs,
    metrics: {
      ...parent.metrics,
      p: model.p,
      N: fitRuns.length,
      logDetPerRun: logDetPerRun(model, fitRuns),
      dEfficiency: dEfficiency(model, fitRuns),
      boundEfficiency: null,
      boundNote: 'not computed for an augmentation',
      iCriterion: iCriterion(model, fitRuns, moments.matrix),
      runsNote: `${request.runs} runs added to the ${done.length} runs done of plan ${parent.planId} (D-optimal augmentation, Dykstra 1971); ${fitted.length} runs fitted in all`,
    },
    warnings: [...parent.warnings, note],
    schedule,
  };
  if (laidOut) {
    const figures = laidOutFigures(plan, model, runs.filter((run) => run.purpose !== 'holdout' && !notDone.has(run.point)), factorIds);
    plan.metrics.gls = figures.gls;
    plan.metrics.blocks = figures.blocks;
  }
  delete plan.comparison;
  delete plan.splitPlot;
  return { plan, modelNote: note };
}

/**
 * The added runs of a laid-out parent: one whole plot each, in the fewest sessions of at most
 * sessions.maxRuns runs after the parent's (sizes as equal as possible), numbered on from the
 * parent's last whole plot. Sets `wholePlot` and `session` on the added runs; returns their
 * schedule with sessions counted from 1 (the caller shifts them after the parent's).
 */
function laidOutAddition(parent: PlanDocument, added: PlannedRun[]) {
  const maxRuns = parent.study.sessions?.maxRuns ?? added.length;
  const sizes = equalSessionSizes(added.length, sessionCountFor(added.length, maxRuns));
  const sessionOf: number[] = sizes.flatMap((size, s) => Array.from({ length: size }, () => s));
  const laid = added.map((run, i) => ({ point: run.point, purpose: run.purpose, wholePlot: i, session: sessionOf[i] }));
  const { schedule, placement } = scheduleLaidOut({ runs: added, levels: parent.levels, study: parent.study }, laid, parent.metrics.seed + 1, false);
  const lastPlot = Math.max(0, ...parent.runs.map((run) => run.wholePlot ?? 0));
  const lastSession = parent.schedule?.sessionCount ?? 0;
  const hard = parent.runs.some((run) => run.wholePlot !== undefined);
  for (const run of added) {
    const place = placement.get(run.point)!;
    run.session = place.session + lastSession;
    if (hard) run.wholePlot = place.wholePlot + lastPlot;
  }
  return schedule;
}

/** metrics.gls and metrics.blocks of a revision, over its fitted runs' whole plots and sessions. */
function laidOutFigures(plan: PlanDocument, model: ReturnType<typeof compileModel>, fitted: PlannedRun[], factorIds: string[]) {
  const plotKey = (run: PlannedRun, i: number) => (run.wholePlot !== undefined ? `w${run.wholePlot}` : `r${i}`);
  const plots = new Map<string, number>();
  const sessions = new Map<number, number>();
  const sessionOfPlot: number[] = [];
  const wholePlotOf = Int32Array.from(fitted, (run, i) => {
    const key = plotKey(run, i);
    if (!plots.has(key)) {
      plots.set(key, plots.size);
      const session = run.session ?? 1;
      if (!sessions.has(session)) sessions.set(session, sessions.size);
      sessionOfPlot.push(sessions.get(session)!);
    }
    return plots.get(key)!;
  });
  const hard = factorIds.map((id) => plan.study.factors.find((factor) => factor.id === id)?.hardToChange === true);
  const structure = {
    wholePlotOf,
    sessionOfWholePlot: Int32Array.from(sessionOfPlot),
    wholePlots: plots.size,
    sessions: Math.max(1, sessions.size),
    varianceRatio: plan.study.design.varianceRatio ?? DEFAULT_VARIANCE_RATIO,
  };
  return structuredPrecision(model, fitted.map((run) => factorIds.map((id) => run.coded[id])), structure, hard);
}

function explicitTerms(texts: string[], factorIds: string[]): { terms: Record<string, number>[]; note: string } {
  const terms = texts.filter((text) => text.trim() !== '1').map((text, i) => parseTerm(text, factorIds, `--model[${i}]`));
  return { terms: unique(terms, factorIds), note: `model given with --model: ${texts.join(', ')}` };
}

function extendedTerms(parent: PlanDocument, analysis: AnalysisDocument, factorIds: string[]): { terms: Record<string, number>[]; note: string } {
  const current = parent.model.terms.map((text, i) => parseTerm(text, factorIds, `model.terms[${i}]`));
  const has = new Set(current.map((powers) => termLabel({ powers }, factorIds)));
  const levelsOf = new Map(parent.levels.map((level) => [level.id, level.values.length]));
  const additions: { powers: Record<string, number>; why: string }[] = [];
  const add = (powers: Record<string, number>, why: string) => {
    const label = termLabel({ powers }, factorIds);
    if (has.has(label)) return;
    has.add(label);
    additions.push({ powers, why });
  };
  const candidatesFor = (ids: string[], why: string) => {
    for (const id of ids) if ((levelsOf.get(id) ?? 0) >= 3) add({ [id]: 2 }, why);
    for (const a of factorIds) for (const b of factorIds) if (a < b && (ids.includes(a) || ids.includes(b))) add(factorIds.indexOf(a) < factorIds.indexOf(b) ? { [a]: 1, [b]: 1 } : { [b]: 1, [a]: 1 }, why);
  };
  for (const response of analysis.responses) {
    if (response.verdictReasons.some((reason) => reason.kind === 'lackOfFit')) candidatesFor(factorIds, `lack of fit in ${response.id}`);
  }
  for (const response of analysis.responses) {
    const disagreeing = response.labVsModel.factors.filter((factor) => factor.disagrees).map((factor) => factor.factor);
    if (disagreeing.length > 0) candidatesFor(disagreeing, `the lab and the process model disagree about ${disagreeing.join(', ')} in ${response.id}`);
  }
  if (additions.length === 0) return { terms: current, note: 'model unchanged: no lack of fit and no disagreement with the process model point to a missing term' };
  const byWhy = new Map<string, string[]>();
  for (const addition of additions) byWhy.set(addition.why, [...(byWhy.get(addition.why) ?? []), termLabel({ powers: addition.powers }, factorIds)]);
  const note = `model extended by ${[...byWhy].map(([why, labels]) => `${labels.join(', ')} (${why})`).join('; ')}`;
  return { terms: [...current, ...additions.map((addition) => addition.powers)], note };
}

function unique(terms: Record<string, number>[], factorIds: string[]): Record<string, number>[] {
  const seen = new Set<string>();
  return terms.filter((powers) => {
    const label = termLabel({ powers }, factorIds);
    if (seen.has(label)) return false;
    seen.add(label);
    return true;
  });
}
