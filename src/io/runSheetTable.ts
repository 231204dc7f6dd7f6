/**
 * The run sheet as a table, shared by the CSV and the workbook so both show the same columns,
 * the same words and the same rounding, and so that `tierplan analyze` can read either back.
 *
 * Columns, in this order (the machine key of each column in brackets; keys are stable, the
 * human headers may be reworded):
 *   Run no. [run] · session label, e.g. Day [session] · Whole plot [whole_plot] (only when
 *   the plan's runs carry whole plots) · Point [point] · Kind of run [kind] ·
 *   per VARIED factor, in study order: its set-point [set:<factor id>] and a blank "as run"
 *   column [as_run:<factor id>] right after it, headed `as run [unit]` ·
 *   per response, in study order: a blank result column [result:<response id>] ·
 *   Start time [start] · End time [end] · Material lot [lot] · Operator [operator] ·
 *   Checked by [checked_by] · Date [date] · Remarks [remarks].
 *
 * `runSheetTable(plan, plan.schedule).columns` is the one column definition: the CSV and the
 * workbook write it, and a reader finds each column by `key` and knows what to do with it by
 * `group` (COLUMN_GROUP). In the workbook, keys sit in hidden row 6 above the headers; in the
 * CSV, in the row after the first empty line.
 *
 * Conventions fixed here:
 * - Headers carry the unit in square brackets, `Inlet air temperature [°C]`, as the other
 *   tables of the tool do (`withUnit` of `textTable.ts`); a unit of `-` or none is left out.
 * - Settings are the plan's own values on the factor's settable step, shown with the decimals
 *   of that step (`settingValue` / `settingDecimals`; the step is the precision, or the implied
 *   significant-figure step of core levels.ts when the study gives none).
 * - The "as run" column stays blank unless the value actually set differs from the set-point:
 *   the set-point cell itself is never edited (a reader treats a changed set-point as another
 *   plan's sheet). A run that could not be done has Remarks starting with NOT_DONE_WORD
 *   ("not done", any letter case).
 * - Sessions and whole plots come from the run when it carries them (`PlannedRun.session`,
 *   `wholePlot`), else the session from the schedule.
 * - `resets[r]` lists the hard-to-change factors whose setting changes before row r (the
 *   technician must reset and wait); the sheets mark those set-points.
 * - A setting outside the factor's equipment limits is refused here as well, as a last guard
 *   before anything reaches the bench.
 */
import { InputError } from '../core/inputError.js';
import type { PlannedRun, RunPurpose } from '../core/design/designTypes.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import { sameSetting } from '../core/schedule/hardToChangeGrouping.js';
import { settingDecimals } from '../core/design/levels.js';
import type { Factor } from '../core/study.js';
import { withUnit } from './textTable.js';
import { settingValue } from './numberText.js';

export type ColumnKind =
  | 'sequence'
  | 'session'
  | 'wholePlot'
  | 'point'
  | 'purpose'
  | 'setPoint'
  | 'asRun'
  | 'response'
  | 'start'
  | 'end'
  | 'lot'
  | 'operator'
  | 'checkedBy'
  | 'date'
  | 'remarks';

/**
 * What a reader does with a column: `identity` (run, session, whole plot, point, kind: must
 * match the plan), `setPoint` (must match the plan), `asRun` (a deviation, blank when none),
 * `response` (a result), `record` (bench record: times, lot, names, date, remarks).
 */
export type ColumnGroup = 'identity' | 'setPoint' | 'asRun' | 'response' | 'record';

export const COLUMN_GROUP: Record<ColumnKind, ColumnGroup> = {
  sequence: 'identity',
  session: 'identity',
  wholePlot: 'identity',
  point: 'identity',
  purpose: 'identity',
  setPoint: 'setPoint',
  asRun: 'asRun',
  response: 'response',
  start: 'record',
  end: 'record',
  lot: 'record',
  operator: 'record',
  checkedBy: 'record',
  date: 'record',
  remarks: 'record',
};

