#!/usr/bin/env node
/**
 * Entry point: wires the subcommands and turns user errors into one line and exit code 2.
 */
import { Command, CommanderError } from 'commander';
import { InputError } from '../core/inputError.js';
import { toolVersion } from '../io/toolVersion.js';
import { registerTiers } from './tiersCommand.js';
import { registerPlan } from './planCommand.js';
import { registerCompare } from './compareCommand.js';
import { registerInit } from './initCommand.js';
import { registerAnalyze } from './analyzeCommand.js';
import { registerAugment } from './augmentCommand.js';
import { withExample } from './helpExample.js';

const EXIT_USER_ERROR = 2;

async function main(argv: string[]): Promise<void> {
  const program = new Command();
  program
    .name('tierplan')
    .description('From global sensitivity indices to the smallest lab campaign that still calibrates a process model.')
    .version(toolVersion())
    .exitOverride()
    // Usage mistakes get the same one-line form as every other user error; `--help` shows the rest.
    .configureOutput({
      outputError: (message, write) => write(`tierplan: ${message.replace(/^error: /, '').replace(/\s*\n\s*/g, ' ').trim()} (see tierplan --help)\n`),
    });
  withExample(program, 'tierplan plan samples/spray-dryer/study.yaml --out out/spray-dryer');
  registerInit(program);
  registerTiers(program);
  registerPlan(program);
  registerCompare(program);
  registerAnalyze(program);
  registerAugment(program);
  await program.parseAsync(argv);
}

main(process.argv).catch((error: unknown) => {
  if (error instanceof InputError) {
    process.stderr.write(`tierplan: ${error.describe()}\n`);
    process.exitCode = EXIT_USER_ERROR;
    return;
  }
  if (error instanceof CommanderError) {
    // Help and version exit 0; a usage mistake has already been printed by commander.
    process.exitCode = error.exitCode === 0 ? 0 : EXIT_USER_ERROR;
    return;
  }
  throw error;
});
