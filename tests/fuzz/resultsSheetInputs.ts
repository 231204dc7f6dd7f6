/**
 * Mutated results sheets for the fuzz harness: the run sheet of a plan exactly as tierplan
 * writes it (runsheet.csv by `runSheetCsv`, runsheet.xlsx by `planWorkbook`), filled with the
 * invented sample results (samples/spray-dryer/makeResults.ts, INVENTED), then broken on
 * purpose — cells changed to odd, huge, quoted or wrongly typed values, rows removed,
 * duplicated, swapped or added in bulk, columns removed or inserted, and, for the CSV, the
 * text itself cut or spliced (an unbalanced quote, a quoted cell of a megabyte), for the
 * workbook, its bytes.
 *
 * The plan is the hand-made fixture of tests/fixtures/plan (INVENTED), with a fixed run order,
 * so a case costs no planning. Arbitraries are synchronous and workbooks are written
 * asynchronously, so a case is a description (`ResultsSheetCase`) that `writeResultsSheet`
 * turns into the file.
 */
import fc from 'fast-check';
import ExcelJS from 'exceljs';
import { parse } from 'csv-parse/sync';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';
import { scheduleRuns } from '../../src/core/schedule/scheduleRuns.js';
import { locateRunTable } from '../../src/io/resultsSheet.js';
import { runSheetTable } from '../../src/io/runSheetTable.js';
import { SHEET_NAMES } from '../../src/io/workbook/planWorkbook.js';
import { filledCsv, filledWorkbook } from '../../samples/spray-dryer/makeResults.js';
import { sprayDryerPlan } from '../fixtures/plan/sprayDryerPlan.js';

/** A cell value as the mutations write it; the object forms are workbook-only cell types. */
type HostileCell =
  | string
  | number
  | boolean
  | null
  | { date: string }
  | { formula: string; result: number | string | { error: string } }
  | { richText: string[] }
  | { hyperlink: string; text: string }
  | { error: string };

export interface SheetMutation {
  op: 'cell' | 'deleteRow' | 'duplicateRow' | 'swapRows' | 'blankRow' | 'manyRows' | 'deleteColumn' | 'insertColumn' | 'text' | 'bytes';
  /** Row and column picks; rows are counted from the run table's key row most of the time. */
  row: number;
  column: number;
  /** Pick anywhere in the sheet instead of in the run table. */
  anywhere: boolean;
  value: HostileCell;
  /** Rows appended by `manyRows`; the spliced text of `text`. */
  count: number;
  snippet: string;
}

export interface ResultsSheetCase {
  format: 'csv' | 'xlsx';
  mutations: SheetMutation[];
}

/** The plan every results case reads against (fixed run order, so the sheet is the same each time). */
export function resultsFuzzPlan(): PlanDocument {
  const plan = sprayDryerPlan();
  plan.schedule = scheduleRuns(plan, 20261201);
  return plan;
}

const MEGABYTE_CELL = `"${'7'.repeat(1_100_000)}"`;

const hostileCell: fc.Arbitrary<HostileCell> = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom<HostileCell>(0, -1, 180, 182, 1e308, -1e308, 1e-320, 5e-324, 2 ** 53, 0.1 + 0.2, 12.345, -0, 1e15, 99999) },
  {
    weight: 3,
    arbitrary: fc.constantFrom<HostileCell>(
      null, '', ' ', 'NaN', 'Infinity', '-Infinity', '1e309', '81,5', '1 000', '1_000', '0x10', '+5', '.5', '5.', '1e5', '١٢', '25%', '#DIV/0!', '#N/A',
      '=1+1', '@SUM(A1)', '"', '""', '"quoted"', 'a\nb', 'a\r\nb', '\u0000', '\ufeff1', '\u202e5', 'not done', 'NOT DONE: blocked', 'not done'.repeat(200),
      'x'.repeat(20_000), '9'.repeat(400), 'TP-0000000000', 'f'.repeat(64), 'Run no.', 'run', 'Point', 'F01', 'C1', 'H1', 'A01', '<script>alert(1)</script>', '__proto__',
    ),
  },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: fc.string({ maxLength: 10 }) },
  {
    weight: 2,
    arbitrary: fc.constantFrom<HostileCell>(
      { date: '2026-12-02T10:00:00.000Z' },
      { formula: '1+1', result: 2 },
      { formula: 'A1', result: 'text' },
      { formula: '1/0', result: { error: '#DIV/0!' } },
      { richText: ['18', '2'] },
      { hyperlink: 'https://example.invalid', text: '81.5' },
      { error: '#VALUE!' },
    ),
  },
);

