/**
 * Reads a small table — CSV, XLSX or JSON, chosen by file extension — into a header and
 * rows of raw cells, remembering where each row sits so that messages can point at it.
 *
 * CSV quoting follows RFC 4180 (Shafranovich, 2005, "Common Format and MIME Type for
 * Comma-Separated Values (CSV) Files"), parsed by csv-parse; XLSX is read with exceljs.
 *
 * Conventions fixed here:
 * - Rows are numbered as a spreadsheet shows them: the first line of the file is row 1,
 *   and comment lines (first non-blank character `#`) and blank lines still count, so
 *   "row 7" is line 7 in a text editor and row 7 in a spreadsheet program.
 * - CSV text is UTF-8; a UTF-8 byte-order mark is dropped; UTF-16 is refused with advice.
 * - CSV separators are detected from the header line: commas with `.` decimals, or
 *   semicolons, where decimal commas (`0,245`) are accepted and turned into `0.245`. That
 *   pair is what spreadsheet programs write under locales whose decimal mark is a comma
 *   (common practice). A header with both or neither separator, or a semicolon file
 *   mixing decimal marks, is refused rather than guessed.
 * - XLSX: the worksheet with a preferred name (e.g. `indices`), else the first one. Cells
 *   may hold numbers or numeric text; formula cells give their cached result.
 * - JSON: an array of row objects, or `{ "rows": [...] }`. A JSON row has no line number,
 *   so its location is the key path `[3].total` (or `rows[3].total`).
 * Cells are returned raw (string, number or null); the caller decides what they mean.
 */
import { readFile, stat } from 'node:fs/promises';
import { extname } from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import type ExcelJS from 'exceljs';
import { excerpt, InputError, type InputLocation } from '../core/inputError.js';
import { aboveLimit, checkLimit, limitOf } from '../core/inputLimits.js';
import { parseJsonText } from './documentText.js';
import { zipContentSize } from './zipContentSize.js';

export type CellValue = string | number | null;

export interface TableRow {
  /** Spreadsheet row (`{row}`) or JSON entry (`{key}`), without the column. */
  at: InputLocation;
  /** One cell per header column; missing trailing cells are null. */
  cells: CellValue[];
}

export interface TableRows {
  /** The file as it should appear in messages. */
  file: string;
  format: 'csv' | 'xlsx' | 'json';
  /** Header cells as written (trimmed). */
  header: string[];
  headerAt: InputLocation;
  rows: TableRow[];
  /** True when a semicolon-separated CSV with decimal commas was read. */
  decimalComma: boolean;
}

const TABLE_EXTENSIONS = ['.csv', '.xlsx', '.json'] as const;

/** Where a cell is, in the terms the user's file uses. */
export function cellLocation(table: TableRows, row: TableRow, column: number): InputLocation {
  const name = table.header[column] ?? `column ${column + 1}`;
  if (table.format === 'json') return { file: table.file, key: `${row.at.key}.${name}` };
  return { file: table.file, row: row.at.row, column: name };
}

/** Where a whole row is (for messages about the row, not one cell). */
export function rowLocation(table: TableRows, row: TableRow): InputLocation {
  return { file: table.file, ...row.at };
}

/**
 * Reads `path` (on disk) and reports problems against `file` (as shown to the user).
 * `sheetNames` are worksheet names preferred in a workbook, compared case-insensitively.
 */
export async function readTableRows(path: string, file: string, sheetNames: readonly string[] = []): Promise<TableRows> {
  const extension = extname(path).toLowerCase();
  if (!(TABLE_EXTENSIONS as readonly string[]).includes(extension)) {
    const hint = extension === '.xls' ? '; save the workbook as .xlsx' : extension === '.tsv' || extension === '.txt' ? '; export it as comma-separated .csv' : '';
    throw new InputError(`unsupported table type "${extension || '(no extension)'}"; use .csv, .xlsx or .json${hint}`, { file });
  }
  const size = await checkReadableFile(path, file);
  // A workbook is unpacked whole in memory, so it gets a smaller limit than text.
  const sizeLimit = extension === '.xlsx' ? 'workbookFileBytes' : 'tableFileBytes';
  if (size > limitOf(sizeLimit)) throw new InputError(`is ${megabytes(size)}, ${aboveLimit(sizeLimit)}`, { file });
  // stat succeeds on a file the user may not read (permissions), so reading needs its own message.
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (error) {
    throw new InputError(fileSystemProblem(error), { file });
  }
  const table =
    extension === '.xlsx' ? await readWorkbook(bytes, file, sheetNames) : extension === '.json' ? readJsonRows(bytes, file) : readCsvRows(bytes, file);
  checkLimit('tableRows', table.rows.length, { file }, 'data rows');
  return table;
}

