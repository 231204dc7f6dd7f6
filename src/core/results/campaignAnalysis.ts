/**
 * The analysis of a whole campaign, as written to analysis.json: every response of the plan
 * fitted from the results read off its run sheet, validated at the holdouts, given a verdict,
 * and its fitted polynomial's Sobol' indices set beside the indices the plan started from.
 *
 * Inputs are plain data: the plan document and the checked sheet (`SheetResults`, read by
 * src/io/resultsSheet.ts; for a plan revision, the parent's sheet and the added runs' sheet
 * combined by revisionResults.ts). Per response, `analyzeResponse` does the statistics.
 *
 * Conventions fixed here:
 * - Coded units are those of the plan (low → −1, high → +1 over the study range). A run's
 *   coordinates are its as-run values where the sheet gives one, else the planned coded point.
 * - Fitting runs and centre repeats are fitted; holdouts only validate. A run marked not done
 *   has no result.
 * - Runs carrying `wholePlot` and `session` (split-plot plans) are passed on, so the fit is
 *   REML with a random whole-plot effect and fixed sessions; otherwise the runs are treated as
 *   completely randomised (least squares).
 * - Lab against the process model (`labVsModel`): both sets of total indices are compared as
 *   shares of the varied factors' sum, because the process model's indices also spread
 *   variance over model parameters and fixed factors that the lab does not vary. A factor
 *   disagrees when its shares differ by more than DISAGREEMENT_SHARE (0.20, our rule: a fifth
 *   of the explained variance moves to or from the factor, enough to change its tier under
 *   the default cut-offs 0.05 / 0.30). Indices of the fitted polynomial: Sobol' 1993 via its
 *   Legendre expansion (polynomialSensitivity.ts).
 */
import type { PlanDocument } from '../plan/planDocument.js';
import type { PlannedRun } from '../design/designTypes.js';
import type { Response } from '../study.js';
import { compileModel } from '../model/modelMatrix.js';
import { INTERCEPT_LABEL } from '../model/modelTerm.js';
import { parseTerm } from '../model/termSyntax.js';
import { asRunCoded } from './asRunPoint.js';
import type { AnalysisRun, ResponseAnalysis } from '../analysis/analysisTypes.js';
import { analyzeResponse } from '../analysis/analyzeResponse.js';

/** Share difference above which the lab and the process model disagree about a factor. */
export const DISAGREEMENT_SHARE = 0.2;

/** One run as the sheet reports it, checked against the plan. */
export interface SheetRun {
  /** Run number of the run sheet. */
  run: number;
  point: string;
  /** Factor id → the value actually set, where the sheet records a deviation (engineering units). */
  asRun: Record<string, number>;
  /** Response id → result, null when blank or not done. */
  results: Record<string, number | null>;
  notDone: boolean;
}

export interface SheetResults {
  planId: string;
  checksum: string;
  runs: SheetRun[];
  /** What the reader noticed but did not refuse. */
  warnings: string[];
}

export interface FactorComparison {
  factor: string;
  /** The plan's (process model's) indices. Null when the index table has no row. */
  plan: { first: number; total: number } | null;
  /** The fitted polynomial's indices over the studied box. */
  lab: { first: number; total: number } | null;
  /** Total index as a share of the varied factors' sum. */
  planShare: number | null;
  labShare: number | null;
  /** labShare − planShare. */
  difference: number | null;
  disagrees: boolean;
}

export interface LabVsModel {
  factors: FactorComparison[];
  /** Any factor disagrees. */
  disagrees: boolean;
  threshold: number;
  note: string;
}

export interface CampaignResponse extends ResponseAnalysis {
  name: string;
  unit: string;
  labVsModel: LabVsModel;
}

export interface AnalysisDocument {
  formatVersion: 1;
  tool: { name: 'tierplan'; version: string };
  plan: { id: string; checksum: string };
  /** `parent`: for a plan revision, the parent plan whose sheet gave the parent's runs. */
  results: { file: string; sheet: string | null; runs: number; notDone: number[]; parent?: { plan: { id: string; checksum: string }; file: string; sheet: string | null } };
  responses: CampaignResponse[];
  /** calibrated when every response is. */
  summary: { calibrated: string[]; notYet: string[] };
  warnings: string[];
}


/** Run extras that split-plot plans carry. */

