/**
 * The plan workbook (runsheet.xlsx): the run sheet the technician prints and fills in, then
 * the plan behind it on further sheets, one module per sheet:
 * "Run sheet" (runSheet.ts), "Decision" (decisionSheet.ts), "Factor tiers" (tierSheet.ts),
 * "Model and metrics" (modelSheet.ts), "Comparison" (comparisonSheet.ts), "Plan record"
 * (recordSheet.ts). What they share — the one font, row heights, print set-up — is in
 * sheetLayout.ts.
 *
 * Conventions fixed here:
 * - Every text from the study is written as a plain string value, never as a formula.
 * - Every sheet carries the plan id in its footer, so a loose printed page can be traced.
 * - Creator "tierplan", created and modified = the plan's `createdAt`, so two workbooks of the
 *   same plan differ only in the zip container's own metadata.
 */
import ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import type { Schedule } from '../../core/schedule/scheduleTypes.js';
import { runSheetTable } from '../runSheetTable.js';
import { RUN_SHEET_NAME, addRunSheet } from './runSheet.js';
import { DECISION_SHEET_NAME, addDecisionSheet } from './decisionSheet.js';
import { TIER_SHEET_NAME, addTierSheet } from './tierSheet.js';
import { MODEL_SHEET_NAME, addModelSheet } from './modelSheet.js';
import { COMPARISON_SHEET_NAME, addComparisonSheet } from './comparisonSheet.js';
import { RECORD_SHEET_NAME, addRecordSheet } from './recordSheet.js';
import { footer } from './sheetLayout.js';

export const SHEET_NAMES = {
  runSheet: RUN_SHEET_NAME,
  decision: DECISION_SHEET_NAME,
  tiers: TIER_SHEET_NAME,
  model: MODEL_SHEET_NAME,
  comparison: COMPARISON_SHEET_NAME,
  record: RECORD_SHEET_NAME,
} as const;

export async function planWorkbook(plan: PlanDocument, schedule: Schedule): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  const created = new Date(plan.createdAt);
  workbook.creator = 'tierplan';
  workbook.lastModifiedBy = 'tierplan';
  workbook.created = created;
  workbook.modified = created;
  workbook.title = `Run sheet — ${plan.study.title}`;

  addRunSheet(workbook, plan, schedule, runSheetTable(plan, schedule));
  addDecisionSheet(workbook, plan);
  addTierSheet(workbook, plan);
  addModelSheet(workbook, plan, schedule);
  addComparisonSheet(workbook, plan);
  addRecordSheet(workbook, plan, schedule);
  for (const sheet of workbook.worksheets) {
    // exceljs leaves out columns 9 units wide (its default) from the file; without a stated
    // default, spreadsheet programs would print them at their own, narrower default.
    sheet.properties.defaultColWidth = 9;
    if (!sheet.headerFooter?.oddFooter) sheet.headerFooter = { oddFooter: footer(`Plan ${plan.planId} · ${sheet.name}`) };
  }

  return Buffer.from(await workbook.xlsx.writeBuffer());
}
