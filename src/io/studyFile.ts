/**
 * Reads a study file (YAML or JSON), checks it key by key, reads the index tables it
 * names and returns the validated `Study` every later stage works from.
 *
 * The schema is the zod shapes below, each key with a `.describe()`; `npm run schema` ships it
 * as schema/study.schema.json, and the README lists the keys for users.
 *
 * Conventions fixed here:
 * - One schema for both syntaxes (YAML 1.2 via the `yaml` package; JSON). Validation is a
 *   zod 4 strict schema for shapes and types, then explicit cross-field checks (low < high,
 *   nominal inside the range, critical > moderate, …) so each rule has one readable message.
 * - An unknown key anywhere is an error with the closest valid key suggested (Levenshtein
 *   distance) — a misspelt optional key silently ignored would change the plan unnoticed.
 * - Every error is one line naming the study file and the key path (`factors[2].low`).
 * - `policy`, `design`, `design.levels` may be partial; they merge over DEFAULT_POLICY and
 *   DEFAULT_DESIGN. `responses[].weight` defaults to 1, `sessions.label` to "Session",
 *   `sessions.hours` to DEFAULT_SESSION_HOURS (8, a working day).
 * - `factors[].settleMinutes` (0–1440) is kept on any operating factor but only acts on a
 *   hard-to-change one; elsewhere it draws a warning, as keys with no effect on a model
 *   parameter do.
 * - Table paths are relative to the study file's folder; `Study.source` keeps them as
 *   written, messages show them joined to the study file's folder as the user gave it.
 * - Ids are identifiers (letter, then letters, digits or `_`) because constraints and model
 *   terms are written with them; keywords and constants of the constraint language are refused.
 */
import { readFile, stat } from 'node:fs/promises';
import { dirname, extname, isAbsolute, join, resolve } from 'node:path';
import { z } from 'zod';
import { excerpt, InputError } from '../core/inputError.js';
import { parseTerm } from '../core/model/termSyntax.js';
import {
  AGGREGATE_RULES,
  CONFIDENCE_POLICIES,
  CRITERIA,
  DEFAULT_DESIGN,
  DEFAULT_POLICY,
  DEFAULT_SESSION_HOURS,
  MODEL_PRESETS,
  POLICY_CUT_OFFS,
  cutOffsInOrder,
  isCutOff,
  type CostSettings,
  type DesignSettings,
  type Factor,
  type Response,
  type SessionSettings,
  type Study,
  type TierPolicy,
} from '../core/study.js';
import { readIndexTable, readInteractionTable } from './indexTables.js';
import { fileSystemProblem, megabytes, undecodableLine } from './tableRows.js';
import { parseJsonText, parseYamlText } from './documentText.js';
import { aboveLimit, checkLimit, isLimitMessage, limitIssue, limitMessage, limitOf, type LimitName } from '../core/inputLimits.js';
import { didYouMean } from '../core/suggestKey.js';
import { RESERVED_WORDS } from '../core/region/constraintWords.js';

const STUDY_EXTENSIONS = ['.yaml', '.yml', '.json'] as const;

/** Letter first, then letters, digits or underscores: usable in constraints and model terms. */
const IDENTIFIER = /^[A-Za-z][A-Za-z0-9_]*$/;

// ------------------------------------------------------------------------------- schema

/**
 * What `tierplan init` writes where only the user knows the value. The schema refuses it
 * everywhere, so an unfilled skeleton stops at the first placeholder with "fill in …".
 */
export const PLACEHOLDER = 'TODO';
const NOT_PLACEHOLDER = new RegExp(`^(?!\\s*${PLACEHOLDER}\\s*$)`);

/** A number, a text or a list no larger than its limit in src/core/inputLimits.ts. */
const capped = <T extends z.ZodNumber | z.ZodString>(schema: T, name: LimitName): T =>
  schema.max(limitOf(name), { error: limitIssue(name) }) as T;
