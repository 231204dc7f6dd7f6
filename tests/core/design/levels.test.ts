import { describe, expect, it } from 'vitest';
import { impliedStepNotes, planLevels, roundToPrecision, settingDecimals, settingStep } from '../../../src/core/design/levels.js';
import { toCoded, toEngineering } from '../../../src/core/region/codedUnits.js';
import { expectInputError } from '../../support/expectInputError.js';
import type { Factor } from '../../../src/core/study.js';
import { DEFAULT_DESIGN } from '../../../src/core/study.js';
import type { TierResult } from '../../../src/core/sensitivity/tierTypes.js';
import { sampleFactors, sampleTiers } from './sprayDryerFixture.js';

const defaults = DEFAULT_DESIGN.levels;

function withFactor(id: string, patch: Partial<Factor>): Factor[] {
  return sampleFactors().map((f) => (f.id === id ? { ...f, ...patch } : f));
}

describe('roundToPrecision', () => {
  it('rounds to multiples of the precision without binary noise', () => {
    expect(roundToPrecision(12.299999999999999, 0.1)).toBe(12.3);
    expect(roundToPrecision(0.1 + 0.2, 0.1)).toBe(0.3);
    expect(String(roundToPrecision(8 + 3 * (8 / 3), 0.1))).toBe('16');
    expect(roundToPrecision(173.333, 1)).toBe(173);
    expect(roundToPrecision(37.3, 0.5)).toBe(37.5);
    expect(roundToPrecision(21437, 100)).toBe(21400);
    expect(roundToPrecision(0.123456, 0.25)).toBe(0);
    expect(roundToPrecision(0.2, 0.25)).toBe(0.25);
    expect(roundToPrecision(3.3e-7, 1e-7)).toBe(3e-7);
  });
  it('sends halves up, including ones that carry binary noise (12.35 / 0.1 = 123.49999…)', () => {
    expect(roundToPrecision(12.35, 0.1)).toBe(12.4);
    expect(roundToPrecision(180.5, 1)).toBe(181);
  });
  it('only cleans noise when no precision is given', () => {
    expect(roundToPrecision(0.1 + 0.2)).toBe(0.3);
    expect(roundToPrecision(1 / 3)).toBeCloseTo(1 / 3, 11);
  });
});

describe('settingStep (settings without a precision)', () => {
  // The rule of levels.ts: 3 significant figures of the range's largest magnitude, ten times finer
  // while fewer than 20 steps span [low, high] or a value the study gives is off the step.
  // Expected steps worked out by hand from that rule.
  it('keeps three significant figures of the range', () => {
    expect(settingStep({ low: 30, high: 45 })).toBe(0.1);
    expect(settingStep({ low: 160, high: 200 })).toBe(1);
    expect(settingStep({ low: 8, high: 16 })).toBe(0.1);
    expect(settingStep({ low: 15000, high: 25000 })).toBe(100);
    expect(settingStep({ low: 0.01, high: 0.1 })).toBe(0.001);
    expect(settingStep({ low: -50, high: -10 })).toBe(0.1); // −33.3
    expect(settingDecimals({ low: 30, high: 45 })).toBe(1);
    expect(settingDecimals({ low: 15000, high: 25000 })).toBe(0);
  });

  it('goes finer for a narrow range or a nominal and levels off the step, and keeps a given precision', () => {
    // 1000–1010: 3 figures give 10, one step across the range; 0.1 is the first with ≥ 20 steps (100).
    expect(settingStep({ low: 1000, high: 1010 })).toBe(0.1);
    expect(settingStep({ low: 30, high: 45, nominal: 37.25 })).toBe(0.01);
    expect(settingStep({ low: 30, high: 45, levels: [30, 33.333, 45] })).toBe(0.001);
    expect(settingStep({ low: 30, high: 45, precision: 0.5 })).toBe(0.5);
  });

  it('rounds the settings of a factor without precision and warns once for it', () => {
    const factors = withFactor('feed_solids', { precision: undefined, low: 30, high: 44 });
    const levels = planLevels(factors, sampleTiers(), defaults);
    const solids = levels.find((level) => level.id === 'feed_solids')!;
    // 30 + i·14/3 = 30, 34.667, 39.333, 44 → 30, 34.7, 39.3, 44 on 0.1 steps (not 34.6666…)
    expect(solids.values).toEqual([30, 34.7, 39.3, 44]);
    const notes = impliedStepNotes(factors);
    expect(notes).toHaveLength(1);
    expect(notes[0]).toMatch(/^factors\[1\] \(feed_solids\) has no precision: its settings are rounded to steps of 0\.1 % w\/w \(3 significant figures\)/);
    expect(impliedStepNotes(sampleFactors())).toEqual([]);
  });
});