const sheetMutation: fc.Arbitrary<SheetMutation> = fc.record({
  op: fc.constantFrom<SheetMutation['op']>('cell', 'cell', 'cell', 'cell', 'deleteRow', 'duplicateRow', 'swapRows', 'blankRow', 'manyRows', 'deleteColumn', 'insertColumn', 'text', 'bytes'),
  row: fc.nat(),
  column: fc.nat(),
  anywhere: fc.integer({ min: 0, max: 4 }).map((draw) => draw === 0),
  value: hostileCell,
  count: fc.constantFrom(2, 50, 10_001),
  snippet: fc.constantFrom('"', '""', '"a', '\r\n', '\n\n', ',', ',,,,', '\u0000', '\ufeff', '\r', MEGABYTE_CELL, `"${'x'.repeat(70_000)}`, 'Run no.,', '\uFFFD'),
});

export const resultsSheetCaseArbitrary: fc.Arbitrary<ResultsSheetCase> = fc.record({
  format: fc.constantFrom<'csv' | 'xlsx'>('csv', 'xlsx'),
  // About one case in five keeps its sheet as filled, so that analyses are exercised too.
  mutations: fc.oneof({ weight: 1, arbitrary: fc.constant<SheetMutation[]>([]) }, { weight: 4, arbitrary: fc.array(sheetMutation, { minLength: 1, maxLength: 3 }) }),
});

/** What one mutation did, for the report of a failing case. */
export function describeMutation(mutation: SheetMutation): string {
  const value = JSON.stringify(mutation.op === 'text' ? mutation.snippet : mutation.value) ?? 'undefined';
  return `${mutation.op} row ${mutation.row} column ${mutation.column}${mutation.anywhere ? ' (anywhere)' : ''}: ${value.slice(0, 40)}${mutation.op === 'manyRows' ? ` ×${mutation.count}` : ''}`;
}

type Grid = HostileCell[][];

/** The filled sheet of `plan` with the case's mutations applied, as the bytes of the file. */
export async function writeResultsSheet(plan: PlanDocument, sheetCase: ResultsSheetCase): Promise<Uint8Array> {
  const columns = runSheetTable(plan, plan.schedule!).columns;
  if (sheetCase.format === 'csv') {
    const text = filledCsv(plan);
    const grid = (parse(text, { bom: true, relax_column_count: true, skip_empty_lines: false }) as string[][]).map((row) => row.map((cell) => (cell === '' ? null : cell)));
    const tableRow = locateRunTable(grid, columns)?.row ?? 0;
    const gridMutations = sheetCase.mutations.filter((m) => m.op !== 'text' && m.op !== 'bytes');
    for (const mutation of gridMutations) mutateGrid(grid, tableRow, mutation);
    let csv = gridMutations.length === 0 ? text : `\uFEFF${grid.map((row) => row.map(csvText).join(',')).join('\r\n')}\r\n`;
    for (const mutation of sheetCase.mutations.filter((m) => m.op === 'text')) {
      const at = mutation.row % (csv.length + 1);
      csv = mutation.anywhere ? csv.slice(0, at) : csv.slice(0, at) + mutation.snippet + csv.slice(at);
    }
    return new TextEncoder().encode(csv);
  }
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load((await filledWorkbook(plan)) as unknown as ArrayBuffer);
  const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
  const grid: Grid = [];
  for (let r = 1; r <= sheet.rowCount; r++) {
    const row: HostileCell[] = [];
    for (let c = 1; c <= sheet.columnCount; c++) {
      const cell = sheet.getCell(r, c);
      const value = cell.isMerged && cell.master !== cell ? null : cell.value;
      row.push(typeof value === 'string' || typeof value === 'number' ? value : null);
    }
    grid.push(row);
  }
  const tableRow = locateRunTable(grid as (string | number | null)[][], columns)?.row ?? 0;
  const gridMutations = sheetCase.mutations.filter((m) => m.op !== 'text' && m.op !== 'bytes');
  for (const mutation of gridMutations) {
    // Row and column edits go to the sheet itself, so merges and styles move as a spreadsheet moves them.
    applyToWorksheet(sheet, grid, tableRow, mutation);
  }
  let bytes = new Uint8Array(await workbook.xlsx.writeBuffer());
  for (const mutation of sheetCase.mutations.filter((m) => m.op === 'bytes')) {
    const at = mutation.row % bytes.length;
    if (mutation.anywhere) bytes = bytes.slice(0, at);
    else {
      bytes = Uint8Array.from(bytes);
      for (let i = 0; i < 16 && at + i < bytes.length; i++) bytes[at + i] ^= 0x5a;
    }
  }
  return bytes;
}

