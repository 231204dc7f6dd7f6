/**
 * `tierplan analyze <plan.json> <results>`: reads the filled run sheet back, checks it
 * against the plan, fits and validates every response, and writes analysis.json (with
 * analysis.xlsx and analysis.html) or prints it.
 */
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { loadPlan } from '../io/planFile.js';
import { readResultsSheet } from '../io/resultsSheet.js';
import { toolVersion } from '../io/toolVersion.js';
import { analysisJson } from '../io/analysisFiles.js';
import { withExample } from './helpExample.js';
import { analyzeSummary } from './analyzeSummary.js';

interface AnalyzeOptions {
  out?: string;
  json?: boolean;
  force?: boolean;
}

export function registerAnalyze(program: Command): void {
  const command = program
    .command('analyze')
    .description('fit and validate the model from the filled run sheet, and set the lab beside the process model')
    .argument('<plan>', 'plan.json written by `tierplan plan`')
    .argument('<results>', 'the filled runsheet.xlsx or runsheet.csv of that plan')
    .option('-o, --out <dir>', 'folder for analysis.json, analysis.xlsx and analysis.html')
    .option('--json', 'print analysis.json on stdout and write nothing')
    .option('--force', 'overwrite analysis files of a different plan in the output folder');
  withExample(command, 'tierplan analyze out/spray-dryer/plan.json samples/spray-dryer/results.xlsx --out out/spray-dryer');
  command.action(async (planPath: string, resultsPath: string, options: AnalyzeOptions) => {
    const plan = await loadPlan(planPath);
    const sheet = await readResultsSheet(resultsPath, plan);
    const { analyzeCampaign } = await import('../core/results/campaignAnalysis.js');
    let analysis;
    try {
      analysis = analyzeCampaign(plan, sheet, { file: resultsPath, sheet: sheet.sheet, toolVersion: toolVersion() });
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
      for (const input of [planPath, resultsPath]) {
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
