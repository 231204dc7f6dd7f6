/**
 * Small hand-made study pieces for the tier tests (invented numbers, chosen so every
 * expected value can be worked out by hand).
 */
import type { Factor, FactorRole, IndexRow, Response, TierPolicy } from '../../../src/core/study.js';
import { DEFAULT_POLICY } from '../../../src/core/study.js';

export function factor(id: string, role: FactorRole = 'operating'): Factor {
  return { id, name: `Factor ${id}`, unit: '-', role, low: 0, high: 1, nominal: 0.5 };
}

export function response(id: string, weight = 1): Response {
  return { id, name: `Response ${id}`, unit: '-', weight };
}

export function row(factorId: string, responseId: string, first: number, total: number, bounds?: [number, number]): IndexRow {
  return {
    factor: factorId,
    response: responseId,
    first,
    total,
    ...(bounds ? { totalLow: bounds[0], totalHigh: bounds[1] } : {}),
  };
}

export function policy(overrides: Partial<TierPolicy> = {}): TierPolicy {
  return { ...DEFAULT_POLICY, ...overrides };
}
