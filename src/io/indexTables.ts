/**
 * Reads and checks the Sobol' index tables named by a study file.
 *
 * First-order and total indices (Sobol', 1993/2001; Homma & Saltelli, 1996, "Importance
 * measures in global sensitivity analysis of nonlinear models") come in long format, one
 * row per (factor, response): `factor, response, first, total` plus optional confidence
 * bounds `first_low, first_high, total_low, total_high`. Second-order indices come one row
 * per (factor pair, response): `factor_a, factor_b, response, index`.
 *
 * Conventions and tolerances fixed here:
 * - Headers are compared trimmed, case-insensitively, with spaces and hyphens read as `_`;
 *   the accepted aliases are INDEX_COLUMN_ALIASES and INTERACTION_COLUMN_ALIASES.
 * - Indices are variance fractions in [0, 1]. Monte-Carlo estimators overshoot a little, so
 *   a value within INDEX_RANGE_TOLERANCE outside [0, 1] is clipped with a warning; beyond
 *   that it is an error (probably percentages or a wrong column).
 * - First-order above total by more than FIRST_ABOVE_TOTAL_TOLERANCE is only a warning:
 *   S_i ≤ S_Ti holds exactly, but estimator noise on near-additive models breaks it slightly.
 * - A confidence bound on the wrong side of its estimate (by more than the same tolerance)
 *   is an error: the columns are probably swapped or misread. Bounds outside [0, 1] are
 *   clipped to it (normal for intervals around small indices) with one summary warning.
 * - A second-order index above either factor's total index (S_ij ≤ S_Ti, Saltelli et al.,
 *   2008, "Global Sensitivity Analysis: The Primer", ch. 4) beyond the tolerance is a warning.
 * Row numbers in messages are spreadsheet rows (see tableRows.ts).
 */
import type { IndexRow, InteractionRow } from '../core/study.js';
import { excerpt, InputError, type InputLocation } from '../core/inputError.js';
import { cellLocation, readTableRows, rowLocation, type CellValue, type TableRow, type TableRows } from './tableRows.js';
import { didYouMean, suggestKey } from '../core/suggestKey.js';
import { checkLimit } from '../core/inputLimits.js';

export type IndexColumn = 'factor' | 'response' | 'first' | 'total' | 'first_low' | 'first_high' | 'total_low' | 'total_high';
export type InteractionColumn = 'factor_a' | 'factor_b' | 'response' | 'index';

/** Accepted header spellings (after trimming, lower-casing, spaces/hyphens → `_`). */
export const INDEX_COLUMN_ALIASES: Readonly<Record<IndexColumn, readonly string[]>> = {
  factor: ['factor', 'parameter'],
  response: ['response', 'output'],
  first: ['first', 's1', 'si', 'first_order'],
  total: ['total', 'st', 'sti', 'total_order'],
  first_low: ['first_low', 's1_low'],
  first_high: ['first_high', 's1_high'],
  total_low: ['total_low', 'st_low'],
  total_high: ['total_high', 'st_high'],
};

const INTERACTION_COLUMN_ALIASES: Readonly<Record<InteractionColumn, readonly string[]>> = {
  factor_a: ['factor_a', 'parameter_a'],
  factor_b: ['factor_b', 'parameter_b'],
  response: ['response', 'output'],
  index: ['index', 's2', 'second_order'],
};

/** How far outside [0, 1] an index may stray (estimator noise) before it is an error. */
const INDEX_RANGE_TOLERANCE = 0.05;
/** How far first-order may exceed total, or an estimate cross its bound, before we speak up. */
const INDEX_ORDER_TOLERANCE = 0.02;
/** Sum of first-order indices of one response above 1 + this is reported (Σ S_i ≤ 1). */
const FIRST_ORDER_SUM_TOLERANCE = 0.05;

export interface StudyIds {
  factorIds: readonly string[];
  responseIds: readonly string[];
}

export interface IndexTable {
  rows: IndexRow[];
  warnings: string[];
}

export interface InteractionTable {
  rows: InteractionRow[];
  warnings: string[];
}

