/**
 * The proposed plan side by side with the classical plans, all judged on the proposed plan's
 * target model, region and centre replicates.
 *
 * Data flow: plan document → target model (plan.model.terms over the varied factors) and
 * region (rebuilt from the study echo) → comparator designs (comparators.ts) → one
 * evaluation per design (evaluate/designQuality.ts) → rows, savings, verdicts, summary.
 *
 * Conventions fixed here:
 * - The proposed plan is judged on its fitting and centre runs (the runs the model is fitted
 *   to); its holdout runs are counted in `runs`, cost and hours but not in the fit. Every run
 *   of a comparator is a fitting run.
 * - Relative information: (det M_this / det M_proposed)^(1/p) with M = X'X / N (per run) or
 *   X'X (total), the usual D-criterion ratio (Atkinson, Donev & Tobias, 2007, "Optimum
 *   Experimental Designs, with SAS", §11.1).
 * - Savings are "comparator minus proposed": positive means the proposed plan is cheaper;
 *   percentages are of the comparator's figure (19 runs against 11 → 8 runs, 42.1 %).
 * - Level changes of the proposed plan come from its run schedule when present, otherwise
 *   from grouped order as for the comparators (campaignCost.ts).
 */
import { InputError } from '../inputError.js';
import type { Study } from '../study.js';
import type { FactorLevels, PlannedRun } from '../design/designTypes.js';
import type { Schedule } from '../schedule/scheduleTypes.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { compileModel, type CompiledModel } from '../model/modelMatrix.js';
import { INTERCEPT_LABEL, termLabel } from '../model/modelTerm.js';
import { parseTerm } from '../model/termSyntax.js';
import { buildCandidateRegion } from '../region/candidateRegion.js';
import { regionMoments } from '../evaluate/regionMoments.js';
import { DEFAULT_ALPHA, DEFAULT_DELTA, assessDesignQuality, type DesignQuality } from '../evaluate/designQuality.js';
import { predictionSample } from '../evaluate/predictionVariance.js';
import type { ComparatorId, ComparatorRow, Comparison } from './comparisonTypes.js';
import { buildComparators, runPlacement, type ComparatorDesign } from './comparators.js';
import { campaignCost, groupedLevelChanges } from './campaignCost.js';
import { comparatorVerdict, comparisonSummary, proposedVerdict } from './verdict.js';
import { comparatorLabel } from './comparatorNames.js';

export interface ComparisonOptions {
  /** Effect size in σ units for the power figures (default 2). */
  delta?: number;
  /** Test level for the power figures (default 0.05). */
  alpha?: number;
}

/** What the comparison reads of a plan (a PlanDocument is one; the plan stage depends on this one, not back). */
export interface ComparisonInput {
  study: Omit<Study, 'warnings'>;
  levels: FactorLevels[];
  model: { terms: string[] };
  runs: PlannedRun[];
  schedule?: Pick<Schedule, 'hardToChange'>;
}