describe('planLevels on the spray-dryer sample', () => {
  const levels = planLevels(sampleFactors(), sampleTiers(), defaults);

  it('gives operating factors only, in study order', () => {
    expect(levels.map((l) => l.id)).toEqual(['inlet_temp', 'feed_solids', 'feed_rate', 'atomiser_speed', 'air_flow']);
  });

  it('gives critical factors 4 equally spaced levels rounded to precision, coded from the rounded values', () => {
    const inlet = levels[0];
    // 160 + i·40/3 = 160, 173.33, 186.67, 200 → 1 °C steps → 160, 173, 187, 200 (hand computation)
    expect(inlet.values).toEqual([160, 173, 187, 200]);
    expect(inlet.coded).toEqual([-1, -0.35, 0.35, 1]);
    expect(inlet.varied).toBe(true);
    expect(inlet.fixedAt).toBeNull();
    expect(inlet.reason).toBe('critical (aggregated total 0.37 ≥ 0.30): 4 levels so a cubic trend can be fitted');
    const solids = levels[1];
    expect(solids.values).toEqual([30, 35, 40, 45]);
    expect(solids.coded[1]).toBeCloseTo(-1 / 3, 12);
    expect(solids.coded[2]).toBeCloseTo(1 / 3, 12);
  });

  it('gives moderate factors 3 levels', () => {
    expect(levels[2].values).toEqual([8, 12, 16]);
    expect(levels[2].coded).toEqual([-1, 0, 1]);
    expect(levels[2].reason).toBe(
      'moderate (aggregated total 0.18, between 0.05 and 0.30): 3 levels so curvature (a quadratic) can be fitted',
    );
    expect(levels[3].values).toEqual([15000, 20000, 25000]);
  });

  it('fixes the negligible air flow at its nominal 400 m³/h', () => {
    const air = levels[4];
    expect(air.varied).toBe(false);
    expect(air.values).toEqual([]);
    expect(air.coded).toEqual([]);
    expect(air.fixedAt).toBe(400);
    expect(air.reason).toBe('negligible (aggregated total 0.04 < 0.05): fixed at its nominal 400 m³/h');
  });
});

describe('planLevels rules', () => {
  it('takes the tier defaults from the design settings', () => {
    const levels = planLevels(sampleFactors(), sampleTiers(), { critical: 5, moderate: 2 });
    // 30 + i·3.75 = 30, 33.75, 37.5, 41.25, 45 → 0.5 steps, halves towards the middle: symmetric levels
    expect(levels[1].values).toEqual([30, 34, 37.5, 41, 45]);
    expect(levels[1].coded[1]).toBeCloseTo(-levels[1].coded[3], 12);
    expect(levels[2].values).toEqual([8, 16]);
    expect(levels[2].reason).toContain('2 levels so a straight-line trend can be fitted');
  });

  it('accepts a level count override and says it came from the study file', () => {
    const levels = planLevels(withFactor('feed_rate', { levels: 5 }), sampleTiers(), defaults);
    expect(levels[2].values).toEqual([8, 10, 12, 14, 16]);
    expect(levels[2].reason).toContain('5 levels set in the study file so a trend up to degree 4');
  });

  it('accepts an explicit list of engineering values and sorts it', () => {
    const levels = planLevels(withFactor('feed_rate', { levels: [16, 8, 10.5] }), sampleTiers(), defaults);
    expect(levels[2].values).toEqual([8, 10.5, 16]);
    expect(levels[2].coded).toEqual([-1, -0.375, 1]);
    expect(levels[2].reason).toContain('3 levels listed in the study file');
  });

  it('varies a negligible factor on request and says so', () => {
    const levels = planLevels(withFactor('air_flow', { levels: 3 }), sampleTiers(), defaults);
    expect(levels[4].varied).toBe(true);
    expect(levels[4].values).toEqual([350, 400, 450]);
    expect(levels[4].fixedAt).toBeNull();
    expect(levels[4].reason).toContain('varied on request');
  });

  it('states the upper-bound rule and borderline factors in the reason', () => {
    const tiers = sampleTiers();
    tiers.policy = { ...tiers.policy, confidence: 'upper' };
    tiers.factors[2] = { ...tiers.factors[2], decidedOn: 0.2, borderline: true };
    const levels = planLevels(sampleFactors(), tiers, defaults);
    expect(levels[2].reason).toContain('upper bound of aggregated total 0.20');
    expect(levels[2].reason).toContain('borderline');
    tiers.factors[4] = { ...tiers.factors[4], borderline: true };
    expect(planLevels(sampleFactors(), tiers, defaults)[4].reason).toContain('give it levels in the study file');
  });

  it('rounds the nominal of a fixed factor to its precision', () => {
    const levels = planLevels(withFactor('air_flow', { nominal: 401.2 }), sampleTiers(), defaults);
    expect(levels[4].fixedAt).toBe(400);
  });

  it('keeps the end levels inside the range when low/high are not multiples of the precision', () => {
    const levels = planLevels(withFactor('feed_rate', { low: 8.05, high: 15.95, precision: 0.1 }), sampleTiers(), defaults);
    const v = levels[2].values;
    expect(v[0]).toBeGreaterThanOrEqual(8.05);
    expect(v[2]).toBeLessThanOrEqual(15.95);
    expect(v).toEqual([8.1, 12, 15.9]);
  });
});

