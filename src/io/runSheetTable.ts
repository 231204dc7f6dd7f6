/**
 * The run sheet as a table, shared by the CSV and the workbook so both show the same columns,
 * the same words and the same rounding.
 *
 * Conventions fixed here:
 * - Columns: run number, session, point id, kind of run, every VARIED factor (study order) in
 *   engineering units, one empty entry column per response, then operator, date and remarks.
 * - Headers carry the unit in square brackets, `Inlet air temperature [°C]`, as the other
 *   tables of the tool do (`withUnit` of `textTable.ts`); a unit of `-` or none is left out.
 * - Settings are rounded to the factor's precision; the number of decimals shown is the number
 *   of decimals of the precision (0.5 → 1, 100 → 0). Without a precision, the decimals of
 *   the plan's own level values are used (at most 6).
 * - A setting outside the factor's equipment limits is refused here as well, as a last guard
 *   before anything reaches the bench.
 */
import { InputError } from '../core/inputError.js';
import type { RunPurpose } from '../core/design/designTypes.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import { withUnit } from './textTable.js';

export type ColumnKind = 'sequence' | 'session' | 'point' | 'purpose' | 'factor' | 'response' | 'operator' | 'date' | 'remarks';

export interface RunSheetColumn {
  kind: ColumnKind;
  header: string;
  /** Factor or response id, for `factor` and `response` columns. */
  id?: string;
  /** Decimals shown, for `factor` columns. */
  decimals?: number;
  unit?: string;
  name?: string;
}

export interface FixedSetting {
  id: string;
  /** `Name [unit]`. */
  label: string;
  value: number;
  decimals: number;
}

export interface RunSheetTable {
  columns: RunSheetColumn[];
  /** One row per scheduled run, in execution order; entry cells are null. */
  rows: (string | number | null)[][];
  fixed: FixedSetting[];
}

/** Words the technician reads in the "kind of run" column. */
export const PURPOSE_WORDS: Record<RunPurpose, string> = {
  fit: 'Model run',
  centre: 'Centre repeat',
  holdout: 'Validation run',
};

/** The safety caution printed on every run sheet. */
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

export const FILL_IN_HINT = 'Enter each measured result in its column, in the unit shown; note anything unusual under Remarks.';

/** Decimals needed to show multiples of `step` exactly (0.5 → 1, 0.25 → 2, 100 → 0). */
export function decimalsOf(step: number): number {
  for (let d = 0; d <= 10; d++) {
    const scaled = step * 10 ** d;
    if (Math.abs(scaled - Math.round(scaled)) < 1e-9 * Math.max(1, Math.abs(scaled))) return d;
  }
  return 10;
}

/** `value` on the factor's settable step, shown with `decimals` digits; never `-0`. */
export function roundTo(value: number, step: number | undefined, decimals: number): number {
  const stepped = step && step > 0 ? Math.round(value / step) * step : value;
  const rounded = Number(stepped.toFixed(decimals));
  return rounded === 0 ? 0 : rounded;
}

export function runSheetTable(plan: PlanDocument, schedule: Schedule): RunSheetTable {
  const factorById = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const decimalsFor = (id: string, values: number[]): number => {
    const precision = factorById.get(id)?.precision;
    if (precision !== undefined && precision > 0) return decimalsOf(precision);
    return Math.min(6, Math.max(0, ...values.map((value) => decimalsOf(Math.abs(value)))));
  };

  const varied = plan.levels.filter((level) => level.varied);
  const columns: RunSheetColumn[] = [
    { kind: 'sequence', header: 'Run no.' },
    { kind: 'session', header: schedule.sessionLabel },
    { kind: 'point', header: 'Point' },
    { kind: 'purpose', header: 'Kind of run' },
    ...varied.map((level) => ({
      kind: 'factor' as const,
      header: withUnit(level.name, level.unit),
      id: level.id,
      name: level.name,
      unit: level.unit,
      decimals: decimalsFor(level.id, plan.runs.map((run) => run.settings[level.id]).filter(Number.isFinite)),
    })),
    ...plan.study.responses.map((response) => ({
      kind: 'response' as const,
      header: withUnit(response.name, response.unit),
      id: response.id,
      name: response.name,
      unit: response.unit,
    })),
    { kind: 'operator', header: 'Operator' },
    { kind: 'date', header: 'Date' },
    { kind: 'remarks', header: 'Remarks' },
  ];

  const runByPoint = new Map(plan.runs.map((run) => [run.point, run]));
  const rows = schedule.order.map((scheduled) => {
    const run = runByPoint.get(scheduled.point);
    if (!run) throw new Error(`schedule names point ${scheduled.point}, which the plan does not have`);
    return columns.map((column): string | number | null => {
      switch (column.kind) {
        case 'sequence':
          return scheduled.sequence;
        case 'session':
          return scheduled.session;
        case 'point':
          return scheduled.point;
        case 'purpose':
          return PURPOSE_WORDS[scheduled.purpose];
        case 'factor': {
          const id = column.id!;
          const value = run.settings[id];
          if (!Number.isFinite(value)) throw new Error(`run ${run.point} has no setting for ${id}`);
          const factor = factorById.get(id);
          const shown = roundTo(value, factor?.precision, column.decimals!);
          if (factor?.limits && (shown < factor.limits.low || shown > factor.limits.high)) {
            throw new InputError(
              `run ${run.point} sets ${factor.name} to ${shown} ${factor.unit}, outside the equipment limits ${factor.limits.low}–${factor.limits.high}; the run sheet is refused`,
              { key: `factors.${id}.limits` },
            );
          }
          return shown;
        }
        default:
          return null;
      }
    });
  });

  const fixed: FixedSetting[] = plan.levels
    .filter((level) => !level.varied && level.fixedAt !== null)
    .map((level) => {
      const decimals = decimalsFor(level.id, [level.fixedAt!]);
      return {
        id: level.id,
        label: withUnit(level.name, level.unit),
        value: roundTo(level.fixedAt!, factorById.get(level.id)?.precision, decimals),
        decimals,
      };
    });

  return { columns, rows, fixed };
}
