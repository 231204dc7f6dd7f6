/**
 * The "Run sheet" of the plan workbook: the page the technician prints and fills in, and the
 * sheet `tierplan analyze` reads back once the results are typed in.
 *
 * Layout (fixed here; a reader relies on the cells named):
 * - Row 1: A1 the title "Run sheet — <study title>".
 * - Row 2: A2 "Plan id", C2 the plan id; F2 "Checksum", G2 the plan's SHA-256 checksum.
 * - Row 3: A3 "Caution", C3 the safety caution.  Row 4: A4 "Held fixed", C4 the fixed
 *   settings in words ("none" when nothing is fixed).  Row 5: A5 "Marks", C5 what the marks
 *   of the table mean. (Labels span A:B, texts C to the last column.)
 * - Row 6 (hidden, KEY_ROW): the column keys of runSheetTable.ts (`run`, `session`,
 *   `set:<factor id>`, `as_run:<factor id>`, `result:<response id>`, …); a reader finds columns
 *   by key. Row 7 (HEADER_ROW): the human headers. Rows 8 on: one row per run in execution
 *   order, column A holding the run number; the first row whose column A is empty ends the
 *   table. Below it, after one empty row, notes: run order, hard-to-change grouping, the
 *   sessions with their hours, how to fill in.
 * - Set-points are numbers with the factor's decimals as number format; as-run and result
 *   cells accept numbers only (data validation); Date is a date cell, Start and End times are
 *   free text (hh:mm). A run that could not be done has Remarks starting with "not done".
 *
 * Print: rows 1–7 repeat on every page (title, plan id, caution, fixed settings, marks and the
 * column headers), landscape, fit to one page wide, rows at least RUN_ROW_HEIGHT tall for
 * handwriting, a page break after each session, the seed and page number in the footer.
 * A set-point on a shaded cell in bold needs a reset of a hard-to-change factor before its run.
 */
import type ExcelJS from 'exceljs';
import type { PlanDocument } from '../../core/plan/planDocument.js';
import type { Schedule } from '../../core/schedule/scheduleTypes.js';
import { sessionHours } from '../../core/schedule/sessionHours.js';
import { wordList } from '../../core/wordList.js';
import { FILL_IN_HINT, NOT_DONE_WORD, SAFETY_CAUTION, type RunSheetColumn, type RunSheetTable } from '../runSheetTable.js';
import { settingText, withUnitText } from '../numberText.js';
import { overLimitWarning, sessionLine } from '../sessionWording.js';
import { FILL, decimalsFormat, footer, heightFor, put, spanText, styleCell, widthForWord, wrappedLines } from './sheetLayout.js';

export const RUN_SHEET_NAME = 'Run sheet';
export const KEY_ROW = 6;
export const HEADER_ROW = 7;
export const FIRST_RUN_ROW = 8;
/** Fixed cells of the identity row. */
export const PLAN_ID_CELL = 'C2';
export const CHECKSUM_CELL = 'G2';

/** Row height of a run, points: about 10 mm, room to write by hand (common practice). */
export const RUN_ROW_HEIGHT = 30;
/** Response entries outside ±1e12 are typing slips, not measurements. */
const ENTRY_LIMIT = 1e12;
const HEADER_SIZE = 9;

function columnWidth(column: RunSheetColumn): number {
  switch (column.kind) {
    case 'sequence':
    case 'session':
      return 4.5;
    case 'wholePlot':
      return 5;
    case 'point':
      return 5.5;
    case 'purpose':
      return 8.5;
    case 'setPoint':
      return 8.5;
    case 'asRun':
      return 7;
    case 'response':
      return 9;
    case 'start':
    case 'end':
      return 6;
    case 'lot':
    case 'operator':
    case 'checkedBy':
      return 8;
    case 'date':
      return 8.5;
    case 'remarks':
      return 14;
  }
}