/** Reads the first-order / total table at `path`; messages name `file`. */
export async function readIndexTable(path: string, file: string, ids: StudyIds): Promise<IndexTable> {
  const table = await readTableRows(path, file, ['indices']);
  // A JSON table's columns come from its rows, so an empty one has no header to check.
  if (table.format === 'json') requireDataRows(table, '');
  const columns = mapColumns(table, INDEX_COLUMN_ALIASES, ['factor', 'response', 'first', 'total']);
  requireBoundPairs(table, columns);
  requireDataRows(table, '');
  const warnings: string[] = [];
  const clipped: { count: number; first?: InputLocation } = { count: 0 };
  const seen = new Map<string, TableRow>();
  const rows: IndexRow[] = [];

  for (const row of table.rows) {
    const factor = readId(table, row, columns.factor, ids.factorIds, 'factor', 'factors');
    const response = readId(table, row, columns.response, ids.responseIds, 'response', 'responses');
    const key = `${factor}\u0000${response}`;
    const earlier = seen.get(key);
    if (earlier) {
      throw new InputError(
        `duplicate row for factor ${factor} × response ${response}; ${describeRow(table, earlier)} already gives it`,
        rowLocation(table, row),
      );
    }
    seen.set(key, row);

    const first = readEstimate(table, row, columns.first, warnings);
    const total = readEstimate(table, row, columns.total, warnings);
    const indexRow: IndexRow = { factor, response, first: first.value, total: total.value };
    const bounds: [keyof IndexRow, number | undefined, typeof first, 'low' | 'high'][] = [
      ['firstLow', columns.first_low, first, 'low'],
      ['firstHigh', columns.first_high, first, 'high'],
      ['totalLow', columns.total_low, total, 'low'],
      ['totalHigh', columns.total_high, total, 'high'],
    ];
    for (const [field, column, estimate, side] of bounds) {
      if (column === undefined || row.cells[column] === null) continue;
      const bound = readNumber(table, row, column);
      const wrongSide = side === 'low' ? bound > estimate.raw + INDEX_ORDER_TOLERANCE : bound < estimate.raw - INDEX_ORDER_TOLERANCE;
      if (wrongSide) {
        throw new InputError(
          `${side} bound ${bound} is ${side === 'low' ? 'above' : 'below'} its estimate ${estimate.raw} (tolerance ${INDEX_ORDER_TOLERANCE}); are the bound columns swapped?`,
          cellLocation(table, row, column),
        );
      }
      const inside = Math.min(1, Math.max(0, bound));
      if (inside !== bound) {
        clipped.count++;
        clipped.first ??= cellLocation(table, row, column);
      }
      (indexRow as unknown as Record<string, number>)[field] = inside;
    }
    checkInterval(table, row, indexRow, 'first', columns.first_low, columns.first_high);
    checkInterval(table, row, indexRow, 'total', columns.total_low, columns.total_high);
    if (indexRow.first > indexRow.total + INDEX_ORDER_TOLERANCE) {
      warnings.push(
        new InputError(
          `first-order index ${indexRow.first} exceeds total index ${indexRow.total} by more than ${INDEX_ORDER_TOLERANCE} (S1 ≤ ST in theory; check the estimates or the sample size)`,
          rowLocation(table, row),
        ).describe(),
      );
    }
    rows.push(indexRow);
  }

  requireEveryPair(file, ids, seen);
  if (clipped.count > 0 && clipped.first) {
    warnings.push(
      new InputError(
        `${clipped.count} confidence bound${clipped.count === 1 ? ' lies' : 's lie'} outside [0, 1] and ${clipped.count === 1 ? 'was' : 'were'} clipped to it (first here)`,
        clipped.first,
      ).describe(),
    );
  }
  for (const response of ids.responseIds) {
    const sum = rows.filter((row) => row.response === response).reduce((total, row) => total + row.first, 0);
    if (sum > 1 + FIRST_ORDER_SUM_TOLERANCE) {
      warnings.push(
        `${file}: first-order indices of response ${response} add up to ${round(sum)}, more than 1 (they are shares of one variance; check the estimates)`,
      );
    }
  }
  return { rows, warnings };
}

/**
 * The factor and response ids an index table names, in the order they first appear, for a
 * study written from the table (`tierplan init`). The whole table is then read as a study
 * would read it, so a table the study could not use is refused now, not after the skeleton
 * has been filled in; `idProblem` says why an id cannot be a study id.
 */
