/**
 * The limits on every input: one table, read by every reader that enforces one, and the
 * one wording of the error a reader raises when an input goes past its limit.
 *
 * Why limits: a study file, an index table or a plan is one typo or one bad export away from
 * asking for ten million runs, a million levels or a YAML alias bomb. Each limit below lies
 * far beyond any real lab campaign and keeps every command inside the time and memory budget
 * (TIME_BUDGET_SECONDS, MEMORY_BUDGET_MIB on a 2-core machine; figures in bench/limits.ts).
 * A value past a limit is refused where it is read, with one line naming the key and the
 * limit, so nothing is computed and nothing is written.
 *
 * Conventions fixed here:
 * - `value` is inclusive: the limit itself is allowed, one more is refused.
 * - `kind: 'refusal'` limits are enforced (InputError); `kind: 'threshold'` ones only switch a
 *   computation to another method (the candidate grid beyond the enumeration threshold is
 *   searched without being listed) and are documented here so that the table is complete.
 * - The README's "Limits" table lists every entry with the same value; a test compares them.
 *
 * How to add a limit (e.g. for a new study key or a new table):
 * 1. Add an entry to INPUT_LIMITS: a camelCase name, the value, the unit word used in the
 *    message ("runs", "rows"), what it applies to (the key or file, as the README shows it)
 *    and why the value is safe.
 * 2. Enforce it where the input is read: `checkLimit('name', value, location)` in io or core,
 *    or, inside a zod schema, `.max(limitOf('name'), { error: limitIssue('name') })`.
 * 3. Add the row to the README table (the test `tests/core/inputLimits.test.ts` fails until
 *    you do) and a test that the value passes and value + 1 is refused with the one line.
 */
import { InputError, type InputLocation } from './inputError.js';

/** Wall-clock seconds any command may take on the 2-core reference machine for inputs inside the limits. */
export const TIME_BUDGET_SECONDS = 60;
/** Peak memory (resident set) any command may use for inputs inside the limits. */
export const MEMORY_BUDGET_MIB = 1536;

export interface InputLimit {
  value: number;
  /** Word after the number in messages and in the README ("runs", "bytes"). */
  unit: string;
  /** What is limited, as the README names it. */
  appliesTo: string;
  /** Why this value: what it is far beyond, what it protects. */
  why: string;
  kind: 'refusal' | 'threshold';
}

const MIB = 1024 * 1024;
/** Every limit message ends with this, so a reader can tell them from its own wording. */
const LIMITS_REFERENCE = '(see "Limits" in the README)';


