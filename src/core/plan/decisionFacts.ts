/**
 * The facts behind the manager's decision, as data: the proposed plan against the conventional
 * plan and the best classical alternative (runs, cost, bench hours, calendar sessions, what each
 * can estimate), how surely the plan detects what it must, the single main risk, and what a
 * failed validation would cost. The outputs word these facts (src/io/managerDecision.ts); no
 * sentence is built here, so none has to be parsed back.
 *
 * Rules fixed here:
 * - Best classical alternative: with `comparison.equalPrecision`, the family that reaches the
 *   plan's precision target with the fewest runs; otherwise, among the classical plans that were
 *   built, fit the model and can be run as listed (no run breaks a constraint or an equipment
 *   limit), the one with the fewest runs, ties to the lower average prediction variance. The
 *   conventional plan is shown on its own and is never the alternative.
 * - Calendar sessions: with `sessions.maxRuns`, ⌈runs / maxRuns⌉ for every plan, the schedule's
 *   own rule (sessionPlan.ts; the proposed plan uses its schedule); without sessions, working
 *   days of DEFAULT_SESSION_HOURS bench hours, ⌈hours / 8⌉, when the study gives costs.
 * - Failed validation: the follow-up is sized as one lack-of-fit allowance of the run-count rule,
 *   max(3, ⌈p/4⌉) runs (runCount.ts): enough to add that many terms to the model (those lack of
 *   fit points to) and re-check it. A planning allowance, not an optimum. Its cost assumes each
 *   added run needs a reset of the hard-to-change factors (an upper estimate).
 * - Main risk, the first that applies: the precision target is missed; without a precision
 *   block, a model term is detected with less than GOOD_POWER at the comparison's δ; a
 *   borderline factor is held fixed; hard-to-change factors are grouped without whole plots
 *   (the session then moves with their setting); otherwise, effects outside the model form.
 */
import { DEFAULT_SESSION_HOURS, type Study } from '../study.js';
import type { PlanDocument } from './planDocument.js';
import type { FactorPrecision, InteractionPrecision, PlanPrecision as PrecisionBlock } from '../precision/precisionTypes.js';
import type { ComparatorId, ComparatorRow, Comparison } from '../compare/comparisonTypes.js';
import { campaignCost } from '../compare/campaignCost.js';
import { sessionCountFor } from '../schedule/sessionPlan.js';
import { GOOD_POWER } from '../compare/verdict.js';

export interface PlanFigures {
  id: ComparatorId;
  label: string;
  runs: number;
  cost: number | null;
  hours: number | null;
  /** Calendar sessions (days, shifts) or working days; null when neither rule applies. */
  sessions: number | null;
  /** Model parameters it can estimate, of `p`. */
  estimable: number;
  missingTerms: string[];
  offLimitsRuns: number;
  /** Runs it needs for the precision target, when the comparison has equal-precision figures (null: cannot). */
  runsForPrecision?: number | null;
}

export type MainRisk =
  | { kind: 'precisionShort'; weakest: FactorPrecision | InteractionPrecision; target: number }
  | { kind: 'weakTerm'; term: string; power: number; vif: number | null; delta: number }
  | { kind: 'borderlineFixed'; factors: string[] }
  | { kind: 'groupedHardToChange'; factors: string[]; sessions: number }
  | { kind: 'modelForm'; holdoutRuns: number };

export interface DecisionFacts {
  p: number;
  currency: string | null;
  /** How `sessions` was counted: the study's sessions, working days, or not at all. */
  sessionBasis: { kind: 'sessions'; label: string; maxRuns: number } | { kind: 'workingDays'; hours: number } | { kind: 'none' };
  proposed: PlanFigures & { fitRuns: number; centreRuns: number; holdoutRuns: number };
  conventional: PlanFigures | null;
  /** The best classical alternative, or null with why. */
  alternative: PlanFigures | null;
  alternativeMissing: 'noneFits' | 'noneRunnable' | null;
  precision: PrecisionBlock | null;
  /** The weakest model term at δ σ (today's figure, for plans without a precision block). */
  termPower: { term: string | null; power: number; delta: number; reaching: number; terms: number } | null;
  risk: MainRisk;
  fallback: { runs: number; cost: number | null; hours: number | null; sessions: number | null; allowanceOf: number };
}

