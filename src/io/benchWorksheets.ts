/**
 * Printable bench worksheets: one self-contained HTML file, one printed page per run, in
 * execution order.
 *
 * Each page carries the run's sequence, session, point id, purpose and the plan id; the
 * varied set-points large with their units; the fixed settings smaller; tick boxes for the
 * preparation steps; fields for every response with its unit; observations; signature and
 * date lines; and the safety caution (templates/partials/safetyCaution.hbs). Wording lives in
 * templates/benchWorksheets.hbs and the step list below; layout and print CSS in the template.
 * Settings print with the decimals the factor's `precision` implies, so the sheet never asks
 * for a finer setting than the equipment can take. The caution text is common practice for
 * lab run sheets, not a citation.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule, ScheduledRun } from '../core/schedule/scheduleTypes.js';
import type { PlannedRun, RunPurpose } from '../core/design/designTypes.js';
import type { Factor } from '../core/study.js';
import { InputError } from '../core/inputError.js';
import { renderTemplate } from './templateRendering.js';
import { PURPOSE_WORDS } from './runSheetTable.js';
import { settingText } from './numberText.js';

// Titles are the run sheets' words (PURPOSE_WORDS), so paper and spreadsheet name a run alike.
const PURPOSE_TEXT: Record<RunPurpose, { title: string; hint: string }> = {
  fit: { title: PURPOSE_WORDS.fit, hint: 'Used to estimate the model.' },
  centre: { title: PURPOSE_WORDS.centre, hint: 'Repeated at the middle of the ranges to measure run-to-run scatter and drift.' },
  holdout: { title: PURPOSE_WORDS.holdout, hint: 'Not used for fitting: checks the model’s predictions afterwards.' },
};

interface SetPointView {
  name: string;
  value: string;
  unit: string;
  /** True when the setting differs from the previous run of the same session. */
  changed: boolean;
  /** What the operator does relative to the previous run, in words. */
  changeText: string;
  hardToChange: boolean;
}

interface WorksheetView {
  sequence: number;
  total: number;
  sessionLabel: string;
  session: number;
  point: string;
  purposeTitle: string;
  purposeHint: string;
  setPoints: SetPointView[];
  fixedSettings: { name: string; value: string; unit: string }[];
  steps: string[];
  responses: { name: string; unit: string }[];
}

/** The schedule to print, or the plan's own order (flagged as not randomised) when there is none. */
function executionOrder(plan: PlanDocument, schedule: Schedule | undefined): { order: ScheduledRun[]; note: string; sessionLabel: string } {
  if (schedule) return { order: schedule.order, note: schedule.note, sessionLabel: schedule.sessionLabel };
  return {
    order: plan.runs.map((run, index) => ({ sequence: index + 1, point: run.point, purpose: run.purpose, session: 1 })),
    note: 'NOT RANDOMISED: these sheets follow the plan’s own point order because no run schedule was supplied.',
    sessionLabel: 'Session',
  };
}

function worksheetViews(plan: PlanDocument, order: ScheduledRun[], sessionLabel: string, hardToChange: Set<string>): WorksheetView[] {
  const factorById = new Map<string, Factor>(plan.study.factors.map((factor) => [factor.id, factor]));
  const factorOf = (id: string): Factor => {
    const factor = factorById.get(id);
    if (!factor) throw new Error(`plan levels name ${id}, which is not a study factor`);
    return factor;
  };
  const runByPoint = new Map<string, PlannedRun>(plan.runs.map((run) => [run.point, run]));
  const varied = plan.levels.filter((level) => level.varied);
  const fixed = plan.levels.filter((level) => !level.varied && level.fixedAt !== null && factorById.get(level.id)?.role !== 'model');
  const responses = plan.study.responses.map((response) => ({ name: response.name, unit: response.unit }));

  let previous: { run: PlannedRun; session: number } | null = null;
  return order.map((scheduled, index) => {
    const run = runByPoint.get(scheduled.point);
    if (!run) {
      throw new InputError(`the run schedule names point ${scheduled.point}, which the plan does not contain`, {
        key: `schedule.order[${index}].point`,
      });
    }
    const setPoints = varied.map((level) => {
      const factor = factorById.get(level.id);
      const setting = run.settings[level.id];
      if (setting === undefined) {
        throw new InputError(`run ${run.point} has no setting for varied factor ${level.id}`, { key: `runs.${run.point}.settings.${level.id}` });
      }
      const newSession = previous === null || previous.session !== scheduled.session;
      const changed = !newSession && previous!.run.settings[level.id] !== setting;
      const changeText = newSession
        ? `first run of ${sessionLabel} ${scheduled.session}`
        : changed
          ? 'CHANGE from previous run'
          : 'same as previous run';
      return {
        name: level.name,
        value: settingText(setting, factorOf(level.id)),
        unit: level.unit,
        changed,
        changeText,
        hardToChange: hardToChange.has(level.id),
      };
    });
    const fixedSettings = fixed.map((level) => ({
      name: level.name,
      value: settingText(run.settings[level.id] ?? (level.fixedAt as number), factorOf(level.id)),
      unit: level.unit,
    }));
    const steps = [
      `Check that this sheet belongs to plan ${plan.planId} and that it is run ${scheduled.sequence} of ${order.length}.`,
      'Check every setting on this sheet against the equipment’s rated limits and the site’s operating procedures.',
      'Confirm the fixed settings listed on this sheet are in place.',
      ...setPoints.map((point) => `Set ${point.name} to ${point.value} ${point.unit}.`),
      'Wait until the process is at steady state by the site’s criterion; record the time it was reached.',
      'Record the start time, then take the product or samples for this run.',
      `Label every sample with plan ${plan.planId}, run ${scheduled.sequence} and point ${run.point}.`,
      'Measure each response and write it below with its unit.',
      'Leave the equipment as the next run or the shutdown procedure requires.',
    ];
    previous = { run, session: scheduled.session };
    const purpose = PURPOSE_TEXT[scheduled.purpose] ?? PURPOSE_TEXT[run.purpose];
    return {
      sequence: scheduled.sequence,
      total: order.length,
      sessionLabel,
      session: scheduled.session,
      point: run.point,
      purposeTitle: purpose.title,
      purposeHint: purpose.hint,
      setPoints,
      fixedSettings,
      steps,
      responses,
    };
  });
}

/**
 * Renders the bench worksheets. `schedule` defaults to `plan.schedule`; with neither, the sheets
 * follow the plan's point order and say on every page that the order is not randomised.
 */
export async function benchWorksheetsHtml(plan: PlanDocument, schedule: Schedule | undefined = plan.schedule): Promise<string> {
  const { order, note, sessionLabel } = executionOrder(plan, schedule);
  const hardToChange = new Set(schedule?.hardToChange?.factors ?? []);
  return renderTemplate('benchWorksheets', {
    title: plan.study.title,
    planId: plan.planId,
    toolVersion: plan.tool.version,
    createdDate: plan.createdAt.slice(0, 10),
    orderNote: note,
    randomised: schedule !== undefined,
    worksheets: worksheetViews(plan, order, sessionLabel, hardToChange),
  });
}