/** An engineering value: finite and within ±numberMagnitude. */
const setting = (): z.ZodNumber => capped(z.number(), 'numberMagnitude').min(-limitOf('numberMagnitude'), { error: limitIssue('numberMagnitude') });
const text = (): z.ZodString => capped(z.string(), 'textLength');
const identifier = (): z.ZodString => capped(z.string(), 'idLength');
/** Text the user must write themselves (a placeholder left in it is refused). */
const filledText = (): z.ZodString => text().regex(NOT_PLACEHOLDER, { error: 'fill in the text' });

const limitsSchema = z
  .strictObject({
    low: setting().describe('lowest setting the equipment is rated for, in the factor\'s unit'),
    high: setting().describe('highest setting the equipment is rated for, in the factor\'s unit'),
  })
  .describe('the equipment\'s rated range; a planned setting outside it is refused');

const factorSchema = z.strictObject({
  id: identifier().describe('identifier used in the index tables, constraints and model terms: a letter, then letters, digits or _'),
  name: filledText().min(1).describe('readable name, shown on the run sheets and the report'),
  unit: filledText().describe('engineering unit of low, high and nominal, e.g. °C or kg/h; "-" when it has none'),
  role: z.enum(['operating', 'model']).describe('operating: a setting the lab can vary; model: a parameter of the process model'),
  low: setting().describe('low end of the range the sensitivity analysis covered, in the factor\'s unit'),
  high: setting().describe('high end of that range, above low'),
  nominal: setting().describe('usual setting or value, between low and high; negligible factors are fixed here'),
  precision: setting().positive().optional().describe('smallest settable step; settings are rounded to a multiple of it'),
  limits: limitsSchema.optional(),
  levels: z
    .union(
      [
        capped(z.number().int().min(2), 'levelsPerFactor'),
        z.array(setting()).min(2).max(limitOf('levelsPerFactor'), { error: limitIssue('levelsPerFactor') }),
      ],
      {
        error: (issue) =>
          Array.isArray(issue.input) && issue.input.length > limitOf('levelsPerFactor')
            ? `lists ${issue.input.length} levels, ${aboveLimit('levelsPerFactor')}`
            : 'must be a level count (a whole number ≥ 2) or a list of at least 2 level values',
      },
    )
    .optional()
    .describe('a level count, or the level values, instead of the count the tier gives'),
  hardToChange: z.boolean().optional().describe('true when changing the setting is slow or costly: runs sharing it are kept together'),
  settleMinutes: z.number().min(0).max(1440).optional().describe('minutes a hard-to-change factor needs to settle after a change (0–1440)'),
  analysedRange: z
    .strictObject({
      low: z.number().describe('low end of the range the sensitivity analysis sampled'),
      high: z.number().describe('high end of that range'),
    })
    .optional()
    .describe('the range the sensitivity analysis sampled, when it differs from low–high; predicted effects are scaled to the plan range'),
});

const responseSchema = z.strictObject({
  id: identifier().describe('identifier used in the index tables: a letter, then letters, digits or _'),
  name: filledText().min(1).describe('readable name, shown on the run sheets and the report'),
  unit: filledText().describe('unit the response is measured in; "-" when it has none'),
  weight: capped(z.number().positive(), 'numberMagnitude').optional().describe('relative weight under the weighted aggregate (default 1)'),
  spread: z.number().positive().optional().describe('standard deviation of the response over the analysed ranges, as the sensitivity analysis reports it'),
  noise: z.number().positive().optional().describe('standard deviation of one lab result (repeatability of process plus measurement)'),
  tolerance: z.number().positive().optional().describe('acceptable prediction error at the holdout runs, for the verdict of analyze (response units)'),
  smallestEffect: z
    .number()
    .positive()
    .optional()
    .describe('smallest change across the studied range worth detecting; used when spread is absent'),
});

const policySchema = z
  .strictObject({
    aggregate: z.enum(AGGREGATE_RULES).optional().describe('how indices combine over the responses (default mean)'),
    critical: z.number().optional().describe('aggregated total index at or above which a factor is critical (default 0.30)'),
    moderate: z.number().optional().describe('aggregated total index at or above which a factor is moderate (default 0.05)'),
    interaction: z.number().optional().describe('second-order index at or above which a pair earns an interaction term (default 0.05)'),
    confidence: z.enum(CONFIDENCE_POLICIES).optional().describe('tier on the estimate (point, default) or the upper confidence bound (upper)'),
  })
  .describe('the tier cut-offs');

