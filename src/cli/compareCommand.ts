import type { Command } from 'commander';

// Placeholder until the compare subcommand lands.
export function registerCompare(program: Command): void {
  void program;
}
