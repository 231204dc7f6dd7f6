/**
 * `tierplan compare <study | plan.json>`: the proposed plan side by side with the classical
 * plans, on the same model, region and centre replicates.
 *
 * A file with a `formatVersion` key is read as a plan document (its runs are judged as they
 * are); anything else is read as a study and planned first, exactly as `tierplan plan` would.
 * The comparison is always recomputed, so `--delta` and `--alpha` apply to a saved plan too.
 * `--out` also writes it to a .csv or .json file that records the plan's id.
 */
import { stat } from 'node:fs/promises';
import { dirname, extname, resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import { loadStudy } from '../io/studyFile.js';
import { checkedPlan, readPlanJson, sealPlan } from '../io/planFile.js';
import { toolVersion } from '../io/toolVersion.js';
import { comparisonExportFormat, writeComparisonExport } from '../io/comparisonExport.js';
import { compareSummary } from './compareSummary.js';
import { optionNumber } from './optionNumber.js';
import { withExample } from './helpExample.js';

interface CompareOptions {
  json?: boolean;
  out?: string;
  force?: boolean;
  delta?: string;
  alpha?: string;
}

/** The plan to compare and the files it was made from (never to be overwritten by `--out`). */
interface ComparedPlan {
  plan: PlanDocument;
  inputFiles: string[];
}

export function registerCompare(program: Command): void {
  const command = program
    .command('compare')
    .description('set the proposed plan against full, fractional and response-surface plans on the same model')
    .argument('<file>', 'study file (.yaml, .yml or .json) or a plan.json written by `tierplan plan`')
    .option('--json', 'print the comparison as JSON on stdout')
    .option('-o, --out <file>', 'also write the comparison to a .csv (one row per plan) or .json file')
    .option('--force', 'overwrite an --out file that holds the comparison of a different plan')
    // No commander defaults: left out, the comparison's own defaults apply (and the plan id is the plan's).
    .option('--delta <sigma>', 'effect size for the power column, in residual standard deviations (default 2)')
    .option('--alpha <level>', 'significance level of the two-sided t-test for the power column (default 0.05)');
  withExample(command, 'tierplan compare samples/spray-dryer/study.yaml --delta 1.5 --out comparison.csv');
  command.action(async (file: string, options: CompareOptions) => {
    // Everything the options alone can get wrong is refused before any file is read.
    const delta = options.delta === undefined ? undefined : positiveNumber(options.delta, 'delta');
    const alpha = options.alpha === undefined ? undefined : positiveNumber(options.alpha, 'alpha');
    if (alpha !== undefined && alpha >= 1) throw new InputError(`--alpha must lie between 0 and 1, got ${options.alpha}`);
    if (options.out !== undefined) comparisonExportFormat(options.out);

    const { plan, inputFiles } = await planFrom(file);
    // The design and comparison modules load mathjs and friends: only when a command needs them.
    const { buildComparison } = await import('../core/compare/buildComparison.js');
    const comparison = buildComparison(plan, { delta, alpha });
    if (options.out !== undefined) {
      await writeComparisonExport(options.out, comparison, planIdOf(plan, comparison, options, buildComparison), {
        inputFiles,
        force: Boolean(options.force),
      });
    }
    process.stdout.write(options.json ? `${JSON.stringify(comparison, null, 2)}\n` : compareSummary(comparison, plan));
    if (options.out !== undefined) process.stderr.write(`wrote ${options.out}\n`);
  });
}

/**
 * The id of the plan compared: a saved plan's own, or the id `tierplan plan` gives the same
 * study (its sealed document holds the comparison at the default effect size and test level).
 */
function planIdOf(
  plan: PlanDocument,
  comparison: PlanDocument['comparison'],
  options: CompareOptions,
  buildComparison: (plan: PlanDocument) => NonNullable<PlanDocument['comparison']>,
): string {
  if (plan.planId) return plan.planId;
  const asDefault = options.delta === undefined && options.alpha === undefined;
  return sealPlan({ ...plan, comparison: asDefault ? comparison : buildComparison(plan) }).planId;
}

async function planFrom(file: string): Promise<ComparedPlan> {
  const planDocument = await parsedPlanDocument(file);
  if (planDocument !== null) return { plan: checkedPlan(planDocument, file), inputFiles: [resolve(file)] };
  const study = await loadStudy(file);
  for (const warning of study.warnings) process.stderr.write(`warning: ${warning}\n`);
  const studyFolder = dirname(resolve(file));
  const inputFiles = [resolve(file), ...[study.source.indicesFile, study.source.interactionsFile].filter((path): path is string => path !== undefined).map((path) => resolve(studyFolder, path))];
  const showProgress = Boolean(process.stderr.isTTY);
  const { buildPlan } = await import('../core/plan/buildPlan.js');
  try {
    const plan = buildPlan(study, {
      toolVersion: toolVersion(),
      skipComparison: true,
      onProgress: showProgress ? (message) => process.stderr.write(`… ${message}\n`) : undefined,
    });
    return { plan, inputFiles };
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
  // A missing or unreadable file is reported by the study reader, in its own words.
  const readable = await stat(file).then((info) => info.isFile(), () => false);
  if (!readable) return null;
  // Size, depth and key checks hold for any JSON the command reads, plan or study.
  const parsed = await readPlanJson(file);
  return typeof parsed === 'object' && parsed !== null && 'formatVersion' in parsed ? parsed : null;
}

function positiveNumber(text: string, key: string): number {
  const value = optionNumber(text);
  if (!Number.isFinite(value) || value <= 0) {
    throw new InputError(`--${key} must be a positive number, got "${text}"`);
  }
  return value;
}