export function analyzeCampaign(
  plan: PlanDocument,
  sheet: SheetResults,
  source: { file: string; sheet: string | null; toolVersion: string; parent?: AnalysisDocument['results']['parent'] },
): AnalysisDocument {
  const varied = plan.levels.filter((level) => level.varied);
  const factorIds = varied.map((level) => level.id);
  const factorOf = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const powers = plan.model.terms.map((term, i) => ({ powers: parseTerm(term, factorIds, `model.terms[${i}]`) }));
  const model = compileModel([{ powers: {} }, ...powers], factorIds);
  const terms = [INTERCEPT_LABEL, ...plan.model.terms];
  const ranges = factorIds.map((id) => ({ low: factorOf.get(id)!.low, high: factorOf.get(id)!.high }));
  const sheetByPoint = new Map(sheet.runs.map((run) => [run.point, run]));

  const analysisRun = (planned: PlannedRun, responseId: string): AnalysisRun => {
    const recorded = sheetByPoint.get(planned.point);
    if (!recorded) throw new Error(`sheet results have no run for point ${planned.point}`);
    const coded = asRunCoded(planned, recorded.asRun, factorIds, factorOf);
    const observed = recorded.notDone ? null : (recorded.results[responseId] ?? null);
    return {
      run: recorded.run,
      point: planned.point,
      coded,
      observed,
      ...(planned.wholePlot !== undefined ? { wholePlot: planned.wholePlot } : {}),
      ...(planned.session !== undefined ? { session: planned.session } : {}),
    };
  };
  const byRunNumber = (a: AnalysisRun, b: AnalysisRun) => a.run - b.run;

  const responses: CampaignResponse[] = plan.study.responses.map((response) => {
    const targets = response;
    const planned = plan.runs;
    const runs = planned.filter((run) => run.purpose !== 'holdout').map((run) => analysisRun(run, response.id)).sort(byRunNumber);
    const holdouts = planned.filter((run) => run.purpose === 'holdout').map((run) => analysisRun(run, response.id)).sort(byRunNumber);
    const analysis = analyzeResponse({
      id: response.id,
      model,
      terms,
      ranges,
      runs,
      holdouts,
      tolerance: targets.tolerance,
      noise: targets.noise,
    });
    return { ...analysis, name: response.name, unit: response.unit, labVsModel: labVsModel(plan, response.id, factorIds, analysis) };
  });

  return {
    formatVersion: 1,
    tool: { name: 'tierplan', version: source.toolVersion },
    plan: { id: plan.planId, checksum: plan.checksum },
    results: {
      file: source.file,
      sheet: source.sheet,
      runs: sheet.runs.length,
      notDone: sheet.runs.filter((run) => run.notDone).map((run) => run.run),
      ...(source.parent ? { parent: source.parent } : {}),
    },
    responses,
    summary: {
      calibrated: responses.filter((r) => r.verdict === 'calibrated').map((r) => r.id),
      notYet: responses.filter((r) => r.verdict !== 'calibrated').map((r) => r.id),
    },
    warnings: [...sheet.warnings],
  };
}

function labVsModel(plan: PlanDocument, responseId: string, factorIds: readonly string[], analysis: ResponseAnalysis): LabVsModel {
  const planRows = new Map(plan.study.indices.filter((row) => row.response === responseId).map((row) => [row.factor, row]));
  const labRows = new Map((analysis.sensitivity?.factors ?? []).map((row) => [row.factor, row]));
  const planSum = factorIds.reduce((sum, id) => sum + (planRows.get(id)?.total ?? 0), 0);
  const labSum = factorIds.reduce((sum, id) => sum + (labRows.get(id)?.total ?? 0), 0);
  const factors = factorIds.map((id): FactorComparison => {
    const planRow = planRows.get(id);
    const labRow = labRows.get(id);
    const planShare = planRow && planSum > 0 ? planRow.total / planSum : null;
    const labShare = labRow && labSum > 0 ? labRow.total / labSum : null;
    const difference = planShare !== null && labShare !== null ? labShare - planShare : null;
    return {
      factor: id,
      plan: planRow ? { first: planRow.first, total: planRow.total } : null,
      lab: labRow ? { first: labRow.first, total: labRow.total } : null,
      planShare,
      labShare,
      difference,
      disagrees: difference !== null && Math.abs(difference) > DISAGREEMENT_SHARE,
    };
  });
  const disagreeing = factors.filter((factor) => factor.disagrees).map((factor) => factor.factor);
  const note =
    analysis.sensitivity === null
      ? 'the fitted model has no indices (an inestimable term or a constant fit): nothing to compare'
      : disagreeing.length > 0
        ? `the lab and the process model disagree about ${disagreeing.join(', ')}: their shares of the varied factors' total index differ by more than ${DISAGREEMENT_SHARE}`
        : `the lab agrees with the process model: every varied factor's share of the total index is within ${DISAGREEMENT_SHARE}`;
  return { factors, disagrees: disagreeing.length > 0, threshold: DISAGREEMENT_SHARE, note };
}
