/**
 * Plain-text tables for the terminal: aligned columns, units beside the header, numbers
 * right-aligned on their decimal point with a fixed count of significant digits.
 *
 * Conventions fixed here:
 * - A unit is shown beside its header in square brackets, `Inlet air temperature [°C]`,
 *   the way a lab notebook labels a column; a unit of `-` (dimensionless) is omitted.
 * - Widths are measured in terminal cells, not UTF-16 code units: combining marks and
 *   ANSI colour sequences take no cell, East Asian wide characters take two, so `°C`, `µm`,
 *   `m³/h` and coloured cells line up.
 * - `null` is an absent value and prints as an en dash `–`.
 * - Numbers keep `digits` significant digits (default 3; `significantText` of numberText.ts);
 *   integers print in full.
 * - Columns are separated by two spaces; trailing spaces are trimmed from every line.
 */
import { significantText } from './numberText.js';

export interface TextColumn {
  header: string;
  unit?: string;
  /** Default: right when every non-null cell of the column is a number, else left. */
  align?: 'left' | 'right';
}

export type TextCell = string | number | null;

const ABSENT = '–';
const COLUMN_GAP = '  ';
const DEFAULT_DIGITS = 3;

/** Terminal cells a string occupies. */
export function displayWidth(text: string): number {
  // eslint-disable-next-line no-control-regex
  const visible = text.replace(/\u001b\[[0-9;]*m/g, '');
  let width = 0;
  for (const char of visible) {
    const code = char.codePointAt(0) ?? 0;
    if (/\p{Mn}|\p{Me}|\p{Cf}/u.test(char)) continue;
    width += isWide(code) ? 2 : 1;
  }
  return width;
}

// East Asian wide and fullwidth blocks (Unicode UAX #11, main ranges) and emoji.
function isWide(code: number): boolean {
  return (
    (code >= 0x1100 && code <= 0x115f) ||
    (code >= 0x2e80 && code <= 0xa4cf && code !== 0x303f) ||
    (code >= 0xac00 && code <= 0xd7a3) ||
    (code >= 0xf900 && code <= 0xfaff) ||
    (code >= 0xfe30 && code <= 0xfe4f) ||
    (code >= 0xff00 && code <= 0xff60) ||
    (code >= 0xffe0 && code <= 0xffe6) ||
    (code >= 0x1f300 && code <= 0x1faff) ||
    (code >= 0x20000 && code <= 0x3fffd)
  );
}

function padEnd(text: string, width: number): string {
  return text + ' '.repeat(Math.max(0, width - displayWidth(text)));
}

function padStart(text: string, width: number): string {
  return ' '.repeat(Math.max(0, width - displayWidth(text))) + text;
}

/** `Name [unit]`, or the name alone for no unit or `-` (dimensionless). */
export function withUnit(name: string, unit: string | undefined): string {
  const trimmed = (unit ?? '').trim();
  return trimmed === '' || trimmed === '-' ? name : `${name} [${trimmed}]`;
}

/**
 * Numbers of one column, padded so their decimal points line up: the part after the
 * point is padded on the right to the longest such part in the column.
 */
function alignDecimals(texts: (string | undefined)[]): (string | undefined)[] {
  let longestFraction = 0;
  for (const text of texts) {
    if (text === undefined) continue;
    const point = text.indexOf('.');
    if (point >= 0) longestFraction = Math.max(longestFraction, text.length - point);
  }
  if (longestFraction === 0) return texts;
  return texts.map((text) => {
    if (text === undefined) return text;
    const point = text.indexOf('.');
    const fraction = point >= 0 ? text.length - point : 0;
    return text + ' '.repeat(longestFraction - fraction);
  });
}

/**
 * Renders `rows` under `columns` as an aligned plain-text table, with an optional title
 * line above and a rule of dashes under the headers. Rows shorter than `columns` are
 * padded with absent cells.
 */
export function renderTable(
  columns: TextColumn[],
  rows: TextCell[][],
  options: { title?: string; digits?: number } = {},
): string {
  const digits = options.digits ?? DEFAULT_DIGITS;
  const headers = columns.map((column) => withUnit(column.header, column.unit));
  const cells: string[][] = rows.map(() => new Array<string>(columns.length).fill(''));
  const aligns: ('left' | 'right')[] = [];

  columns.forEach((column, c) => {
    const raw = rows.map((row) => (c < row.length ? row[c] : null));
    const numericOnly = raw.every((cell) => cell === null || typeof cell === 'number');
    aligns.push(column.align ?? (numericOnly ? 'right' : 'left'));
    const numberTexts = alignDecimals(
      raw.map((cell) => (typeof cell === 'number' ? significantText(cell, digits) : undefined)),
    );
    raw.forEach((cell, r) => {
      cells[r][c] = cell === null ? ABSENT : typeof cell === 'number' ? (numberTexts[r] as string) : cell;
    });
  });

  const widths = columns.map((_, c) =>
    Math.max(displayWidth(headers[c]), ...cells.map((row) => displayWidth(row[c]))),
  );
  const line = (texts: string[]): string =>
    texts
      .map((text, c) => (aligns[c] === 'right' ? padStart(text, widths[c]) : padEnd(text, widths[c])))
      .join(COLUMN_GAP)
      .replace(/\s+$/, '');

  const out: string[] = [];
  if (options.title) out.push(options.title);
  out.push(line(headers));
  out.push(widths.map((width) => '-'.repeat(width)).join(COLUMN_GAP));
  for (const row of cells) out.push(line(row));
  return `${out.join('\n')}\n`;
}