const levelsSchema = z
  .strictObject({
    critical: capped(z.number().int().min(2), 'levelsPerFactor').optional().describe('levels of a critical factor (default 4)'),
    moderate: capped(z.number().int().min(2), 'levelsPerFactor').optional().describe('levels of a moderate factor (default 3)'),
  })
  .describe('level counts per tier');

const list = <T extends z.ZodType>(item: T, name: LimitName) => z.array(item).max(limitOf(name), { error: limitIssue(name) });

const designSchema = z
  .strictObject({
    runs: z
      .union([capped(z.number().int().min(1), 'fittingRuns'), z.literal('auto')], { error: runsError('whole number of runs (≥ 1) or "auto"', 'fittingRuns') })
      .optional()
      .describe('fitting runs, not counting centre or holdout runs, or auto (default)'),
    model: z
      .union([z.enum(MODEL_PRESETS), list(capped(z.string().min(1), 'expressionLength'), 'modelTerms').min(1)], {
        error: (issue) =>
          Array.isArray(issue.input)
            ? listError(issue.input, 'modelTerms', 'expressionLength')
            : 'must be "linear", "interactions", "quadratic" or a list of model terms such as [inlet_temp, inlet_temp*feed_rate]',
      })
      .optional()
      .describe('linear, interactions, quadratic or a list of terms; derived from the tiers when absent'),
    criterion: z.enum(CRITERIA).optional().describe('D (default) or I optimality'),
    centreRuns: capped(z.number().int().min(0), 'centreRuns').optional().describe('replicate runs at the centre point (default 3)'),
    holdoutRuns: z
      .union([capped(z.number().int().min(0), 'holdoutRuns'), z.literal('auto')], { error: runsError('whole number of runs (≥ 0) or "auto"', 'holdoutRuns') })
      .optional()
      .describe('validation runs kept out of the fit, or auto (default, about a fifth of the fitting runs)'),
    // 32-bit generators: a larger seed would silently repeat a smaller one's design.
    seed: z.number().int().min(0).max(4294967295).optional().describe('random seed of the search and the run order (default 1)'),
    levels: levelsSchema.optional(),
    starts: capped(z.number().int().min(1), 'starts').optional().describe('random starts of the exchange search (default 20)'),
    precision: z
      .strictObject({
        power: z.number().optional().describe('power every predicted effect must reach (default 0.8)'),
        alpha: z.number().optional().describe('level of the tests (default 0.05)'),
      })
      .optional()
      .describe('the precision target the run count is sized to'),
    maxRuns: z.number().int().min(1).optional().describe('most fitting runs that runs: auto may choose (default 4 × the model parameters)'),
    potential: z
      .union([z.literal('auto'), z.array(z.string().min(1))], { error: 'must be "auto" or a list of model terms such as [inlet_temp^3] ([] for none)' })
      .optional()
      .describe('potential terms the plan guards against without estimating them: auto (default) or a term list, [] for none'),
    wholePlots: z
      .union([capped(z.number().int().min(1), 'wholePlots'), z.literal('auto')], { error: runsError('whole number of whole plots (≥ 1) or "auto"', 'wholePlots') })
      .optional()
      .describe('whole plots of the fitting runs when a factor is hard to change, or auto (default: chosen from the costs and the precision target)'),
    varianceRatio: capped(z.number().min(0), 'varianceRatio')
      .optional()
      .describe('whole-plot variance over run-to-run variance for the split-plot design (default 1)'),
  })
  .describe('the design search');

const sessionsSchema = z
  .strictObject({
    maxRuns: capped(z.number().int().min(1), 'sessionRuns').describe('most runs in one session (day, shift or batch)'),
    label: text().min(1).optional().describe('what a session is called on the run sheet (default Session)'),
    hours: z.number().positive().max(24).optional().describe('bench hours one session may hold (default 8, a working day); sessions above it are warned'),
  })
  .describe('how the runs are split into sessions');

