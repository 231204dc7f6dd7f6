/**
 * The "Factor tiers" sheet: every factor's tier from its aggregated total Sobol' index
 * (Saltelli et al. 2008, Global Sensitivity Analysis: The Primer), what the plan does with it
 * and why (for a model parameter: estimate it from the lab data, or take a literature value);
 * then the interacting pairs.
 *
 * Indices are numbers rounded by the index rule of numberText.ts (two decimals) and shown
 * with two decimals, so the sheet, the report and the terminal print the same figure. Bold
 * rows are borderline factors (their interval straddles a threshold); the sheet says so.
 */
import type ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import { INDEX_DECIMALS, indexText, rounded, settingText } from '../numberText.js';
import { FILL, blockBreaks, contentHeight, decimalsFormat, fitRowHeight, heightFor, pageHeight, printSetup, put, spanText } from './sheetLayout.js';

export const TIER_SHEET_NAME = 'Factor tiers';

const HEADERS = [
  'Factor', 'Role', 'Tier', 'Total index', 'Interval of the total', 'First-order index', 'Through interactions', 'In the plan', 'Why',
];
const WIDTHS = [30, 11, 10, 8, 11, 9, 11, 26, 46];
const INDEX_FORMAT = decimalsFormat(INDEX_DECIMALS);

export function addTierSheet(workbook: ExcelJS.Workbook, plan: PlanDocument): ExcelJS.Worksheet {
  const sheet = workbook.addWorksheet(TIER_SHEET_NAME);
  WIDTHS.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  const last = WIDTHS.length;
  const levels = new Map(plan.levels.map((level) => [level.id, level]));
  const factorOf = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const p = plan.tiers.policy;

  spanText(sheet, 1, 1, last, "Factor tiers from the aggregated total Sobol' indices", { size: 13, bold: true });
  spanText(
    sheet,
    2,
    1,
    last,
    `Aggregated over the responses by the ${p.aggregate} rule and decided on the ${p.confidence === 'upper' ? 'upper confidence bound' : 'estimate'}: ` +
      `critical at or above ${indexText(p.critical)}, moderate at or above ${indexText(p.moderate)}, negligible below. ` +
      'Bold rows are borderline: the interval of the total index straddles a threshold.',
    { size: 9 },
  );

  const headerRow = 4;
  HEADERS.forEach((text, i) => put(sheet.getCell(headerRow, i + 1), text, { bold: true, fill: FILL.header, border: true, size: 9 }));
  fitRowHeight(sheet, headerRow);

  const factors = [...plan.tiers.factors].sort((a, b) => b.aggregatedTotal - a.aggregatedTotal);
  let row = headerRow + 1;
  for (const factor of factors) {
    const level = levels.get(factor.id);
    const study = factorOf.get(factor.id);
    const setting = (value: number) => (study ? settingText(value, study) : String(value));
    const inPlan = !level
      ? factor.role === 'model'
        ? calibrationWords(plan, factor.id)
        : '–'
      : level.varied
        ? `varied: ${level.values.map(setting).join(', ')} ${level.unit}`
        : `held at ${level.fixedAt === null ? '–' : setting(level.fixedAt)} ${level.unit}`;
    const interval =
      factor.aggregatedTotalLow !== null && factor.aggregatedTotalHigh !== null
        ? `${indexText(factor.aggregatedTotalLow)} to ${indexText(factor.aggregatedTotalHigh)}`
        : '–';
    const values: ExcelJS.CellValue[] = [
      factor.unit && factor.unit !== '-' ? `${factor.name} [${factor.unit}]` : factor.name,
      factor.role === 'model' ? 'model parameter' : 'setting',
      factor.tier,
      rounded(factor.aggregatedTotal, INDEX_DECIMALS),
      interval,
      rounded(factor.aggregatedFirst, INDEX_DECIMALS),
      rounded(factor.interactionShare, INDEX_DECIMALS),
      inPlan,
      level?.reason ?? '',
    ];
    values.forEach((value, i) =>
      put(sheet.getCell(row, i + 1), value, {
        size: 9,
        bold: factor.borderline,
        border: true,
        numFmt: [3, 5, 6].includes(i) ? INDEX_FORMAT : undefined,
        align: [3, 4, 5, 6].includes(i) ? 'center' : undefined,
      }),
    );
    fitRowHeight(sheet, row);
    row += 1;
  }

  const blocks: { row: number; height: number }[] = [];

  if (plan.tiers.interactionPairs.length > 0) {
    row += 1;
    const start = row;
    ['Interacting pair', 'Second-order index (largest over the responses)', 'Responses where it reaches the threshold'].forEach((text, i) =>
      put(sheet.getCell(row, [1, 4, 8][i]), text, { bold: true, fill: FILL.header, border: true, size: 9 }),
    );
    sheet.mergeCells(row, 4, row, 7);
    sheet.mergeCells(row, 8, row, 9);
    fitRowHeight(sheet, row, heightFor(2, 9));
    row += 1;
    for (const pair of plan.tiers.interactionPairs) {
      put(sheet.getCell(row, 1), `${nameOf(plan, pair.factorA)} × ${nameOf(plan, pair.factorB)}`, { size: 9, border: true });
      sheet.mergeCells(row, 4, row, 7);
      put(sheet.getCell(row, 4), rounded(pair.index, INDEX_DECIMALS), { size: 9, border: true, numFmt: INDEX_FORMAT, align: 'center' });
      sheet.mergeCells(row, 8, row, 9);
      put(sheet.getCell(row, 8), pair.responses.map((id) => nameOf(plan, id)).join(', '), { size: 9, border: true });
      fitRowHeight(sheet, row);
      row += 1;
    }
    blocks.push({ row: start, height: heightSum(sheet, start, row) });
  }

  const { onePage } = printSetup(sheet, { widths: WIDTHS, contentHeight: contentHeight(sheet), titleRows: `${headerRow}:${headerRow}` });
  if (!onePage) {
    blockBreaks(sheet, { capacity: pageHeight(WIDTHS, sheet.pageSetup.orientation ?? 'landscape'), repeated: sheet.getRow(headerRow).height ?? 15, lastRow: row - 1, blocks });
  }
  return sheet;
}

function heightSum(sheet: ExcelJS.Worksheet, from: number, to: number): number {
  let total = 0;
  for (let r = from; r < to; r++) total += sheet.getRow(r).height ?? 15;
  return total;
}

function nameOf(plan: PlanDocument, id: string): string {
  return plan.study.factors.find((factor) => factor.id === id)?.name ?? plan.study.responses.find((response) => response.id === id)?.name ?? id;
}

function calibrationWords(plan: PlanDocument, id: string): string {
  const entry = plan.tiers.calibration.entries.find((e) => e.id === id);
  if (!entry) return 'model parameter';
  return entry.action === 'estimate' ? 'estimate precisely from the lab data' : 'take a literature or nominal value';
}