/** "3.2 MB" (decimal megabytes, as file managers show sizes). */
export function megabytes(bytes: number): string {
  return `${(bytes / 1e6).toFixed(1)} MB`;
}

/** One-line errors for a missing, empty, folder or unreadable file; returns its size in bytes. */
export async function checkReadableFile(path: string, file: string): Promise<number> {
  let info;
  try {
    info = await stat(path);
  } catch (error) {
    throw new InputError(fileSystemProblem(error), { file });
  }
  if (info.isDirectory()) throw new InputError('is a folder, not a file', { file });
  if (info.size === 0) throw new InputError('is empty', { file });
  return info.size;
}

export function fileSystemProblem(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (code === 'ENOENT') return 'file not found';
  if (code === 'EACCES' || code === 'EPERM') return 'cannot be read (permission denied)';
  if (code === 'EISDIR') return 'is a folder, not a file';
  return `cannot be read (${code ?? String(error)})`;
}

// ---------------------------------------------------------------------------------- text

/** Decodes UTF-8 text, dropping a byte-order mark and refusing UTF-16 and workbooks in disguise. */
function decodeUtf8Text(bytes: Uint8Array, file: string): string {
  if (bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04) {
    throw new InputError('is a zipped workbook, not text; give it the .xlsx extension or export it as CSV', { file });
  }
  const utf16Bom = (bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff);
  const nulByte = bytes.subarray(0, 512).includes(0);
  if (utf16Bom || nulByte) {
    throw new InputError(
      'is UTF-16 encoded (a "Unicode text" export); tierplan reads UTF-8 only — save it again as "CSV UTF-8" or plain comma-separated CSV',
      { file },
    );
  }
  const start = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  const text = new TextDecoder('utf-8').decode(bytes.subarray(start));
  const badLine = undecodableLine(text);
  if (badLine !== undefined) {
    throw new InputError(
      `is not UTF-8 text (line ${badLine} has bytes UTF-8 cannot read, probably a legacy encoding such as Windows-1252); save it again as "CSV UTF-8"`,
      { file },
    );
  }
  return text;
}

/**
 * The first line holding U+FFFD, which the UTF-8 decoder puts where bytes are not UTF-8 —
 * e.g. "°C" saved as Windows-1252. Without this check such text is silently altered.
 */
