/**
 * `tierplan tiers <study>`: the tier decision alone — which factors are critical, moderate
 * or negligible, which model parameters need precise estimation, and how robust that is to
 * the cut-offs. Options override the study's `policy`.
 */
import { dirname, resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../core/inputError.js';
import { decideTiers } from '../core/sensitivity/decideTiers.js';
import {
  AGGREGATE_RULES,
  CONFIDENCE_POLICIES,
  cutOffsInOrder,
  isCutOff,
  type AggregateRule,
  type ConfidencePolicy,
  type Study,
  type TierPolicy,
} from '../core/study.js';
import { loadStudy } from '../io/studyFile.js';
import { painterFor } from '../io/terminalStyle.js';
import { tierDocument, tierExportFormat, writeTierExport } from '../io/tierExport.js';
import { tiersSummary } from './tiersSummary.js';
import { optionNumber } from './optionNumber.js';

interface TiersOptions {
  json?: boolean;
  out?: string;
  aggregate?: string;
  critical?: string;
  moderate?: string;
  interaction?: string;
  confidence?: string;
}

export function registerTiers(program: Command): void {
  program
    .command('tiers')
    .description('label each factor critical, moderate or negligible from its total Sobol\' index, and list the model parameters to estimate')
    .argument('<study>', 'study file (.yaml, .yml or .json)')
    .option('--json', 'print the tier decision as JSON on stdout')
    .option('-o, --out <file>', 'also write the decision to a .csv (one row per factor) or .json file')
    .option('--aggregate <rule>', 'how indices combine over responses: mean, max or weighted (overrides policy.aggregate)')
    .option('--critical <x>', 'total index at or above which a factor is critical, between 0 and 1 (overrides policy.critical)')
    .option('--moderate <x>', 'total index at or above which a factor is moderate, between 0 and 1 (overrides policy.moderate)')
    .option('--interaction <x>', 'second-order index at or above which a pair is listed, between 0 and 1 (overrides policy.interaction)')
    .option('--confidence <basis>', 'tier on the estimate (point) or the upper confidence bound (upper) (overrides policy.confidence)')
    .action(async (studyPath: string, options: TiersOptions) => {
      // Everything the options alone can get wrong is refused before the study is read.
      const overrides = parseOverrides(options);
      if (options.out !== undefined) tierExportFormat(options.out);

      const loaded = await loadStudy(studyPath);
      const study: Study = { ...loaded, policy: mergePolicy(loaded.policy, overrides) };
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

function parseOverrides(options: TiersOptions): Partial<TierPolicy> {
  const overrides: Partial<TierPolicy> = {};
  if (options.aggregate !== undefined) {
    if (!(AGGREGATE_RULES as readonly string[]).includes(options.aggregate)) {
      throw new InputError(`--aggregate must be mean, max or weighted, not "${options.aggregate}"`);
    }
    overrides.aggregate = options.aggregate as AggregateRule;
  }
  if (options.confidence !== undefined) {
    if (!(CONFIDENCE_POLICIES as readonly string[]).includes(options.confidence)) {
      throw new InputError(`--confidence must be point or upper, not "${options.confidence}"`);
    }
    overrides.confidence = options.confidence as ConfidencePolicy;
  }
  if (options.critical !== undefined) overrides.critical = fraction('--critical', options.critical);
  if (options.moderate !== undefined) overrides.moderate = fraction('--moderate', options.moderate);
  if (options.interaction !== undefined) overrides.interaction = fraction('--interaction', options.interaction);
  return overrides;
}

/** A cut-off on the same terms as the study's `policy` keys: strictly between 0 and 1. */
function fraction(name: string, text: string): number {
  const value = optionNumber(text);
  if (!isCutOff(value)) {
    throw new InputError(`${name} must be a number strictly between 0 and 1 (such as 0.3), not "${text}"`);
  }
  return value;
}

function mergePolicy(fromStudy: TierPolicy, overrides: Partial<TierPolicy>): TierPolicy {
  const policy = { ...fromStudy, ...overrides };
  if (!cutOffsInOrder(policy)) {
    const source = (key: 'critical' | 'moderate') =>
      overrides[key] !== undefined ? `--${key} ${policy[key]}` : `${key} ${policy[key]} (from the study)`;
    throw new InputError(`the moderate cut-off must be below the critical one: ${source('moderate')} is not below ${source('critical')}`);
  }
  return policy;
}
