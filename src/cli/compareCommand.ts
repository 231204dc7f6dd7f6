/**
 * `tierplan compare <study | plan.json>`: the proposed plan side by side with the classical
 * plans, on the same model, region and centre replicates.
 *
 * A file with a `formatVersion` key is read as a plan document (its runs are judged as they
 * are); anything else is read as a study and planned first, exactly as `tierplan plan` would.
 * The comparison is always recomputed, so `--delta` and `--alpha` apply to a saved plan too.
 */
import { readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { ComparatorRow, Comparison } from '../core/compare/comparisonTypes.js';
import { loadStudy } from '../io/studyFile.js';
import { checkedPlan } from '../io/planFile.js';
import { toolVersion } from '../io/toolVersion.js';
import { displayWidth, formatNumber, renderTable } from '../io/textTable.js';
import { optionNumber } from './optionNumber.js';

interface CompareOptions {
  json?: boolean;
  delta: string;
  alpha: string;
}

export function registerCompare(program: Command): void {
  program
    .command('compare')
    .description('set the proposed plan against full, fractional and response-surface plans on the same model')
    .argument('<file>', 'study file (.yaml, .yml or .json) or a plan.json written by `tierplan plan`')
    .option('--json', 'print the comparison as JSON on stdout')
    .option('--delta <sigma>', 'effect size for the power column, in residual standard deviations', '2')
    .option('--alpha <level>', 'significance level of the two-sided t-test for the power column', '0.05')
    .action(async (file: string, options: CompareOptions) => {
      const delta = positiveNumber(options.delta, 'delta');
      const alpha = positiveNumber(options.alpha, 'alpha');
      if (alpha >= 1) throw new InputError(`--alpha must lie between 0 and 1, got ${options.alpha}`);
      const plan = await planFrom(file);
      // The design and comparison modules load mathjs and friends: only when a command needs them.
      const { buildComparison } = await import('../core/compare/buildComparison.js');
      const comparison = buildComparison(plan, { delta, alpha });
      process.stdout.write(options.json ? `${JSON.stringify(comparison, null, 2)}\n` : comparisonText(comparison, plan));
    });
}

async function planFrom(file: string): Promise<PlanDocument> {
  const planDocument = await parsedPlanDocument(file);
  if (planDocument !== null) return checkedPlan(planDocument, file);
  const study = await loadStudy(file);
  for (const warning of study.warnings) process.stderr.write(`warning: ${warning}\n`);
  const showProgress = Boolean(process.stderr.isTTY);
  const { buildPlan } = await import('../core/plan/buildPlan.js');
  try {
    return buildPlan(study, {
      toolVersion: toolVersion(),
      skipComparison: true,
      onProgress: showProgress ? (message) => process.stderr.write(`… ${message}\n`) : undefined,
    });
  } catch (error) {
    throw error instanceof InputError ? error.inFile(file) : error;
  }
}

/**
 * The parsed content of a JSON file whose top level has `formatVersion` (a plan document), or
 * null for anything else. Parsed once here and checked by `checkedPlan`, not read a second time.
 */
async function parsedPlanDocument(file: string): Promise<object | null> {
  if (extname(file).toLowerCase() !== '.json') return null;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    return null; // let the study reader report the missing file in its own words
  }
  try {
    const parsed: unknown = JSON.parse(text);
    return typeof parsed === 'object' && parsed !== null && 'formatVersion' in parsed ? parsed : null;
  } catch {
    return null;
  }
}

function positiveNumber(text: string, key: string): number {
  const value = optionNumber(text);
  if (!Number.isFinite(value) || value <= 0) {
    throw new InputError(`--${key} must be a positive number, got "${text}"`);
  }
  return value;
}

/** Width the prose is wrapped to (the tables are about as wide). */
const TEXT_WIDTH = 100;

/**
 * The human view: the decision first, then what each plan estimates, what it costs, the
 * proposed plan term by term, what the columns mean, and one verdict per plan.
 */