export function undecodableLine(text: string): number | undefined {
  const at = text.indexOf('\uFFFD');
  if (at < 0) return undefined;
  let line = 1;
  for (let i = 0; i < at; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

function isCommentLine(line: string): boolean {
  return line.trimStart().startsWith('#');
}

// ----------------------------------------------------------------------------------- CSV

const DECIMAL_COMMA_NUMBER = /^[+-]?\d*,\d+(?:[eE][+-]?\d+)?$/;
const DECIMAL_POINT_NUMBER = /^[+-]?\d*\.\d+(?:[eE][+-]?\d+)?$/;

function readCsvRows(bytes: Uint8Array, file: string): TableRows {
  const text = decodeUtf8Text(bytes, file);
  // Blank out comment lines instead of removing them so that csv-parse's line count stays
  // equal to the row a spreadsheet would show.
  const lines = text.split(/\r\n|\n|\r/);
  const kept = lines.map((line) => (isCommentLine(line) ? '' : line));
  const headerIndex = kept.findIndex((line) => line.trim() !== '');
  if (headerIndex < 0) throw new InputError('has no header row (only blank or comment lines)', { file });
  const headerLine = kept[headerIndex];
  const commas = countOutsideQuotes(headerLine, ',');
  const semicolons = countOutsideQuotes(headerLine, ';');
  const headerRow = headerIndex + 1;
  if (commas > 0 && semicolons > 0) {
    throw new InputError(
      `the header mixes commas and semicolons, so the column separator is ambiguous; export the table as comma-separated CSV with "." decimals`,
      { file, row: headerRow },
    );
  }
  if (commas === 0 && semicolons === 0) {
    const tab = headerLine.includes('\t') ? ' (it looks tab-separated)' : '';
    throw new InputError(
      `the header has a single column${tab}; expected comma-separated columns such as factor,response,first,total`,
      { file, row: headerRow },
    );
  }
  const delimiter = semicolons > 0 ? ';' : ',';

  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parseCsv(kept.join('\n'), {
      delimiter,
      info: true,
      skip_empty_lines: true,
      relax_column_count: true,
      trim: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (error) {
    const line = (error as { lines?: number }).lines;
    const reason = (error as Error).message.replace(/\s+/g, ' ');
    throw new InputError(`is not valid CSV: ${reason}`, line !== undefined ? { file, row: line } : { file });
  }
  const [headerRecord, ...dataRecords] = records;
  const header = headerRecord.record.map((cell) => cell.trim());
  checkLimit('tableColumns', header.length, { file, row: headerRecord.info.lines }, 'header columns');
  const rows: TableRow[] = [];
  let firstComma: { row: number; column: string; text: string } | undefined;
  let firstPoint: { row: number; column: string; text: string } | undefined;
  for (const { record, info } of dataRecords) {
    const row = info.lines;
    if (record.every((cell) => cell.trim() === '')) continue;
    if (record.length > header.length) {
      const advice =
        delimiter === ','
          ? '; if the numbers use decimal commas, separate the columns with semicolons (or export with "." decimals)'
          : '';
      throw new InputError(`has ${record.length} cells but the header has ${header.length} columns${advice}`, { file, row });
    }
    const cells: CellValue[] = header.map((_, c) => {
      const cell = record[c];
      return cell === undefined || cell === '' ? null : cell;
    });
    if (delimiter === ';') {
      for (let c = 0; c < cells.length; c++) {
        const cell = cells[c];
        if (cell === null || typeof cell !== 'string') continue;
        if (DECIMAL_COMMA_NUMBER.test(cell)) {
          firstComma ??= { row, column: header[c], text: cell };
          cells[c] = cell.replace(',', '.');
        } else if (DECIMAL_POINT_NUMBER.test(cell)) {
          firstPoint ??= { row, column: header[c], text: cell };
        }
      }
      if (firstComma && firstPoint) {
        const later = firstComma.row >= firstPoint.row ? firstComma : firstPoint;
        throw new InputError(
          `mixed decimal marks: "${excerpt(firstComma.text)}" (row ${firstComma.row}) uses a decimal comma but "${excerpt(firstPoint.text)}" (row ${firstPoint.row}) a decimal point; export the whole table with one convention — commas between columns and "." decimals is safest`,
          { file, row: later.row, column: later.column },
        );
      }
    } else if (record.some((cell) => cell.includes(';'))) {
      throw new InputError(
        'contains semicolons but the header is comma-separated; export the whole table with one separator',
        { file, row },
      );
    }
    rows.push({ at: { row }, cells });
  }
  return { file, format: 'csv', header, headerAt: { row: headerRecord.info.lines }, rows, decimalComma: firstComma !== undefined };
}

/** Separator count on one line, ignoring text inside double quotes. */
function countOutsideQuotes(line: string, separator: string): number {
  let count = 0;
  let quoted = false;
  for (const character of line) {
    if (character === '"') quoted = !quoted;
    else if (!quoted && character === separator) count++;
  }
  return count;
}

// ---------------------------------------------------------------------------------- XLSX

async function readWorkbook(bytes: Uint8Array, file: string, sheetNames: readonly string[]): Promise<TableRows> {
  const unpacked = zipContentSize(bytes);
  if (unpacked !== null && unpacked > limitOf('workbookContentBytes')) {
    const shown = Number.isFinite(unpacked) ? megabytes(unpacked) : 'more than 4 GB';
    throw new InputError(`unpacks to ${shown}, ${aboveLimit('workbookContentBytes')}; export the table as CSV`, { file });
  }
  // exceljs takes a noticeable part of a second to load; only workbook users pay for it.
  const { default: excel } = await import('exceljs');
  const workbook = new excel.Workbook();
  try {
    await workbook.xlsx.load(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength) as unknown as ExcelJS.Buffer);
  } catch (error) {
    throw new InputError(`cannot be read as an .xlsx workbook (${(error as Error).message.split('\n')[0]})`, { file });
  }
  const wanted = sheetNames.map((name) => name.toLowerCase());
  const sheet =
    workbook.worksheets.find((candidate) => wanted.includes(candidate.name.trim().toLowerCase())) ?? workbook.worksheets[0];
  if (sheet === undefined) throw new InputError('has no worksheets', { file });

  let header: string[] | undefined;
  let headerAt: InputLocation = {};
  const rows: TableRow[] = [];
  // Header and comment rows come on top of the data rows; the exact count is checked after reading.
  checkLimit('tableRows', sheet.actualRowCount - 1, { file }, 'rows');
  checkLimit('tableColumns', sheet.actualColumnCount, { file }, 'columns');
  sheet.eachRow({ includeEmpty: false }, (sheetRow, rowNumber) => {
    const values: CellValue[] = [];
    const width = Math.max(sheetRow.cellCount, header?.length ?? 0);
    for (let c = 1; c <= width; c++) values.push(workbookCell(sheetRow.getCell(c).value));
    const firstFilled = values.find((value) => value !== null);
    if (firstFilled === undefined) return;
    if (typeof firstFilled === 'string' && firstFilled.trimStart().startsWith('#')) return;
    if (header === undefined) {
      let last = values.length;
      while (last > 0 && values[last - 1] === null) last--;
      header = values.slice(0, last).map((value) => (value === null ? '' : String(value).trim()));
      headerAt = { row: rowNumber };
      return;
    }
    const cells = header.map((_, c) => values[c] ?? null);
    if (values.slice(header.length).some((value) => value !== null)) {
      throw new InputError(`has cells beyond the last header column (${header.length} columns)`, { file, row: rowNumber });
    }
    rows.push({ at: { row: rowNumber }, cells });
  });
  if (header === undefined) throw new InputError(`worksheet "${excerpt(sheet.name)}" is empty`, { file });
  return { file, format: 'xlsx', header, headerAt, rows, decimalComma: false };
}

/** A workbook cell as raw text or number; formulas give their cached result. */
function workbookCell(value: ExcelJS.CellValue | undefined): CellValue {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return value;
  if (typeof value === 'string') return value.trim() === '' ? null : value.trim();
  if (typeof value === 'boolean') return String(value);
  if (value instanceof Date) return value.toISOString();
  if (typeof value === 'object') {
    if ('result' in value) return workbookCell(value.result as ExcelJS.CellValue);
    if ('richText' in value) return workbookCell(value.richText.map((run) => run.text).join(''));
    if ('error' in value) return String(value.error);
    if ('text' in value) return workbookCell(String(value.text));
  }
  return String(value);
}

// ---------------------------------------------------------------------------------- JSON

function readJsonRows(bytes: Uint8Array, file: string): TableRows {
  const text = decodeUtf8Text(bytes, file);
  if (text.trim() === '') throw new InputError('is empty', { file });
  const data = parseJsonText(text, file);
  let entries: unknown;
  let prefix = '';
  if (Array.isArray(data)) entries = data;
  else if (data !== null && typeof data === 'object' && Array.isArray((data as { rows?: unknown }).rows)) {
    entries = (data as { rows: unknown[] }).rows;
    prefix = 'rows';
  } else {
    throw new InputError('must hold an array of row objects, or an object with a "rows" array', { file });
  }
  const list = entries as unknown[];
  checkLimit('tableRows', list.length, { file }, 'data rows');
  const header: string[] = [];
  const known = new Set<string>();
  for (let i = 0; i < list.length; i++) {
    const entry = list[i];
    if (entry === null || typeof entry !== 'object' || Array.isArray(entry)) {
      throw new InputError('must be an object with one key per column', { file, key: `${prefix}[${i}]` });
    }
    for (const key of Object.keys(entry)) {
      if (known.has(key)) continue;
      known.add(key);
      header.push(key);
      checkLimit('tableColumns', header.length, { file, key: `${prefix}[${i}].${excerpt(key)}` }, 'columns');
    }
  }
  const rows: TableRow[] = list.map((entry, i) => ({
    at: { key: `${prefix}[${i}]` },
    cells: header.map((key) => jsonCell((entry as Record<string, unknown>)[key])),
  }));
  return { file, format: 'json', header, headerAt: {}, rows, decimalComma: false };
}

function jsonCell(value: unknown): CellValue {
  if (value === undefined || value === null) return null;
  if (typeof value === 'number') return value;
  if (typeof value === 'string') return value.trim() === '' ? null : value.trim();
  return JSON.stringify(value);
}
