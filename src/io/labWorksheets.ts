/**
 * Printable lab worksheets: one self-contained HTML file, one printed page per run, in
 * execution order.
 *
 * Each page carries the run's sequence, session (and whole plot, for split-plot plans), point
 * id, purpose and the plan id; the session's runs and bench hours, with a warning when they
 * exceed what one session may hold (`sessions.hours`, core sessionHours.ts); the varied
 * set-points large with their units, what changes from the run before ("from 180 to 160 °C")
 * and a box for the value actually set; the fixed settings smaller; tick boxes for the steps,
 * with a wait step of the factor's `settleMinutes` after a hard-to-change setting changes;
 * fields for every response with its unit; the record fields of the run sheet (start and end
 * time, material lot, operator, checked by, date) under the same names, so everything written
 * here has a column to go to; the safety caution (templates/partials/safetyCaution.hbs). The
 * run order's seed and method go to the page footer.
 *
 * Wording lives in templates/labWorksheets.hbs and the step list below; layout and print CSS
 * in the template. Settings print with numberText.ts `settingText`, the same numbers as the
 * run sheets. The caution text is common practice for lab run sheets, not a citation.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule, ScheduledRun } from '../core/schedule/scheduleTypes.js';
import type { PlannedRun, RunPurpose } from '../core/design/designTypes.js';
import type { Factor } from '../core/study.js';
import { InputError } from '../core/inputError.js';
import { sameSetting } from '../core/schedule/hardToChangeGrouping.js';
import { sessionHours, type SessionLoad } from '../core/schedule/sessionHours.js';
import { renderTemplate } from './templateRendering.js';
import { NOT_DONE_WORD, PURPOSE_WORDS } from './runSheetTable.js';
import { settingText, withUnitText } from './numberText.js';
import { overLimitWarning, sessionLine } from './sessionWording.js';

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
  /** True when the setting differs from the previous run. */
  changed: boolean;
  /** The previous run's setting as printed, or null on the first run. */
  previous: string | null;
  /** What the operator does relative to the previous run, in words: "from 180 to 160 °C". */
  changeText: string;
  hardToChange: boolean;
  /** "wait 40 min", when a hard-to-change setting changes and the study gives a settling time. */
  wait: string;
}

interface WorksheetView {
  sequence: number;
  total: number;
  sessionLabel: string;
  session: number;
  wholePlot: number | null;
  point: string;
  purposeTitle: string;
  purposeHint: string;
  sessionText: string;
  sessionWarning: string | null;
  setPoints: SetPointView[];
  fixedSettings: { name: string; value: string; unit: string }[];
  steps: string[];
  responses: { name: string; unit: string }[];
}

/** The schedule to print, or the plan's own order (flagged as not randomised) when there is none. */
function executionOrder(plan: PlanDocument, schedule: Schedule | undefined): { order: ScheduledRun[]; note: string; sessionLabel: string } {
  if (schedule) return { order: schedule.order, note: schedule.note, sessionLabel: schedule.sessionLabel };
  return {
    order: plan.runs.map((run, index) => ({ sequence: index + 1, point: run.point, purpose: run.purpose, session: run.session ?? 1 })),
    note: 'NOT RANDOMISED: these sheets follow the plan’s own point order because no run schedule was supplied.',
    sessionLabel: 'Session',
  };
}

