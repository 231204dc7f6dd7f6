/**
 * Sessions as fixed blocks: the columns that let every session have its own level, added to
 * the model matrix after the model terms.
 *
 * Coding: sum-to-zero (effects) coding over the sessions that occur, in ascending order —
 * with S sessions, column s (s = 1 … S−1) is +1 in session s, −1 in the last session and 0
 * elsewhere (Montgomery, 2017, "Design and Analysis of Experiments", 9th ed., ch. 4 and 7:
 * block effects constrained to sum to zero). The model terms' estimates do not depend on the
 * coding; the intercept then is the average over sessions, and a prediction without a
 * session (`blockRow` of an unknown session) is the prediction for an average session.
 * One session gives no column.
 */

export interface SessionBlocks {
  /** Session numbers that occur, ascending; one column per session but the last. */
  sessions: number[];
  columns: number;
}

export function sessionBlocks(sessions: readonly number[] | undefined): SessionBlocks {
  const distinct = sessions ? [...new Set(sessions)].sort((a, b) => a - b) : [];
  return { sessions: distinct, columns: Math.max(0, distinct.length - 1) };
}

/** The block part of a row for `session` (zeros for an unknown session or none). */
export function blockRow(blocks: SessionBlocks, session: number | undefined, out: Float64Array, offset: number): void {
  for (let c = 0; c < blocks.columns; c++) out[offset + c] = 0;
  if (session === undefined) return;
  const at = blocks.sessions.indexOf(session);
  if (at < 0) return;
  if (at === blocks.sessions.length - 1) {
    for (let c = 0; c < blocks.columns; c++) out[offset + c] = -1;
  } else {
    out[offset + at] = 1;
  }
}