export function addRunSheet(workbook: ExcelJS.Workbook, plan: PlanDocument, schedule: Schedule, table: RunSheetTable): ExcelJS.Worksheet {
  const sheet = workbook.addWorksheet(RUN_SHEET_NAME);
  const width = table.columns.length;
  // Wide enough that no header word breaks in the middle.
  const widths = table.columns.map((column) =>
    Math.max(columnWidth(column), ...column.header.split(/\s+/).map((word) => widthForWord(word, HEADER_SIZE, true))),
  );
  widths.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  const factorOf = new Map(plan.study.factors.map((factor) => [factor.id, factor]));

  // Row 1: title.
  spanText(sheet, 1, 1, width, `Run sheet — ${plan.study.title}`, { size: 13, bold: true });

  // Row 2: identity, in fixed cells.
  sheet.mergeCells('A2:B2');
  put(sheet.getCell('A2'), 'Plan id', { bold: true, size: 9, wrap: false });
  sheet.mergeCells('C2:E2');
  put(sheet.getCell(PLAN_ID_CELL), plan.planId, { bold: true, size: 11, wrap: false });
  put(sheet.getCell('F2'), 'Checksum', { size: 8, wrap: false, align: 'right' });
  sheet.mergeCells(2, 7, 2, Math.max(7, width));
  put(sheet.getCell(CHECKSUM_CELL), plan.checksum, { size: 7, wrap: false });
  sheet.getRow(2).height = heightFor(1, 11);

  // Rows 3–5: caution, fixed settings, marks; the label spans A:B, the text C to the last column.
  const label = (row: number, text: string, fill?: ExcelJS.Fill) => {
    sheet.mergeCells(row, 1, row, 2);
    put(sheet.getCell(row, 1), text, { bold: true, size: 9, fill, wrap: false });
  };
  label(3, 'Caution', FILL.caution);
  spanText(sheet, 3, 3, width, SAFETY_CAUTION, { bold: true, fill: FILL.caution, size: 9 });
  const fixed = table.fixed.map((setting) => `${setting.name} ${withUnitText(settingText(setting.value, factorOf.get(setting.id)!), setting.unit)}`);
  label(4, 'Held fixed');
  spanText(sheet, 4, 3, width, fixed.length > 0 ? `${fixed.join('; ')} (every run).` : 'none', { size: 9 });
  label(5, 'Marks');
  spanText(sheet, 5, 3, width, marksText(plan, schedule, table), { size: 9 });

  // Row 6: machine keys (hidden); row 7: headers.
  table.columns.forEach((column, i) => put(sheet.getCell(KEY_ROW, i + 1), column.key, { size: 7, wrap: false }));
  sheet.getRow(KEY_ROW).hidden = true;
  let headerLines = 1;
  table.columns.forEach((column, i) => {
    put(sheet.getCell(HEADER_ROW, i + 1), column.header, {
      bold: true,
      size: HEADER_SIZE,
      fill: column.kind === 'asRun' ? FILL.entry : FILL.header,
      border: true,
      align: 'center',
      wrap: true,
    });
    sheet.getCell(HEADER_ROW, i + 1).alignment = { wrapText: true, vertical: 'middle', horizontal: 'center' };
    headerLines = Math.max(headerLines, wrappedLines(column.header, widths[i], HEADER_SIZE, true));
  });
  sheet.getRow(HEADER_ROW).height = heightFor(headerLines, HEADER_SIZE);

  // The runs.
  table.rows.forEach((values, r) => {
    const rowNumber = FIRST_RUN_ROW + r;
    const resets = new Set(table.resets[r]);
    table.columns.forEach((column, i) => {
      const cell = sheet.getCell(rowNumber, i + 1);
      cell.value = values[i];
      const reset = column.kind === 'setPoint' && resets.has(column.id!);
      styleCell(cell, {
        size: column.kind === 'setPoint' ? 11 : 10,
        bold: reset,
        border: true,
        fill: reset ? FILL.reset : column.kind === 'asRun' ? FILL.entry : undefined,
        align: ['sequence', 'session', 'wholePlot', 'point'].includes(column.kind) ? 'center' : column.kind === 'setPoint' ? 'right' : undefined,
        numFmt: column.kind === 'setPoint' || column.kind === 'asRun' ? decimalsFormat(column.decimals ?? 0) : column.kind === 'date' ? 'yyyy-mm-dd' : undefined,
        wrap: column.kind === 'purpose' || column.kind === 'remarks',
      });
      cell.alignment = { ...cell.alignment, vertical: 'middle' };
      if (column.kind === 'response' || column.kind === 'asRun') cell.dataValidation = entryValidation(column, values, table);
    });
    sheet.getRow(rowNumber).height = RUN_ROW_HEIGHT;
    // Each session after the first starts on a new printed page: one page set per day or shift.
    if (r + 1 < table.rows.length && table.sessions[r + 1] !== table.sessions[r]) sheet.getRow(rowNumber).addPageBreak();
  });

  addNotes(sheet, plan, schedule, FIRST_RUN_ROW + table.rows.length + 1, width);

  sheet.views = [{ state: 'frozen', xSplit: 0, ySplit: HEADER_ROW, topLeftCell: `A${FIRST_RUN_ROW}`, activeCell: `A${FIRST_RUN_ROW}` }];
  sheet.pageSetup = {
    ...sheet.pageSetup,
    paperSize: 9,
    orientation: 'landscape',
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: 0,
    printTitlesRow: `1:${HEADER_ROW}`,
    margins: { left: 0.3, right: 0.3, top: 0.4, bottom: 0.5, header: 0.2, footer: 0.25 },
  };
  sheet.headerFooter = {
    oddFooter: footer(`Plan ${plan.planId} · run order seed ${schedule.seed} · ${plan.tool.name} ${plan.tool.version}`),
  };
  return sheet;
}