function comparisonText(comparison: Comparison, plan: PlanDocument): string {
  const currency = comparison.currency ?? undefined;
  const rows = comparison.comparators;
  const name = (row: ComparatorRow) => shortName(row, plan);
  const lines: string[] = [plan.study.title, ''];
  lines.push(...wrap(`Decision: ${comparison.summary}`, ''), '');

  const estimates = renderTable(
    [
      { header: 'Plan' },
      { header: 'Fit runs' },
      { header: 'Fits model' },
      { header: 'D-eff', unit: '%', align: 'right' },
      { header: 'Info/run', align: 'right' },
      { header: 'Info total', align: 'right' },
      { header: 'Avg var', unit: 'σ²', align: 'right' },
      { header: 'Min power', unit: '%', align: 'right' },
    ],
    rows.map((row) => [
      name(row),
      row.runs === null ? null : (row.fittingRuns ?? row.runs),
      row.runs === null ? 'not built' : row.fitsModel ? 'yes' : `no, ${plural(row.missingTerms.length, 'term')}`,
      fixed(row.dEfficiency, 1),
      fixed(row.relativeInformationPerRun, 2),
      fixed(row.relativeInformationTotal, 2),
      row.averagePredictionVariance,
      fixed(row.minPower === null ? null : 100 * row.minPower, 1),
    ]),
    { title: `What each plan can estimate: the same ${comparison.modelTerms.length} model terms + intercept (p = ${comparison.p}), coded units` },
  );
  lines.push(estimates.replace(/\n+$/, ''), '');

  const costs = renderTable(
    [
      { header: 'Plan' },
      { header: 'Runs' },
      { header: 'Off limits', align: 'right' },
      { header: 'Level changes', align: 'right' },
      { header: 'Cost', unit: currency, align: 'right' },
      { header: 'Time', unit: 'h', align: 'right' },
      { header: 'Runs saved', align: 'right' },
      { header: 'Cost saved', unit: currency, align: 'right' },
    ],
    rows.map((row) => [
      name(row),
      row.runs,
      row.runs === null ? null : String(row.offLimitsRuns ?? 0),
      row.levelChanges === null ? null : String(row.levelChanges),
      row.cost === null ? null : grouped(row.cost),
      fixed(row.hours, 1),
      row.id === 'proposed' ? null : savedText(row.runsSaved, row.percentRunsSaved, (value) => String(value)),
      row.id === 'proposed' ? null : savedText(row.costSaved, row.percentCostSaved, grouped),
    ]),
    { title: 'What each plan costs and whether it can be run as listed (all runs, holdout runs included)' },
  );
  lines.push(costs.replace(/\n+$/, ''), '');

  const proposed = rows.find((row) => row.id === 'proposed');
  if (proposed?.terms && proposed.terms.length > 0) {
    const termTable = renderTable(
      [{ header: 'Term' }, { header: 'Std error', unit: 'σ', align: 'right' }, { header: 'VIF', align: 'right' }, { header: 'Power', unit: '%', align: 'right' }],
      proposed.terms.map((term) => [term.term === '1' ? '1 (intercept)' : term.term, fixed(term.standardError, 3), fixed(term.vif, 1), fixed(term.power === null ? null : 100 * term.power, 1)]),
      { title: `The proposed plan term by term (power for an effect of ${comparison.delta}σ, α = ${comparison.alpha})` },
    );
    lines.push(termTable.replace(/\n+$/, ''));
    const detail = [
      residualText(proposed, comparison.p),
      proposed.aCriterion != null ? `A-criterion ${formatNumber(proposed.aCriterion)} σ² (average coefficient variance)` : null,
      proposed.gEfficiency != null
        ? `G-efficiency ${fixed(proposed.gEfficiency, 1)} % (the floor p/N of the scaled prediction variance against its worst value, ${proposed.gEfficiencyBasis ?? 'over the region'})`
        : null,
      proposed.maxVif != null ? `largest VIF ${fixed(proposed.maxVif, 1)}` : null,
    ].filter((text): text is string => text !== null);
    if (detail.length > 0) lines.push(...wrap(`${capitalise(detail.join('; '))}.`, ''));
    lines.push('');
  }

  lines.push('What the columns mean');
  const notes = [
    'Fit runs: the runs each plan\'s figures are computed on. For the proposed plan these are its model and centre runs ' +
      '(its holdout runs only check predictions, and count in runs, cost and time); for the other plans, all their runs. ' +
      'The centre runs are why the proposed plan\'s D-eff and Avg var here differ from those `tierplan plan` prints for its model runs alone.',
    'D-eff: textbook D-efficiency 100·|X\'X|^(1/p)/N, relative to an ideal orthogonal two-level plan of the same size. ' +
      'Models with squared or cubic terms never reach 100 %, so compare the rows with each other, not with 100.',
    'Info/run, Info total: information (det X\'X)^(1/p) relative to the proposed plan, per run and in total; ' +
      'above 1 means more information than the proposed plan.',
    `Avg var: average variance of a predicted response over the studied region, in units of σ² (lower is better): ` +
      `${comparison.predictionVarianceMethod}.`,
    `Min power: the smallest over the model terms. ${comparison.powerConvention ?? `Effect of ${comparison.delta}σ across the coded range, two-sided t-test at α = ${comparison.alpha}.`}`,
    'Off limits: runs that break the study\'s constraints or equipment limits; a plan with any cannot be run as listed, ' +
      'and its figures describe runs that cannot be made.',
    'Level changes: changes of a hard-to-change factor\'s setting (the proposed plan as scheduled, the others grouped, ' +
      'the fewest they could need); their cost and time are included.',
    'Runs saved, Cost saved: the other plan minus the proposed plan, and in % of the other plan; ' +
      'negative means the other plan is smaller or cheaper.',
  ];
  if (comparison.currency === null) notes.push('Cost and time are blank because the study has no `costs` section.');
  for (const note of notes) lines.push(...wrap(note, '  ', '    '));
  lines.push('');

  lines.push('What each plan means');
  for (const row of rows) {
    lines.push(...wrap(`${name(row)} — ${row.label}.`, '  ', '    '));
    lines.push(...wrap(row.verdict, '    '));
    const confounded = aliasText(row);
    if (confounded) lines.push(...wrap(`Confounded: ${confounded}.`, '    '));
  }
  return `${lines.join('\n')}\n`;
}

