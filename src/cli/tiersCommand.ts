/**
 * `tierplan tiers <study>`: the tier decision alone — which factors are critical, moderate
 * or negligible, which model parameters need precise estimation, and how robust that is to
 * the cut-offs. Options override the study's `policy`.
 */
import { dirname, resolve } from 'node:path';
import type { Command } from 'commander';
import { decideTiers } from '../core/sensitivity/decideTiers.js';
import type { Study } from '../core/study.js';
import { loadStudy } from '../io/studyFile.js';
import { painterFor } from '../io/terminalStyle.js';
import { tierDocument, tierExportFormat, writeTierExport } from '../io/tierExport.js';
import { tiersSummary } from './tiersSummary.js';
import { withExample } from './helpExample.js';
import { addTierOptions, tierOverrides, withTierOverrides, type TierOptionValues } from './tierOptions.js';

interface TiersOptions extends TierOptionValues {
  json?: boolean;
  out?: string;
}

export function registerTiers(program: Command): void {
  const command = program
    .command('tiers')
    .description('label each factor critical, moderate or negligible from its total Sobol\' index, and list the model parameters to estimate')
    .argument('<study>', 'study file (.yaml, .yml or .json)')
    .option('--json', 'print the tier decision as JSON on stdout')
    .option('-o, --out <file>', 'also write the decision to a .csv (one row per factor) or .json file');
  addTierOptions(command);
  withExample(command, 'tierplan tiers samples/spray-dryer/study.yaml --critical 0.25 --out tiers.csv');
  command.action(async (studyPath: string, options: TiersOptions) => {
    // Everything the options alone can get wrong is refused before the study is read.
    const overrides = tierOverrides(options);
    if (options.out !== undefined) tierExportFormat(options.out);

    const loaded = await loadStudy(studyPath);
    const study: Study = { ...loaded, policy: withTierOverrides(loaded.policy, overrides) };
    for (const warning of study.warnings) process.stderr.write(`warning: ${warning}\n`);

    const result = decideTiers(study);
    const document = tierDocument(study.title, result, study.warnings);
    if (options.out !== undefined) {
      const studyFolder = dirname(resolve(studyPath));
      const inputFiles = [studyPath, study.source.indicesFile, study.source.interactionsFile]
        .filter((file): file is string => file !== undefined)
        .map((file, i) => (i === 0 ? resolve(file) : resolve(studyFolder, file)));
      await writeTierExport(options.out, document, result, study.responses.map((response) => response.id), inputFiles);
    }

    if (options.json) {
      process.stdout.write(`${JSON.stringify(document, null, 2)}\n`);
    } else {
      process.stdout.write(tiersSummary(study, result, painterFor(process.stdout, process.env)));
    }
    if (options.out !== undefined) process.stderr.write(`wrote ${options.out}\n`);
  });
}
