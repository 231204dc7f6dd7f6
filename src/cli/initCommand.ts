/**
 * `tierplan init <indices table>`: a study skeleton from an index table, so a new study
 * starts from the factors and responses the sensitivity analysis already names. The table is
 * read as a study would read it; the skeleton (studySkeleton.ts) is written whole, never over
 * an existing file without `--force`, and never over the table.
 */
import { dirname, extname, isAbsolute, relative, resolve, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { counted } from '../core/countedNoun.js';
import { indexTableIds } from '../io/indexTables.js';
import { idProblem, PLACEHOLDER } from '../io/studyFile.js';
import { studySchemaPath } from '../io/studySchemaFile.js';
import { placeholderCount, studySkeleton } from '../io/studySkeleton.js';
import { writeSingleFile } from '../io/singleFileOutput.js';
import { withExample } from './helpExample.js';

interface InitOptions {
  out: string;
  force?: boolean;
}

const SKELETON_EXTENSIONS = ['.yaml', '.yml'];

export function registerInit(program: Command): void {
  const command = program
    .command('init')
    .description('write a study skeleton (YAML) from an index table, with a placeholder wherever a value must be filled in')
    .argument('<indices>', 'first-order and total index table (.csv, .xlsx or .json) of the sensitivity analysis')
    .option('-o, --out <file>', 'the study file to write (.yaml or .yml)', 'study.yaml')
    .option('--force', 'overwrite an existing file');
  withExample(command, 'tierplan init samples/spray-dryer/indices.csv --out my-study.yaml');
  command.action(async (table: string, options: InitOptions) => {
    const out = options.out;
    if (!SKELETON_EXTENSIONS.includes(extname(out).toLowerCase())) {
      throw new InputError('the skeleton is YAML (its comments explain each key); name the file .yaml or .yml', { file: out });
    }
    const { factorIds, responseIds, warnings } = await indexTableIds(resolve(table), table, idProblem);
    for (const warning of warnings) process.stderr.write(`warning: ${warning}\n`);

    const studyFolder = dirname(resolve(out));
    const text = studySkeleton({
      factorIds,
      responseIds,
      indicesPath: referenceFrom(studyFolder, resolve(table)),
      schemaReference: referenceFrom(studyFolder, studySchemaPath(), true),
      tableShown: table,
      studyShown: out,
    });
    await writeSingleFile(out, text, {
      inputs: { files: [resolve(table)], described: 'the skeleton (the index table it is written from)' },
      keep: true,
      force: Boolean(options.force),
      extensions: '.yaml or .yml',
    });
    process.stdout.write(
      `Wrote ${out}: ${counted(factorIds.length, 'factor')} and ${counted(responseIds.length, 'response')} from ${table}.\n` +
        `Fill in the ${counted(placeholderCount(text), 'placeholder')} marked ${PLACEHOLDER} (the title; each factor's unit, role, low, high and nominal; ` +
        `each response's unit), then run:\n  tierplan plan ${out} --out plan\n`,
    );
  });
}

/**
 * `target` as the study file will name it: relative to the study's folder, with forward
 * slashes; for the schema, a file URL when the two share no folder but the root (a relative
 * path would then break as soon as either moved).
 */
function referenceFrom(folder: string, target: string, asUrlWhenApart = false): string {
  const path = relative(folder, target);
  const apart = isAbsolute(path) || resolve(folder).split(sep)[1] !== resolve(target).split(sep)[1];
  if (asUrlWhenApart && apart) return pathToFileURL(target).href;
  return isAbsolute(path) ? target : path.split(sep).join('/');
}