export function buildComparison(plan: ComparisonInput, options: ComparisonOptions = {}): Comparison {
  const delta = options.delta ?? DEFAULT_DELTA;
  const alpha = options.alpha ?? DEFAULT_ALPHA;
  if (!(delta > 0) || !Number.isFinite(delta)) throw new InputError(`the effect size must be a positive number of σ, got ${delta}`, { key: 'delta' });
  if (!(alpha > 0 && alpha < 1)) throw new InputError(`the test level must lie between 0 and 1, got ${alpha}`, { key: 'alpha' });

  const variedLevels = plan.levels.filter((level) => level.varied);
  const variedIds = variedLevels.map((level) => level.id);
  const k = variedIds.length;
  const termPowers = plan.model.terms.map((text, i) => parseTerm(text, variedIds, `model.terms[${i}]`));
  const modelTerms = termPowers.map((powers) => termLabel({ powers }, variedIds));
  const model = compileModel([{ powers: {} }, ...termPowers.map((powers) => ({ powers }))], variedIds);
  const termLabels = [INTERCEPT_LABEL, ...modelTerms];

  const region = buildCandidateRegion(plan.study.factors, plan.levels, plan.study.constraints);
  const moments = regionMoments(model, region, plan.study.design.seed);
  const sample = predictionSample(k, region);
  const evaluate = (points: number[][]): DesignQuality =>
    assessDesignQuality(model, points, { moments: moments.matrix, region, delta, alpha, termLabels, sample });

  const costs = plan.study.costs;
  const operating = plan.study.factors.filter((factor) => factor.role === 'operating');
  const hardToChange = operating.filter((factor) => factor.hardToChange).map((factor) => factor.id);
  const codedOf = (coded: Record<string, number>): number[] => variedIds.map((id) => coded[id] ?? 0);

  // The proposed plan.
  const allPoints = plan.runs.map((run) => codedOf(run.coded));
  const fitPoints = allPoints.filter((_, i) => plan.runs[i].purpose !== 'holdout');
  const holdoutRuns = plan.runs.length - fitPoints.length;
  const centreRuns = plan.runs.filter((run) => run.purpose === 'centre').length;
  const proposedEvaluation = evaluate(fitPoints);
  const proposedChanges =
    hardToChange.length === 0
      ? null
      : (plan.schedule?.hardToChange?.levelChanges ??
        groupedLevelChanges(allPoints, hardToChange, (id) => variedIds.indexOf(id)));
  const proposedRow = row('proposed', comparatorLabel.proposed(fitPoints.length - centreRuns, centreRuns, holdoutRuns), plan.runs.length, proposedEvaluation, proposedChanges);
  Object.assign(proposedRow, runPlacement(region, allPoints));
  const verdictContext = { currency: costs?.currency ?? null, termCount: modelTerms.length, delta };
  proposedRow.verdict = proposedVerdict(proposedRow, fitPoints.length, holdoutRuns, verdictContext);

  // The classical plans.
  const designs = buildComparators({
    variedIds,
    operatingIds: operating.map((factor) => factor.id),
    hardToChange,
    centreRuns,
    plannedLevels: variedLevels.map((level) => [...level.coded].sort((a, b) => a - b)),
    hasInteractions: termPowers.some((powers) => Object.keys(powers).length >= 2),
    hasSquares: termPowers.some((powers) => Object.values(powers).some((power) => power >= 2)),
    p: model.p,
    factors: plan.study.factors,
    region,
    conventionalRegion: allOperatingRegion(plan),
  });
  const evaluations = new Map<ComparatorId, DesignQuality>([['proposed', proposedEvaluation]]);
  const rows: ComparatorRow[] = [proposedRow];
  for (const design of designs) {
    const evaluation = design.points ? evaluate(design.points) : null;
    if (evaluation) evaluations.set(design.id, evaluation);
    const comparatorRow = design.points
      ? row(design.id, design.label, design.points.length, evaluation, design.levelChanges)
      : unbuiltRow(design);
    if (design.points) {
      comparatorRow.offLimitsRuns = design.offLimitsRuns;
      comparatorRow.runsOutsideRange = design.runsOutsideRange;
    }
    addRelative(comparatorRow, evaluation, proposedEvaluation, model);
    addSavings(comparatorRow, proposedRow);
    if (design.generators) {
      comparatorRow.generators = design.generators;
      comparatorRow.resolution = design.resolution;
      comparatorRow.wordLengthPattern = design.wordLengthPattern;
    }
    comparatorRow.verdict = comparatorVerdict(comparatorRow, proposedRow, design.notes, verdictContext);
    rows.push(comparatorRow);
  }
  proposedRow.relativeInformationPerRun = proposedEvaluation.fitsModel ? 1 : null;
  proposedRow.relativeInformationTotal = proposedEvaluation.fitsModel ? 1 : null;
  proposedRow.runsSaved = 0;
  proposedRow.percentRunsSaved = 0;
  proposedRow.costSaved = proposedRow.cost === null ? null : 0;
  proposedRow.percentCostSaved = proposedRow.cost === null ? null : 0;

  const fdsCurves: Comparison['fdsCurves'] = [];
  for (const [id, evaluation] of evaluations) {
    if (evaluation.fds) {
      fdsCurves.push({ id, fraction: evaluation.fds.fraction, variance: evaluation.fds.variance, scaledVariance: evaluation.fds.scaledVariance });
    }
  }

  const comparison: Omit<Comparison, 'summary'> = {
    modelTerms,
    p: model.p,
    delta,
    alpha,
    powerConvention: powerConvention(delta, alpha),
    predictionVarianceMethod: `${moments.method}; trace((X'X)⁻¹W) over the region`,
    currency: costs?.currency ?? null,
    comparators: rows,
    fdsCurves,
  };
  return { ...comparison, summary: comparisonSummary(comparison) };

  function row(id: ComparatorId, label: string, runs: number, evaluation: DesignQuality | null, levelChanges: number | null): ComparatorRow {
    const { cost, hours } = campaignCost(runs, levelChanges, costs);
    return {
      id,
      label,
      runs,
      fitsModel: evaluation ? evaluation.fitsModel : null,
      missingTerms: evaluation ? evaluation.nonEstimable.map((term) => term.term) : [],
      dEfficiency: evaluation?.dEfficiency ?? null,
      relativeInformationPerRun: null,
      relativeInformationTotal: null,
      averagePredictionVariance: evaluation?.iCriterion ?? null,
      minPower: evaluation?.minPower ?? null,
      cost,
      hours,
      levelChanges,
      runsSaved: null,
      percentRunsSaved: null,
      costSaved: null,
      percentCostSaved: null,
      verdict: '',
      ...(evaluation?.minPower != null ? { minPowerTerm: weakestTerm(evaluation) } : {}),
      ...(evaluation ? evaluationDetail(evaluation) : {}),
    };
  }
}

