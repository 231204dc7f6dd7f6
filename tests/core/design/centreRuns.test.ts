import { describe, expect, it } from 'vitest';
import { buildCandidateRegion } from '../../../src/core/region/candidateRegion.js';
import { centrePoint } from '../../../src/core/design/centreRuns.js';
import { planLevels } from '../../../src/core/design/levels.js';
import type { Factor } from '../../../src/core/study.js';
import { DEFAULT_DESIGN } from '../../../src/core/study.js';
import { sampleConstraint, sampleFactors, sampleTiers } from './sprayDryerFixture.js';

function setup(patch: Record<string, Partial<Factor>> = {}) {
  const factors = sampleFactors().map((f) => ({ ...f, ...(patch[f.id] ?? {}) }));
  return { factors, levels: planLevels(factors, sampleTiers(), DEFAULT_DESIGN.levels) };
}

describe('centrePoint', () => {
  it('is coded 0 on the sample, where the constraint allows it', () => {
    const { factors, levels } = setup();
    const region = buildCandidateRegion(factors, levels, [sampleConstraint]);
    const centre = centrePoint(region, levels, factors);
    expect(centre.coded).toEqual([0, 0, 0, 0]);
    expect(centre.note).toBe('');
  });

  it('reports a centre that rounding to the precision moves off 0', () => {
    // 160–201 °C in 1 °C steps: the midpoint 180.5 is set as 181 °C, coded 0.5 / 20.5 = 0.0244.
    const { factors, levels } = setup({ inlet_temp: { high: 201 } });
    const region = buildCandidateRegion(factors, levels, []);
    const centre = centrePoint(region, levels, factors);
    expect(centre.coded[0]).toBeCloseTo(0.5 / 20.5, 10);
    expect(centre.coded.slice(1)).toEqual([0, 0, 0]);
    expect(centre.note).toContain('centre runs at inlet_temp 181 °C, feed_solids 37.5 % w/w, feed_rate 12 kg/h, atomiser_speed 20000 rpm');
    expect(centre.note).toContain('inlet_temp at coded 0.024 instead of 0');
  });

  it('moves to the nearest feasible point when the constraints exclude the centre', () => {
    // feed_rate ≤ 0.2·T − 26 is 10 kg/h at T = 180 °C, so feed 12 kg/h is excluded at the centre. Hand search over
    // levels and midpoints: (T 180, feed 10) is feasible at coded distance 0.5; (T 193, feed 12) at 0.65; nothing
    // closer is feasible (feed 12 kg/h needs T ≥ 190 °C, coded 0.5, and the settings on offer nearest to it are
    // 187 °C (bound 11.4 kg/h, too low) and 193 °C — so feed drops to 10 kg/h or T moves by 0.65).
    const { factors, levels } = setup();
    const region = buildCandidateRegion(factors, levels, ['feed_rate <= 0.2 * inlet_temp - 26']);
    const centre = centrePoint(region, levels, factors);
    expect(centre.coded).toEqual([0, 0, -0.5, 0]);
    expect(region.isFeasible(centre.coded)).toBe(true);
    expect(centre.note).toContain('excluded by the constraints or equipment limits');
    expect(centre.note).toContain('coded distance 0.500');
    expect(centre.note).toContain('feed_rate 10 kg/h');
  });

  it('searches large fine grids by seeded sampling and descent', () => {
    const many: Factor[] = Array.from({ length: 12 }, (_, i) => ({
      id: `x${i + 1}`, name: `x${i + 1}`, unit: '-', role: 'operating', low: 0, high: 2, nominal: 1, precision: 1,
    }));
    const tiers = { ...sampleTiers(), factors: many.map((f) => ({ ...sampleTiers().factors[2], id: f.id })) };
    const levels = planLevels(many, tiers, DEFAULT_DESIGN.levels);
    // Centre x = 1 everywhere breaks x1 + x2 ≤ 1; the nearest fix lowers one of x1, x2 to 0: coded distance 1.
    const region = buildCandidateRegion(many, levels, ['x1 + x2 <= 1']);
    const centre = centrePoint(region, levels, many, { seed: 7 });
    expect(region.isFeasible(centre.coded)).toBe(true);
    expect(Math.hypot(...centre.coded)).toBeCloseTo(1, 12);
    expect(centre.coded.slice(2)).toEqual(new Array(10).fill(0));
  });
});
