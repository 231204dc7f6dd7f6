/**
 * The run sheet as CSV, for labs that keep their records in a spreadsheet of their own.
 *
 * Layout (fixed here; documented in DEVELOPERS.md):
 * - UTF-8 with a byte-order mark (spreadsheet programs need it to read `°C`, `µm`, `m³/h`),
 *   comma-separated, RFC 4180 quoting, CRLF line ends (the RFC's choice, read by every
 *   spreadsheet and text editor).
 * - A header block of label/value rows first — study title, plan id, checksum (SHA-256 of plan.json), seed, tool version, how
 *   the order was made, the safety caution, one `Held fixed` row per fixed factor (label, then
 *   its value as a number) — then ONE empty line, then the table: a header row and one row per
 *   run in execution order. A program reading the sheet back skips to the first empty line.
 * - No timestamp: the same plan and seed give the same bytes.
 * - Every text cell passes the formula-injection guard of `csvCell.ts`.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import { csvCell, type CsvValue } from './csvCell.js';
import { FILL_IN_HINT, IDENTITY_LABELS, SAFETY_CAUTION, runSheetTable } from './runSheetTable.js';

const BOM = '\uFEFF';
const EOL = '\r\n';

export function runSheetCsv(plan: PlanDocument, schedule: Schedule): string {
  const table = runSheetTable(plan, schedule);
  const lines: string[] = [];
  const line = (cells: CsvValue[], decimals: (number | undefined)[] = []): void => {
    lines.push(cells.map((cell, i) => csvCell(cell, decimals[i])).join(','));
  };

  line(['Run sheet', plan.study.title]);
  line([IDENTITY_LABELS.planId, plan.planId]);
  line([IDENTITY_LABELS.checksum, plan.checksum]);
  line(['Seed', schedule.seed]);
  line(['Made with', `${plan.tool.name} ${plan.tool.version}`]);
  line(['Run order', schedule.note]);
  if (schedule.hardToChange) line(['Hard to change', schedule.hardToChange.note]);
  line(['Caution', SAFETY_CAUTION]);
  for (const setting of table.fixed) line(['Held fixed', setting.label, setting.value], [undefined, undefined, setting.decimals]);
  line(['Fill in', FILL_IN_HINT]);
  lines.push('');

  line(table.columns.map((column) => column.header));
  for (const row of table.rows) line(row, table.columns.map((column) => column.decimals));

  return BOM + lines.join(EOL) + EOL;
}