const amount = (): z.ZodNumber => capped(z.number(), 'numberMagnitude');
const levelChangeSchema = z
  .strictObject({
    cost: amount().min(0).describe('extra cost of one change, in the currency'),
    hours: amount().min(0).describe('extra bench hours of one change'),
  })
  .describe('extra cost and time of each change of a hard-to-change setting');

const costsSchema = z
  .strictObject({
    currency: filledText().min(1).describe('currency code or word the costs are in, e.g. EUR'),
    perRun: amount().positive().describe('cost of one run'),
    hoursPerRun: amount().positive().describe('bench hours of one run'),
    perLevelChange: levelChangeSchema.optional(),
  })
  .describe('what a run costs, for the comparison and the report');

const studySchema = z
  .strictObject({
    title: filledText().min(1).describe('shown on every output'),
    factors: list(factorSchema, 'factors').min(1).describe('every factor of the sensitivity analysis: operating settings and model parameters'),
    responses: list(responseSchema, 'responses').min(1).describe('the responses the indices are given for'),
    indices: text().min(1).describe('first-order and total index table (CSV, XLSX or JSON), relative to this file'),
    interactions: text().min(1).optional().describe('second-order index table, relative to this file'),
    policy: policySchema.optional(),
    design: designSchema.optional(),
    constraints: list(capped(z.string().min(1), 'expressionLength'), 'constraints')
      .optional()
      .describe('conditions every run must meet, over factor ids in engineering units, e.g. feed_rate <= 0.2 * inlet_temp - 18'),
    sessions: sessionsSchema.optional(),
    costs: costsSchema.optional(),
  })
  .describe('A tierplan study: the factors and responses of a global sensitivity analysis, its index tables, and how to plan the lab campaign.');

/** A union's one message: the limit when a whole number went past it, else what is expected. */
function runsError(expected: string, name: LimitName): (issue: { input?: unknown }) => string {
  return (issue) =>
    typeof issue.input === 'number' && Number.isInteger(issue.input) && issue.input > limitOf(name)
      ? limitMessage(name, issue.input)
      : `must be a ${expected}`;
}

/** The message for a model term list that failed: too long a list, too long a term, or not text. */
function listError(items: unknown[], name: LimitName, itemName: LimitName): string {
  if (items.length > limitOf(name)) return `lists ${items.length} entries, ${aboveLimit(name)}`;
  const long = items.findIndex((item) => typeof item === 'string' && item.length > limitOf(itemName));
  if (long >= 0) return `entry ${long} is ${(items[long] as string).length} characters long, ${aboveLimit(itemName)}`;
  if (items.length === 0) return 'must list at least 1 model term';
  return 'must be "linear", "interactions", "quadratic" or a list of model terms such as [inlet_temp, inlet_temp*feed_rate]';
}

type StudyDocument = z.infer<typeof studySchema>;

/**
 * The study file's JSON Schema (draft 2020-12), generated from the validator so the two cannot
 * drift; `schema/study.schema.json` is this, written by `npm run schema`. It checks shapes,
 * types and key names as an editor types; the cross-field rules (low < high, …) stay here.
 */
export function studyJsonSchema(): Record<string, unknown> {
  const { $schema, ...rest } = z.toJSONSchema(studySchema) as Record<string, unknown>;
  return { $schema, title: 'tierplan study file', ...rest };
}


/** Valid keys of each object in the file, by key path with list indices written `[]`. */
const KEYS_AT: Readonly<Record<string, readonly string[]>> = {
  '': Object.keys(studySchema.shape),
  'factors[]': Object.keys(factorSchema.shape),
  'factors[].limits': Object.keys(limitsSchema.shape),
  'factors[].analysedRange': Object.keys(limitsSchema.shape),
  'design.precision': ['power', 'alpha'],
  'responses[]': Object.keys(responseSchema.shape),
  policy: Object.keys(policySchema.shape),
  design: Object.keys(designSchema.shape),
  'design.levels': Object.keys(levelsSchema.shape),
  sessions: Object.keys(sessionsSchema.shape),
  costs: Object.keys(costsSchema.shape),
  'costs.perLevelChange': Object.keys(levelChangeSchema.shape),
};