export function decisionFacts(plan: PlanDocument): DecisionFacts {
  const comparison = plan.comparison;
  const study = plan.study;
  const basis = sessionBasis(study);
  const count = (purpose: string) => plan.runs.filter((run) => run.purpose === purpose).length;
  const fitRuns = count('fit');
  const centreRuns = count('centre');
  const holdoutRuns = count('holdout');
  const p = plan.metrics.p;

  const rows = comparison?.comparators ?? [];
  const proposedRow = rows.find((row) => row.id === 'proposed');
  const ownCost = campaignCost(plan.runs.length, plan.schedule?.hardToChange?.levelChanges ?? null, study.costs);
  const proposed = {
    id: 'proposed' as const,
    label: proposedRow?.label ?? 'Proposed plan',
    runs: plan.runs.length,
    cost: proposedRow?.cost ?? ownCost.cost,
    hours: proposedRow?.hours ?? ownCost.hours,
    sessions: plan.schedule && basis.kind === 'sessions' ? plan.schedule.sessionCount : sessionsFor(plan.runs.length, proposedRow?.hours ?? ownCost.hours, basis),
    estimable: proposedRow ? p - proposedRow.missingTerms.length : p,
    missingTerms: proposedRow?.missingTerms ?? [],
    offLimitsRuns: proposedRow?.offLimitsRuns ?? 0,
    fitRuns,
    centreRuns,
    holdoutRuns,
    ...precisionRuns(comparison, 'proposed'),
  };

  const figures = (row: ComparatorRow): PlanFigures => ({
    id: row.id,
    label: row.label,
    runs: row.runs ?? 0,
    cost: row.cost,
    hours: row.hours,
    sessions: sessionsFor(row.runs ?? 0, row.hours, basis),
    estimable: row.fitsModel === null ? 0 : p - row.missingTerms.length,
    missingTerms: row.missingTerms,
    offLimitsRuns: row.offLimitsRuns ?? 0,
    ...precisionRuns(comparison, row.id),
  });

  const conventionalRow = rows.find((row) => row.id === 'conventional' && row.runs !== null);
  const { row: alternativeRow, missing } = bestAlternative(rows, comparison);

  const precision = plan.precision ?? null;
  const termPower = proposedRow && proposedRow.minPower !== null && comparison ? weakestTerm(proposedRow, comparison.delta) : null;

  return {
    p,
    currency: comparison?.currency ?? study.costs?.currency ?? null,
    sessionBasis: basis,
    proposed,
    conventional: conventionalRow ? figures(conventionalRow) : null,
    alternative: alternativeRow ? figures(alternativeRow) : null,
    alternativeMissing: alternativeRow ? null : missing,
    precision,
    termPower,
    risk: mainRisk(plan, precision, termPower, holdoutRuns),
    fallback: fallbackRuns(plan, basis),
  };
}

function sessionBasis(study: Omit<Study, 'warnings'>): DecisionFacts['sessionBasis'] {
  if (study.sessions) return { kind: 'sessions', label: study.sessions.label, maxRuns: study.sessions.maxRuns };
  if (study.costs) return { kind: 'workingDays', hours: DEFAULT_SESSION_HOURS };
  return { kind: 'none' };
}

function sessionsFor(runs: number, hours: number | null, basis: DecisionFacts['sessionBasis']): number | null {
  if (runs <= 0) return null;
  if (basis.kind === 'sessions') return sessionCountFor(runs, basis.maxRuns);
  if (basis.kind === 'workingDays' && hours !== null) return Math.max(1, Math.ceil(hours / basis.hours - 1e-9));
  return null;
}

