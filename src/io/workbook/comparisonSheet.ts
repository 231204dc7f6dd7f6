/**
 * The "Comparison" sheet: the proposed plan beside the classical plans, all judged on the
 * proposed plan's model, with what every figure is relative to, then one verdict per plan.
 *
 * Figures follow numberText.ts (counts, money, hours, whole-per-cent shares and power, 0.1 %
 * efficiencies, two-decimal ratios, three significant figures of prediction variance) and are
 * written as text, so the sheet prints exactly what the report prints. The proposed plan's row
 * is bold on a blue fill; the sheet says so.
 */
import type ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import type { ComparatorRow } from '../../core/compare/comparisonTypes.js';
import { comparatorName } from '../comparatorNames.js';
import { ABSENT, countOf, countText, efficiencyText, hoursText, moneyText, percentText, powerText, ratioText, varianceText } from '../numberText.js';
import { FILL, blockBreaks, contentHeight, fitRowHeight, pageHeight, printSetup, put, spanText } from './sheetLayout.js';

export const COMPARISON_SHEET_NAME = 'Comparison';

const WIDTHS = [24, 7, 10, 9, 10, 9, 9, 10, 11, 11, 8, 8, 12, 12];

export function addComparisonSheet(workbook: ExcelJS.Workbook, plan: PlanDocument): ExcelJS.Worksheet {
  const sheet = workbook.addWorksheet(COMPARISON_SHEET_NAME);
  WIDTHS.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  const last = WIDTHS.length;
  spanText(sheet, 1, 1, last, 'The proposed plan beside classical plans', { size: 13, bold: true });
  const comparison = plan.comparison;
  if (!comparison) {
    spanText(sheet, 3, 1, last, 'The comparison with classical plans was not computed for this plan; run `tierplan compare` on plan.json to add it.');
    printSetup(sheet, { widths: WIDTHS, contentHeight: contentHeight(sheet), orientation: 'landscape' });
    return sheet;
  }
  const currency = comparison.currency;
  spanText(
    sheet,
    2,
    1,
    last,
    `Every figure is for the proposed plan's model (${comparison.p} parameters), in coded units. Information is relative to the proposed plan (1.00 = the same). ` +
      `Power: the chance of detecting a term that alone moves the response by ${comparison.delta}σ across the studied range, at α = ${comparison.alpha}. ` +
      'The bold row on a blue fill is the proposed plan.',
    { size: 9 },
  );

  const headerRow = 4;
  const headers = [
    'Plan', 'Runs', 'Fits the model', 'Runs outside the limits', 'D-efficiency (textbook)',
    'Information per run', 'Information in total', 'Average prediction variance (σ²)', 'Weakest term’s power',
    `Cost${currency ? ` (${currency})` : ''}`, 'Bench hours', 'Level changes', 'Runs saved by the proposed plan', 'Cost saved by the proposed plan',
  ];
  headers.forEach((text, i) => put(sheet.getCell(headerRow, i + 1), text, { bold: true, fill: FILL.header, border: true, size: 9 }));
  fitRowHeight(sheet, headerRow);

  let row = headerRow + 1;
  for (const c of comparison.comparators) {
    const proposed = c.id === 'proposed';
    const cells = comparatorCells(c, currency);
    cells.forEach((text, i) =>
      put(sheet.getCell(row, i + 1), text, { size: 9, border: true, bold: proposed, fill: proposed ? FILL.proposed : undefined, align: i === 0 ? undefined : i === 2 ? 'center' : 'right' }),
    );
    fitRowHeight(sheet, row);
    row += 1;
  }

  const tableHeight = contentHeight(sheet);
  const blocks: { row: number; height: number }[] = [];
  row += 1;
  blocks.push({ row, height: 4 * 30 });
  spanText(sheet, row, 1, last, 'What each plan is, what it cannot estimate, and a verdict in words', { bold: true });
  row += 1;
  for (const c of comparison.comparators) {
    put(sheet.getCell(row, 1), comparatorName(c.id), { size: 9, bold: c.id === 'proposed' });
    const missing = c.runs !== null && c.missingTerms.length > 0 ? ` Cannot estimate ${c.missingTerms.join(', ')}.` : '';
    spanText(sheet, row, 2, last, `${c.label}.${missing} ${c.verdict}`, { size: 9 });
    row += 1;
  }
  row += 1;
  blocks.push({ row, height: 4 * 20 });
  spanText(sheet, row, 1, last, 'What the columns are relative to', { bold: true });
  row += 1;
  for (const note of [
    "D-efficiency (textbook): 100·|X'X|^(1/p)/N, relative to an ideal orthogonal plan of the same size, not to the proposed plan.",
    'Information per run, in total: (det X\'X of the plan ÷ det X\'X of the proposed plan)^(1/p), per fitting run or in total; above 1.00 means more information than the proposed plan.',
    `Average prediction variance: over the studied region, in σ² units; lower is better (${comparison.predictionVarianceMethod}).`,
    'Runs outside the limits: runs that break the study’s constraints or equipment limits; such a plan cannot be run as listed.',
    'Runs and cost saved: the other plan minus the proposed plan, as a share of the other plan; "more" when the proposed plan is the larger.',
  ]) {
    spanText(sheet, row, 1, last, note, { size: 9 });
    row += 1;
  }

  const { onePage } = printSetup(sheet, { widths: WIDTHS, contentHeight: contentHeight(sheet), titleRows: `${headerRow}:${headerRow}`, tableHeight });
  if (!onePage) blockBreaks(sheet, { capacity: pageHeight(WIDTHS, sheet.pageSetup.orientation ?? 'landscape'), repeated: sheet.getRow(headerRow).height ?? 15, lastRow: row - 1, blocks });
  return sheet;
}

function comparatorCells(c: ComparatorRow, currency: string | null): string[] {
  const built = c.runs !== null;
  return [
    comparatorName(c.id),
    built ? countText(c.runs) : 'not built',
    !built ? ABSENT : c.fitsModel === null ? ABSENT : c.fitsModel ? 'yes' : `no, ${countOf(c.missingTerms.length, 'term')} missing`,
    !built ? ABSENT : c.offLimitsRuns ? countText(c.offLimitsRuns) : 'none',
    efficiencyText(c.dEfficiency),
    ratioText(c.relativeInformationPerRun),
    ratioText(c.relativeInformationTotal),
    varianceText(c.averagePredictionVariance),
    c.minPower === null ? ABSENT : `${powerText(c.minPower)}${c.minPowerTerm ? ` (${c.minPowerTerm})` : ''}`,
    moneyText(c.cost, null),
    hoursText(c.hours),
    c.levelChanges === null ? ABSENT : countText(c.levelChanges),
    saved(c.runsSaved, c.percentRunsSaved, c.id, (value) => countText(value)),
    saved(c.costSaved, c.percentCostSaved, c.id, (value) => moneyText(value, null)),
  ];
}

/** "10 (29 %)", "6 more (32 %)", or a dash for the proposed plan itself. */
function saved(value: number | null, percent: number | null, id: string, format: (value: number) => string): string {
  if (id === 'proposed' || value === null) return ABSENT;
  const share = percent === null ? '' : ` (${percentText(Math.abs(percent))})`;
  return value >= 0 ? `${format(value)}${share}` : `${format(-value)} more${share}`;
}