/** What the bold, shaded and grey cells mean, and where pages break. */
function marksText(plan: PlanDocument, schedule: Schedule, table: RunSheetTable): string {
  const parts: string[] = [];
  const hard = schedule.hardToChange?.factors ?? [];
  if (hard.length > 0) {
    const factors = hard.map((id) => plan.study.factors.find((factor) => factor.id === id)).filter((factor) => factor !== undefined);
    const settle = factors
      .filter((factor) => factor.settleMinutes !== undefined && factor.settleMinutes > 0)
      .map((factor) => `${factor.name} ${factor.settleMinutes} min`);
    parts.push(
      `Bold set-point on a yellow cell: ${wordList(factors.map((factor) => factor.name))} changes before this run; reset it and let it settle` +
        (settle.length > 0 ? ` (${wordList(settle)})` : '') +
        ' before starting.',
    );
  }
  parts.push('Grey "as run" columns: leave blank unless the value actually set differs from the set-point beside it.');
  parts.push(`Each ${schedule.sessionLabel.toLowerCase()} starts on a new page.`);
  if (table.wholePlots) parts.push('Whole plot: runs sharing the hard-to-change settings, done one after another.');
  return parts.join(' ');
}

function entryValidation(column: RunSheetColumn, values: (string | number | null)[], table: RunSheetTable): ExcelJS.DataValidation {
  const unit = column.unit && column.unit !== '-' ? ` in ${column.unit}` : '';
  if (column.kind === 'asRun') {
    const setIndex = table.columns.findIndex((other) => other.kind === 'setPoint' && other.id === column.id);
    const setPoint = values[setIndex];
    return {
      type: 'decimal',
      operator: 'between',
      allowBlank: true,
      formulae: [-ENTRY_LIMIT, ENTRY_LIMIT],
      showInputMessage: true,
      promptTitle: 'As run'.slice(0, 32),
      prompt: `Only if the ${column.name} actually set differs from ${setPoint}${unit}: write the value set. Numbers only.`.slice(0, 255),
      showErrorMessage: true,
      errorStyle: 'stop',
      errorTitle: 'Number expected',
      error: `Enter the ${column.name} actually set as a number${unit}, or leave it empty.`.slice(0, 255),
    };
  }
  return {
    type: 'decimal',
    operator: 'between',
    allowBlank: true,
    formulae: [-ENTRY_LIMIT, ENTRY_LIMIT],
    showInputMessage: true,
    promptTitle: column.name!.slice(0, 32),
    prompt: `Measured ${column.name}${unit}. Numbers only.`.slice(0, 255),
    showErrorMessage: true,
    errorStyle: 'stop',
    errorTitle: 'Number expected',
    error: `Enter ${column.name} as a number${unit}, or leave it empty. Put comments under Remarks.`.slice(0, 255),
  };
}

/** The notes under the table: printed once, after the last run. */
function addNotes(sheet: ExcelJS.Worksheet, plan: PlanDocument, schedule: Schedule, first: number, width: number): void {
  let row = first + 1;
  const note = (label: string, text: string, warning = false): void => {
    sheet.mergeCells(row, 1, row, 3);
    put(sheet.getCell(row, 1), label, { bold: true, size: 9, wrap: false });
    spanText(sheet, row, 4, width, text, { size: 9, bold: warning });
    row += 1;
  };
  note('Run order', schedule.note);
  if (schedule.hardToChange) note('Hard to change', schedule.hardToChange.note);
  const hours = sessionHours(plan, schedule);
  for (const load of hours.sessions) {
    const warning = overLimitWarning(load, schedule.sessionLabel, hours);
    note(load.session === 1 ? 'Sessions' : '', `${sessionLine(load, schedule.sessionLabel)}${warning ? ` — ${warning}` : ''}.`, warning !== null);
  }
  note('Fill in', FILL_IN_HINT);
  note('Not done', `A run that could not be done: write "${NOT_DONE_WORD}" at the start of its Remarks, with the reason.`);
}
