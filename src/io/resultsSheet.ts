/**
 * Reads a filled run sheet back — runsheet.xlsx (sheet "Run sheet") or runsheet.csv, exactly
 * as `tierplan plan` wrote them — and checks it against its plan before anything is fitted.
 *
 * Method: the expected sheet is rebuilt from plan.json with the writers' own column
 * definition (`runSheetTable`), so nothing here knows a header position. The table is the
 * first row that holds every expected column label (the columns' machine keys when the
 * definition has them, else their header text); each column is found by its label in that
 * row. Runs follow until the first row whose run-number cell is empty. The plan id and the
 * checksum are the cells right of their labels (`IDENTITY_LABELS`) above the table.
 *
 * Refusals (InputError naming file, sheet, row and column; spreadsheet letters for columns):
 * - a sheet of another plan: plan id or checksum differs from plan.json;
 * - a run number the plan does not have, a run listed twice, a run missing, or a changed
 *   point id;
 * - a changed set-point (a deviation belongs in the "as run" column) — compared at the
 *   decimals the sheet shows;
 * - a result or as-run value that is not a number (decimal point, no thousands separators);
 * - an as-run value outside the factor's equipment limits.
 * Warnings (returned, not thrown):
 * - a blank result (the run is left out of that response's fit);
 * - a run whose Remarks start with NOT_DONE_WORD ("not done", any letter case): its results
 *   are ignored, whatever is written in them;
 * - an as-run value outside the studied range but inside the equipment limits (the model
 *   then extrapolates).
 *
 * Limits: the file sizes of the README's table limits (tableFileBytes for the CSV,
 * workbookFileBytes and workbookContentBytes for the workbook); a text cell of at most
 * `sheetCellLength` characters, refused with its cell named; at most MAX_SHEET_ROWS rows and
 * MAX_SHEET_COLUMNS columns are read (the run table of the largest plan the study limits allow
 * lies far inside). Cell contents quoted in messages are cut to an excerpt.
 */
import { readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import ExcelJS from 'exceljs';
import { parse } from 'csv-parse/sync';
import { excerpt, InputError } from '../core/inputError.js';
import { aboveLimit, checkLimit, limitOf } from '../core/inputLimits.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { SheetResults, SheetRun } from '../core/results/campaignAnalysis.js';
import { IDENTITY_LABELS, NOT_DONE_WORD, runSheetTable, type RunSheetColumn } from './runSheetTable.js';
import { SHEET_NAMES } from './workbook/planWorkbook.js';
import { checkReadableFile, fileSystemProblem, megabytes } from './tableRows.js';
import { zipContentSize } from './zipContentSize.js';

export const MAX_SHEET_ROWS = 10000;
export const MAX_SHEET_COLUMNS = 500;

export type CellValue = string | number | null;

/** A sheet as a grid of plain values; `cells[r][c]` is spreadsheet row r + 1, column c + 1. */
interface CellGrid {
  sheet: string | null;
  cells: CellValue[][];
  /** Spreadsheet row number of `cells[r]` (CSV: its line; they differ only after quoted line breaks). */
  rowNumber(r: number): number;
}

/** How the reader uses a column of the writer's definition. */
type ColumnRole = 'run' | 'point' | 'setPoint' | 'asRun' | 'result' | 'remarks' | 'other';

/**
 * The role of a column of the writer's definition. The kind is compared as text so that
 * the reader follows both the set-point kinds in use (`factor` for a set-point column, and
 * `setPoint` / `asRun` where the sheet has "as run" columns) without a second table.
 */
function roleOf(column: RunSheetColumn): ColumnRole {
  switch (column.kind as string) {
    case 'sequence':
      return 'run';
    case 'point':
      return 'point';
    case 'factor':
    case 'setPoint':
      return 'setPoint';
    case 'asRun':
      return 'asRun';
    case 'response':
      return 'result';
    case 'remarks':
      return 'remarks';
    default:
      return 'other';
  }
}

/** The labels a column may be found by: its machine key first when the definition has one. */
function labelsOf(column: RunSheetColumn): string[] {
  const key = (column as { key?: unknown }).key;
  return typeof key === 'string' ? [key, column.header] : [column.header];
}

export async function readResultsSheet(path: string, plan: PlanDocument): Promise<SheetResults & { sheet: string | null; format: 'xlsx' | 'csv' }> {
  const extension = extname(path).toLowerCase();
  if (extension !== '.xlsx' && extension !== '.csv') {
    throw new InputError('results must be the run sheet as .xlsx or .csv, as `tierplan plan` wrote it', { file: path });
  }
  // The table limits of the README apply: a workbook is unpacked whole in memory, so it gets the smaller one.
  const size = await checkReadableFile(path, path);
  const sizeLimit = extension === '.xlsx' ? 'workbookFileBytes' : 'tableFileBytes';
  if (size > limitOf(sizeLimit)) throw new InputError(`is ${megabytes(size)}, ${aboveLimit(sizeLimit)}`, { file: path });
  let content: Buffer;
  try {
    content = await readFile(path);
  } catch (error) {
    throw new InputError(fileSystemProblem(error), { file: path });
  }
  const grid = extension === '.xlsx' ? await workbookGrid(content, path) : csvGrid(content, path);
  return { ...checkedResults(grid, plan, path), sheet: grid.sheet, format: extension === '.xlsx' ? 'xlsx' : 'csv' };
}

/** Spreadsheet column letters of a 0-based column index (0 → A, 26 → AA). */
export function columnLetters(index: number): string {
  let n = index + 1;
  let letters = '';
  while (n > 0) {
    const rest = (n - 1) % 26;
    letters = String.fromCharCode(65 + rest) + letters;
    n = Math.floor((n - 1) / 26);
  }
  return letters;
}

async function workbookGrid(content: Buffer, path: string): Promise<CellGrid> {
  const unpacked = zipContentSize(content);
  if (unpacked !== null && unpacked > limitOf('workbookContentBytes')) {
    const shown = Number.isFinite(unpacked) ? megabytes(unpacked) : 'more than 4 GB';
    throw new InputError(`unpacks to ${shown}, ${aboveLimit('workbookContentBytes')}`, { file: path });
  }
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.load(content as unknown as ArrayBuffer);
  } catch {
    throw new InputError('is not a readable .xlsx workbook', { file: path });
  }
  const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet);
  if (!sheet) throw new InputError(`has no sheet "${SHEET_NAMES.runSheet}": is it the run sheet tierplan wrote?`, { file: path });
  const rows = Math.min(sheet.rowCount, MAX_SHEET_ROWS);
  const columns = Math.min(sheet.columnCount, MAX_SHEET_COLUMNS);
  const cells: CellValue[][] = [];
  for (let r = 1; r <= rows; r++) {
    const row = sheet.getRow(r);
    const values: CellValue[] = [];
    for (let c = 1; c <= columns; c++) {
      const cell = row.getCell(c);
      // A merged range holds its value in its first cell only.
      const value = cell.isMerged && cell.master !== cell ? null : plainValue(cell.value);
      checkCellLength(value, { file: `${path}, sheet ${SHEET_NAMES.runSheet}`, row: r, column: columnLetters(c - 1) });
      values.push(value);
    }
    cells.push(values);
  }
  return { sheet: SHEET_NAMES.runSheet, cells, rowNumber: (r) => r + 1 };
}

