/**
 * The readable summary `tierplan analyze` prints: the verdict per response first, then how
 * well each fit predicts, the holdouts, and the lab's sensitivity picture beside the plan's.
 */
import type { AnalysisDocument } from '../core/results/campaignAnalysis.js';
import { renderTable } from '../io/textTable.js';
import { significantText } from '../io/numberText.js';

export function analyzeSummary(analysis: AnalysisDocument): string {
  const lines: string[] = [];
  lines.push(`Analysis of plan ${analysis.plan.id} from ${analysis.results.file}${analysis.results.sheet ? ` (sheet ${analysis.results.sheet})` : ''}`);
  const parent = analysis.results.parent;
  if (parent) lines.push(`  with the runs of its parent plan ${parent.plan.id} from ${parent.file}${parent.sheet ? ` (sheet ${parent.sheet})` : ''}`);
  const all = analysis.responses.length;
  lines.push(
    analysis.summary.notYet.length === 0
      ? `Verdict: calibrated — all ${all} responses.`
      : `Verdict: not yet — ${analysis.summary.calibrated.length} of ${all} responses calibrated; not yet: ${analysis.summary.notYet.join(', ')}.`,
  );
  lines.push('');
  lines.push(
    renderTable(
      [
        { header: 'Response' },
        { header: 'Verdict' },
        { header: 'Runs fitted', align: 'right' },
        { header: 'Fit' },
        { header: 'R²', align: 'right' },
        { header: 'Predicted R²', align: 'right' },
        { header: 'Residual SD', align: 'right' },
        { header: 'Holdouts inside', align: 'right' },
        { header: 'RMS prediction error', align: 'right' },
        { header: 'Unit' },
      ],
      analysis.responses.map((r) => [
        r.id,
        r.verdict,
        r.n,
        r.method,
        r.rSquared,
        r.predictedRSquared,
        r.residualSd,
        r.validation.checked > 0 ? `${r.validation.inside} of ${r.validation.checked}` : null,
        r.validation.rmsPredictionError,
        r.unit,
      ]),
    ),
  );
  for (const r of analysis.responses) {
    if (r.verdictReasons.length === 0 && !r.labVsModel.disagrees) continue;
    lines.push(`${r.id}:`);
    for (const reason of r.verdictReasons) lines.push(`  not yet: ${reason.message}`);
    if (r.labVsModel.disagrees) lines.push(`  ${r.labVsModel.note}`);
  }
  const anyIndices = analysis.responses.some((r) => r.labVsModel.factors.some((f) => f.lab !== null));
  if (anyIndices) {
    lines.push('');
    const factors = analysis.responses[0].labVsModel.factors.map((f) => f.factor);
    lines.push(
      renderTable(
        [{ header: 'Response' }, ...factors.flatMap((id) => [{ header: `${id} model`, align: 'right' as const }, { header: 'lab', align: 'right' as const }])],
        analysis.responses.map((r) => [
          r.id,
          ...r.labVsModel.factors.flatMap((f) => [f.planShare, f.labShare === null ? null : `${significantText(f.labShare, 2)}${f.disagrees ? ' !' : ''}`]),
        ]),
        { title: `Share of the total index among the varied factors, process model against lab (! differs by more than ${significantText(analysis.responses[0].labVsModel.threshold)})`, digits: 2 },
      ),
    );
  }
  if (analysis.warnings.length > 0) {
    lines.push('');
    for (const warning of analysis.warnings) lines.push(`warning: ${warning}`);
  }
  return `${lines.join('\n')}\n`;
}
