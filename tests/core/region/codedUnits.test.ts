import { describe, expect, it } from 'vitest';
import { toCoded, toEngineering } from '../../../src/core/region/codedUnits.js';

describe('coding', () => {
  // Coded units: low → −1, high → +1, linear (Montgomery, Design and Analysis of Experiments, 9th ed., ch. 6,
  // coded variables; chapter from memory).
  it('maps low to −1, high to +1 and the midpoint to 0', () => {
    const f = { low: 160, high: 200 };
    expect(toCoded(f, 160)).toBe(-1);
    expect(toCoded(f, 200)).toBe(1);
    expect(toCoded(f, 180)).toBe(0);
    expect(toCoded(f, 173)).toBeCloseTo(-0.35, 12);
    expect(toEngineering(f, 0.35)).toBeCloseTo(187, 12);
    expect(toEngineering(f, toCoded(f, 166.5))).toBeCloseTo(166.5, 12);
  });
});