// --------------------------------------------------------------------------------- load

/** Reads, validates and completes the study at `path` (as the user gave it). */
export async function loadStudy(path: string): Promise<Study> {
  const document = await readStudyDocument(path);
  const parsed = studySchema.safeParse(document, { reportInput: true });
  if (!parsed.success) throw issueToError(parsed.error.issues, path);
  const { study, warnings: studyWarnings } = checkStudyRules(parsed.data, path);

  const folder = dirname(resolve(path));
  const shown = (written: string): string => (isAbsolute(written) ? written : join(dirname(path), written));
  const ids = { factorIds: study.factors.map((factor) => factor.id), responseIds: study.responses.map((response) => response.id) };
  const indexTable = await readIndexTable(resolve(folder, parsed.data.indices), shown(parsed.data.indices), ids);
  const interactionTable =
    parsed.data.interactions === undefined
      ? { rows: [], warnings: [] }
      : await readInteractionTable(resolve(folder, parsed.data.interactions), shown(parsed.data.interactions), ids, indexTable.rows);

  return {
    ...study,
    indices: indexTable.rows,
    interactions: interactionTable.rows,
    source: {
      studyFile: path,
      indicesFile: parsed.data.indices,
      ...(parsed.data.interactions !== undefined ? { interactionsFile: parsed.data.interactions } : {}),
    },
    warnings: [...studyWarnings, ...indexTable.warnings, ...interactionTable.warnings],
  };
}

