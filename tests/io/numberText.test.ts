/**
 * The one number rule per quantity (src/io/numberText.ts). Expected texts are worked out by hand
 * from the rule table in the module header; the 0.365 case is the binary-noise trap that made
 * one index print as 0.36 in one place and 0.37 in another.
 */
import { describe, expect, it } from 'vitest';
import {
  ABSENT,
  countOf,
  countText,
  efficiencyText,
  hoursText,
  indexText,
  moneyText,
  noiseUnitsText,
  percentText,
  powerText,
  ratioText,
  settingText,
  settingValue,
  significantText,
  varianceText,
} from '../../src/io/numberText.js';

describe('quantity rules', () => {
  it('prints an index with two decimals, halves up despite binary noise', () => {
    expect((0.365).toFixed(2)).toBe('0.36'); // the trap: 0.365 is stored as 0.36499999…
    expect(indexText(0.365)).toBe('0.37');
    expect(indexText(0.3)).toBe('0.30');
    expect(indexText(0.004)).toBe('0.00');
    expect(indexText(null)).toBe(ABSENT);
  });

  it('groups counts and money in one locale, whole units after the currency code', () => {
    expect(countText(1250)).toBe('1,250');
    expect(countOf(1, 'run')).toBe('1 run');
    expect(countOf(25, 'run')).toBe('25 runs');
    expect(moneyText(22210, 'EUR')).toBe('EUR 22,210');
    expect(moneyText(7779.6, 'EUR')).toBe('EUR 7,780');
    expect(moneyText(1200, null)).toBe('1,200');
    expect(moneyText(undefined, 'EUR')).toBe(ABSENT);
  });

  it('prints hours to 0.1 h without a trailing zero, shares and power as whole per cent', () => {
    expect(hoursText(25.8)).toBe('25.8');
    expect(hoursText(81.02)).toBe('81');
    expect(hoursText(1234.56)).toBe('1,234.6');
    expect(percentText(28.571)).toBe('29 %');
    expect(powerText(0.714)).toBe('71 %');
    expect(powerText(0.089)).toBe('9 %');
    expect(efficiencyText(94.97)).toBe('95.0 %');
    expect(ratioText(0.925)).toBe('0.93');
    expect(varianceText(0.76712)).toBe('0.767');
    expect(varianceText(0.0765)).toBe('0.0765');
    expect(noiseUnitsText(1.84)).toBe('1.8σ');
  });

  it('prints a setting with the decimals of its settable step, the given precision or the implied one', () => {
    expect(settingText(12, { low: 8, high: 16, precision: 0.1 })).toBe('12.0');
    expect(settingText(37.5, { low: 30, high: 45, precision: 0.5 })).toBe('37.5');
    expect(settingText(1.25, { low: 0, high: 2, precision: 0.25 })).toBe('1.25');
    expect(settingText(20000, { low: 15000, high: 25000, precision: 100 })).toBe('20000');
    expect(settingText(37.3, { low: 30, high: 45, precision: 0.5 })).toBe('37.5');
    expect(settingText(-0.04, { low: -1, high: 1, precision: 0.1 })).toBe('0.0');
    // No precision: 3 significant figures of 30–45 → steps of 0.1 (levels.ts settingStep).
    expect(settingText(100 / 3, { low: 30, high: 45 })).toBe('33.3');
    expect(settingValue(100 / 3, { low: 30, high: 45 })).toBe(33.3);
  });
});

describe('significantText', () => {
  it('keeps three significant digits by default', () => {
    expect(significantText(0.46)).toBe('0.460');
    expect(significantText(0.0125)).toBe('0.0125');
    expect(significantText(1 / 3)).toBe('0.333');
    expect(significantText(66.666)).toBe('66.7');
    expect(significantText(-2.345678)).toBe('-2.35');
  });

  it('counts digits after rounding, prints integers in full and switches to exponents far from 1', () => {
    expect(significantText(0.99996)).toBe('1.00');
    expect(significantText(15000)).toBe('15000');
    expect(significantText(0)).toBe('0');
    expect(significantText(0.00001234)).toBe('1.23e-5');
    expect(significantText(123456789.5)).toBe('1.23e8');
    expect(significantText(0.123456, 5)).toBe('0.12346');
    expect(significantText(Number.NaN)).toBe('NaN');
    expect(significantText(-Infinity)).toBe('-∞');
  });
});
