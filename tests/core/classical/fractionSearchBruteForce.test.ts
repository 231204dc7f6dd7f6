/**
 * Cross-check of the minimum-aberration search's pruning (symmetry reduction and the
 * branch-and-bound cut) against plain enumeration of every generator set.
 *
 * This is an internal consistency check, not an outside reference: the published designs are
 * checked in fractionalFactorial.test.ts. Here every set of p distinct interaction columns of the
 * m base factors is tried, without any pruning, and the lexicographically smallest word-length
 * pattern must equal the one the search returns at that run size.
 */
import { describe, expect, it } from 'vitest';
import { minimumAberrationFraction } from '../../../src/core/classical/fractionalFactorial.js';
import { definingRelationGroup, wordLength, wordLengthCounts } from '../../../src/core/classical/wordLengthPattern.js';

/** Negative when pattern `a` has less aberration than `b` (lexicographic order), 0 when equal. */
function compareWordLengthPatterns(a: readonly number[], b: readonly number[]): number {
  const n = Math.max(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const difference = (a[i] ?? 0) - (b[i] ?? 0);
    if (difference !== 0) return difference;
  }
  return 0;
}

function bruteForceMinimumPattern(k: number, m: number): number[] {
  const p = k - m;
  const columns: number[] = [];
  for (let column = 1; column < 2 ** m; column++) if (wordLength(column) >= 2) columns.push(column);
  let best: number[] | null = null;
  const chosen: number[] = [];
  const visit = (start: number): void => {
    if (chosen.length === p) {
      const words = definingRelationGroup(chosen.map((column, i) => column | (1 << (m + i))));
      const pattern = wordLengthCounts(words, k).slice(2);
      if (!best || compareWordLengthPatterns(pattern, best) < 0) best = pattern;
      return;
    }
    for (let i = start; i < columns.length; i++) {
      chosen.push(columns[i]);
      visit(i + 1);
      chosen.pop();
    }
  };
  visit(0);
  return best!;
}

describe('search equals exhaustive enumeration', () => {
  it.each([
    [5, 3], [6, 3], [7, 3],
    [6, 4], [7, 4], [8, 4], [9, 4], [10, 4], [12, 4], [14, 4],
    [7, 5], [8, 5], [9, 5], [10, 5], [11, 5],
    [8, 6], [9, 6], [10, 6],
  ])('%i factors on %i base factors', (k, m) => {
    const runs = 2 ** m;
    const fraction = minimumAberrationFraction(k, 3, { minRuns: runs, maxRuns: runs })!;
    expect(fraction.runs).toBe(runs);
    expect(fraction.search?.exhaustive).toBe(true);
    expect(fraction.wordLengthPattern).toEqual(bruteForceMinimumPattern(k, m));
  });
});
