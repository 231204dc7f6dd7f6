/**
 * The comparison as a file (`tierplan compare --out comparison.csv` or `.json`).
 *
 * Conventions fixed here:
 * - JSON: the document `tierplan compare --json` prints, with `planId` added first: the plan
 *   the comparison is of, the id `tierplan plan` gives the same study and seed.
 * - CSV: one row per plan in the comparison's order, a header row of snake_case names, the
 *   plan id in the first column of every row (so a sheet cut out of the file still says
 *   whose it is). Numbers are written as computed; text is quoted and guarded against formula
 *   injection (csvCell.ts); missing terms are joined with "; ".
 * - Written whole or not at all, never over an input, and an existing file is replaced only
 *   when it records the same plan id, or with `--force` (singleFileOutput.ts), as the
 *   plan's own files are.
 */
import { extname } from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import { InputError } from '../core/inputError.js';
import type { Comparison } from '../core/compare/comparisonTypes.js';
import { COMPARATOR_SHORT_NAME } from '../core/compare/comparatorNames.js';
import { csvCell, type CsvValue } from './csvCell.js';
import { writeSingleFile } from './singleFileOutput.js';

export type ComparisonExportFormat = 'csv' | 'json';

/** The export format named by the file's extension; anything but .csv or .json is refused. */
export function comparisonExportFormat(path: string): ComparisonExportFormat {
  const extension = extname(path).toLowerCase();
  if (extension === '.csv') return 'csv';
  if (extension === '.json') return 'json';
  throw new InputError(`cannot write "${extension || '(no extension)'}" files; name the file .csv or .json`, { file: path });
}

const PLAN_ID_COLUMN = 'plan_id';

export function comparisonCsv(comparison: Comparison, planId: string): string {
  const header = [
    PLAN_ID_COLUMN,
    'id',
    'name',
    'label',
    'runs',
    'fitting_runs',
    'fits_model',
    'missing_terms',
    'd_efficiency',
    'relative_information_per_run',
    'relative_information_total',
    'average_prediction_variance',
    'min_power',
    'min_power_term',
    'off_limits_runs',
    'runs_outside_range',
    'level_changes',
    'cost',
    'currency',
    'hours',
    'runs_saved',
    'percent_runs_saved',
    'cost_saved',
    'percent_cost_saved',
    'verdict',
  ];
  const lines = [header.map((name) => csvCell(name)).join(',')];
  for (const row of comparison.comparators) {
    const cells: CsvValue[] = [
      planId,
      row.id,
      COMPARATOR_SHORT_NAME[row.id],
      row.label,
      row.runs,
      row.runs === null ? null : (row.fittingRuns ?? row.runs),
      row.fitsModel === null ? null : row.fitsModel ? 'yes' : 'no',
      row.missingTerms.join('; '),
      row.dEfficiency,
      row.relativeInformationPerRun,
      row.relativeInformationTotal,
      row.averagePredictionVariance,
      row.minPower,
      row.minPowerTerm ?? null,
      row.runs === null ? null : (row.offLimitsRuns ?? 0),
      row.runs === null ? null : (row.runsOutsideRange ?? 0),
      row.levelChanges,
      row.cost,
      row.cost === null ? null : comparison.currency,
      row.hours,
      row.runsSaved,
      row.percentRunsSaved,
      row.costSaved,
      row.percentCostSaved,
      row.verdict,
    ];
    lines.push(cells.map((cell) => csvCell(cell)).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}

export function comparisonJson(comparison: Comparison, planId: string): string {
  return `${JSON.stringify({ planId, ...comparison }, null, 2)}\n`;
}

/** The plan id an earlier comparison file records, or null when it records none. */
function recordedPlanId(format: ComparisonExportFormat, text: string): string | null {
  try {
    if (format === 'json') {
      const id = (JSON.parse(text) as { planId?: unknown } | null)?.planId;
      return typeof id === 'string' && id !== '' ? id : null;
    }
    const [header, first] = parseCsv(text.replace(/^\uFEFF/, ''), { to_line: 2, relax_column_count: true }) as string[][];
    return header?.[0] === PLAN_ID_COLUMN && first?.[0] ? first[0] : null;
  } catch {
    return null;
  }
}

/** Writes the comparison of plan `planId` to `path` (CSV or JSON by extension). */
export async function writeComparisonExport(
  path: string,
  comparison: Comparison,
  planId: string,
  options: { inputFiles: readonly string[]; force: boolean },
): Promise<void> {
  const format = comparisonExportFormat(path);
  const content = format === 'json' ? comparisonJson(comparison, planId) : comparisonCsv(comparison, planId);
  await writeSingleFile(path, content, {
    inputs: { files: options.inputFiles, described: 'the comparison (the study file, one of its index tables or the plan file)' },
    owner: { id: planId, idOf: (text) => recordedPlanId(format, text), what: 'comparison' },
    force: options.force,
    extensions: '.csv or .json',
  });
}
