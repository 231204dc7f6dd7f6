/**
 * analysis.html: the analysis for the scientist and the manager, one self-contained file.
 *
 * Content, in order: the verdict per response with its reasons (first, in words a manager
 * can act on); then per response the four charts of charts/analysisCharts.ts (observed
 * against predicted with the holdouts marked, residuals against run order, the prediction
 * intervals at the holdouts, the indices side by side), the fit statistics and the
 * coefficient table; then the warnings from reading the sheet.
 *
 * Every figure is taken from the analysis document; this module only formats. User text goes
 * through handlebars escaping (`{{ }}`); charts are vega SVG, the only triple-brace content —
 * the same escaping and print rules as the plan report (templates/managerReport.hbs).
 */
import type { AnalysisDocument } from '../core/results/campaignAnalysis.js';
import { holdoutIntervalSvg, indexComparisonSvg, observedPredictedSvg, residualOrderSvg } from './charts/analysisCharts.js';
import { renderTemplate } from './templateRendering.js';
import { withUnit } from './textTable.js';
import { significantText } from './numberText.js';

const DASH = '—';

function number(value: number | null | undefined, digits = 3): string {
  return value === null || value === undefined || !Number.isFinite(value) ? DASH : significantText(value, digits);
}

export async function analysisReportHtml(analysis: AnalysisDocument, title: string): Promise<string> {
  const responses = await Promise.all(
    analysis.responses.map(async (r) => ({
      heading: withUnit(r.name, r.unit),
      verdict: r.verdict,
      calibrated: r.verdict === 'calibrated',
      reasons: r.verdictReasons.map((reason) => reason.message),
      passed: r.verdictPassed,
      labNote: r.labVsModel.note,
      holdoutLevel: Math.round(r.validation.level * 100),
      labDisagrees: r.labVsModel.disagrees,
      statistics: [
        ['Fit', r.method],
        ['Runs fitted', String(r.n)],
        ['R²', number(r.rSquared)],
        ['Adjusted R²', number(r.adjustedRSquared)],
        ['Predicted R² (from PRESS)', number(r.predictedRSquared)],
        ['Residual SD', `${number(r.residualSd)} ${r.unit}`],
        ['Noise SD: study / estimated', r.noise ? `${number(r.noise.study)} / ${number(r.noise.estimated)} (${r.noise.basis})` : DASH],
        ['Holdouts inside their interval', r.validation.checked > 0 ? `${r.validation.inside} of ${r.validation.checked}` : DASH],
        ['RMS prediction error at the holdouts', `${number(r.validation.rmsPredictionError)} ${r.unit}`],
        ...(r.varianceComponents ? [['Variance components: whole plot / run', `${number(r.varianceComponents.wholePlot)} / ${number(r.varianceComponents.run)}`]] : []),
      ].map(([label, value]) => ({ label, value })),
      coefficients: r.coefficients.map((c) => ({
        term: c.term === '1' ? '1 (intercept)' : c.term,
        estimate: number(c.estimate, 4),
        standardError: number(c.standardError, 3),
        t: number(c.t, 3),
        p: c.p === null ? DASH : c.p < 0.0001 ? '< 0.0001' : number(c.p, 2),
        interval: c.lower === null || c.upper === null ? DASH : `${number(c.lower, 4)} … ${number(c.upper, 4)}`,
      })),
      observedPredicted: await observedPredictedSvg(r),
      residualOrder: await residualOrderSvg(r),
      holdoutIntervals: await holdoutIntervalSvg(r),
      indices: await indexComparisonSvg(r),
    })),
  );
  const calibrated = analysis.summary.notYet.length === 0;
  return renderTemplate('analysisReport', {
    title,
    planId: analysis.plan.id,
    checksum: analysis.plan.checksum,
    resultsFile: analysis.results.parent
      ? `${analysis.results.file} and, for the runs of parent plan ${analysis.results.parent.plan.id}, ${analysis.results.parent.file}`
      : analysis.results.file,
    toolVersion: analysis.tool.version,
    headline: calibrated
      ? `Calibrated: all ${analysis.responses.length} responses predict the runs they never saw within their intervals.`
      : `Not yet calibrated: ${analysis.summary.notYet.length} of ${analysis.responses.length} responses need attention (${analysis.summary.notYet.join(', ')}).`,
    calibrated,
    responses,
    warnings: analysis.warnings,
  });
}
