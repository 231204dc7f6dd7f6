import type { Command } from 'commander';

// Placeholder until the tiers subcommand lands.
export function registerTiers(program: Command): void {
  void program;
}
