/**
 * How a sequence of runs is cut into sessions (days, shifts or batches).
 *
 * Conventions fixed here:
 * - The number of sessions is the fewest that respect the per-session maximum: ceil(n / maxRuns).
 * - Without hard-to-change groups the sizes are as equal as possible: the first n mod S sessions
 *   take one run more than the others.
 * - With groups (runs that share the setting of a hard-to-change factor, kept together), cuts
 *   are placed on group boundaries whenever the session count and the maximum allow it; only
 *   then are sizes made as equal as possible. The cut search is a small dynamic programme over
 *   cut positions (R. Bellman, 1957, Dynamic Programming) minimising, in this order, the number
 *   of groups split by a cut and the sum of squared deviations of session sizes from n / S.
 */
import { InputError } from '../inputError.js';

/** Fewest sessions of at most `maxRuns` runs that hold `runCount` runs. */
export function sessionCountFor(runCount: number, maxRuns: number): number {
  if (!Number.isInteger(maxRuns) || maxRuns < 1) {
    throw new InputError(`the most runs in one session must be a whole number ≥ 1, not ${maxRuns}`, { key: 'sessions.maxRuns' });
  }
  return Math.max(1, Math.ceil(runCount / maxRuns));
}

/** Sizes of `sessions` sessions holding `runCount` runs, as equal as possible, larger ones first. */
export function equalSessionSizes(runCount: number, sessions: number): number[] {
  const base = Math.floor(runCount / sessions);
  const extra = runCount % sessions;
  return Array.from({ length: sessions }, (_, s) => base + (s < extra ? 1 : 0));
}

export interface SessionCut {
  /** Session sizes in sequence order. */
  sizes: number[];
  /** Number of groups that straddle a session boundary. */
  splitGroups: number;
}

/**
 * Cut a sequence made of consecutive groups (sizes `groupSizes`, in order) into the fewest
 * sessions of at most `maxRuns` runs, splitting as few groups as possible, then balancing sizes.
 */
export function cutIntoSessions(groupSizes: readonly number[], maxRuns: number): SessionCut {
  const n = groupSizes.reduce((a, b) => a + b, 0);
  const sessions = sessionCountFor(n, maxRuns);
  if (sessions === 1) return { sizes: [n], splitGroups: 0 };

  // boundary[i] is true when a cut after the first i runs falls between two groups.
  const boundary = new Array<boolean>(n + 1).fill(false);
  let at = 0;
  for (const size of groupSizes) {
    boundary[at] = true;
    at += size;
  }
  boundary[n] = true;

  const target = n / sessions;
  // best[s][i]: cheapest way to put the first i runs into s sessions, as [splits, squares].
  const splits: number[][] = [];
  const squares: number[][] = [];
  const from: number[][] = [];
  for (let s = 0; s <= sessions; s++) {
    splits.push(new Array<number>(n + 1).fill(Infinity));
    squares.push(new Array<number>(n + 1).fill(Infinity));
    from.push(new Array<number>(n + 1).fill(-1));
  }
  splits[0][0] = 0;
  squares[0][0] = 0;
  for (let s = 1; s <= sessions; s++) {
    for (let i = 1; i <= n; i++) {
      // Cuts inside a group count as one split each; the final position n is always a boundary.
      const cutCost = boundary[i] ? 0 : 1;
      for (let size = 1; size <= Math.min(maxRuns, i); size++) {
        const j = i - size;
        if (splits[s - 1][j] === Infinity) continue;
        const sp = splits[s - 1][j] + cutCost;
        const sq = squares[s - 1][j] + (size - target) ** 2;
        // Ties keep the first found, i.e. the smallest last session, which leaves larger sessions first.
        if (sp < splits[s][i] || (sp === splits[s][i] && sq < squares[s][i] - 1e-9)) {
          splits[s][i] = sp;
          squares[s][i] = sq;
          from[s][i] = j;
        }
      }
    }
  }
  const sizes: number[] = [];
  let i = n;
  for (let s = sessions; s > 0; s--) {
    const j = from[s][i];
    sizes.unshift(i - j);
    i = j;
  }
  return { sizes, splitGroups: splits[sessions][n] };
}