function pickRow(length: number, tableRow: number, mutation: SheetMutation): number {
  if (length === 0) return 0;
  if (mutation.anywhere) return mutation.row % length;
  const runRows = Math.max(1, length - tableRow);
  return Math.min(length - 1, tableRow + (mutation.row % runRows));
}

function mutateGrid(grid: Grid, tableRow: number, mutation: SheetMutation): void {
  const r = pickRow(grid.length, tableRow, mutation);
  const width = Math.max(1, ...grid.map((row) => row.length));
  const c = mutation.column % width;
  switch (mutation.op) {
    case 'cell':
      if (grid[r]) grid[r][c] = plainOf(mutation.value);
      return;
    case 'deleteRow':
      grid.splice(r, 1);
      return;
    case 'duplicateRow':
      if (grid[r]) grid.splice(r, 0, [...grid[r]]);
      return;
    case 'swapRows': {
      const other = Math.min(grid.length - 1, r + 1);
      [grid[r], grid[other]] = [grid[other], grid[r]];
      return;
    }
    case 'blankRow':
      grid.splice(r, 0, []);
      return;
    case 'manyRows':
      if (grid[r]) for (let i = 0; i < mutation.count; i++) grid.push([...grid[r]]);
      return;
    case 'deleteColumn':
      for (const row of grid) row.splice(c, 1);
      return;
    case 'insertColumn':
      for (const row of grid) row.splice(c, 0, plainOf(mutation.value));
      return;
    default:
      return;
  }
}

function applyToWorksheet(sheet: ExcelJS.Worksheet, grid: Grid, tableRow: number, mutation: SheetMutation): void {
  const r = pickRow(sheet.rowCount, tableRow, mutation) + 1;
  const c = (mutation.column % Math.max(1, sheet.columnCount)) + 1;
  switch (mutation.op) {
    case 'cell':
      sheet.getCell(r, c).value = workbookValue(mutation.value);
      return;
    case 'deleteRow':
      sheet.spliceRows(r, 1);
      return;
    case 'duplicateRow':
      sheet.duplicateRow(r, 1, true);
      return;
    case 'swapRows': {
      const here = sheet.getRow(r).values;
      const next = sheet.getRow(r + 1).values;
      sheet.getRow(r).values = next;
      sheet.getRow(r + 1).values = here;
      return;
    }
    case 'blankRow':
      sheet.insertRow(r, []);
      return;
    case 'manyRows': {
      const values = sheet.getRow(r).values;
      // exceljs writes a few thousand rows a second: the workbook gets fewer, the CSV passes the row window.
      sheet.addRows(Array.from({ length: Math.min(mutation.count, 1500) }, () => values));
      return;
    }
    case 'deleteColumn':
      sheet.spliceColumns(c, 1);
      return;
    case 'insertColumn':
      sheet.spliceColumns(c, 0, Array.from({ length: sheet.rowCount }, () => workbookValue(mutation.value)));
      return;
    default:
      void grid;
      return;
  }
}

/** The text a CSV cell shows for a value (workbook-only types as the text a spreadsheet would export). */
function plainOf(value: HostileCell): string | number | null {
  if (value === null || typeof value === 'string' || typeof value === 'number') return value;
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  if ('date' in value) return value.date.slice(0, 10);
  if ('formula' in value) return typeof value.result === 'object' ? value.result.error : value.result;
  if ('richText' in value) return value.richText.join('');
  if ('hyperlink' in value) return value.text;
  return value.error;
}

function workbookValue(value: HostileCell): ExcelJS.CellValue {
  if (value === null || typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') return value;
  if ('date' in value) return new Date(value.date);
  if ('formula' in value) return { formula: value.formula, result: value.result } as ExcelJS.CellFormulaValue;
  if ('richText' in value) return { richText: value.richText.map((text) => ({ text })) };
  if ('hyperlink' in value) return { hyperlink: value.hyperlink, text: value.text };
  return { error: value.error } as ExcelJS.CellErrorValue;
}

/** RFC 4180 quoting, as a spreadsheet program exports a cell. */
function csvText(value: HostileCell): string {
  const plain = plainOf(value);
  if (plain === null) return '';
  const text = String(plain);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
