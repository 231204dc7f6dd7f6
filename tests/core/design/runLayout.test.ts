/**
 * The layout of fitting, centre and holdout runs into whole plots and sessions
 * (src/core/design/runLayout.ts): sizes, packing and the fitted structure.
 */
import { describe, expect, it } from 'vitest';
import { fittedStructure, layoutRuns } from '../../../src/core/design/runLayout.js';
import { expectInputError } from '../../support/expectInputError.js';

function sessionLoads(layout: ReturnType<typeof layoutRuns>): number[] {
  const loads = new Array<number>(layout.sessions).fill(0);
  layout.wholePlotOf.forEach((w) => loads[layout.sessionOfWholePlot[w]]++);
  return loads;
}

describe('layoutRuns', () => {
  it('packs 7 whole plots of 3 runs, 3 centre and 4 holdout runs into the 5 sessions of 6 that suffice', () => {
    const layout = layoutRuns({ fitRuns: 21, centreRuns: 3, holdoutRuns: 4, maxRuns: 6, wholePlots: 7 });
    // 28 runs need at least ⌈28 / 6⌉ = 5 sessions; the larger units go in first so none is forced out.
    expect(layout.sessions).toBe(5);
    expect(Math.max(...sessionLoads(layout))).toBeLessThanOrEqual(6);
    expect(sessionLoads(layout).reduce((a, b) => a + b, 0)).toBe(28);
    expect([...layout.wholePlotSizes].filter((size) => size === 3)).toHaveLength(7);
    expect(layout.wholePlots).toBe(7 + 3 + 4);
    expect(layout.split).toBe(true);
    // The centre replicates open, halve and close the campaign.
    const centreSessions = layout.roles.flatMap((role, i) => (role === 'centre' ? [layout.sessionOfWholePlot[layout.wholePlotOf[i]]] : []));
    expect(centreSessions).toEqual([0, 2, 4]);
  });

  it('makes whole plots as equal as possible, the first N mod W one run larger', () => {
    const layout = layoutRuns({ fitRuns: 21, centreRuns: 0, holdoutRuns: 0, wholePlots: 9 });
    expect([...layout.wholePlotSizes].sort((a, b) => b - a)).toEqual([3, 3, 3, 2, 2, 2, 2, 2, 2]);
    expect(layout.sessions).toBe(1);
  });

  it('refuses a whole plot larger than a session and more whole plots than runs', () => {
    expect(expectInputError(() => layoutRuns({ fitRuns: 16, centreRuns: 0, holdoutRuns: 0, maxRuns: 4, wholePlots: 2 })).location.key).toBe('sessions.maxRuns');
    expect(expectInputError(() => layoutRuns({ fitRuns: 5, centreRuns: 0, holdoutRuns: 0, wholePlots: 6 })).location.key).toBe('design.wholePlots');
  });

  it('drops the holdouts from the fitted structure and renumbers whole plots and sessions from 0', () => {
    const layout = layoutRuns({ fitRuns: 6, centreRuns: 1, holdoutRuns: 2, maxRuns: 3, wholePlots: 3 });
    const { structure, slots } = fittedStructure(layout, 0.5);
    expect(slots).toHaveLength(7);
    expect(slots.every((slot) => layout.roles[slot] !== 'holdout')).toBe(true);
    expect(structure.wholePlots).toBe(4);
    expect(new Set(structure.wholePlotOf)).toEqual(new Set([0, 1, 2, 3]));
    expect(structure.sessionOfWholePlot).toHaveLength(4);
    expect(Math.max(...structure.sessionOfWholePlot)).toBe(structure.sessions - 1);
    expect(structure.varianceRatio).toBe(0.5);
  });
});