/** "21 fitting runs − 14 coefficients = 7 residual degrees of freedom": what the t-tests have to work with. */
function residualText(row: ComparatorRow, p: number): string | null {
  if (row.fittingRuns === undefined) return null;
  return `${row.fittingRuns} fitting runs − ${p} coefficients = ${row.fittingRuns - p} residual degrees of freedom for the tests`;
}

/** "inlet_temp^3 with inlet_temp; feed_solids^2 with inlet_temp^2", partners with their alias coefficients. */
function aliasText(row: ComparatorRow): string {
  if (!row.aliases || row.aliases.length === 0) return '';
  const MAX_PARTNERS = 3;
  return row.aliases
    .map((alias) => {
      if (alias.aliasedWith.length === 0) return `${alias.term} (constant over the plan)`;
      const partners = alias.aliasedWith
        .slice(0, MAX_PARTNERS)
        .map((partner) => (Math.abs(partner.coefficient - 1) < 1e-9 ? partner.term : `${formatNumber(partner.coefficient)}·${partner.term}`));
      const more = alias.aliasedWith.length > MAX_PARTNERS ? ` and ${alias.aliasedWith.length - MAX_PARTNERS} more` : '';
      return `${alias.term} with ${partners.join(', ')}${more}`;
    })
    .join('; ');
}

function savedText(value: number | null, percent: number | null, format: (value: number) => string): string | null {
  if (value === null) return null;
  const sign = value < 0 ? '−' : '';
  const amount = `${sign}${format(Math.abs(value))}`;
  return percent === null ? amount : `${amount} (${percent < 0 ? '−' : ''}${Math.abs(percent).toFixed(1)} %)`;
}

function fixed(value: number | null | undefined, decimals: number): string | null {
  return value === null || value === undefined ? null : value.toFixed(decimals);
}

function grouped(value: number): string {
  return Math.round(value).toLocaleString('en-US');
}

function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? '' : 's'}`;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Greedy word wrap to TEXT_WIDTH with a first-line and a continuation indent. */
function wrap(text: string, indent: string, continuation: string = indent): string[] {
  const out: string[] = [];
  let line = indent;
  let empty = true;
  for (const word of text.split(/\s+/).filter((w) => w.length > 0)) {
    if (!empty && displayWidth(line) + 1 + displayWidth(word) > TEXT_WIDTH) {
      out.push(line);
      line = continuation + word;
    } else {
      line += (empty ? '' : ' ') + word;
    }
    empty = false;
  }
  out.push(line);
  return out;
}

function shortName(row: ComparatorRow, plan: PlanDocument): string {
  const k = plan.levels.filter((level) => level.varied).length;
  switch (row.id) {
    case 'proposed':
      return 'Proposed';
    case 'conventional':
      return `Conventional 2^${plan.study.factors.filter((f) => f.role === 'operating').length}`;
    case 'full-factorial':
      return `Full 2^${k}`;
    case 'fractional': {
      if (row.runs === null) return 'Fraction';
      if (!row.generators || row.generators.length === 0) return `Fraction (= full 2^${k})`;
      return `2^(${k}-${row.generators.length}) res ${roman(row.resolution ?? 0)}`;
    }
    case 'plackett-burman':
      return `Plackett–Burman${row.runs === null ? '' : ` ${row.runs - centreCount(plan)}`}`;
    case 'full-grid':
      return `Full grid ${plan.levels.filter((level) => level.varied).map((level) => level.coded.length).join('×')}`;
    case 'ccd-face':
      return 'CCD face-centred';
    case 'ccd-rotatable':
      return 'CCD rotatable';
    case 'box-behnken':
      return 'Box–Behnken';
  }
}

function centreCount(plan: PlanDocument): number {
  return plan.runs.filter((run) => run.purpose === 'centre').length;
}

function roman(resolution: number): string {
  return ['', 'I', 'II', 'III', 'IV', 'V', 'VI', 'VII', 'VIII'][resolution] ?? String(resolution);
}
