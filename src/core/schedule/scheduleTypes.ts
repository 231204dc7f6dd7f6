/**
 * The randomised run order: who runs what, in which sequence and session.
 */
import type { RunPurpose } from '../design/designTypes.js';

export interface ScheduledRun {
  /** 1-based execution sequence. */
  sequence: number;
  /** Point id in the plan's `runs`. */
  point: string;
  purpose: RunPurpose;
  /** 1-based session (day, shift or batch); 1 when the study defines no sessions. */
  session: number;
}

export interface Schedule {
  seed: number;
  order: ScheduledRun[];
  sessionCount: number;
  /** What a session is called on the sheets, e.g. "Day". */
  sessionLabel: string;
  /** Restricted randomisation for hard-to-change factors, when the study marks any. */
  hardToChange: { factors: string[]; levelChanges: number; note: string } | null;
  /** How the order was made, in one or two sentences for the sheets. */
  note: string;
}