export interface RunSheetColumn {
  kind: ColumnKind;
  /** COLUMN_GROUP of `kind`. */
  group: ColumnGroup;
  /** Stable machine key, e.g. `set:inlet_temp` (see the module header). */
  key: string;
  header: string;
  /** Factor or response id, for set-point, as-run and response columns. */
  id?: string;
  /** Decimals shown, for set-point and as-run columns. */
  decimals?: number;
  unit?: string;
  name?: string;
}

export interface FixedSetting {
  id: string;
  /** `Name [unit]`. */
  label: string;
  name: string;
  unit: string;
  value: number;
  decimals: number;
}

export interface RunSheetTable {
  columns: RunSheetColumn[];
  /** One row per scheduled run, in execution order; entry cells are null. */
  rows: (string | number | null)[][];
  /** Per row: the session it belongs to. */
  sessions: number[];
  /** Per row: ids of hard-to-change factors whose setting changes before that run. */
  resets: string[][];
  fixed: FixedSetting[];
  /** True when the runs carry whole plots (split-plot plans). */
  wholePlots: boolean;
}

/** Words the technician reads in the "kind of run" column. */
export const PURPOSE_WORDS: Record<RunPurpose, string> = {
  fit: 'Model run',
  centre: 'Centre repeat',
  holdout: 'Validation run',
};

/** The safety caution printed on every run sheet page. */
export const SAFETY_CAUTION =
  "Before starting, check every setting against the equipment's rated limits and the site's safety procedures. " +
  'This plan does not replace a hazard review; local codes and licensed practice prevail.';

/** What the technician writes at the start of Remarks for a run that could not be done (any letter case). */
export const NOT_DONE_WORD = 'not done';

/**
 * Labels of the identity cells in the header block of both sheets: the label in one cell, its
 * value in the next filled cell to the right. `tierplan analyze` finds them by these labels.
 */
export const IDENTITY_LABELS = { planId: 'Plan id', checksum: 'Checksum' } as const;

export const FILL_IN_HINT =
  'Write each measured result in its column, in the unit shown. Never change a set-point: if the value actually set differs, ' +
  `write it in the "as run" column beside it. For a run that could not be done, start Remarks with "${NOT_DONE_WORD}".`;

/** Machine keys of the columns (module header). */
export const COLUMN_KEY = {
  sequence: 'run',
  session: 'session',
  wholePlot: 'whole_plot',
  point: 'point',
  purpose: 'kind',
  setPoint: (id: string) => `set:${id}`,
  asRun: (id: string) => `as_run:${id}`,
  response: (id: string) => `result:${id}`,
  start: 'start',
  end: 'end',
  lot: 'lot',
  operator: 'operator',
  checkedBy: 'checked_by',
  date: 'date',
  remarks: 'remarks',
} as const;

