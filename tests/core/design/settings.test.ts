import { describe, expect, it } from 'vitest';
import { planLevels, settableValue } from '../../../src/core/design/levels.js';
import { settingsFor } from '../../../src/core/design/settings.js';
import { DEFAULT_DESIGN } from '../../../src/core/study.js';
import { sampleFactors, sampleTiers } from './sprayDryerFixture.js';

const factors = sampleFactors();
const levels = planLevels(factors, sampleTiers(), DEFAULT_DESIGN.levels);

describe('settingsFor', () => {
  it('gives every operating factor in study order, fixed ones at their fixed setting', () => {
    const s = settingsFor({ inlet_temp: 0.35, feed_solids: -1 / 3, feed_rate: 0.5, atomiser_speed: 0.123 }, levels, factors);
    expect(Object.keys(s)).toEqual(['inlet_temp', 'feed_solids', 'feed_rate', 'atomiser_speed', 'air_flow']);
    // 180 + 0.35·20 = 187 °C; 37.5 − 7.5/3 = 35 %; 12 + 0.5·4 = 14 kg/h; 20000 + 0.123·5000 = 20615 → 20600 rpm.
    expect(s).toEqual({ inlet_temp: 187, feed_solids: 35, feed_rate: 14, atomiser_speed: 20600, air_flow: 400 });
  });

  it('prints 0.1 steps without binary noise', () => {
    // 12 + 0.075·4 = 12.3 (12.299999999999999 in a naive computation path)
    const s = settingsFor({ inlet_temp: 0, feed_solids: 0, feed_rate: 0.075, atomiser_speed: 0 }, levels, factors);
    expect(String(s.feed_rate)).toBe('12.3');
    expect(s.feed_solids).toBe(37.5);
  });

  it('reproduces the level settings from the coded levels', () => {
    for (const level of levels.filter((l) => l.varied)) {
      level.coded.forEach((c, i) => {
        const coded = { inlet_temp: 0, feed_solids: 0, feed_rate: 0, atomiser_speed: 0, [level.id]: c };
        expect(settingsFor(coded, levels, factors)[level.id]).toBe(level.values[i]);
      });
    }
  });

  it('treats a missing varied factor as a programming error, not a user error', () => {
    expect(() => settingsFor({ inlet_temp: 0 }, levels, factors)).toThrow(/no coded value for feed_solids/);
  });
});

describe('settableValue', () => {
  it('rounds exact halves towards the middle of the range, so mirrored settings stay mirrored', () => {
    const f = { low: 30, high: 45, precision: 0.5 };
    expect(settableValue(f, 33.75)).toBe(34);
    expect(settableValue(f, 41.25)).toBe(41);
    expect(settableValue(f, 41.3)).toBe(41.5);
    const t = { low: 160, high: 200, precision: 1 };
    expect(settableValue(t, 166.5)).toBe(167);
    expect(settableValue(t, 193.5)).toBe(193);
  });
});
