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
import { readPlanFile } from '../io/planFile.js';
import { toolVersion } from '../io/toolVersion.js';
import { renderTable } from '../io/textTable.js';

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
      if (alpha >= 1) throw new InputError(`--alpha must lie between 0 and 1, got ${options.alpha}`, { key: 'alpha' });
      const plan = await planFrom(file);
      // The design and comparison modules load mathjs and friends: only when a command needs them.
      const { buildComparison } = await import('../core/compare/buildComparison.js');
      const comparison = buildComparison(plan, { delta, alpha });
      process.stdout.write(options.json ? `${JSON.stringify(comparison, null, 2)}\n` : comparisonText(comparison, plan));
    });
}

async function planFrom(file: string): Promise<PlanDocument> {
  if (await isPlanDocument(file)) return readPlanFile(file);
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

/** A JSON file whose top level has `formatVersion` is a plan document. */
async function isPlanDocument(file: string): Promise<boolean> {
  if (extname(file).toLowerCase() !== '.json') return false;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    return false; // let the study reader report the missing file in its own words
  }
  try {
    const parsed: unknown = JSON.parse(text);
    return typeof parsed === 'object' && parsed !== null && 'formatVersion' in parsed;
  } catch {
    return false;
  }
}

function positiveNumber(text: string, key: string): number {
  const value = Number(text);
  if (text.trim() === '' || !Number.isFinite(value) || value <= 0) {
    throw new InputError(`--${key} must be a positive number, got "${text}"`, { key });
  }
  return value;
}

/** The human table: one row per plan, then the verdicts, then the decision. */
export function comparisonText(comparison: Comparison, plan: PlanDocument): string {
  const currency = comparison.currency ?? undefined;
  const rows = comparison.comparators.map((row) => [
    shortName(row, plan),
    row.runs,
    row.runs === null ? 'not built' : row.fitsModel ? 'yes' : `no, ${row.missingTerms.length} term${row.missingTerms.length === 1 ? '' : 's'}`,
    row.dEfficiency,
    row.relativeInformationPerRun,
    row.averagePredictionVariance,
    row.minPower === null ? null : 100 * row.minPower,
    row.cost,
    row.hours,
    row.id === 'proposed' ? null : row.runsSaved,
    row.id === 'proposed' ? null : row.percentRunsSaved,
  ]);
  const table = renderTable(
    [
      { header: 'Plan' },
      { header: 'Runs' },
      { header: 'Fits model' },
      { header: 'D-eff', unit: '%' },
      { header: 'Info/run' },
      { header: 'Avg var', unit: 'σ²' },
      { header: 'Min power', unit: '%' },
      { header: 'Cost', unit: currency },
      { header: 'Time', unit: 'h' },
      { header: 'Saved runs' },
      { header: 'Saved', unit: '%' },
    ],
    rows,
    { title: `Plans judged on the same model (p = ${comparison.p}), coded units` },
  );
  const lines: string[] = [plan.study.title, '', table.replace(/\n+$/, ''), ''];
  lines.push(
    'Every plan is judged on the runs its model is fitted to: for the proposed plan its model and centre runs ' +
      '(holdout runs only add cost and time), for the others all their runs.',
  );
  lines.push(
    'Info/run: information per run relative to the proposed plan, (det M / det M_proposed)^(1/p). ' +
      'Saved runs: runs the proposed plan saves against that plan (negative: the other plan is smaller).',
  );
  lines.push(
    `Min power: smallest over the model terms, two-sided t-test at α = ${comparison.alpha}, for a term that moves the response by ${comparison.delta}σ across the coded range.`,
  );
  lines.push(`Avg var: average prediction variance over the region; ${comparison.predictionVarianceMethod}.`,
  );
  lines.push('');
  lines.push('What each plan means:');
  for (const row of comparison.comparators) {
    lines.push(`  ${shortName(row, plan)} — ${row.label}.`);
    lines.push(`    ${row.verdict}`);
  }
  lines.push('');
  lines.push(comparison.summary);
  return `${lines.join('\n')}\n`;
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
      const p = Math.round(k - Math.log2(row.runs - centreCount(plan)));
      if (!row.generators || row.generators.length === 0) return `Fraction (none; full 2^${k})`;
      return `2^(${k}-${p}) res ${roman(row.resolution ?? 0)}: ${row.generators.join(' ')}`;
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
