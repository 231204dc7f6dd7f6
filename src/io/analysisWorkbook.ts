/**
 * analysis.xlsx: the analysis as a workbook, for the scientist who wants to work the numbers
 * further. Every value is the one in analysis.json (numbers stay numbers, nulls stay blank).
 *
 * Sheets (our own naming): "Verdict" (one row per response, with the reasons), "Coefficients"
 * (coded and engineering units), "ANOVA", "Run diagnostics", "Validation" (holdout runs with
 * their prediction intervals, and the coverage), "Lab vs model" (indices side by side).
 *
 * Conventions fixed here: one block per response on each sheet, headed by the response name;
 * text from the study is written as plain strings, never as formulas; creator "tierplan".
 */
import ExcelJS from 'exceljs';
import type { AnalysisDocument, CampaignResponse } from '../core/results/campaignAnalysis.js';
import { withUnit } from './textTable.js';

const BOLD = { bold: true } as const;
const HEADER_FILL: ExcelJS.Fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFE7E6E6' } };

type Cell = string | number | boolean | null;

/** Writes a titled table at `row` and returns the next free row (one blank row after). */
function block(sheet: ExcelJS.Worksheet, row: number, title: string, headers: string[], rows: Cell[][]): number {
  sheet.getCell(row, 1).value = title;
  sheet.getCell(row, 1).font = { bold: true, size: 12 };
  headers.forEach((text, c) => {
    const cell = sheet.getCell(row + 1, c + 1);
    cell.value = text;
    cell.font = BOLD;
    cell.fill = HEADER_FILL;
    cell.alignment = { wrapText: true, vertical: 'middle' };
  });
  rows.forEach((values, r) =>
    values.forEach((value, c) => {
      sheet.getCell(row + 2 + r, c + 1).value = typeof value === 'boolean' ? (value ? 'yes' : 'no') : value;
    }),
  );
  return row + 3 + rows.length;
}

function title(response: CampaignResponse): string {
  return withUnit(response.name, response.unit);
}

