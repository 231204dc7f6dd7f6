/**
 * The tier-policy options shared by `tierplan tiers` and `tierplan plan`: one definition of
 * `--aggregate`, `--critical`, `--moderate`, `--interaction` and `--confidence`, their
 * reading and their check, so both commands accept and refuse the same values in the same words.
 *
 * Conventions fixed here:
 * - Every option overrides the study key of the same name under `policy`.
 * - Option values are checked before the study is read (a typo costs no file reading), and
 *   the merged policy once it is: a cut-off order broken by an option is blamed on the option.
 * - Cut-offs lie strictly between 0 and 1, as the study keys do.
 */
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { AGGREGATE_RULES, CONFIDENCE_POLICIES, type AggregateRule, type ConfidencePolicy, type TierPolicy } from '../core/study.js';
import { optionNumber } from './optionNumber.js';

export interface TierOptionValues {
  aggregate?: string;
  critical?: string;
  moderate?: string;
  interaction?: string;
  confidence?: string;
}

/** Adds the five policy options to `command`. */
export function addTierOptions(command: Command): Command {
  return command
    .option('--aggregate <rule>', `how indices combine over responses: ${AGGREGATE_RULES.join(', ')} (overrides policy.aggregate)`)
    .option('--critical <x>', 'total index at or above which a factor is critical, between 0 and 1 (overrides policy.critical)')
    .option('--moderate <x>', 'total index at or above which a factor is moderate, between 0 and 1 (overrides policy.moderate)')
    .option('--interaction <x>', 'second-order index at or above which a pair is listed, between 0 and 1 (overrides policy.interaction)')
    .option('--confidence <basis>', 'tier on the estimate (point) or the upper confidence bound (upper) (overrides policy.confidence)');
}

/** The overrides the options ask for; a value that can never be valid is refused here. */
export function tierOverrides(options: TierOptionValues): Partial<TierPolicy> {
  const overrides: Partial<TierPolicy> = {};
  if (options.aggregate !== undefined) overrides.aggregate = choice('--aggregate', options.aggregate, AGGREGATE_RULES);
  if (options.confidence !== undefined) overrides.confidence = choice('--confidence', options.confidence, CONFIDENCE_POLICIES);
  if (options.critical !== undefined) overrides.critical = fraction('--critical', options.critical);
  if (options.moderate !== undefined) overrides.moderate = fraction('--moderate', options.moderate);
  if (options.interaction !== undefined) overrides.interaction = fraction('--interaction', options.interaction);
  return overrides;
}

/** The study's policy with the overrides on top; the cut-off order is checked on the result. */
export function withTierOverrides(fromStudy: TierPolicy, overrides: Partial<TierPolicy>): TierPolicy {
  const policy = { ...fromStudy, ...overrides };
  if (!(policy.moderate < policy.critical)) {
    const source = (key: 'critical' | 'moderate') =>
      overrides[key] !== undefined ? `--${key} ${policy[key]}` : `${key} ${policy[key]} (from the study)`;
    throw new InputError(`the moderate cut-off must be below the critical one: ${source('moderate')} is not below ${source('critical')}`);
  }
  return policy;
}

function choice<T extends AggregateRule | ConfidencePolicy>(name: string, text: string, allowed: readonly T[]): T {
  if (!(allowed as readonly string[]).includes(text)) {
    const words = `${allowed.slice(0, -1).join(', ')} or ${allowed[allowed.length - 1]}`;
    throw new InputError(`${name} must be ${words}, not "${text}"`);
  }
  return text as T;
}

/** A cut-off on the same terms as the study's `policy` keys: strictly between 0 and 1. */
function fraction(name: string, text: string): number {
  const value = optionNumber(text);
  if (!(value > 0 && value < 1)) {
    throw new InputError(`${name} must be a number strictly between 0 and 1 (such as 0.3), not "${text}"`);
  }
  return value;
}