export async function indexTableIds(
  path: string,
  file: string,
  idProblem: (id: string) => string | undefined,
): Promise<StudyIds & { warnings: string[] }> {
  const table = await readTableRows(path, file, ['indices']);
  if (table.format === 'json') requireDataRows(table, '');
  const columns = mapColumns(table, INDEX_COLUMN_ALIASES, ['factor', 'response', 'first', 'total']);
  requireDataRows(table, '');
  const factorIds: string[] = [];
  const responseIds: string[] = [];
  for (const row of table.rows) {
    for (const [column, kind, ids] of [
      [columns.factor, 'factor', factorIds],
      [columns.response, 'response', responseIds],
    ] as const) {
      const cell = row.cells[column];
      if (cell === null) throw new InputError(`is empty; a ${kind} id is required`, cellLocation(table, row, column));
      const id = String(cell).trim();
      if (ids.includes(id)) continue;
      const problem = idProblem(id);
      if (problem !== undefined) throw new InputError(`${problem}; rename it in the table`, cellLocation(table, row, column));
      ids.push(id);
    }
  }
  // The study written from these ids must be readable: the same limits as the study's lists.
  checkLimit('factors', factorIds.length, { file }, 'factors');
  checkLimit('responses', responseIds.length, { file }, 'responses');
  const { warnings } = await readIndexTable(path, file, { factorIds, responseIds });
  return { factorIds, responseIds, warnings };
}

/** Reads the second-order table at `path`; `indices` (already read) bounds each pair. */
export async function readInteractionTable(
  path: string,
  file: string,
  ids: StudyIds,
  indices: readonly IndexRow[],
): Promise<InteractionTable> {
  const table = await readTableRows(path, file, ['interactions']);
  // A JSON table's columns come from its rows, so an empty one has no header to check.
  if (table.format === 'json') requireDataRows(table, '; remove the `interactions` key from the study file if there are none');
  const columns = mapColumns(table, INTERACTION_COLUMN_ALIASES, ['factor_a', 'factor_b', 'response', 'index']);
  requireDataRows(table, '; remove the `interactions` key from the study file if there are none');
  const warnings: string[] = [];
  const seen = new Map<string, TableRow>();
  const rows: InteractionRow[] = [];
  const totals = new Map(indices.map((row) => [`${row.factor}\u0000${row.response}`, row.total]));

  for (const row of table.rows) {
    const factorA = readId(table, row, columns.factor_a, ids.factorIds, 'factor', 'factors');
    const factorB = readId(table, row, columns.factor_b, ids.factorIds, 'factor', 'factors');
    const response = readId(table, row, columns.response, ids.responseIds, 'response', 'responses');
    if (factorA === factorB) {
      throw new InputError(
        `factor_a and factor_b are both ${factorA}; a second-order index needs two different factors`,
        cellLocation(table, row, columns.factor_b),
      );
    }
    const [one, two] = [factorA, factorB].sort();
    const key = `${one}\u0000${two}\u0000${response}`;
    const earlier = seen.get(key);
    if (earlier) {
      throw new InputError(
        `duplicate pair ${factorA} × ${factorB} for response ${response} (order does not matter); ${describeRow(table, earlier)} already gives it`,
        rowLocation(table, row),
      );
    }
    seen.set(key, row);
    const index = readEstimate(table, row, columns.index, warnings).value;
    const limit = Math.min(totals.get(`${factorA}\u0000${response}`) ?? 1, totals.get(`${factorB}\u0000${response}`) ?? 1);
    if (index > limit + INDEX_ORDER_TOLERANCE) {
      warnings.push(
        new InputError(
          `second-order index ${index} exceeds the smaller total index of ${factorA} and ${factorB} for ${response} (${limit}) by more than ${INDEX_ORDER_TOLERANCE}; S_ij ≤ S_Ti in theory`,
          rowLocation(table, row),
        ).describe(),
      );
    }
    rows.push({ factorA, factorB, response, index });
  }
  return { rows, warnings };
}

// ------------------------------------------------------------------------------- columns

function normaliseHeader(text: string): string {
  return text.trim().toLowerCase().replace(/[\s-]+/g, '_');
}

