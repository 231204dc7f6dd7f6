/**
 * The "Plan record" sheet: what identifies the plan and where it came from — plan id,
 * checksum, seeds, tool and format versions, study and table files, sessions, fixed factors.
 * Labels in column A, values in column B (fixed: a reader may look a value up by its label).
 */
import type ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import type { Schedule } from '../../core/schedule/scheduleTypes.js';
import { DEFAULT_SESSION_HOURS } from '../../core/study.js';
import { countOf, hoursText, settingText, withUnitText } from '../numberText.js';
import { contentHeight, fitRowHeight, printSetup, put, spanText } from './sheetLayout.js';

export const RECORD_SHEET_NAME = 'Plan record';
const WIDTHS = [28, 72];

export function addRecordSheet(workbook: ExcelJS.Workbook, plan: PlanDocument, schedule: Schedule): ExcelJS.Worksheet {
  const sheet = workbook.addWorksheet(RECORD_SHEET_NAME);
  WIDTHS.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  spanText(sheet, 1, 1, 2, 'Plan record', { size: 13, bold: true });
  const source = plan.study.source;
  const sessions = plan.study.sessions;
  const factorOf = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const fixed = plan.levels
    .filter((level) => !level.varied && level.fixedAt !== null)
    .map((level) => `${level.name} ${withUnitText(settingText(level.fixedAt!, factorOf.get(level.id)!), level.unit)}`);
  const entries: [string, string | number][] = [
    ['Plan id', plan.planId],
    ['Checksum (SHA-256)', plan.checksum],
    ['Run order seed', schedule.seed],
    ['Design search seed', plan.metrics.seed],
    ['Tool', plan.tool.name],
    ['Tool version', plan.tool.version],
    ['Plan format version', plan.formatVersion],
    ['Created (UTC)', plan.createdAt],
    ['Study title', plan.study.title],
    ['Study file', source.studyFile],
    ['Index table', source.indicesFile],
    ['Second-order index table', source.interactionsFile ?? 'none'],
    [
      'Sessions',
      sessions
        ? `${countOf(schedule.sessionCount, sessions.label.toLowerCase())} of at most ${countOf(sessions.maxRuns, 'run')} and ${hoursText(sessions.hours ?? DEFAULT_SESSION_HOURS)} h each`
        : 'not split',
    ],
    ['Fixed factors', fixed.join('; ') || 'none'],
  ];
  entries.forEach(([label, value], i) => {
    const row = 3 + i;
    put(sheet.getCell(row, 1), label, { bold: true, size: 9 });
    put(sheet.getCell(row, 2), value, { size: 9, align: 'left' });
    fitRowHeight(sheet, row);
  });
  printSetup(sheet, { widths: WIDTHS, contentHeight: contentHeight(sheet), orientation: 'portrait' });
  return sheet;
}