export const INPUT_LIMITS = {
  studyFileBytes: {
    value: 1 * MIB,
    unit: 'bytes',
    appliesTo: 'study file size',
    why: 'a study of 2 000 factors is about 200 KB',
    kind: 'refusal',
  },
  tableFileBytes: {
    value: 32 * MIB,
    unit: 'bytes',
    appliesTo: 'CSV or JSON table file size (index, interaction and results tables)',
    why: '200 000 rows of eight numbers fit in about 12 MB',
    kind: 'refusal',
  },
  workbookFileBytes: {
    value: 16 * MIB,
    unit: 'bytes',
    appliesTo: 'XLSX table file size',
    why: '200 000 rows of eight columns take about 6 MB',
    kind: 'refusal',
  },
  workbookContentBytes: {
    value: 64 * MIB,
    unit: 'bytes',
    appliesTo: 'XLSX content once unpacked',
    why: 'a workbook is read whole into memory, about 18 times its unpacked size; 200 000 rows of eight columns unpack to 62 MB',
    kind: 'refusal',
  },
  planFileBytes: {
    value: 64 * MIB,
    unit: 'bytes',
    appliesTo: 'plan.json read by compare',
    why: 'a plan echoes its study, index rows included: 200 000 rows take about 30 MB',
    kind: 'refusal',
  },
  tableRows: {
    value: 200_000,
    unit: 'rows',
    appliesTo: 'data rows of one table (index, interaction and results tables)',
    why: '2 000 factors × 100 responses',
    kind: 'refusal',
  },
  tableColumns: {
    value: 1000,
    unit: 'columns',
    appliesTo: 'columns of one table',
    why: 'an index table has 8 columns; a results sheet one per factor and response',
    kind: 'refusal',
  },
  sheetCellLength: {
    value: 10_000,
    unit: 'characters',
    appliesTo: 'one cell of a results sheet (runsheet.csv or runsheet.xlsx read by analyze and augment)',
    why: 'a remark is a few sentences; a longer cell is a pasted file or an unclosed quote',
    kind: 'refusal',
  },
  nestingDepth: {
    value: 64,
    unit: 'levels',
    appliesTo: 'nesting of lists and mappings in YAML and JSON files',
    why: 'a study file nests 4 levels deep; deep nesting exhausts the parser',
    kind: 'refusal',
  },
  yamlAliases: {
    value: 100,
    unit: 'alias expansions',
    appliesTo: 'YAML aliases (*name) expanded in a study file',
    why: 'nested aliases expand exponentially (an "alias bomb")',
    kind: 'refusal',
  },
  textLength: {
    value: 500,
    unit: 'characters',
    appliesTo: 'title, names, units, labels, currency',
    why: 'every text is printed on run sheets and in tables',
    kind: 'refusal',
  },
  idLength: {
    value: 64,
    unit: 'characters',
    appliesTo: 'factor and response ids',
    why: 'ids are written in constraints, model terms and column headers',
    kind: 'refusal',
  },
  factors: {
    value: 2000,
    unit: 'factors',
    appliesTo: 'factors (operating settings and model parameters)',
    why: 'sensitivity analyses of the largest process models screen a few hundred parameters',
    kind: 'refusal',
  },
  responses: {
    value: 100,
    unit: 'responses',
    appliesTo: 'responses',
    why: 'each response is a column the bench fills in on every run',
    kind: 'refusal',
  },
  operatingFactors: {
    value: 100,
    unit: 'operating factors',
    appliesTo: 'factors with role operating',
    why: 'every operating factor is a setting on each worksheet',
    kind: 'refusal',
  },
  variedFactors: {
    value: 30,
    unit: 'varied factors',
    appliesTo: 'operating factors the plan varies (after tiering)',
    why: 'calibration campaigns vary up to about 15 settings',
    kind: 'refusal',
  },
  levelsPerFactor: {
    value: 50,
    unit: 'levels',
    appliesTo: 'factors[].levels (a count or a list), design.levels.critical, design.levels.moderate',
    why: 'a cubic trend needs 4 levels; each level is tried at every exchange step',
    kind: 'refusal',
  },
  modelTerms: {
    value: 500,
    unit: 'model terms',
    appliesTo: 'model terms, intercept included (design.model, or the model derived from the tiers)',
    why: 'a full quadratic in 30 factors has 496 terms',
    kind: 'refusal',
  },
  fittingRuns: {
    value: 1000,
    unit: 'runs',
    appliesTo: 'design.runs',
    why: 'lab campaigns run tens of runs, rarely a few hundred',
    kind: 'refusal',
  },
  wholePlots: {
    value: 1000,
    unit: 'whole plots',
    appliesTo: 'design.wholePlots',
    why: 'at most one whole plot per fitting run',
    kind: 'refusal',
  },
  varianceRatio: {
    value: 100,
    unit: 'times the run variance',
    appliesTo: 'design.varianceRatio',
    why: 'split-plot studies report whole-plot variances up to about ten times the run variance',
    kind: 'refusal',
  },
  centreRuns: {
    value: 100,
    unit: 'runs',
    appliesTo: 'design.centreRuns',
    why: 'pure error is estimated well from 3 to 6 replicates',
    kind: 'refusal',
  },
  holdoutRuns: {
    value: 200,
    unit: 'runs',
    appliesTo: 'design.holdoutRuns',
    why: 'about 20 % of the fitting runs is common practice',
    kind: 'refusal',
  },
  sessionRuns: {
    value: 1300,
    unit: 'runs',
    appliesTo: 'sessions.maxRuns',
    why: 'the largest campaign the other limits allow',
    kind: 'refusal',
  },
  starts: {
    value: 1000,
    unit: 'starts',
    appliesTo: 'design.starts and --starts',
    why: '20 starts reach the best plan of a 50-times-longer search within 1 %',
    kind: 'refusal',
  },
  searchWork: {
    value: 4e8,
    unit: 'work units',
    appliesTo: 'design search work: starts × the multiply-adds of one exchange pass (about runs × terms × level trials), see DEVELOPERS.md',
    why: `about ${TIME_BUDGET_SECONDS / 2} s of search on the 2-core reference machine; a larger search is refused before it starts`,
    kind: 'refusal',
  },
  constraints: {
    value: 50,
    unit: 'constraints',
    appliesTo: 'constraints',
    why: 'each constraint is evaluated at every trial point of the search',
    kind: 'refusal',
  },
  expressionLength: {
    value: 1000,
    unit: 'characters',
    appliesTo: 'one constraint or one model term',
    why: 'the longest real constraint is a line of text',
    kind: 'refusal',
  },
  expressionDepth: {
    value: 20,
    unit: 'levels',
    appliesTo: 'nesting of parentheses, function calls and operators in one constraint',
    why: 'deep nesting exhausts the expression parser',
    kind: 'refusal',
  },
  numberMagnitude: {
    value: 1e15,
    unit: '(absolute value)',
    appliesTo: 'factor low, high, nominal, precision, limits and level values; costs',
    why: 'settings beyond 1e15 lose the digits the coding needs (doubles carry 15–16)',
    kind: 'refusal',
  },
  enumeratedGrid: {
    value: 250_000,
    unit: 'grid points',
    appliesTo: 'candidate grid listed point by point (larger grids are searched by coordinate exchange and sampled, never listed)',
    why: 'the point exchange and the exact continuous bound need the grid in memory',
    kind: 'threshold',
  },
} as const satisfies Record<string, InputLimit>;

