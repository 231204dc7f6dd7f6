/**
 * `tierplan plan <study>`: the whole job — tiers, levels, model, optimal design, centre and
 * holdout runs, run order, comparison — and the files the bench and the manager use.
 */
import { isAbsolute, relative, resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { limitMessage, limitOf, type LimitName } from '../core/inputLimits.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import { isCriterion, type DesignSettings, type Study } from '../core/study.js';
import { loadStudy } from '../io/studyFile.js';
import { planJson, sealPlan } from '../io/planFile.js';
import { toolVersion } from '../io/toolVersion.js';
import { planSummary } from './planSummary.js';
import { optionNumber } from './optionNumber.js';
import { withExample } from './helpExample.js';
import { addTierOptions, tierOverrides, withTierOverrides, type TierOptionValues } from './tierOptions.js';

interface PlanOptions extends TierOptionValues {
  out?: string;
  json?: boolean;
  force?: boolean;
  seed?: string;
  runs?: string;
  centreRuns?: string;
  holdoutRuns?: string;
  criterion?: string;
  starts?: string;
}

export function registerPlan(program: Command): void {
  const command = program
    .command('plan')
    .description('plan the lab campaign for a study and write the run sheets and the report')
    .argument('<study>', 'study file (.yaml, .yml or .json)')
    .option('-o, --out <dir>', 'folder for plan.json, runsheet.xlsx, runsheet.csv, worksheets.html and report.html')
    .option('--json', 'print the plan document on stdout (writes nothing unless --out is given)')
    .option('--force', 'overwrite files of a different plan in the output folder')
    .option('--seed <n>', 'random seed for the design search and the run order (overrides design.seed)')
    .option('--runs <n>', "fitting runs of the optimal design, not counting centre or holdout runs, or 'auto' (overrides design.runs)")
    .option('--centre-runs <n>', 'replicate runs at the centre point, added to the fitting runs (overrides design.centreRuns)')
    .option('--holdout-runs <n>', "validation runs kept out of the fit, added to the others, or 'auto' (overrides design.holdoutRuns)")
    .option('--criterion <name>', 'D or I (overrides design.criterion)')
    .option('--starts <n>', 'random starts of the exchange search (overrides design.starts)');
  addTierOptions(command);
  withExample(command, 'tierplan plan samples/spray-dryer/study.yaml --centre-runs 4 --out out/spray-dryer');
  command.action(async (studyPath: string, options: PlanOptions) => {
    // Everything the options alone can get wrong is refused before the study is read.
    const designOverrides = designOptionOverrides(options);
    const policyOverrides = tierOverrides(options);
    const loaded = await loadStudy(studyPath);
    const study: Study = {
      ...loaded,
      policy: withTierOverrides(loaded.policy, policyOverrides),
      design: { ...loaded.design, ...designOverrides },
    };
    for (const warning of study.warnings) process.stderr.write(`warning: ${warning}\n`);

    const showProgress = Boolean(process.stderr.isTTY);
    const { buildPlan } = await import('../core/plan/buildPlan.js');
    let plan: PlanDocument;
    try {
      plan = sealPlan(
        buildPlan(study, {
          toolVersion: toolVersion(),
          onProgress: showProgress ? (message) => process.stderr.write(`… ${message}\n`) : undefined,
          // The search is the slow stage (seconds on large grids): count its starts in place.
          onSearchProgress: showProgress
            ? (done, total) => process.stderr.write(`\r  start ${done} of ${total}${done === total ? '\n' : ''}`)
            : undefined,
          runsSetBy: options.runs !== undefined && options.runs !== 'auto' ? 'the --runs option' : undefined,
        }),
      );
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      // A value given on the command line is blamed on its option, not on the study file.
      const option = overridingOption(error.location.key, options);
      if (option) throw new InputError(`${option.name} ${option.value}: ${error.message}`);
      // Core knows keys, not files: name the study file the key lives in.
      throw error.inFile(studyPath);
    }

    let written: string[] = [];
    if (options.out) written = await writePlanFiles(options.out, plan, Boolean(options.force));

    if (options.json) {
      process.stdout.write(planJson(plan));
      return;
    }
    process.stdout.write(planSummary(plan));
    if (written.length > 0) {
      process.stdout.write(`\nWrote ${written.length} files to ${options.out}:\n`);
      for (const path of written) process.stdout.write(`  ${shownPath(path)}\n`);
    } else {
      process.stdout.write('\nNothing written: add --out <dir> for plan.json, the run sheets and the report.\n');
    }
  });
}

async function writePlanFiles(dir: string, plan: PlanDocument, force: boolean): Promise<string[]> {
  const schedule = plan.schedule;
  if (!schedule) throw new Error('plan has no run order');
  // Loaded here, not at start-up: the workbook and chart libraries take a second to load
  // and `tierplan tiers` or `plan --json` never need them.
  const [{ writeOutputSet }, { runSheetCsv }, { planWorkbook }, { labWorksheetsHtml }, { managerReportHtml }] = await Promise.all([
    import('../io/outputSet.js'),
    import('../io/runSheetCsv.js'),
    import('../io/workbook/planWorkbook.js'),
    import('../io/labWorksheets.js'),
    import('../io/managerReport.js'),
  ]);
  const files = [
    { name: 'plan.json', content: planJson(plan) },
    { name: 'runsheet.xlsx', content: await planWorkbook(plan, schedule) },
    { name: 'runsheet.csv', content: runSheetCsv(plan, schedule) },
    { name: 'worksheets.html', content: await labWorksheetsHtml(plan, schedule) },
    { name: 'report.html', content: await managerReportHtml(plan, schedule) },
  ];
  return writeOutputSet(resolve(dir), files, { planId: plan.planId, force });
}

/** The study key each overriding option stands for, as core names it in its errors. */
const OPTION_KEYS = {
  seed: { name: '--seed', key: 'design.seed' },
  runs: { name: '--runs', key: 'design.runs' },
  centreRuns: { name: '--centre-runs', key: 'design.centreRuns' },
  holdoutRuns: { name: '--holdout-runs', key: 'design.holdoutRuns' },
  criterion: { name: '--criterion', key: 'design.criterion' },
  starts: { name: '--starts', key: 'design.starts' },
  aggregate: { name: '--aggregate', key: 'policy.aggregate' },
  critical: { name: '--critical', key: 'policy.critical' },
  moderate: { name: '--moderate', key: 'policy.moderate' },
  interaction: { name: '--interaction', key: 'policy.interaction' },
  confidence: { name: '--confidence', key: 'policy.confidence' },
} as const satisfies Partial<Record<keyof PlanOptions, { name: string; key: string }>>;

/** The command-line option that set the study key an error names, if one did. */
function overridingOption(key: string | undefined, options: PlanOptions): { name: string; value: string } | null {
  for (const [field, option] of Object.entries(OPTION_KEYS) as [keyof typeof OPTION_KEYS, (typeof OPTION_KEYS)[keyof typeof OPTION_KEYS]][]) {
    const value = options[field];
    if (key === option.key && value !== undefined) return { name: option.name, value };
  }
  return null;
}

/** The `design` keys the options set, each checked on the same terms as the study key. */
function designOptionOverrides(options: PlanOptions): Partial<DesignSettings> {
  const design: Partial<DesignSettings> = {};
  if (options.seed !== undefined) design.seed = integerOption('--seed', options.seed, 0, MAX_SEED);
  if (options.starts !== undefined) design.starts = integerOption('--starts', options.starts, 1, 'starts');
  if (options.runs !== undefined) design.runs = options.runs === 'auto' ? 'auto' : integerOption('--runs', options.runs, 1, 'fittingRuns');
  if (options.centreRuns !== undefined) design.centreRuns = integerOption('--centre-runs', options.centreRuns, 0, 'centreRuns');
  if (options.holdoutRuns !== undefined) {
    design.holdoutRuns = options.holdoutRuns === 'auto' ? 'auto' : integerOption('--holdout-runs', options.holdoutRuns, 0, 'holdoutRuns');
  }
  if (options.criterion !== undefined) {
    const criterion = options.criterion.toUpperCase();
    if (!isCriterion(criterion)) throw new InputError(`--criterion must be D or I, not ${options.criterion}`);
    design.criterion = criterion;
  }
  return design;
}

/** A written file relative to the working folder, or absolute when that would climb out of it. */
function shownPath(path: string): string {
  const shown = relative(process.cwd(), path);
  return shown === '' || shown.startsWith('..') || isAbsolute(shown) ? path : shown;
}

/** Seeds feed 32-bit generators: a larger seed would silently repeat a smaller one's design. */
const MAX_SEED = 4294967295;

/** A whole number ≥ `minimum` from an option; `bound` is its limit (by name) or a plain maximum. */
function integerOption(name: string, text: string, minimum: number, bound: LimitName | number = Number.MAX_SAFE_INTEGER): number {
  const value = optionNumber(text);
  if (typeof bound === 'string' && Number.isInteger(value) && value > limitOf(bound)) throw new InputError(`${name} ${text}: ${limitMessage(bound, value)}`);
  const maximum = typeof bound === 'string' ? limitOf(bound) : bound;
  if (!Number.isInteger(value) || value < minimum || value > maximum) {
    const range = maximum === Number.MAX_SAFE_INTEGER ? `≥ ${minimum}` : `from ${minimum} to ${maximum}`;
    throw new InputError(`${name} must be a whole number ${range}, not ${text}`);
  }
  return value;
}
