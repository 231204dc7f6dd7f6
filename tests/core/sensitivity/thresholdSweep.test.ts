import { describe, expect, it } from 'vitest';
import { DEFAULT_SWEEP_GRID, thresholdSweep } from '../../../src/core/sensitivity/thresholdSweep.js';

describe('thresholdSweep', () => {
  // decidedOn values chosen to sit between grid points.
  const factors = [
    { role: 'operating' as const, decidedOn: 0.42 },
    { role: 'operating' as const, decidedOn: 0.18 },
    { role: 'operating' as const, decidedOn: 0.03 },
    { role: 'model' as const, decidedOn: 0.27 },
    { role: 'model' as const, decidedOn: 0.005 },
  ];

  it('default grids: critical 0.10–0.60 by 0.05, moderate 0.01–0.20 by 0.01', () => {
    expect(DEFAULT_SWEEP_GRID.critical).toEqual([0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5, 0.55, 0.6]);
    expect(DEFAULT_SWEEP_GRID.moderate).toHaveLength(20);
    expect(DEFAULT_SWEEP_GRID.moderate[0]).toBe(0.01);
    expect(DEFAULT_SWEEP_GRID.moderate[19]).toBe(0.2);
  });

  it('counts each tier per row, split by role, and marks the policy row in both sweeps', () => {
    const rows = thresholdSweep(factors, { critical: 0.3, moderate: 0.05 });
    const criticalRows = rows.filter((row) => row.swept === 'critical');
    const moderateRows = rows.filter((row) => row.swept === 'moderate');
    expect(criticalRows).toHaveLength(11);
    expect(moderateRows).toHaveLength(20);

    const at = (critical: number) => criticalRows.find((row) => Math.abs(row.critical - critical) < 1e-9);
    // critical 0.30: 0.42 critical; 0.18, 0.27 moderate; 0.03, 0.005 negligible
    expect(at(0.3)?.counts).toEqual({ critical: 1, moderate: 2, negligible: 2 });
    expect(at(0.3)?.isPolicy).toBe(true);
    expect(at(0.3)?.countsByRole).toEqual({
      operating: { critical: 1, moderate: 1, negligible: 1 },
      model: { critical: 0, moderate: 1, negligible: 1 },
    });
    // critical 0.15: 0.42, 0.18, 0.27 critical
    expect(at(0.15)?.counts).toEqual({ critical: 3, moderate: 0, negligible: 2 });
    expect(at(0.15)?.isPolicy).toBe(false);
    // critical 0.45: none critical
    expect(at(0.45)?.counts).toEqual({ critical: 0, moderate: 3, negligible: 2 });

    const atModerate = (moderate: number) => moderateRows.find((row) => Math.abs(row.moderate - moderate) < 1e-9);
    // moderate 0.01: only 0.005 negligible
    expect(atModerate(0.01)?.counts).toEqual({ critical: 1, moderate: 3, negligible: 1 });
    expect(atModerate(0.05)?.isPolicy).toBe(true);
    // moderate 0.19: 0.18 drops to negligible
    expect(atModerate(0.19)?.counts).toEqual({ critical: 1, moderate: 1, negligible: 3 });
    expect(rows.filter((row) => row.isPolicy)).toHaveLength(2);
  });

  it('adds an off-grid policy value and skips rows where critical ≤ moderate', () => {
    const rows = thresholdSweep(factors, { critical: 0.33, moderate: 0.12 });
    const criticals = rows.filter((row) => row.swept === 'critical').map((row) => row.critical);
    expect(criticals).toEqual([0.15, 0.2, 0.25, 0.3, 0.33, 0.35, 0.4, 0.45, 0.5, 0.55, 0.6]);
    const moderates = rows.filter((row) => row.swept === 'moderate').map((row) => row.moderate);
    expect(moderates).toHaveLength(20);
    expect(moderates).toContain(0.12);
    const tight = thresholdSweep(factors, { critical: 0.12, moderate: 0.11 });
    expect(tight.filter((row) => row.swept === 'moderate').map((row) => row.moderate)).toEqual([
      0.01, 0.02, 0.03, 0.04, 0.05, 0.06, 0.07, 0.08, 0.09, 0.1, 0.11,
    ]);
    expect(tight.every((row) => row.critical > row.moderate)).toBe(true);
  });
});
