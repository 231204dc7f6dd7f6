/**
 * Bench hours per session (day, shift or batch) of a scheduled plan, against the hours one
 * session may hold.
 *
 * hours of a session = its runs × costs.hoursPerRun + its level changes × costs.perLevelChange.hours
 *
 * the same arithmetic as the campaign's bench time (compare/campaignCost.ts), split by session,
 * so the sessions' hours add up to the campaign's. A level change (consecutive runs whose
 * setting of a hard-to-change factor differs; `sameSetting` of hardToChangeGrouping.ts) is
 * booked to the session of the run it prepares, so a change at the start of a session is that
 * session's work; the first set-up of the campaign is not a change. The limit is
 * `sessions.hours`, DEFAULT_SESSION_HOURS (8 h, a working day) when the study gives none.
 * Without a `costs` section the hours are unknown (null) and no session is flagged.
 *
 * Sessions come from the run itself when it carries one (`PlannedRun.session`, split-plot
 * plans), else from the schedule entry.
 */
import { DEFAULT_SESSION_HOURS, type Study } from '../study.js';
import type { PlannedRun } from '../design/designTypes.js';
import type { Schedule } from './scheduleTypes.js';
import { sameSetting } from './hardToChangeGrouping.js';

export interface SessionLoad {
  /** 1-based session number. */
  session: number;
  /** Run numbers (1-based sequence) of the first and last run of the session. */
  firstRun: number;
  lastRun: number;
  runs: number;
  levelChanges: number;
  /** Bench hours, or null when the study has no costs. */
  hours: number | null;
  /** True when `hours` exceeds the limit. */
  overLimit: boolean;
}

export interface SessionHours {
  /** Hours one session may hold. */
  limit: number;
  /** Whether the limit came from the study (`sessions.hours`) or is the default. */
  limitFromStudy: boolean;
  sessions: SessionLoad[];
}

export function sessionHours(
  plan: { runs: PlannedRun[]; study: Pick<Study, 'factors' | 'sessions' | 'costs'> },
  schedule: Pick<Schedule, 'order'>,
): SessionHours {
  const limit = plan.study.sessions?.hours ?? DEFAULT_SESSION_HOURS;
  const costs = plan.study.costs;
  const runByPoint = new Map(plan.runs.map((run) => [run.point, run]));
  const hardIds = plan.study.factors.filter((factor) => factor.hardToChange === true).map((factor) => factor.id);

  const sessions: SessionLoad[] = [];
  let previous: PlannedRun | undefined;
  for (const entry of schedule.order) {
    const run = runByPoint.get(entry.point);
    if (!run) throw new Error(`schedule names point ${entry.point}, which the plan does not have`);
    const session = run.session ?? entry.session;
    let load = sessions[sessions.length - 1];
    if (!load || load.session !== session) {
      load = { session, firstRun: entry.sequence, lastRun: entry.sequence, runs: 0, levelChanges: 0, hours: null, overLimit: false };
      sessions.push(load);
    }
    load.runs += 1;
    load.lastRun = entry.sequence;
    if (previous) {
      for (const id of hardIds) {
        const before = previous.settings[id];
        const now = run.settings[id];
        if (before !== undefined && now !== undefined && !sameSetting(before, now)) load.levelChanges += 1;
      }
    }
    previous = run;
  }
  if (costs) {
    for (const load of sessions) {
      load.hours = load.runs * costs.hoursPerRun + (costs.perLevelChange ? load.levelChanges * costs.perLevelChange.hours : 0);
      load.overLimit = load.hours > limit + 1e-9;
    }
  }
  return { limit, limitFromStudy: plan.study.sessions?.hours !== undefined, sessions };
}