function worksheetViews(plan: PlanDocument, order: ScheduledRun[], sessionLabel: string): WorksheetView[] {
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
  order.forEach((scheduled, index) => {
    if (!runByPoint.has(scheduled.point)) {
      throw new InputError(`the run schedule names point ${scheduled.point}, which the plan does not contain`, {
        key: `schedule.order[${index}].point`,
      });
    }
  });
  const hours = sessionHours(plan, { order });
  const loadOf = new Map<number, SessionLoad>(hours.sessions.map((load) => [load.session, load]));

  let previous: { run: PlannedRun; session: number } | null = null;
  return order.map((scheduled) => {
    const run = runByPoint.get(scheduled.point)!;
    const session = run.session ?? scheduled.session;
    const before = previous;
    const setPoints = varied.map((level) => {
      const factor = factorOf(level.id);
      const setting = run.settings[level.id];
      if (setting === undefined) {
        throw new InputError(`run ${run.point} has no setting for varied factor ${level.id}`, { key: `runs.${run.point}.settings.${level.id}` });
      }
      const value = settingText(setting, factor);
      const last = before?.run.settings[level.id];
      const previousText = last === undefined ? null : settingText(last, factor);
      const changed = last !== undefined && !sameSetting(last, setting);
      const newSession = before !== null && before.session !== session;
      const changeText =
        previousText === null
          ? `first run: set to ${withUnitText(value, level.unit)}`
          : changed
            ? `CHANGE from ${previousText} to ${withUnitText(value, level.unit)}`
            : `same as run ${scheduled.sequence - 1}${newSession ? `, the last of ${sessionLabel} ${before!.session}` : ''}`;
      const hardToChange = factor.hardToChange === true;
      const needsWait = hardToChange && (changed || before === null) && factor.settleMinutes !== undefined && factor.settleMinutes > 0;
      return { name: level.name, value, unit: level.unit, previous: previousText, changed, changeText, hardToChange, wait: needsWait ? `wait ${factor.settleMinutes} min` : '' };
    });
    const fixedSettings = fixed.map((level) => ({
      name: level.name,
      value: settingText(run.settings[level.id] ?? (level.fixedAt as number), factorOf(level.id)),
      unit: level.unit,
    }));
    const waits = varied
      .map((level, j) => ({ factor: factorOf(level.id), point: setPoints[j] }))
      .filter(({ point }) => point.wait !== '')
      .map(({ factor }) => `Wait ${factor.settleMinutes} min for ${factor.name} to settle after the change.`);
    const steps = [
      `Check that this sheet belongs to plan ${plan.planId} and that it is run ${scheduled.sequence} of ${order.length}.`,
      'Check every setting on this sheet against the equipment’s rated limits and the site’s operating procedures.',
      'Confirm the fixed settings listed on this sheet are in place.',
      ...setPoints.map((point) =>
        point.previous === null
          ? `Set ${point.name} to ${withUnitText(point.value, point.unit)}.`
          : point.changed
            ? `Change ${point.name} from ${point.previous} to ${withUnitText(point.value, point.unit)}.`
            : `Check ${point.name} is still at ${withUnitText(point.value, point.unit)}.`,
      ),
      ...waits,
      'Wait until the process is at steady state by the site’s criterion.',
      'Record the start time, then take the product or samples for this run.',
      `Label every sample with plan ${plan.planId}, run ${scheduled.sequence} and point ${run.point}.`,
      'Measure each response and write it below with its unit; write any set-point actually used in its “as run” box.',
      'Leave the equipment as the next run or the shutdown procedure requires.',
    ];
    previous = { run, session };
    const purpose = PURPOSE_TEXT[scheduled.purpose] ?? PURPOSE_TEXT[run.purpose];
    const load = loadOf.get(session);
    return {
      sequence: scheduled.sequence,
      total: order.length,
      sessionLabel,
      session,
      wholePlot: run.wholePlot ?? null,
      point: run.point,
      purposeTitle: purpose.title,
      purposeHint: purpose.hint,
      sessionText: load ? sessionLine(load, sessionLabel) : '',
      sessionWarning: load ? overLimitWarning(load, sessionLabel, hours) : null,
      setPoints,
      fixedSettings,
      steps,
      responses,
    };
  });
}

/**
 * Renders the lab worksheets. `schedule` defaults to `plan.schedule`; with neither, the sheets
 * follow the plan's point order and say on every page that the order is not randomised.
 */
export async function labWorksheetsHtml(plan: PlanDocument, schedule: Schedule | undefined = plan.schedule): Promise<string> {
  const { order, note, sessionLabel } = executionOrder(plan, schedule);
  return renderTemplate('labWorksheets', {
    title: plan.study.title,
    planId: plan.planId,
    toolVersion: plan.tool.version,
    createdDate: plan.createdAt.slice(0, 10),
    orderNote: note,
    randomised: schedule !== undefined,
    notDoneWord: NOT_DONE_WORD,
    worksheets: worksheetViews(plan, order, sessionLabel),
  });
}
