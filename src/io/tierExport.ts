/**
 * The tier decision as a machine-readable document (`tierplan tiers --json`) and as a file
 * (`--out tiers.csv` or `--out tiers.json`).
 *
 * Conventions fixed here:
 * - The JSON document is `{title, policy, factors, interactionPairs, calibration, sweep,
 *   notes, warnings}`; `factors[]` carries every field of `FactorTier`. Numbers are written
 *   as computed (full double precision).
 * - The CSV has one row per factor, in study order, with a header row of snake_case names;
 *   per-response total indices follow as `total_<response id>` columns. Text cells are
 *   quoted and guarded against formula injection (`csvCell.ts`); numbers are plain.
 * - The file is written whole or not at all and never over the study file or its index
 *   tables (singleFileOutput.ts); an earlier export is replaced.
 */
import { extname } from 'node:path';
import { InputError } from '../core/inputError.js';
import type { TierResult } from '../core/sensitivity/tierTypes.js';
import { csvCell, type CsvValue } from './csvCell.js';
import { writeSingleFile } from './singleFileOutput.js';

export type TierExportFormat = 'csv' | 'json';

export interface TierDocument {
  title: string;
  policy: TierResult['policy'];
  factors: TierResult['factors'];
  interactionPairs: TierResult['interactionPairs'];
  calibration: TierResult['calibration'];
  sweep: TierResult['sweep'];
  notes: string[];
  warnings: string[];
}

export function tierDocument(title: string, result: TierResult, warnings: readonly string[]): TierDocument {
  return {
    title,
    policy: result.policy,
    factors: result.factors,
    interactionPairs: result.interactionPairs,
    calibration: result.calibration,
    sweep: result.sweep,
    notes: result.notes ?? [],
    warnings: [...warnings],
  };
}

/** The export format named by the file's extension; anything but .csv or .json is refused. */
export function tierExportFormat(path: string): TierExportFormat {
  const extension = extname(path).toLowerCase();
  if (extension === '.csv') return 'csv';
  if (extension === '.json') return 'json';
  throw new InputError(`cannot write "${extension || '(no extension)'}" files; name the file .csv or .json`, {
    file: path,
  });
}

function tierCsv(result: TierResult, responseIds: readonly string[]): string {
  const header = [
    'id',
    'name',
    'unit',
    'role',
    'tier',
    'borderline',
    'aggregated_total',
    'aggregated_total_low',
    'aggregated_total_high',
    'aggregated_first',
    'interaction_share',
    'decided_on',
    'decision_basis',
    'margin',
    ...responseIds.map((id) => `total_${id}`),
  ];
  const lines = [header.map((name) => csvCell(name)).join(',')];
  for (const factor of result.factors) {
    const totals = new Map(factor.perResponse.map((entry) => [entry.response, entry.total]));
    const cells: CsvValue[] = [
      factor.id,
      factor.name,
      factor.unit,
      factor.role,
      factor.tier,
      factor.borderline ? 'yes' : 'no',
      factor.aggregatedTotal,
      factor.aggregatedTotalLow,
      factor.aggregatedTotalHigh,
      factor.aggregatedFirst,
      factor.interactionShare,
      factor.decidedOn,
      factor.decisionBasis ?? 'estimate',
      factor.margin ?? null,
      ...responseIds.map((id) => totals.get(id) ?? null),
    ];
    lines.push(cells.map((cell) => csvCell(cell)).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}

/**
 * Writes `document` to `path` as CSV or JSON (by extension), atomically. `inputFiles` (the
 * study file and its tables) are refused as targets.
 */
export async function writeTierExport(
  path: string,
  document: TierDocument,
  result: TierResult,
  responseIds: readonly string[],
  inputFiles: readonly string[] = [],
): Promise<void> {
  const format = tierExportFormat(path);
  const content = format === 'json' ? `${JSON.stringify(document, null, 2)}\n` : tierCsv(result, responseIds);
  await writeSingleFile(path, content, {
    inputs: { files: inputFiles, described: 'the study (the study file or one of its index tables)' },
    extensions: '.csv or .json',
  });
}