async function readStudyDocument(path: string): Promise<unknown> {
  const extension = extname(path).toLowerCase();
  if (!(STUDY_EXTENSIONS as readonly string[]).includes(extension)) {
    throw new InputError(`unsupported study file type "${extension || '(no extension)'}"; use .yaml, .yml or .json`, { file: path });
  }
  let text: string;
  try {
    const info = await stat(path);
    if (info.isDirectory()) throw new InputError('is a folder, not a study file', { file: path });
    if (info.size > limitOf('studyFileBytes')) {
      throw new InputError(`is ${megabytes(info.size)}, ${aboveLimit('studyFileBytes')}`, { file: path });
    }
    text = await readFile(path, 'utf8');
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError(fileSystemProblem(error), { file: path });
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (text.includes('\u0000')) throw new InputError('is not UTF-8 text (UTF-16 or binary); save it as UTF-8', { file: path });
  const badLine = undecodableLine(text);
  if (badLine !== undefined) {
    throw new InputError(
      `is not UTF-8 text (line ${badLine} has bytes UTF-8 cannot read, probably a legacy encoding such as Windows-1252); save it as UTF-8`,
      { file: path },
    );
  }
  if (text.trim() === '') throw new InputError('is empty', { file: path });

  const data = extension === '.json' ? parseJsonText(text, path) : parseYamlText(text, path);
  if (data === null || data === undefined) throw new InputError('has no content (only comments?)', { file: path });
  if (typeof data !== 'object' || Array.isArray(data)) {
    throw new InputError(`must be a mapping with keys such as ${KEYS_AT[''].slice(0, 4).join(', ')}, …`, { file: path });
  }
  return data;
}

// ----------------------------------------------------------------------- schema messages

function keyPath(path: readonly PropertyKey[]): string {
  let text = '';
  for (const part of path) {
    if (typeof part === 'number') text += `[${part}]`;
    else text += text === '' ? String(part) : `.${String(part)}`;
  }
  return text;
}

/** The one error to show: unknown keys first (a typo explains the "missing" key after it). */
function issueToError(issues: readonly z.core.$ZodIssue[], file: string): InputError {
  const issue = issues.find((candidate) => candidate.code === 'unrecognized_keys') ?? issues[0];
  const at = keyPath(issue.path);
  if (issue.code === 'unrecognized_keys') {
    const unknown = excerpt(issue.keys[0], 40);
    const pattern = issue.path.map((part) => (typeof part === 'number' ? '[]' : String(part))).join('.').replace(/\.\[\]/g, '[]');
    const valid = KEYS_AT[pattern] ?? [];
    return new InputError(`unknown key "${unknown}"${didYouMean(unknown, valid)}`, {
      file,
      key: at === '' ? unknown : `${at}.${unknown}`,
    });
  }
  return new InputError(issueMessage(issue), { file, key: at === '' ? '(top level)' : at });
}

function issueMessage(issue: z.core.$ZodIssue): string {
  const input = (issue as { input?: unknown }).input;
  const full = typeof input === 'string' ? `"${input}"` : JSON.stringify(input) ?? String(input);
  // Keep the one-line message short when a whole mapping or list stands where a value belongs.
  const shown = full.length > 60 ? `${full.slice(0, 57)}…` : full;
  // A missing key reaches zod as `undefined` whatever its type (an enum reports invalid_value).
  if (input === undefined) return 'is required';
  if (typeof input === 'string' && input.trim() === PLACEHOLDER) return `fill in ${placeholderWanted(issue)} (in place of ${PLACEHOLDER})`;
  switch (issue.code) {
    case 'invalid_type': {
      if (issue.expected === 'number' && typeof input === 'number') return 'must be a finite number';
      const wanted: Record<string, string> = {
        number: 'a number',
        int: 'a whole number',
        string: 'text',
        array: 'a list',
        object: 'a mapping of keys',
        boolean: 'true or false',
      };
      return `must be ${wanted[issue.expected] ?? issue.expected}, not ${shown}`;
    }
    case 'too_small': {
      if (issue.origin === 'array') return `must list at least ${issue.minimum} entr${Number(issue.minimum) === 1 ? 'y' : 'ies'}`;
      if (issue.origin === 'string') return 'must not be empty';
      if (isLimitMessage(issue.message)) return issue.message;
      return `must be ${issue.inclusive ? 'at least' : 'greater than'} ${issue.minimum}, not ${shown}`;
    }
    case 'too_big':
      if (isLimitMessage(issue.message)) return issue.message;
      return `must be ${issue.inclusive ? 'at most' : 'less than'} ${issue.maximum}, not ${shown}`;
    case 'invalid_value': {
      const options = issue.values.map((value) => `"${String(value)}"`).join(', ');
      const hint = typeof input === 'string' && input.length >= 3 ? didYouMean(input, issue.values.map(String)).replace(/; expected one of .*$/, '') : '';
      return `must be one of ${options}, not ${shown}${hint}`;
    }
    default:
      return issue.message;
  }
}

/** What belongs where a placeholder was left: "a number", "one of "operating", "model"", "the text". */
function placeholderWanted(issue: z.core.$ZodIssue): string {
  if (issue.code === 'invalid_type') return issue.expected === 'number' ? 'a number' : `a value (${issue.expected})`;
  if (issue.code === 'invalid_value') return `one of ${issue.values.map((value) => `"${String(value)}"`).join(', ')}`;
  return 'the text';
}

// ---------------------------------------------------------------------- cross-field rules

/** Why `id` cannot name a factor or a response, or undefined when it can. */
export function idProblem(id: string): string | undefined {
  if (id.length > limitOf('idLength')) return `"${excerpt(id)}" is ${id.length} characters long, ${aboveLimit('idLength')}`;
  if (!IDENTIFIER.test(id)) {
    return `"${id}" is not a usable id: start with a letter, then letters, digits or "_" (ids are written in constraints and model terms)`;
  }
  if (RESERVED_WORDS.has(id)) return `"${id}" is reserved in constraint expressions; choose another id`;
  return undefined;
}

type CheckedStudy = Omit<Study, 'indices' | 'interactions' | 'source' | 'warnings'>;

function checkStudyRules(data: StudyDocument, file: string): { study: CheckedStudy; warnings: string[] } {
  const warnings: string[] = [];
  const fail = (key: string, message: string): never => {
    throw new InputError(message, { file, key });
  };

  const checkId = (id: string, key: string, seen: Map<string, number>, list: string): void => {
    const problem = idProblem(id);
    if (problem !== undefined) fail(key, problem);
    const earlier = seen.get(id);
    if (earlier !== undefined) fail(key, `id "${id}" is already used by ${list}[${earlier}]; ids must be unique`);
  };

  const factorSeen = new Map<string, number>();
  const factors: Factor[] = data.factors.map((raw, i) => {
    const at = `factors[${i}]`;
    checkId(raw.id, `${at}.id`, factorSeen, 'factors');
    factorSeen.set(raw.id, i);
    if (!(raw.low < raw.high)) fail(`${at}.high`, `high (${raw.high}) must be greater than low (${raw.low})`);
    if (raw.nominal < raw.low || raw.nominal > raw.high) {
      fail(`${at}.nominal`, `nominal ${raw.nominal} lies outside the range ${raw.low} to ${raw.high}`);
    }
    if (raw.limits) {
      if (!(raw.limits.low < raw.limits.high)) {
        fail(`${at}.limits.high`, `limits.high (${raw.limits.high}) must be greater than limits.low (${raw.limits.low})`);
      }
      if (raw.low < raw.limits.low) fail(`${at}.low`, `low ${raw.low} is below the equipment limit ${raw.limits.low} (limits.low)`);
      if (raw.high > raw.limits.high) fail(`${at}.high`, `high ${raw.high} is above the equipment limit ${raw.limits.high} (limits.high)`);
    }
    if (Array.isArray(raw.levels)) {
      raw.levels.forEach((value, j) => {
        if (value < raw.low || value > raw.high) {
          fail(`${at}.levels[${j}]`, `level ${value} lies outside the range ${raw.low} to ${raw.high}`);
        }
      });
      if (new Set(raw.levels).size < 2) fail(`${at}.levels`, 'needs at least 2 distinct level values');
    }
    const factor: Factor = { id: raw.id, name: raw.name, unit: raw.unit, role: raw.role, low: raw.low, high: raw.high, nominal: raw.nominal };
    if (raw.precision !== undefined) factor.precision = raw.precision;
    if (raw.limits !== undefined) factor.limits = { low: raw.limits.low, high: raw.limits.high };
    if (raw.levels !== undefined) factor.levels = Array.isArray(raw.levels) ? [...raw.levels] : raw.levels;
    if (raw.hardToChange !== undefined) factor.hardToChange = raw.hardToChange;
    if (raw.settleMinutes !== undefined) {
      factor.settleMinutes = raw.settleMinutes;
      if (raw.role === 'operating' && raw.hardToChange !== true) {
        warnings.push(new InputError('has no effect unless hardToChange is true (only a hard-to-change setting gets a wait step)', { file, key: `${at}.settleMinutes` }).describe());
      }
    }
    if (raw.analysedRange) {
      if (!(raw.analysedRange.low < raw.analysedRange.high)) {
        fail(`${at}.analysedRange.high`, `analysedRange.high (${raw.analysedRange.high}) must be greater than analysedRange.low (${raw.analysedRange.low})`);
      }
      factor.analysedRange = { low: raw.analysedRange.low, high: raw.analysedRange.high };
    }
    if (raw.role === 'model') {
      // Only operating settings are run in the lab, so these keys cannot act on a model parameter.
      for (const key of ['limits', 'levels', 'hardToChange', 'settleMinutes', 'analysedRange'] as const) {
        if (raw[key] !== undefined) {
          warnings.push(new InputError(`has no effect on a model parameter (only operating settings are set in the lab)`, { file, key: `${at}.${key}` }).describe());
        }
      }
    }
    return factor;
  });
  checkLimit('operatingFactors', factors.filter((factor) => factor.role === 'operating').length, { file, key: 'factors' });
  if (!factors.some((factor) => factor.role === 'operating')) {
    fail('factors', 'needs at least one factor with role "operating" (a setting the lab plan can vary)');
  }

  const responseSeen = new Map<string, number>();
  const responses: Response[] = data.responses.map((raw, i) => {
    checkId(raw.id, `responses[${i}].id`, responseSeen, 'responses');
    responseSeen.set(raw.id, i);
    const response: Response = { id: raw.id, name: raw.name, unit: raw.unit, weight: raw.weight ?? 1 };
    if (raw.spread !== undefined) response.spread = raw.spread;
    if (raw.noise !== undefined) response.noise = raw.noise;
    if (raw.tolerance !== undefined) response.tolerance = raw.tolerance;
    if (raw.smallestEffect !== undefined) response.smallestEffect = raw.smallestEffect;
    if (raw.spread !== undefined && raw.smallestEffect !== undefined) {
      warnings.push(
        new InputError('is not used: spread is given, so the effects are predicted from the indices', { file, key: `responses[${i}].smallestEffect` }).describe(),
      );
    }
    return response;
  });

  const policy: TierPolicy = { ...DEFAULT_POLICY, ...definedOnly(data.policy ?? {}) };
  for (const name of POLICY_CUT_OFFS) {
    if (!isCutOff(policy[name])) fail(`policy.${name}`, `must lie strictly between 0 and 1, not ${policy[name]}`);
  }
  if (!cutOffsInOrder(policy)) {
    fail('policy.critical', `critical (${policy.critical}) must be greater than moderate (${policy.moderate})`);
  }

  const { levels: levelOverrides, precision: precisionOverrides, ...designRest } = data.design ?? {};
  const design: DesignSettings = {
    ...DEFAULT_DESIGN,
    ...definedOnly(designRest),
    levels: { ...DEFAULT_DESIGN.levels, ...definedOnly(levelOverrides ?? {}) },
    precision: { ...DEFAULT_DESIGN.precision, ...definedOnly(precisionOverrides ?? {}) },
  };
  if (!(design.precision.alpha > 0 && design.precision.alpha <= 0.5)) {
    fail('design.precision.alpha', `must lie above 0 and at most 0.5, not ${design.precision.alpha}`);
  }
  if (!(design.precision.power > design.precision.alpha && design.precision.power < 1)) {
    fail('design.precision.power', `must lie above the test level ${design.precision.alpha} and below 1, not ${design.precision.power}`);
  }
  if (Array.isArray(design.potential)) design.potential = [...design.potential];
  const termLists = [
    ...(Array.isArray(design.model) ? [{ list: (design.model = [...design.model]), name: 'design.model' }] : []),
    ...(Array.isArray(design.potential) ? [{ list: design.potential, name: 'design.potential' }] : []),
  ];
  for (const { list, name } of termLists) {
    const operating = factors.filter((factor) => factor.role === 'operating').map((factor) => factor.id);
    const modelOnly = factors.filter((factor) => factor.role === 'model').map((factor) => factor.id);
    list.forEach((term, i) => {
      const key = `${name}[${i}]`;
      const parameter = modelOnly.find((id) => term.split(/[*^\s]+/).includes(id));
      if (parameter !== undefined) fail(key, `term "${excerpt(term)}" uses ${parameter}, a model parameter; model terms use operating settings only`);
      try {
        parseTerm(term, operating, key);
      } catch (error) {
        if (error instanceof InputError) throw error.inFile(file);
        throw error;
      }
    });
  }

  const result: CheckedStudy = { title: data.title, factors, responses, policy, design, constraints: [...(data.constraints ?? [])] };
  if (data.sessions) {
    const sessions: SessionSettings = {
      maxRuns: data.sessions.maxRuns,
      label: data.sessions.label ?? 'Session',
      hours: data.sessions.hours ?? DEFAULT_SESSION_HOURS,
    };
    result.sessions = sessions;
  }
  if (data.costs) {
    const costs: CostSettings = { currency: data.costs.currency, perRun: data.costs.perRun, hoursPerRun: data.costs.hoursPerRun };
    if (data.costs.perLevelChange) costs.perLevelChange = { ...data.costs.perLevelChange };
    result.costs = costs;
  }
  return { study: result, warnings };
}

/** The object without keys whose value is undefined, so spreading it keeps the defaults. */
function definedOnly<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, entry]) => entry !== undefined)) as Partial<T>;
}
