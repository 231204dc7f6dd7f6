/**
 * The "Decision" sheet: the manager's page 1 for those who only receive the workbook — the
 * same words as page 1 of report.html (managerDecision.ts): title, the decision in two
 * sentences, the figures against the conventional and the best classical plan, what the
 * campaign will detect and how surely, the main risk, what a failed validation costs, and the
 * approval block. Portrait, one page.
 */
import type ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import { decisionPage } from '../managerDecision.js';
import { FILL, contentHeight, footer, heightFor, printSetup, put, spanText } from './sheetLayout.js';

export const DECISION_SHEET_NAME = 'Decision';
const WIDTHS = [30, 17, 17, 17, 20];

export function addDecisionSheet(workbook: ExcelJS.Workbook, plan: PlanDocument): ExcelJS.Worksheet {
  const sheet = workbook.addWorksheet(DECISION_SHEET_NAME);
  WIDTHS.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  const last = WIDTHS.length;
  const page = decisionPage(plan);

  let row = 1;
  spanText(sheet, row++, 1, last, page.title, { size: 14, bold: true });
  spanText(sheet, row++, 1, last, `${plan.study.title} · plan ${plan.planId} · created ${plan.createdAt.slice(0, 10)} · ${plan.tool.name} ${plan.tool.version}`, {
    size: 8,
  });
  row += 1;
  spanText(sheet, row++, 1, last, page.decision[0], { bold: true, size: 11, fill: FILL.proposed });
  spanText(sheet, row++, 1, last, page.decision[1], { size: 10, fill: FILL.proposed });
  row += 1;

  // The figures.
  put(sheet.getCell(row, 1), '', { fill: FILL.header, border: true });
  page.columns.forEach((column, i) => put(sheet.getCell(row, 2 + i), column.heading, { bold: true, fill: FILL.header, border: true, size: 9, align: 'right' }));
  sheet.getRow(row).height = heightFor(2, 9);
  row += 1;
  for (const figure of page.rows) {
    put(sheet.getCell(row, 1), figure.measure, { size: 9, border: true });
    figure.cells.forEach((text, i) => put(sheet.getCell(row, 2 + i), text, { size: 9, border: true, align: 'right', bold: i === 0 }));
    sheet.getRow(row).height = heightFor(1, 9);
    row += 1;
  }
  for (const note of page.tableNotes) spanText(sheet, row++, 1, last, note, { size: 8 });
  row += 1;

  const section = (heading: string, lines: string[]): void => {
    spanText(sheet, row++, 1, last, heading, { bold: true, size: 11 });
    for (const line of lines) spanText(sheet, row++, 1, last, line, { size: 9 });
    row += 1;
  };
  section('What the campaign will detect, and how surely', [page.precision.lead, ...page.precision.items.map((item) => `• ${item}`)].filter((line) => line !== ''));
  section('Main risk', [page.risk]);
  section('If validation fails', [page.fallback, page.fallbackRule]);

  spanText(sheet, row++, 1, last, 'Approval', { bold: true, size: 11 });
  put(sheet.getCell(row, 1), '', { fill: FILL.header, border: true });
  page.approval.fields.forEach((field, i) => put(sheet.getCell(row, 2 + i), field, { bold: true, fill: FILL.header, border: true, size: 9 }));
  row += 1;
  for (const role of page.approval.roles) {
    put(sheet.getCell(row, 1), role, { size: 9, border: true });
    page.approval.fields.forEach((_, i) => put(sheet.getCell(row, 2 + i), null, { border: true }));
    sheet.getRow(row).height = 30;
    row += 1;
  }

  printSetup(sheet, { widths: WIDTHS, contentHeight: contentHeight(sheet), orientation: 'portrait' });
  sheet.headerFooter = { oddFooter: footer(`Plan ${plan.planId} · decision`) };
  return sheet;
}