export type LimitName = keyof typeof INPUT_LIMITS;

export function limitOf(name: LimitName): number {
  return INPUT_LIMITS[name].value;
}

/** The limit as the README and the messages print it: 1 048 576 bytes → "1 MiB". */
export function limitText(name: LimitName): string {
  const { value, unit } = INPUT_LIMITS[name];
  if (unit === 'bytes') return value % MIB === 0 ? `${value / MIB} MiB` : `${value} bytes`;
  if (unit.startsWith('(')) return formatCount(value);
  return `${formatCount(value)} ${unit}`;
}

function formatCount(value: number): string {
  if (value >= 1e6 && Number.isInteger(Math.log10(value))) return `1e${Math.log10(value)}`;
  if (value >= 1e6) return value.toExponential().replace('e+', 'e');
  return String(value);
}

/** The tail every limit message ends with: `above the limit of 1000 runs (see "Limits" in the README)`. */
export function aboveLimit(name: LimitName): string {
  if (INPUT_LIMITS[name].unit.startsWith('(')) return `outside the limit of ±${limitText(name)} ${LIMITS_REFERENCE}`;
  return `above the limit of ${limitText(name)} ${LIMITS_REFERENCE}`;
}

/** The message for a value past its limit: "12000 runs is above the limit of 1000 runs (…)". */
export function limitMessage(name: LimitName, given: number | string, what?: string): string {
  const { unit } = INPUT_LIMITS[name];
  const plainNumber = unit === 'bytes' || unit.startsWith('(');
  const amount = what ? `${given} ${what}` : typeof given === 'number' && !plainNumber ? `${given} ${unit}` : String(given);
  return `${amount} is ${aboveLimit(name)}`;
}

/** Throws the one-line InputError when `value` exceeds the limit. */
export function checkLimit(name: LimitName, value: number, location: InputLocation, what?: string): void {
  if (value > INPUT_LIMITS[name].value) throw new InputError(limitMessage(name, value, what), location);
}

/** A zod error callback naming the limit, for `.max(limitOf(name), { error: limitIssue(name) })`. */
export function limitIssue(name: LimitName): (issue: { input?: unknown }) => string {
  return (issue) => {
    const input = issue.input;
    if (typeof input === 'string') return `is ${input.length} characters long, ${aboveLimit(name)}`;
    if (Array.isArray(input)) return `lists ${input.length} entries, ${aboveLimit(name)}`;
    return limitMessage(name, typeof input === 'number' ? input : String(input));
  };
}

/** Marks the messages made here, so a reader can keep them instead of its generic wording. */
export function isLimitMessage(message: string): boolean {
  return message.endsWith(LIMITS_REFERENCE);
}