export function runSheetTable(plan: PlanDocument, schedule: Schedule): RunSheetTable {
  const factorById = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const factorOf = (id: string): Factor => {
    const factor = factorById.get(id);
    if (!factor) throw new Error(`plan levels name ${id}, which is not a study factor`);
    return factor;
  };
  const runByPoint = new Map(plan.runs.map((run) => [run.point, run]));
  const runOf = (point: string): PlannedRun => {
    const run = runByPoint.get(point);
    if (!run) throw new Error(`schedule names point ${point}, which the plan does not have`);
    return run;
  };
  const wholePlots = plan.runs.some((run) => run.wholePlot !== undefined);

  const varied = plan.levels.filter((level) => level.varied);
  const columnList: Omit<RunSheetColumn, 'group'>[] = [
    { kind: 'sequence', key: COLUMN_KEY.sequence, header: 'Run no.' },
    { kind: 'session', key: COLUMN_KEY.session, header: schedule.sessionLabel },
    ...(wholePlots ? [{ kind: 'wholePlot' as const, key: COLUMN_KEY.wholePlot, header: 'Whole plot' }] : []),
    { kind: 'point', key: COLUMN_KEY.point, header: 'Point' },
    { kind: 'purpose', key: COLUMN_KEY.purpose, header: 'Kind of run' },
    ...varied.flatMap((level) => {
      const decimals = settingDecimals(factorOf(level.id));
      const common = { id: level.id, name: level.name, unit: level.unit, decimals };
      return [
        { kind: 'setPoint' as const, key: COLUMN_KEY.setPoint(level.id), header: withUnit(level.name, level.unit), ...common },
        { kind: 'asRun' as const, key: COLUMN_KEY.asRun(level.id), header: withUnit('as run', level.unit), ...common },
      ];
    }),
    ...plan.study.responses.map((response) => ({
      kind: 'response' as const,
      key: COLUMN_KEY.response(response.id),
      header: withUnit(response.name, response.unit),
      id: response.id,
      name: response.name,
      unit: response.unit,
    })),
    { kind: 'start', key: COLUMN_KEY.start, header: 'Start time' },
    { kind: 'end', key: COLUMN_KEY.end, header: 'End time' },
    { kind: 'lot', key: COLUMN_KEY.lot, header: 'Material lot' },
    { kind: 'operator', key: COLUMN_KEY.operator, header: 'Operator' },
    { kind: 'checkedBy', key: COLUMN_KEY.checkedBy, header: 'Checked by' },
    { kind: 'date', key: COLUMN_KEY.date, header: 'Date' },
    { kind: 'remarks', key: COLUMN_KEY.remarks, header: 'Remarks' },
  ];
  const columns: RunSheetColumn[] = columnList.map((column) => ({ ...column, group: COLUMN_GROUP[column.kind] }));

  const hardIds = varied.filter((level) => factorOf(level.id).hardToChange === true).map((level) => level.id);
  const sessions: number[] = [];
  const resets: string[][] = [];
  let previous: PlannedRun | null = null;
  const rows = schedule.order.map((scheduled) => {
    const run = runOf(scheduled.point);
    sessions.push(run.session ?? scheduled.session);
    const before = previous;
    resets.push(before ? hardIds.filter((id) => !sameSetting(before.settings[id], run.settings[id])) : []);
    previous = run;
    return columns.map((column): string | number | null => {
      switch (column.kind) {
        case 'sequence':
          return scheduled.sequence;
        case 'session':
          return run.session ?? scheduled.session;
        case 'wholePlot':
          return run.wholePlot ?? null;
        case 'point':
          return scheduled.point;
        case 'purpose':
          return PURPOSE_WORDS[scheduled.purpose];
        case 'setPoint':
          return checkedSetting(run, factorOf(column.id!));
        default:
          return null;
      }
    });
  });

  const fixed: FixedSetting[] = plan.levels
    .filter((level) => !level.varied && level.fixedAt !== null && factorOf(level.id).role === 'operating')
    .map((level) => {
      const factor = factorOf(level.id);
      return {
        id: level.id,
        label: withUnit(level.name, level.unit),
        name: level.name,
        unit: level.unit,
        value: settingValue(level.fixedAt!, factor),
        decimals: settingDecimals(factor),
      };
    });

  return { columns, rows, sessions, resets, fixed, wholePlots };
}

/** The run's setting of `factor` on its step, refused when outside the equipment limits. */
function checkedSetting(run: PlannedRun, factor: Factor): number {
  const value = run.settings[factor.id];
  if (!Number.isFinite(value)) throw new Error(`run ${run.point} has no setting for ${factor.id}`);
  const shown = settingValue(value, factor);
  if (factor.limits && (shown < factor.limits.low || shown > factor.limits.high)) {
    throw new InputError(
      `run ${run.point} sets ${factor.name} to ${shown} ${factor.unit}, outside the equipment limits ${factor.limits.low}–${factor.limits.high}; the run sheet is refused`,
      { key: `factors.${factor.id}.limits` },
    );
  }
  return shown;
}