/** Header position of each canonical column; unknown, repeated and missing columns are errors. */
function mapColumns<C extends string, R extends C>(
  table: TableRows,
  aliases: Readonly<Record<C, readonly string[]>>,
  required: readonly R[],
): Partial<Record<C, number>> & Record<R, number> {
  const byAlias = new Map<string, C>();
  for (const [canonical, names] of Object.entries(aliases) as [C, readonly string[]][]) {
    for (const name of names) byAlias.set(name, canonical);
  }
  // A JSON table has no header row: point at the first entry that carries the key.
  const headerLocation = (column: number): InputLocation => {
    if (table.format !== 'json') return { file: table.file, ...table.headerAt, column: table.header[column] || `#${column + 1}` };
    const entry = table.rows.find((row) => row.cells[column] !== null) ?? table.rows[0];
    return entry ? cellLocation(table, entry, column) : { file: table.file, column: table.header[column] };
  };
  const found: Partial<Record<C, number>> = {};
  table.header.forEach((text, column) => {
    if (text === '') {
      if (table.rows.every((row) => row.cells[column] === null)) return;
      throw new InputError(`column ${column + 1} has values but no name in the header`, headerLocation(column));
    }
    const canonical = byAlias.get(normaliseHeader(text));
    if (canonical === undefined) {
      const normalised = normaliseHeader(text);
      const halfWidth = /_conf$/.test(normalised)
        ? '; a "_conf" column is usually a confidence half-width — give the bounds instead (estimate − half-width and estimate + half-width) as *_low and *_high'
        : didYouMean(normalised, [...byAlias.keys()]);
      throw new InputError(`unknown column "${excerpt(text)}"${halfWidth}`, headerLocation(column));
    }
    const earlier = found[canonical];
    if (earlier !== undefined) {
      throw new InputError(
        `column "${excerpt(text)}" repeats column "${excerpt(table.header[earlier])}" (both mean ${canonical})`,
        headerLocation(column),
      );
    }
    found[canonical] = column;
  });
  for (const column of required) {
    if (found[column] === undefined) {
      const others = aliases[column].filter((name) => name !== column);
      throw new InputError(
        `missing column ${column}${others.length ? ` (also accepted: ${others.join(', ')})` : ''}`,
        table.format === 'json' ? { file: table.file } : { file: table.file, ...table.headerAt },
      );
    }
  }
  return found as Partial<Record<C, number>> & Record<R, number>;
}

// --------------------------------------------------------------------------------- cells

const knownSets = new WeakMap<readonly string[], Set<string>>();

/** The id list as a set, built once per list: a table of 200 000 rows checks every id. */
function knownSet(known: readonly string[]): Set<string> {
  let set = knownSets.get(known);
  if (set === undefined) {
    set = new Set(known);
    knownSets.set(known, set);
  }
  return set;
}

function readId(
  table: TableRows,
  row: TableRow,
  column: number,
  known: readonly string[],
  kind: 'factor' | 'response',
  section: 'factors' | 'responses',
): string {
  const cell = row.cells[column];
  if (cell === null) throw new InputError(`is empty; a ${kind} id is required`, cellLocation(table, row, column));
  const id = String(cell).trim();
  if (!knownSet(known).has(id)) {
    const suggestion = suggestKey(id, known);
    const hint = suggestion !== undefined ? `; did you mean \`${suggestion}\`?` : `; every ${kind} in the table must be defined under \`${section}\` in the study file`;
    throw new InputError(`unknown ${kind} "${excerpt(id)}"${hint}`, cellLocation(table, row, column));
  }
  return id;
}

