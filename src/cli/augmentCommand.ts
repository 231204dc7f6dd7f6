/**
 * `tierplan augment <plan.json> <results> --runs K [--model …]`: the runs that validation
 * asks for — K runs, D-optimal given the runs done, for the same or an extended model — as a
 * new plan revision with run sheets, worksheets and a report (io/revisionReport.ts) for the
 * added runs only.
 */
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { loadPlan, planJson, sealPlan } from '../io/planFile.js';
import { readResultsSheet } from '../io/resultsSheet.js';
import { toolVersion } from '../io/toolVersion.js';
import { withExample } from './helpExample.js';
import { optionNumber } from './optionNumber.js';

interface AugmentOptions {
  runs: string;
  model?: string;
  out?: string;
  json?: boolean;
  force?: boolean;
}

export function registerAugment(program: Command): void {
  const command = program
    .command('augment')
    .description('add the runs that validation asks for: a new plan revision with sheets for the added runs')
    .argument('<plan>', 'plan.json written by `tierplan plan`')
    .argument('<results>', 'the filled runsheet.xlsx or runsheet.csv of that plan')
    .requiredOption('--runs <k>', 'number of runs to add')
    .option('--model <terms>', 'model terms of the revision, comma-separated (default: the current model, extended where lack of fit or the lab points)')
    .option('-o, --out <dir>', 'folder for the revision: plan.json, runsheet.xlsx, runsheet.csv, worksheets.html and report.html (the added runs, why, the parent)')
    .option('--json', 'print the revision plan.json on stdout (writes nothing unless --out is given)')
    .option('--force', 'overwrite files of a different plan in the output folder');
  withExample(command, 'tierplan augment out/spray-dryer/plan.json samples/spray-dryer/results.xlsx --runs 4 --out out/spray-dryer-2');
  command.action(async (planPath: string, resultsPath: string, options: AugmentOptions) => {
    const runs = optionNumber(options.runs);
    if (!Number.isInteger(runs) || runs < 1) throw new InputError(`--runs must be a whole number of at least 1, not ${options.runs}`);
    const model = options.model?.split(',').map((term) => term.trim()).filter((term) => term !== '');
    const parent = await loadPlan(planPath);
    const [{ analyzeCampaign }, { augmentPlan, checkAugmentable }] = await Promise.all([import('../core/results/campaignAnalysis.js'), import('../core/results/augmentPlan.js')]);
    try {
      checkAugmentable(parent);
    } catch (error) {
      throw error instanceof InputError ? error.inFile(planPath) : error;
    }
    const sheet = await readResultsSheet(resultsPath, parent);
    const analysis = analyzeCampaign(parent, sheet, { file: resultsPath, sheet: sheet.sheet, toolVersion: toolVersion() });
    const { plan: unsealed, modelNote } = augmentPlan(parent, sheet, analysis, { runs, model });
    const plan = sealPlan(unsealed);
    let written: string[] = [];
    if (options.out) {
      const [{ writeOutputSet }, { runSheetCsv }, { planWorkbook }, { labWorksheetsHtml }, { revisionReportHtml }] = await Promise.all([
        import('../io/outputSet.js'),
        import('../io/runSheetCsv.js'),
        import('../io/workbook/planWorkbook.js'),
        import('../io/labWorksheets.js'),
        import('../io/revisionReport.js'),
      ]);
      const schedule = plan.schedule!;
      const files = [
        { name: 'plan.json', content: planJson(plan) },
        { name: 'runsheet.xlsx', content: await planWorkbook(plan, schedule) },
        { name: 'runsheet.csv', content: runSheetCsv(plan, schedule) },
        { name: 'worksheets.html', content: await labWorksheetsHtml(plan, schedule) },
        { name: 'report.html', content: await revisionReportHtml(plan, parent, analysis, modelNote) },
      ];
      for (const input of [planPath, resultsPath]) {
        if (files.some((file) => resolve(options.out!, file.name) === resolve(input))) throw new InputError('is an input of the augmentation; choose another --out folder', { file: input });
      }
      written = await writeOutputSet(resolve(options.out), files, { planId: plan.planId, force: Boolean(options.force) });
    }
    if (options.json) {
      process.stdout.write(planJson(plan));
      return;
    }
    const addedRuns = plan.runs.filter((run) => run.point.startsWith('A') && !parent.runs.some((old) => old.point === run.point));
    const lines = [
      `Plan ${plan.planId}: revision of ${parent.planId} with ${addedRuns.length} added runs (D-optimal given the ${parent.runs.length - analysis.results.notDone.length} runs done).`,
      modelNote.charAt(0).toUpperCase() + modelNote.slice(1) + '.',
      `Model: ${plan.model.terms.length + 1} terms.`,
      ...plan.schedule!.order.map((run) => {
        const planned = plan.runs.find((r) => r.point === run.point)!;
        return `  run ${run.sequence}  ${run.point}  ${plan.levels.filter((l) => l.varied).map((l) => `${l.id} ${planned.settings[l.id]}`).join('  ')}`;
      }),
    ];
    process.stdout.write(`${lines.join('\n')}\n`);
    if (written.length > 0) {
      process.stdout.write(`\nWrote ${written.length} files to ${options.out}:\n`);
      for (const path of written) process.stdout.write(`  ${path}\n`);
    } else {
      process.stdout.write('\nNothing written: add --out <dir> for the revision plan.json and the run sheets of the added runs.\n');
    }
  });
}
