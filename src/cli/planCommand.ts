import type { Command } from 'commander';

// Placeholder until the plan subcommand lands.
export function registerPlan(program: Command): void {
  void program;
}
