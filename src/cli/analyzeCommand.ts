/**
 * `tierplan analyze <plan.json> <results>`: reads the filled run sheet back, checks it
 * against the plan, fits and validates every response, and writes analysis.json (with
 * analysis.xlsx and analysis.html) or prints it. A plan revision (`tierplan augment`) is
 * analysed with its parent: `--parent <plan.json> --parent-results <sheet>` (io/campaignResults.ts).
 */
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { loadPlan } from '../io/planFile.js';
import { parentFilesOf, readCampaignResults } from '../io/campaignResults.js';
import { toolVersion } from '../io/toolVersion.js';
import { analysisJson } from '../io/analysisFiles.js';
import { withExample } from './helpExample.js';
import { analyzeSummary } from './analyzeSummary.js';

interface AnalyzeOptions {
  out?: string;
  json?: boolean;
  force?: boolean;
  parent?: string;
  parentResults?: string;
}

export function registerAnalyze(program: Command): void {
  const command = program
    .command('analyze')
    .description('fit and validate the model from the filled run sheet, and set the lab beside the process model')
    .argument('<plan>', 'plan.json written by `tierplan plan`')
    .argument('<results>', 'the filled runsheet.xlsx or runsheet.csv of that plan (of a revision: the sheet of its added runs)')
    .option('--parent <plan>', 'for a revision written by `tierplan augment`: the plan.json it was made from (its id and checksum must match the revision\'s parent)')
    .option('--parent-results <file>', 'for a revision: the filled run sheet of the parent plan; the parent\'s runs and the added runs are fitted together')
    .option('-o, --out <dir>', 'folder for analysis.json, analysis.xlsx and analysis.html')
    .option('--json', 'print analysis.json on stdout and write nothing')
    .option('--force', 'overwrite analysis files of a different plan in the output folder');
  command.addHelpText(
    'after',
    '\nA revision written by `tierplan augment` lists only its added runs on its sheet: give that sheet as <results>, and the\n' +
      'plan it was made from with --parent <plan.json> --parent-results <its filled sheet>; all runs are fitted together.',
  );
  withExample(command, 'tierplan analyze out/spray-dryer/plan.json samples/spray-dryer/results.xlsx --out out/spray-dryer');
  command.action(async (planPath: string, resultsPath: string, options: AnalyzeOptions) => {
    const parentFiles = parentFilesOf(options);
    const plan = await loadPlan(planPath);
    const { sheet, source, parent } = await readCampaignResults(plan, planPath, resultsPath, parentFiles);
    const { analyzeCampaign } = await import('../core/results/campaignAnalysis.js');
    let analysis;
    try {
      analysis = analyzeCampaign(plan, sheet, { ...source, toolVersion: toolVersion(), ...(parent ? { parent } : {}) });
    } catch (error) {
      throw error instanceof InputError ? error.inFile(planPath) : error;
    }
    if (options.json) {
      process.stdout.write(analysisJson(analysis));
      return;
    }
    let written: string[] = [];
    if (options.out) {
      const { analysisFiles } = await import('../io/analysisFiles.js');
      const { writeOutputSet } = await import('../io/outputSet.js');
      const files = await analysisFiles(analysis, plan);
      const targets = files.map((file) => resolve(options.out!, file.name));
      for (const input of [planPath, resultsPath, ...(parentFiles ? [parentFiles.plan, parentFiles.results] : [])]) {
        if (targets.includes(resolve(input))) throw new InputError('is an input of the analysis; choose another --out folder', { file: input });
      }
      written = await writeOutputSet(resolve(options.out), files, { planId: plan.planId, force: Boolean(options.force), recordFile: 'analysis.json' });
    }
    process.stdout.write(analyzeSummary(analysis));
    if (written.length > 0) {
      process.stdout.write(`\nWrote ${written.length} files to ${options.out}:\n`);
      for (const path of written) process.stdout.write(`  ${path}\n`);
    } else {
      process.stdout.write('\nNothing written: add --out <dir> for analysis.json, analysis.xlsx and analysis.html.\n');
    }
  });
}