describe('planLevels errors', () => {
  it('refuses a precision that leaves fewer settings than levels', () => {
    const e = expectInputError(() => planLevels(withFactor('inlet_temp', { precision: 20 }), sampleTiers(), defaults));
    expect(e.location.key).toBe('factors[0].precision');
    expect(e.message).toContain('only 3 distinct settings');
  });

  it('refuses a precision whose rounding merges two levels', () => {
    // 0–1.9 in 0.5 steps has 4 settings, but the levels 0, 0.63, 1.27, 1.9 round to 0, 0.5, 1.5 and 2 → 1.5
    // (kept inside the range): the top two merge.
    const e = expectInputError(() =>
      planLevels(withFactor('feed_rate', { low: 0, high: 1.9, nominal: 1, precision: 0.5, levels: 4, limits: undefined }), sampleTiers(), defaults),
    );
    expect(e.message).toContain('merges levels 1.5 and 1.5');
    expect(e.location.key).toBe('factors[2].precision');
  });

  it('refuses explicit levels that are not settable or are listed twice', () => {
    expect(expectInputError(() => planLevels(withFactor('inlet_temp', { levels: [160, 170.5, 200] }), sampleTiers(), defaults)).location.key).toBe(
      'factors[0].levels',
    );
    const twice = expectInputError(() => planLevels(withFactor('inlet_temp', { levels: [160, 180, 180, 200] }), sampleTiers(), defaults));
    expect(twice.message).toContain('listed twice');
    expect(expectInputError(() => planLevels(withFactor('inlet_temp', { levels: [180] }), sampleTiers(), defaults)).location.key).toBe(
      'factors[0].levels',
    );
    expect(expectInputError(() => planLevels(withFactor('inlet_temp', { levels: 1 }), sampleTiers(), defaults)).location.key).toBe(
      'factors[0].levels',
    );
  });

  it('refuses explicit levels outside the studied range', () => {
    const e = expectInputError(() => planLevels(withFactor('inlet_temp', { levels: [150, 180, 200] }), sampleTiers(), defaults));
    expect(e.message).toContain('outside the studied range');
  });

  it('refuses a level outside the equipment limits', () => {
    const e = expectInputError(() =>
      planLevels(withFactor('inlet_temp', { limits: { low: 165, high: 220 } }), sampleTiers(), defaults),
    );
    expect(e.location.key).toBe('factors[0].levels');
    expect(e.message).toContain('refused: outside the rated range');
    const fixed = expectInputError(() =>
      planLevels(withFactor('air_flow', { limits: { low: 300, high: 380 } }), sampleTiers(), defaults),
    );
    expect(fixed.message).toContain('refused: outside the rated range');
  });

  it('refuses a bad default level count and an empty range', () => {
    expect(expectInputError(() => planLevels(sampleFactors(), sampleTiers(), { critical: 1, moderate: 3 })).location.key).toBe(
      'design.levels.critical',
    );
    expect(expectInputError(() => planLevels(withFactor('feed_rate', { high: 8 }), sampleTiers(), defaults)).location.key).toBe(
      'factors[2].high',
    );
  });

  it('refuses an operating factor the tiers do not know', () => {
    const tiers: TierResult = { ...sampleTiers(), factors: sampleTiers().factors.filter((f) => f.id !== 'feed_rate') };
    expect(expectInputError(() => planLevels(sampleFactors(), tiers, defaults)).location.key).toBe('factors[2]');
  });
});