/** The evaluation figures beyond the contract columns (optional fields of the row). */
function evaluationDetail(evaluation: DesignQuality): Partial<ComparatorRow> {
  return {
    fittingRuns: evaluation.runs,
    aCriterion: evaluation.aCriterion,
    gEfficiency: evaluation.gEfficiency,
    gEfficiencyBasis: evaluation.gEfficiencyNote,
    maxVif: evaluation.maxVif,
    aliases: evaluation.nonEstimable.map((entry) => ({ term: entry.term, aliasedWith: entry.aliasedWith.map((a) => ({ ...a })) })),
    terms: evaluation.terms.map((term) => ({ ...term })),
  };
}

/** The power convention in words (termPower.ts), stored with the figures it explains. */
function powerConvention(delta: number, alpha: number): string {
  const sigmas = (value: number) => `${Number(value.toPrecision(4))}σ`;
  return (
    `Power: the chance that a two-sided t-test at α = ${alpha} declares a term non-zero when that term alone moves ` +
    `the response by ${delta}σ across the studied range (σ = the run-to-run standard deviation): a coefficient of ` +
    `${sigmas(delta / 2)} for a term whose column spans 2 coded units (x, x·z, x³) and ${sigmas(delta)} for one that spans 1 (x²). ` +
    `A term whose column overlaps other terms (high VIF, e.g. a factor's linear and cubic terms) is estimated ` +
    `imprecisely on its own and gets low power.`
  );
}

/**
 * The region over every operating factor at two levels and the centre, so that the
 * conventional plan's runs are checked with the factors the proposed plan holds fixed varied
 * too; undefined when no run of that grid satisfies the constraints (then the conventional
 * plan is checked on its projection onto the varied factors only).
 */
function allOperatingRegion(plan: ComparisonInput): CandidateRegion | undefined {
  const levelOf = new Map(plan.levels.map((level) => [level.id, level]));
  const levels = plan.study.factors
    .filter((factor) => factor.role === 'operating')
    .map((factor) => ({
      ...(levelOf.get(factor.id) ?? { id: factor.id, name: factor.name, unit: factor.unit, tier: 'negligible' as const, reason: '' }),
      varied: true,
      values: [factor.low, (factor.low + factor.high) / 2, factor.high],
      coded: [-1, 0, 1],
      fixedAt: null,
    }));
  try {
    return buildCandidateRegion(plan.study.factors, levels, plan.study.constraints, { enumerateLimit: 0 });
  } catch (error) {
    if (error instanceof InputError) return undefined;
    throw error;
  }
}

/** The non-intercept term with the smallest power (first in model order on ties). */
function weakestTerm(evaluation: DesignQuality): string | undefined {
  let weakest: { term: string; power: number } | undefined;
  for (const term of evaluation.terms) {
    if (term.power === null) continue;
    if (!weakest || term.power < weakest.power) weakest = { term: term.term, power: term.power };
  }
  return weakest?.term;
}

function unbuiltRow(design: ComparatorDesign): ComparatorRow {
  return {
    id: design.id,
    label: design.label,
    runs: null,
    reason: design.reason,
    fitsModel: null,
    missingTerms: [],
    dEfficiency: null,
    relativeInformationPerRun: null,
    relativeInformationTotal: null,
    averagePredictionVariance: null,
    minPower: null,
    cost: null,
    hours: null,
    levelChanges: null,
    runsSaved: null,
    percentRunsSaved: null,
    costSaved: null,
    percentCostSaved: null,
    verdict: '',
  };
}

function addRelative(target: ComparatorRow, evaluation: DesignQuality | null, proposed: DesignQuality, model: CompiledModel): void {
  if (!evaluation || evaluation.logDet === null || evaluation.logDetPerRun === null) return;
  if (proposed.logDet === null || proposed.logDetPerRun === null) return;
  target.relativeInformationPerRun = Math.exp((evaluation.logDetPerRun - proposed.logDetPerRun) / model.p);
  target.relativeInformationTotal = Math.exp((evaluation.logDet - proposed.logDet) / model.p);
}

/** Savings of the proposed plan against `target` (positive = proposed is smaller/cheaper). */
function addSavings(target: ComparatorRow, proposed: Pick<ComparatorRow, 'runs' | 'cost'>): void {
  if (target.runs !== null && proposed.runs !== null) {
    target.runsSaved = target.runs - proposed.runs;
    target.percentRunsSaved = target.runs > 0 ? (100 * target.runsSaved) / target.runs : null;
  }
  if (target.cost !== null && proposed.cost !== null) {
    target.costSaved = target.cost - proposed.cost;
    target.percentCostSaved = target.cost > 0 ? (100 * target.costSaved) / target.cost : null;
  }
}
