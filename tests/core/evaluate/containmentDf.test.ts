/**
 * Containment degrees of freedom against the classical split-plot ANOVA table (Montgomery,
 * "Design and Analysis of Experiments", split-plot chapter; the df formulas are from memory:
 * whole-plot error a(r − 1) with replicates not blocked, (a − 1)(r − 1) with replicates as
 * blocks; subplot error a(b − 1)(r − 1)).
 */
import { describe, expect, it } from 'vitest';
import { containmentDf } from '../../../src/core/evaluate/containmentDf.js';

describe('containment df', () => {
  // a = 2 whole-plot levels, b = 2 subplot levels, r = replicates; model 1, A, B, AB.
  const terms = [true, true, false, false];
  it.each([
    [2, 1, 2, 2],
    [3, 1, 4, 4],
  ])('r = %i replicates, one session: whole plot a(r − 1), subplot a(b − 1)(r − 1)', (r, sessions, wp, sp) => {
    const df = containmentDf(terms, 4 * r, 2 * r, sessions);
    expect([df.wholePlot, df.subplot]).toEqual([wp, sp]);
    expect(df.perTerm).toEqual([wp, wp, sp, sp]);
  });
  it('replicates as sessions: whole plot (a − 1)(r − 1)', () => {
    const df = containmentDf(terms, 12, 6, 3);
    expect([df.wholePlot, df.subplot]).toEqual([2, 4]);
  });
  it('one stratum when every whole plot is a single run', () => {
    const df = containmentDf(terms, 10, 10, 2);
    expect(df.split).toBe(false);
    expect(df.perTerm).toEqual([5, 5, 5, 5]);
  });
});
