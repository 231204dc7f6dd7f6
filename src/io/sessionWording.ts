/**
 * Sessions (days, shifts or batches) in words for the sheets: which runs each holds, its bench
 * hours and, when they exceed what one session may hold, a warning naming the study key that
 * sets the limit. The hours themselves come from core (`sessionHours.ts`); numbers follow
 * numberText.ts.
 */
import type { SessionHours, SessionLoad } from '../core/schedule/sessionHours.js';
import { countOf, hoursText } from './numberText.js';

/** "runs 1–6" or "run 7". */
export function runSpan(load: Pick<SessionLoad, 'firstRun' | 'lastRun'>): string {
  return load.firstRun === load.lastRun ? `run ${load.firstRun}` : `runs ${load.firstRun}–${load.lastRun}`;
}

/** "Day 1: runs 1–6, 19.4 h" (hours left out when the study has no costs). */
export function sessionLine(load: SessionLoad, label: string): string {
  const hours = load.hours === null ? '' : `, ${hoursText(load.hours)} h`;
  return `${label} ${load.session}: ${runSpan(load)}${hours}`;
}

/** The warning for a session over the limit, or null. */
export function overLimitWarning(load: SessionLoad, label: string, hours: SessionHours): string | null {
  if (!load.overLimit || load.hours === null) return null;
  const source = hours.limitFromStudy ? 'sessions.hours' : 'the default working day; set sessions.hours to change it';
  return (
    `${label} ${load.session} holds ${hoursText(load.hours)} h of bench work, more than the ${hoursText(hours.limit)} h ` +
    `one ${label.toLowerCase()} may hold (${source}): plan a second shift or split it`
  );
}

/** One sentence for all sessions: "5 days: Day 1: runs 1–6, 19.4 h; …". */
export function sessionsSentence(hours: SessionHours, label: string): string {
  const plural = label.toLowerCase().endsWith('s') ? label.toLowerCase() : `${label.toLowerCase()}s`;
  const count = hours.sessions.length === 1 ? `1 ${label.toLowerCase()}` : countOf(hours.sessions.length, label.toLowerCase(), plural);
  return `${count}: ${hours.sessions.map((load) => sessionLine(load, label)).join('; ')}.`;
}

/** One warning for every session over the limit, or null: "Day 1 (15 h) and Day 2 (12 h) hold more than …". */
export function overLimitSummary(hours: SessionHours, label: string): string | null {
  const over = hours.sessions.filter((load) => load.overLimit && load.hours !== null);
  if (over.length === 0) return null;
  if (over.length === 1) return overLimitWarning(over[0], label, hours);
  const source = hours.limitFromStudy ? 'sessions.hours' : 'the default working day; set sessions.hours to change it';
  const names = over.map((load) => `${label} ${load.session} (${hoursText(load.hours!)} h)`);
  const list = `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
  return `${list} hold more bench work than the ${hoursText(hours.limit)} h one ${label.toLowerCase()} may hold (${source}): plan second shifts or split them`;
}
