/**
 * The run sheet as CSV, for labs that keep their records in a spreadsheet of their own, and
 * for typing the results in so that `tierplan analyze` can read them back.
 *
 * Layout (fixed here; a reader relies on it):
 * - UTF-8 with a byte-order mark (spreadsheet programs need it to read `°C`, `µm`, `m³/h`),
 *   comma-separated, RFC 4180 quoting, CRLF line ends (the RFC's choice, read by every
 *   spreadsheet and text editor).
 * - A header block of label/value rows first, each label in the first field: `Run sheet`
 *   (study title), `Plan id`, `Checksum` (SHA-256 of plan.json), `Seed`, `Made with`,
 *   `Caution`, one `Held fixed` row per fixed factor (label, then its value as a number),
 *   `Run order`, `Hard to change` (only when any factor is), one `Session` row per session
 *   (`Session,<label> <n>,<runs>,<hours or empty>`), `Fill in`.
 * - Then ONE empty line, then the column keys (`run`, `session`, `set:<factor id>`, …; see
 *   runSheetTable.ts), then the human header row, then one row per run in execution order.
 *   A reader skips to the first empty line, takes the next row as keys and finds columns by
 *   key, never by position or header text.
 * - No timestamp: the same plan and seed give the same bytes.
 * - Every text cell passes the formula-injection guard of `csvCell.ts`.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import { sessionHours } from '../core/schedule/sessionHours.js';
import { csvCell, type CsvValue } from './csvCell.js';
import { FILL_IN_HINT, IDENTITY_LABELS, SAFETY_CAUTION, runSheetTable } from './runSheetTable.js';
import { rounded } from './numberText.js';

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
  line(['Caution', SAFETY_CAUTION]);
  for (const setting of table.fixed) line(['Held fixed', setting.label, setting.value], [undefined, undefined, setting.decimals]);
  line(['Run order', schedule.note]);
  if (schedule.hardToChange) line(['Hard to change', schedule.hardToChange.note]);
  for (const load of sessionHours(plan, schedule).sessions) {
    line(['Session', `${schedule.sessionLabel} ${load.session}`, load.runs, load.hours === null ? null : rounded(load.hours, 1)]);
  }
  line(['Fill in', FILL_IN_HINT]);
  lines.push('');

  line(table.columns.map((column) => column.key));
  line(table.columns.map((column) => column.header));
  for (const row of table.rows) line(row, table.columns.map((column) => (column.kind === 'setPoint' ? column.decimals : undefined)));

  return BOM + lines.join(EOL) + EOL;
}
