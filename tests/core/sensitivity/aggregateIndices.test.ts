import { describe, expect, it } from 'vitest';
import { aggregateIndices, aggregateValues } from '../../../src/core/sensitivity/aggregateIndices.js';
import { InputError } from '../../../src/core/inputError.js';
import { response, row } from './studyFixture.js';

// Expected values worked out by hand from the definitions in aggregateIndices.ts.
describe('aggregateValues', () => {
  it('mean, max and weighted mean of a small list', () => {
    expect(aggregateValues([0.1, 0.5, 0.3], [1, 1, 1], 'mean')).toBeCloseTo(0.3, 12);
    expect(aggregateValues([0.1, 0.5, 0.3], [1, 1, 1], 'max')).toBe(0.5);
    // (2·0.1 + 1·0.5 + 1·0.3) / 4 = 1.0 / 4
    expect(aggregateValues([0.1, 0.5, 0.3], [2, 1, 1], 'weighted')).toBeCloseTo(0.25, 12);
  });

  it('drops floating-point summation noise (12 significant digits)', () => {
    // 1.46 / 4 is 0.36500000000000005 in doubles
    expect((0.46 + 0.38 + 0.52 + 0.1) / 4).not.toBe(0.365);
    expect(aggregateValues([0.46, 0.38, 0.52, 0.1], [1, 1, 1, 1], 'mean')).toBe(0.365);
    expect(aggregateValues([0.01, 0.09], [1, 1], 'mean')).toBe(0.05);
  });

  it('an empty list aggregates to 0', () => {
    expect(aggregateValues([], [], 'mean')).toBe(0);
    expect(aggregateValues([], [], 'max')).toBe(0);
  });

  it('all-zero weights are a user error', () => {
    expect(() => aggregateValues([0.2], [0], 'weighted')).toThrow(InputError);
  });
});

describe('aggregateIndices', () => {
  const responses = [response('r1', 3), response('r2', 1)];

  it('aggregates total, first and both bounds by the same rule', () => {
    const rows = [row('a', 'r1', 0.2, 0.4, [0.3, 0.5]), row('a', 'r2', 0.1, 0.2, [0.1, 0.3])];
    const mean = aggregateIndices(rows, responses, 'mean');
    expect(mean.total).toBeCloseTo(0.3, 12);
    expect(mean.first).toBeCloseTo(0.15, 12);
    expect(mean.totalLow).toBeCloseTo(0.2, 12);
    expect(mean.totalHigh).toBeCloseTo(0.4, 12);

    const max = aggregateIndices(rows, responses, 'max');
    expect(max).toEqual({ total: 0.4, first: 0.2, totalLow: 0.3, totalHigh: 0.5 });

    // weights 3 and 1: total (3·0.4 + 0.2)/4 = 0.35, first (0.6 + 0.1)/4 = 0.175,
    // low (0.9 + 0.1)/4 = 0.25, high (1.5 + 0.3)/4 = 0.45
    const weighted = aggregateIndices(rows, responses, 'weighted');
    expect(weighted.total).toBeCloseTo(0.35, 12);
    expect(weighted.first).toBeCloseTo(0.175, 12);
    expect(weighted.totalLow).toBeCloseTo(0.25, 12);
    expect(weighted.totalHigh).toBeCloseTo(0.45, 12);
  });

  it('bounds are null unless every row has them', () => {
    const rows = [row('a', 'r1', 0.2, 0.4, [0.3, 0.5]), row('a', 'r2', 0.1, 0.2)];
    const result = aggregateIndices(rows, responses, 'mean');
    expect(result.totalLow).toBeNull();
    expect(result.totalHigh).toBeNull();
    expect(result.total).toBeCloseTo(0.3, 12);
  });

  it('a response the study does not list weighs 1', () => {
    const rows = [row('a', 'r1', 0, 0.4), row('a', 'other', 0, 0.0)];
    // (3·0.4 + 1·0) / 4 = 0.3
    expect(aggregateIndices(rows, responses, 'weighted').total).toBeCloseTo(0.3, 12);
  });
});
