/**
 * One CSV cell, written so that a spreadsheet opens it as data and never as a formula.
 *
 * Quoting follows RFC 4180 (Y. Shafranovich, 2005, "Common Format and MIME Type for
 * Comma-Separated Values (CSV) Files"): a field is wrapped in double quotes and inner quotes
 * are doubled. The formula-injection guard follows the OWASP "CSV Injection" page
 * (https://owasp.org/www-community/attacks/CSV_Injection): a text cell whose first character is
 * `=`, `+`, `-`, `@`, tab or carriage return gets a leading single quote and is quoted, so a
 * spreadsheet shows it as text.
 *
 * Conventions fixed here:
 * - Every text cell is quoted, whatever it holds; numbers are never quoted and never guarded,
 *   so −1.5 stays a number a spreadsheet can compute with.
 * - The guard also looks past leading spaces and treats a leading line feed like a carriage
 *   return (some spreadsheet programs trim before parsing); stricter than OWASP asks, harmless.
 * - A cell that is exactly `-` (how studies write a dimensionless unit) is left alone: a lone
 *   minus cannot form a formula, and `'-` would show its quote in every spreadsheet.
 * - Numbers are written with a fixed count of decimals when given, and `-0` is written `0`.
 */

export type CsvValue = string | number | null;

const FORMULA_TRIGGERS = new Set(['=', '+', '-', '@', '\t', '\r', '\n']);

/** Text as a spreadsheet will show it: a quote prefix when it could start a formula. */
export function neutraliseFormula(text: string): string {
  if (text.trim() === '-') return text;
  const first = text.replace(/^ +/, '').charAt(0);
  return FORMULA_TRIGGERS.has(first) ? `'${text}` : text;
}

/** A quoted, guarded text field. */
function csvText(text: string): string {
  return `"${neutraliseFormula(text).replace(/"/g, '""')}"`;
}

/** A plain number field; `decimals` fixes the digits after the point. */
function csvNumber(value: number, decimals?: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`cannot write ${value} as a CSV number`);
  let text = decimals === undefined ? String(value) : value.toFixed(decimals);
  if (/^-0(\.0*)?$/.test(text)) text = text.slice(1);
  // String() switches to exponent form below 1e-6 and above 1e21; a spreadsheet reads both.
  return text;
}

/** A cell of either kind; null is an empty field. */
export function csvCell(value: CsvValue, decimals?: number): string {
  if (value === null) return '';
  return typeof value === 'number' ? csvNumber(value, decimals) : csvText(value);
}