export async function analysisWorkbook(analysis: AnalysisDocument): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'tierplan';
  workbook.title = `Analysis of plan ${analysis.plan.id}`;

  const verdict = workbook.addWorksheet('Verdict');
  verdict.getCell('A1').value = `Analysis of plan ${analysis.plan.id}`;
  verdict.getCell('A1').font = { bold: true, size: 13 };
  const parent = analysis.results.parent;
  const parentText = parent ? `, the runs of parent plan ${parent.plan.id} from ${parent.file}${parent.sheet ? `, sheet ${parent.sheet}` : ''}` : '';
  verdict.getCell('A2').value = `Results read from ${analysis.results.file}${analysis.results.sheet ? `, sheet ${analysis.results.sheet}` : ''}${parentText}; plan checksum ${analysis.plan.checksum}.`;
  let row = block(
    verdict,
    4,
    'Verdict per response',
    ['Response', 'Unit', 'Verdict', 'Why not yet', 'Checks passed', 'Fit', 'Runs fitted', 'R²', 'Adjusted R²', 'Predicted R²', 'PRESS', 'Residual SD', 'Study noise SD', 'Estimated noise SD'],
    analysis.responses.map((r) => [
      r.name, r.unit, r.verdict, r.verdictReasons.map((reason) => reason.message).join('; '), r.verdictPassed.join('; '), r.method, r.n,
      r.rSquared, r.adjustedRSquared, r.predictedRSquared, r.press, r.residualSd, r.noise?.study ?? null, r.noise?.estimated ?? null,
    ]),
  );
  if (analysis.warnings.length > 0) row = block(verdict, row, 'Warnings from reading the sheet', ['Warning'], analysis.warnings.map((w) => [w]));
  [22, 10, 11, 60, 60, 13, 8, 8, 8, 8, 10, 10, 10, 10].forEach((w, i) => (verdict.getColumn(i + 1).width = w));

  const coefficients = workbook.addWorksheet('Coefficients');
  row = 1;
  for (const r of analysis.responses) {
    row = block(
      coefficients,
      row,
      `${title(r)} — coded units (low → −1, high → +1)`,
      ['Term', 'Estimate', 'Standard error', 't', 'p', 'Lower 95 %', 'Upper 95 %', 'df'],
      r.coefficients.map((c) => [c.term, c.estimate, c.standardError, c.t, c.p, c.lower, c.upper, c.df]),
    );
    row = block(coefficients, row, `${title(r)} — engineering units`, ['Term', 'Estimate', 'Standard error'], r.engineering.map((e) => [e.term, e.estimate, e.standardError]));
  }
  [28, 14, 14, 10, 10, 14, 14, 6].forEach((w, i) => (coefficients.getColumn(i + 1).width = w));

  const anova = workbook.addWorksheet('ANOVA');
  row = 1;
  const lines = [['model', 'Model'], ['residual', 'Residual'], ['lackOfFit', 'Lack of fit'], ['pureError', 'Pure error']] as const;
  for (const r of analysis.responses) {
    row = block(
      anova,
      row,
      title(r),
      ['Source', 'df', 'Sum of squares', 'F', 'p'],
      lines.map(([key, label]) => {
        const entry = r.anova[key];
        return entry ? [label, entry.df, entry.ss, entry.F, entry.p] : [label, 'does not exist', null, null, null];
      }),
    );
  }
  [16, 14, 16, 10, 10].forEach((w, i) => (anova.getColumn(i + 1).width = w));

  const diagnostics = workbook.addWorksheet('Run diagnostics');
  row = 1;
  for (const r of analysis.responses) {
    row = block(
      diagnostics,
      row,
      title(r),
      ['Run no.', 'Point', 'Observed', 'Fitted', 'Residual', 'Leverage', 'Studentised residual', "Cook's distance", 'Flags'],
      r.runs.map((d) => [d.run, d.point, d.observed, d.fitted, d.residual, d.leverage, d.studentised, d.cooksDistance, d.flags.join(', ')]),
    );
  }
  [8, 8, 12, 12, 12, 10, 12, 12, 24].forEach((w, i) => (diagnostics.getColumn(i + 1).width = w));

  const validation = workbook.addWorksheet('Validation');
  row = 1;
  for (const r of analysis.responses) {
    row = block(
      validation,
      row,
      `${title(r)} — holdout runs, ${Math.round(r.validation.level * 100)} % prediction intervals`,
      ['Run no.', 'Point', 'Observed', 'Predicted', 'Lower', 'Upper', 'Inside'],
      r.holdout.map((h) => [h.run, h.point, h.observed, h.predicted, h.lower, h.upper, h.inside]),
    );
    row = block(validation, row, `${title(r)} — summary`, ['Holdouts checked', 'Inside', 'Coverage', 'RMS prediction error', 'Residual SD', 'Ratio'], [
      [r.validation.checked, r.validation.inside, r.validation.coverage, r.validation.rmsPredictionError, r.validation.residualSd, r.validation.errorRatio],
    ]);
  }
  [10, 8, 12, 12, 12, 12, 10].forEach((w, i) => (validation.getColumn(i + 1).width = w));

  const indices = workbook.addWorksheet('Lab vs model');
  row = 1;
  for (const r of analysis.responses) {
    row = block(
      indices,
      row,
      `${title(r)} — ${r.labVsModel.note}`,
      ['Factor', 'Process model first-order', 'Process model total', 'Lab first-order', 'Lab total', 'Process model share', 'Lab share', 'Difference', 'Disagrees'],
      r.labVsModel.factors.map((f) => [f.factor, f.plan?.first ?? null, f.plan?.total ?? null, f.lab?.first ?? null, f.lab?.total ?? null, f.planShare, f.labShare, f.difference, f.disagrees]),
    );
  }
  [18, 14, 14, 12, 12, 14, 12, 12, 10].forEach((w, i) => (indices.getColumn(i + 1).width = w));

  return Buffer.from(await workbook.xlsx.writeBuffer());
}