function precisionRuns(comparison: Comparison | undefined, id: ComparatorId): { runsForPrecision?: number | null } {
  const entry = comparison?.equalPrecision?.find((candidate) => candidate.plan === id);
  return entry ? { runsForPrecision: entry.runs } : {};
}

function bestAlternative(rows: ComparatorRow[], comparison: Comparison | undefined): { row: ComparatorRow | null; missing: 'noneFits' | 'noneRunnable' | null } {
  const classical = rows.filter((row) => row.id !== 'proposed' && row.id !== 'conventional' && row.runs !== null);
  const equal = comparison?.equalPrecision;
  if (equal && equal.length > 0) {
    const reachable = classical
      .map((row) => ({ row, runs: equal.find((entry) => entry.plan === row.id)?.runs ?? null }))
      .filter((entry): entry is { row: ComparatorRow; runs: number } => entry.runs !== null && (entry.row.offLimitsRuns ?? 0) === 0)
      .sort((a, b) => a.runs - b.runs);
    if (reachable.length > 0) return { row: reachable[0].row, missing: null };
  }
  const fitting = classical.filter((row) => row.fitsModel === true);
  const runnable = fitting.filter((row) => (row.offLimitsRuns ?? 0) === 0);
  if (runnable.length === 0) return { row: null, missing: fitting.length === 0 ? 'noneFits' : 'noneRunnable' };
  runnable.sort(
    (a, b) => (a.runs ?? 0) - (b.runs ?? 0) || (a.averagePredictionVariance ?? Infinity) - (b.averagePredictionVariance ?? Infinity),
  );
  return { row: runnable[0], missing: null };
}

function weakestTerm(row: ComparatorRow, delta: number): DecisionFacts['termPower'] {
  const powers = (row.terms ?? []).filter((term) => term.power !== null);
  return {
    term: row.minPowerTerm ?? null,
    power: row.minPower as number,
    delta,
    reaching: powers.filter((term) => (term.power as number) >= GOOD_POWER).length,
    terms: powers.length,
  };
}

function mainRisk(plan: PlanDocument, precision: PrecisionBlock | null, termPower: DecisionFacts['termPower'], holdoutRuns: number): MainRisk {
  if (precision && precision.basis !== 'none' && !precision.met && precision.weakest) {
    return { kind: 'precisionShort', weakest: precision.weakest, target: precision.power };
  }
  if ((!precision || precision.basis === 'none') && termPower && termPower.power < GOOD_POWER && termPower.term) {
    const vif = plan.comparison?.comparators.find((row) => row.id === 'proposed')?.terms?.find((term) => term.term === termPower.term)?.vif ?? null;
    return { kind: 'weakTerm', term: termPower.term, power: termPower.power, vif, delta: termPower.delta };
  }
  const borderlineFixed = plan.tiers.factors
    .filter((factor) => factor.borderline && factor.role === 'operating' && plan.levels.some((level) => level.id === factor.id && !level.varied))
    .map((factor) => factor.name);
  if (borderlineFixed.length > 0) return { kind: 'borderlineFixed', factors: borderlineFixed };
  const grouped = plan.schedule?.hardToChange;
  if (grouped && (plan.schedule?.sessionCount ?? 1) > 1 && !plan.runs.some((run) => run.wholePlot !== undefined)) {
    const names = grouped.factors.map((id) => plan.study.factors.find((factor) => factor.id === id)?.name ?? id);
    return { kind: 'groupedHardToChange', factors: names, sessions: plan.schedule!.sessionCount };
  }
  return { kind: 'modelForm', holdoutRuns };
}

function fallbackRuns(plan: PlanDocument, basis: DecisionFacts['sessionBasis']): DecisionFacts['fallback'] {
  const runs = Math.max(3, Math.ceil(plan.metrics.p / 4));
  const hard = plan.study.factors.some((factor) => factor.hardToChange === true);
  const { cost, hours } = campaignCost(runs, hard ? runs : null, plan.study.costs);
  return { runs, cost, hours, sessions: sessionsFor(runs, hours, basis), allowanceOf: plan.metrics.p };
}
