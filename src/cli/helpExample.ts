/**
 * The closing lines of every `--help`: one command that works as typed from a fresh clone,
 * on the bundled (invented) sample, so a reader sees the options in use.
 */
import type { Command } from 'commander';

/** Ends `command`'s help with `Example:` and the command line. */
export function withExample(command: Command, commandLine: string): Command {
  return command.addHelpText('after', `\nExample:\n  $ ${commandLine}\n`);
}