const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A finite number from a cell, or a one-line error saying what is wrong with it. */
function readNumber(table: TableRows, row: TableRow, column: number): number {
  const cell: CellValue = row.cells[column];
  const where = cellLocation(table, row, column);
  if (cell === null) throw new InputError('is empty; a number is required', where);
  if (typeof cell === 'number') {
    if (!Number.isFinite(cell)) throw new InputError(`${cell} is not a usable index value`, where);
    return cell;
  }
  const text = cell.trim();
  if (/^[+-]?(nan|inf|infinity|#num!|#div\/0!|#n\/a|#value!)$/i.test(text)) {
    throw new InputError(`"${excerpt(text)}" is not a usable index value (NaN, infinite or a spreadsheet error); re-estimate or fix it`, where);
  }
  if (/%$/.test(text)) throw new InputError(`"${excerpt(text)}" is a percentage; give indices as fractions (0.25, not 25%)`, where);
  if (/^[+-]?\d*,\d+$/.test(text)) {
    // Semicolons only help a CSV; in a workbook or JSON the cell itself must change.
    const advice = table.format === 'csv' ? 'use "." decimals, or separate the columns with semicolons' : 'enter it as a number with "." decimals';
    throw new InputError(`"${excerpt(text)}" has a decimal comma; ${advice}`, where);
  }
  if (!PLAIN_NUMBER.test(text)) throw new InputError(`must be a number, not "${excerpt(text)}"`, where);
  return Number(text);
}

/** An index estimate in [0, 1]: small overshoots clipped with a warning, larger ones refused. */
function readEstimate(table: TableRows, row: TableRow, column: number, warnings: string[]): { value: number; raw: number } {
  const raw = readNumber(table, row, column);
  const where = cellLocation(table, row, column);
  if (raw < -INDEX_RANGE_TOLERANCE || raw > 1 + INDEX_RANGE_TOLERANCE) {
    throw new InputError(
      `${raw} is outside [0, 1] by more than ${INDEX_RANGE_TOLERANCE}; Sobol' indices are fractions of the output variance`,
      where,
    );
  }
  const value = Math.min(1, Math.max(0, raw));
  if (value !== raw) {
    warnings.push(new InputError(`${raw} clipped to ${value} (estimator noise around the [0, 1] range)`, where).describe());
  }
  return { value, raw };
}

// ------------------------------------------------------------------------------ intervals

/** A bound column without its partner would give intervals with one end; refuse at the header. */
function requireBoundPairs(table: TableRows, columns: Partial<Record<IndexColumn, number>>): void {
  for (const [low, high] of [['first_low', 'first_high'], ['total_low', 'total_high']] as const) {
    if ((columns[low] === undefined) === (columns[high] === undefined)) continue;
    const [given, missing] = columns[low] !== undefined ? [low, high] : [high, low];
    const column = table.header[columns[given] as number];
    throw new InputError(
      `column "${excerpt(column)}" has no partner column ${missing}; a confidence interval needs both bounds (or leave both columns out)`,
      table.format === 'json'
        ? cellLocation(table, table.rows.find((row) => row.cells[columns[given] as number] !== null) ?? table.rows[0], columns[given] as number)
        : { file: table.file, ...table.headerAt, column },
    );
  }
}

/** Both bounds of an interval or neither, and the low one not above the high one. */
function checkInterval(
  table: TableRows,
  row: TableRow,
  indexRow: IndexRow,
  index: 'first' | 'total',
  lowColumn: number | undefined,
  highColumn: number | undefined,
): void {
  const low = index === 'first' ? indexRow.firstLow : indexRow.totalLow;
  const high = index === 'first' ? indexRow.firstHigh : indexRow.totalHigh;
  if (low === undefined && high === undefined) return;
  if (low === undefined || high === undefined) {
    const [emptyColumn, givenName] = low === undefined ? [lowColumn, `${index}_high`] : [highColumn, `${index}_low`];
    throw new InputError(
      `is empty but ${givenName} is given; a confidence interval needs both bounds (or leave both empty)`,
      cellLocation(table, row, emptyColumn as number),
    );
  }
  if (low > high) {
    throw new InputError(
      `low bound ${low} is above high bound ${high}; are the bound columns swapped?`,
      cellLocation(table, row, lowColumn as number),
    );
  }
}

// ------------------------------------------------------------------------------- helpers

function requireEveryPair(file: string, ids: StudyIds, seen: ReadonlyMap<string, TableRow>): void {
  const missing: string[] = [];
  for (const factor of ids.factorIds) {
    for (const response of ids.responseIds) {
      if (!seen.has(`${factor}\u0000${response}`)) missing.push(`${factor} × ${response}`);
    }
  }
  if (missing.length === 0) return;
  // A factor absent from the whole table is usually a parameter left out of the analysis (or
  // a misspelt id in the study file): name it as such rather than as one missing pair.
  const absent = ids.factorIds.filter((factor) => ids.responseIds.every((response) => !seen.has(`${factor}\u0000${response}`)));
  if (absent.length > 0) {
    const others = absent.length > 1 ? ` (and ${absent.slice(1).join(', ')})` : '';
    throw new InputError(
      `factor ${absent[0]}${others} is defined in the study file but has no rows; every factor in the study, operating or model, needs one row per response`,
      { file },
    );
  }
  const more = missing.length > 1 ? ` (and ${missing.length - 1} more pair${missing.length > 2 ? 's' : ''})` : '';
  throw new InputError(
    `no row for factor × response ${missing[0]}${more}; every factor in the study, operating or model, needs one row per response`,
    { file },
  );
}

function requireDataRows(table: TableRows, advice: string): void {
  if (table.rows.length > 0) return;
  const problem = table.format === 'json' ? 'holds no rows' : 'has a header but no data rows';
  throw new InputError(`${problem}${advice}`, { file: table.file });
}

function describeRow(table: TableRows, row: TableRow): string {
  return row.at.row !== undefined ? `row ${row.at.row}` : `entry ${row.at.key}`;
}

function round(value: number): number {
  return Math.round(value * 1000) / 1000;
}
