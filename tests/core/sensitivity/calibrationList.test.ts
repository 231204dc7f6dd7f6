import { describe, expect, it } from 'vitest';
import { calibrationList } from '../../../src/core/sensitivity/calibrationList.js';
import type { FactorTier, Tier } from '../../../src/core/sensitivity/tierTypes.js';
import type { FactorRole } from '../../../src/core/study.js';

function tiered(id: string, role: FactorRole, tier: Tier, total: number): FactorTier {
  return {
    id,
    name: id,
    unit: '-',
    role,
    aggregatedTotal: total,
    aggregatedFirst: total,
    aggregatedTotalLow: null,
    aggregatedTotalHigh: null,
    decidedOn: total,
    tier,
    borderline: false,
    interactionShare: 0,
    perResponse: [],
  };
}

describe('calibrationList', () => {
  it('estimates critical and moderate model parameters, takes literature values for negligible ones', () => {
    const result = calibrationList([
      tiered('temp', 'operating', 'critical', 0.5),
      tiered('k1', 'model', 'critical', 0.4),
      tiered('k2', 'model', 'moderate', 0.1),
      tiered('k3', 'model', 'negligible', 0.01),
      tiered('k4', 'model', 'negligible', 0),
      tiered('flow', 'operating', 'negligible', 0.02),
    ]);
    expect(result.entries.map((entry) => [entry.id, entry.action])).toEqual([
      ['k1', 'estimate'],
      ['k2', 'estimate'],
      ['k3', 'literature'],
      ['k4', 'literature'],
    ]);
    expect(result.estimate).toBe(2);
    expect(result.literature).toBe(2);
    expect(result.entries[1]).toEqual({ id: 'k2', name: 'k2', tier: 'moderate', aggregatedTotal: 0.1, action: 'estimate' });
  });

  it('is empty when the study has no model parameters', () => {
    expect(calibrationList([tiered('temp', 'operating', 'critical', 0.5)])).toEqual({
      entries: [],
      estimate: 0,
      literature: 0,
    });
  });
});