/** The value a spreadsheet shows, as a number or trimmed text (formulas by their result). */
function plainValue(value: ExcelJS.CellValue): CellValue {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return value;
  if (typeof value === 'string') return value.trim() === '' ? null : value.trim();
  if (typeof value === 'boolean') return String(value);
  // A number under a date format that is no date (1e308) reads back as an invalid Date.
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? 'an invalid date' : value.toISOString();
  if (typeof value === 'object') {
    if ('richText' in value) return plainValue(value.richText.map((part) => part.text).join(''));
    if ('result' in value) return plainValue((value.result ?? null) as ExcelJS.CellValue);
    if ('text' in value) return plainValue(String(value.text));
    if ('error' in value) return String(value.error);
  }
  return null;
}

function csvGrid(content: Buffer, path: string): CellGrid {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(content.toString('utf8'), {
      bom: true,
      relax_column_count: true,
      skip_empty_lines: false,
      info: true,
      to_line: MAX_SHEET_ROWS,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (error) {
    const line = (error as { lines?: number }).lines;
    throw new InputError(`is not readable CSV (${excerpt((error as Error).message.split('\n')[0], 160)})`, { file: path, row: line });
  }
  const lines = records.map(({ info }) => info.lines);
  const cells = records.map(({ record }, r) =>
    record.slice(0, MAX_SHEET_COLUMNS).map((text, c) => {
      const value = text.trim() === '' ? null : text.trim();
      checkCellLength(value, { file: path, row: lines[r], column: columnLetters(c) });
      return value;
    }),
  );
  return { sheet: null, cells, rowNumber: (r) => lines[r] ?? r + 1 };
}

interface LocatedColumn {
  column: RunSheetColumn;
  role: ColumnRole;
  index: number;
}

/**
 * Where the run table starts: the first row (0-based) holding the label of every column of
 * the writer's definition, and the 0-based index of each column in it; null when no row does.
 * Columns sharing a header (two "as run [°C]") take its occurrences in order.
 */
export function locateRunTable(cells: readonly (readonly CellValue[])[], columns: readonly RunSheetColumn[]): { row: number; indexes: number[] } | null {
  for (let r = 0; r < cells.length; r++) {
    const texts = cells[r].map((cell) => (cell === null ? '' : String(cell)));
    const used = new Set<number>();
    const indexes = columns.map((column) => {
      let index = -1;
      for (const label of labelsOf(column)) {
        index = texts.findIndex((text, i) => text === label && !used.has(i));
        if (index >= 0) break;
      }
      used.add(index);
      return index;
    });
    if (indexes.every((index) => index >= 0)) return { row: r, indexes };
  }
  return null;
}

function checkedResults(grid: CellGrid, plan: PlanDocument, path: string): SheetResults {
  const schedule = plan.schedule;
  if (!schedule) throw new InputError('plan has no run order; plan again with `tierplan plan`', { file: path, key: 'schedule' });
  const expected = runSheetTable(plan, schedule);
  const where = (r: number, c?: number, column?: RunSheetColumn): { file: string; row: number; column?: string } => ({
    file: grid.sheet ? `${path}, sheet ${grid.sheet}` : path,
    row: grid.rowNumber(r),
    ...(c === undefined ? {} : { column: `${columnLetters(c)}${column ? ` (${column.header})` : ''}` }),
  });

  // The table: the first row holding every column's label.
  const table = locateRunTable(grid.cells, expected.columns);
  const tableRow = table ? table.row : -1;
  const located: LocatedColumn[] = table ? expected.columns.map((column, i) => ({ column, role: roleOf(column), index: table.indexes[i] })) : [];
  // Identity first: another plan's sheet is named as such, not as a sheet with odd columns.
  const identityRows = tableRow < 0 ? Math.min(grid.cells.length, 40) : tableRow;
  checkIdentity(grid, identityRows, IDENTITY_LABELS.planId, plan.planId, 'plan id', where, tableRow >= 0);
  checkIdentity(grid, identityRows, IDENTITY_LABELS.checksum, plan.checksum, 'checksum', where, false);
  if (tableRow < 0) {
    throw new InputError(
      `no run table with the columns of plan ${plan.planId} (${excerpt(expected.columns.map((column) => column.header).join(', '), 200)}): a column was renamed or removed, or this is another plan's sheet`,
      { file: grid.sheet ? `${path}, sheet ${grid.sheet}` : path },
    );
  }


  const runColumn = located.find((entry) => entry.role === 'run')!;
  const expectedByRun = new Map(expected.rows.map((row, i) => [row[expected.columns.indexOf(runColumn.column)] as number, i]));
  const factors = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const responses = plan.study.responses;
  const seen = new Map<number, number>();
  const runs: SheetRun[] = [];
  const warnings: string[] = [];
  const blank = new Map<string, number[]>();

  for (let r = tableRow + 1; r < grid.cells.length; r++) {
    const cells = grid.cells[r];
    const runCell = cells[runColumn.index] ?? null;
    if (runCell === null) break;
    // The human header row under the key row.
    if (runCell === runColumn.column.header) continue;
    const runNumber = numberIn(runCell);
    const expectedIndex = runNumber === null ? undefined : expectedByRun.get(runNumber);
    if (runNumber === null || expectedIndex === undefined) {
      throw new InputError(`run number ${cellText(runCell)} is not a run of plan ${plan.planId}`, where(r, runColumn.index, runColumn.column));
    }
    if (seen.has(runNumber)) {
      throw new InputError(`run ${runNumber} is listed twice (also on row ${seen.get(runNumber)})`, where(r, runColumn.index, runColumn.column));
    }
    seen.set(runNumber, grid.rowNumber(r));
    const expectedRow = expected.rows[expectedIndex];
    const point = String(expectedRow[expected.columns.indexOf(located.find((entry) => entry.role === 'point')!.column)]);

    const remarksEntry = located.find((entry) => entry.role === 'remarks');
    const remarks = remarksEntry ? String(cells[remarksEntry.index] ?? '') : '';
    const notDone = remarks.toLowerCase().startsWith(NOT_DONE_WORD);
    if (notDone) warnings.push(`run ${runNumber} (point ${point}) is marked "${NOT_DONE_WORD}" in Remarks: its results are left out`);

    const asRun: Record<string, number> = {};
    const results: Record<string, number | null> = {};
    for (const entry of located) {
      const value = cells[entry.index] ?? null;
      const at = where(r, entry.index, entry.column);
      const expectedValue = expectedRow[expected.columns.indexOf(entry.column)];
      switch (entry.role) {
        case 'point':
          if (String(value ?? '') !== String(expectedValue)) {
            throw new InputError(`run ${runNumber} is point ${expectedValue} in plan ${plan.planId}, the sheet says ${cellText(value)}`, at);
          }
          break;
        case 'setPoint': {
          const shown = numberIn(value);
          const decimals = entry.column.decimals ?? 0;
          if (shown === null || Number(shown.toFixed(decimals)) !== Number((expectedValue as number).toFixed(decimals))) {
            throw new InputError(
              `the set-point of run ${runNumber} was ${expectedValue}, the sheet says ${cellText(value)}: never change a set-point; write the value actually set in the "as run" column`,
              at,
            );
          }
          break;
        }
        case 'asRun': {
          if (value === null) break;
          const id = entry.column.id!;
          const factor = factors.get(id)!;
          const actual = numberIn(value);
          if (actual === null) throw new InputError(`"${cellText(value)}" is not a number: write the value actually set of ${factor.name}, or leave it blank`, at);
          if (factor.limits && (actual < factor.limits.low || actual > factor.limits.high)) {
            throw new InputError(
              `as run ${actual} ${factor.unit} lies outside the equipment limits ${factor.limits.low}–${factor.limits.high} of ${factor.name}: check the entry; a run outside the limits is not analysed`,
              at,
            );
          }
          if (actual < Math.min(factor.low, factor.high) || actual > Math.max(factor.low, factor.high)) {
            warnings.push(`run ${runNumber}: ${factor.name} was run at ${actual} ${factor.unit}, outside the studied ${factor.low}–${factor.high}; the model extrapolates there`);
          }
          asRun[id] = actual;
          break;
        }
        case 'result': {
          const id = entry.column.id!;
          if (value === null || notDone) {
            results[id] = null;
            if (value === null && !notDone) blank.set(id, [...(blank.get(id) ?? []), runNumber]);
            break;
          }
          const measured = numberIn(value);
          if (measured === null) {
            throw new InputError(`"${cellText(value)}" is not a number: write the result as a number (decimal point) or leave it blank; comments go under Remarks`, at);
          }
          results[id] = measured;
          break;
        }
        default:
          break;
      }
    }
    runs.push({ run: runNumber, point, asRun, results, notDone });
  }

  const missing = [...expectedByRun.keys()].filter((run) => !seen.has(run));
  if (missing.length > 0) {
    throw new InputError(
      `run${missing.length === 1 ? '' : 's'} ${listed(missing)} of plan ${plan.planId} ${missing.length === 1 ? 'is' : 'are'} missing from the table: keep every row, mark a run that could not be done "${NOT_DONE_WORD}" in Remarks`,
      where(tableRow),
    );
  }
  for (const response of responses) {
    const runsBlank = blank.get(response.id);
    if (runsBlank) warnings.push(`${response.name}: no result for run${runsBlank.length === 1 ? '' : 's'} ${listed(runsBlank)}; fitted on the runs that have one`);
  }
  return { planId: plan.planId, checksum: plan.checksum, runs, warnings };
}

/** The identity cell right of `label` above the table; refused when it names another plan. */
function checkIdentity(
  grid: CellGrid,
  tableRow: number,
  label: string,
  expected: string,
  what: string,
  where: (r: number, c?: number) => { file: string; row: number; column?: string },
  required: boolean,
): void {
  for (let r = 0; r < tableRow; r++) {
    const cells = grid.cells[r];
    const at = cells.findIndex((cell) => cell === label);
    if (at < 0) continue;
    const offset = cells.slice(at + 1).findIndex((cell) => cell !== null);
    const c = offset < 0 ? at + 1 : at + 1 + offset;
    const value = offset < 0 ? null : String(cells[c]);
    if (value !== expected) {
      throw new InputError(
        `${what} ${value === null ? '(empty)' : excerpt(value, 80)} is not the ${what} of this plan.json (${expected}): these results belong to another plan`,
        where(r, c),
      );
    }
    return;
  }
  if (required) throw new InputError(`no "${label}" above the run table: is this a run sheet tierplan wrote?`, where(0));
}

/** Refuses a text cell longer than the `sheetCellLength` limit (a pasted file, not a remark). */
function checkCellLength(value: CellValue, location: { file: string; row: number; column: string }): void {
  if (typeof value === 'string') checkLimit('sheetCellLength', value.length, location, 'characters in one cell');
}

/** Run numbers for a one-line message: the first ten, then how many more. */
function listed(runs: readonly number[]): string {
  return runs.length <= 10 ? runs.join(', ') : `${runs.slice(0, 10).join(', ')} and ${runs.length - 10} more`;
}

/** A cell's content short enough to quote in a one-line message. */
function cellText(value: CellValue | undefined): string {
  return value === null || value === undefined ? 'nothing' : excerpt(String(value));
}

/** A number typed in a cell: a spreadsheet number, or text in plain decimal notation. */
function numberIn(value: CellValue): number | null {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (value === null) return null;
  const text = value.trim();
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(text)) return null;
  const number = Number(text);
  return Number.isFinite(number) ? number : null;
}
