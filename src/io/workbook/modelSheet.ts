/**
 * The "Model and metrics" sheet: the method details a statistician checks — the model terms
 * with the reason for each, the design figures with what each is relative to, and the notes
 * from planning (how the region moments were sampled and the like). The decision sheet leaves
 * all of this out; it lives here once.
 *
 * Figures follow numberText.ts: efficiencies to 0.1 %, prediction variance to three
 * significant figures (written as text so the sheet shows exactly what the report does).
 */
import type ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import type { Schedule } from '../../core/schedule/scheduleTypes.js';
import { efficiencyText, fixedText, varianceText } from '../numberText.js';
import { FILL, blockBreaks, contentHeight, fitRowHeight, pageHeight, printSetup, put, spanText } from './sheetLayout.js';

export const MODEL_SHEET_NAME = 'Model and metrics';
const WIDTHS = [34, 14, 72];

export function addModelSheet(workbook: ExcelJS.Workbook, plan: PlanDocument, schedule: Schedule): ExcelJS.Worksheet {
  const sheet = workbook.addWorksheet(MODEL_SHEET_NAME);
  WIDTHS.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  spanText(sheet, 1, 1, 3, 'Model terms and design figures (coded units: low → −1, high → +1)', { size: 13, bold: true });

  const headerRow = 3;
  put(sheet.getCell(headerRow, 1), 'Model term', { bold: true, fill: FILL.header, border: true });
  sheet.mergeCells(headerRow, 2, headerRow, 3);
  put(sheet.getCell(headerRow, 2), 'Why it is in the model', { bold: true, fill: FILL.header, border: true });
  fitRowHeight(sheet, headerRow);
  let row = headerRow + 1;
  for (const { term, reason } of plan.model.explained) {
    put(sheet.getCell(row, 1), term === '1' ? '1 (intercept)' : term, { size: 9, border: true });
    spanText(sheet, row, 2, 3, reason, { size: 9, border: true });
    row += 1;
  }

  const blocks: { row: number; height: number }[] = [];
  row += 1;
  const metricsStart = row;
  ['Figure', 'Value', 'What it means, and relative to what'].forEach((text, i) => put(sheet.getCell(row, i + 1), text, { bold: true, fill: FILL.header, border: true }));
  fitRowHeight(sheet, row);
  row += 1;
  const m = plan.metrics;
  const countBy = (purpose: string) => plan.runs.filter((run) => run.purpose === purpose).length;
  const metrics: [string, string, string][] = [
    ['Model parameters p', String(m.p), 'Intercept included.'],
    ['Fitting runs N', String(m.N), m.runsNote],
    ['Centre repeats', String(countBy('centre')), 'Replicates at the centre, for pure error and drift.'],
    ['Validation runs', String(countBy('holdout')), 'Kept out of the fit; used to check predictions.'],
    ['Runs on the sheet', String(plan.runs.length), 'Fitting, centre and validation runs together.'],
    [
      'D-efficiency',
      efficiencyText(m.dEfficiency),
      "Textbook 100·|X'X|^(1/p)/N for the fitting runs: relative to a hypothetical orthogonal design of N runs with every setting at ±1, which a model with square terms or constraints cannot reach.",
    ],
    [
      'D-efficiency against the continuous optimum',
      efficiencyText(m.boundEfficiency),
      m.boundEfficiency === null
        ? `Not computed: ${m.boundNote}`
        : `100·(det M(exact)/det M(bound))^(1/p), relative to the best continuous (approximate) D-optimal design, which no exact design can beat: ${m.boundNote}`,
    ],
    ['Average prediction variance', `${varianceText(m.iCriterion)} σ²`, "trace((X'X)⁻¹·W) over the region, W the region moment matrix; lower is better. Not an efficiency."],
    ["log det(X'X/N)", fixedText(m.logDetPerRun, 3), 'Information per fitting run on a log scale; higher is better.'],
    ['Search criterion', m.criterion === 'D' ? 'D-optimal' : 'I-optimal', 'What the exact design search maximised or minimised.'],
    ['Design search seed', String(m.seed), `Run order seed: ${schedule.seed}.`],
    ['Random starts', String(m.starts), 'Independent starts of the exchange search.'],
  ];
  for (const [label, value, meaning] of metrics) {
    put(sheet.getCell(row, 1), label, { size: 9, border: true });
    put(sheet.getCell(row, 2), value, { size: 9, border: true, align: 'right' });
    put(sheet.getCell(row, 3), meaning, { size: 9, border: true });
    fitRowHeight(sheet, row);
    row += 1;
  }
  blocks.push({ row: metricsStart, height: 0 });

  if (plan.warnings.length > 0) {
    row += 1;
    blocks.push({ row, height: 0 });
    spanText(sheet, row, 1, 3, 'Notes from planning', { bold: true });
    row += 1;
    for (const warning of plan.warnings) {
      spanText(sheet, row, 1, 3, warning, { size: 9 });
      row += 1;
    }
  }
  // A block must at least keep its heading with a few rows.
  for (const block of blocks) block.height = 5 * 18;

  const { onePage } = printSetup(sheet, { widths: WIDTHS, contentHeight: contentHeight(sheet), titleRows: `${headerRow}:${headerRow}` });
  if (!onePage) blockBreaks(sheet, { capacity: pageHeight(WIDTHS, sheet.pageSetup.orientation ?? 'portrait'), repeated: sheet.getRow(headerRow).height ?? 15, lastRow: row - 1, blocks });
  return sheet;
}
