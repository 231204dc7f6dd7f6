#!/usr/bin/env node
/**
 * Entry point: wires the subcommands and turns every failure into one line on stderr.
 *
 * Exit codes: 0 done; 2 the input is wrong (an InputError or a usage mistake: the message
 * names the file, row, column, key or option); 3 an internal error — our bug, never the
 * user's — reported by the last-resort handler as one line "internal error — please report"
 * with the tool version (set TIERPLAN_DEBUG=1 for the stack trace). In every failing case
 * nothing is left half-written: files are written under temporary names and renamed into
 * place, and the handler removes any temporary file still pending.
 */
import { Command, CommanderError } from 'commander';
import { excerpt, InputError } from '../core/inputError.js';
import { toolVersion } from '../io/toolVersion.js';
import { removePendingFiles } from '../io/pendingFiles.js';
import { registerTiers } from './tiersCommand.js';
import { registerPlan } from './planCommand.js';
import { registerCompare } from './compareCommand.js';
import { registerInit } from './initCommand.js';
import { registerAnalyze } from './analyzeCommand.js';
import { registerAugment } from './augmentCommand.js';
import { withExample } from './helpExample.js';

const EXIT_USER_ERROR = 2;
const EXIT_INTERNAL_ERROR = 3;

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

/** The version for the report line; the report must not fail because package.json cannot be read. */
function versionText(): string {
  try {
    return toolVersion();
  } catch {
    return 'version unknown';
  }
}

/** The last resort: one line, exit 3, no temporary file left behind. */
function reportInternalError(error: unknown): void {
  removePendingFiles();
  const what = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
  process.stderr.write(`tierplan: internal error — please report (tierplan ${versionText()}): ${excerpt(what, 200)}\n`);
  if (process.env.TIERPLAN_DEBUG) process.stderr.write(`${error instanceof Error ? error.stack : what}\n`);
  process.exitCode = EXIT_INTERNAL_ERROR;
}

function reportFailure(error: unknown): void {
  if (error instanceof InputError) {
    removePendingFiles();
    process.stderr.write(`tierplan: ${error.describe()}\n`);
    process.exitCode = EXIT_USER_ERROR;
    return;
  }
  if (error instanceof CommanderError) {
    // Help and version exit 0; a usage mistake has already been printed by commander.
    process.exitCode = error.exitCode === 0 ? 0 : EXIT_USER_ERROR;
    return;
  }
  reportInternalError(error);
}

// A reader of our output that goes away (`tierplan plan --json | head`) is not an error.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    reportInternalError(error);
    process.exit(EXIT_INTERNAL_ERROR);
  });
}
// Failures outside the command's own promise chain (a callback, a stream) end the same way.
process.on('uncaughtException', (error) => {
  reportFailure(error);
  process.exit(process.exitCode ?? EXIT_INTERNAL_ERROR);
});
process.on('unhandledRejection', (reason) => {
  reportFailure(reason);
  process.exit(process.exitCode ?? EXIT_INTERNAL_ERROR);
});

main(process.argv).catch(reportFailure);
