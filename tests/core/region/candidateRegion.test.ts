import { describe, expect, it } from 'vitest';
import { buildCandidateRegion } from '../../../src/core/region/candidateRegion.js';
import { planLevels } from '../../../src/core/design/levels.js';
import { expectInputError } from '../../support/expectInputError.js';
import type { Factor } from '../../../src/core/study.js';
import { DEFAULT_DESIGN } from '../../../src/core/study.js';
import { sampleConstraint, sampleFactors, sampleTiers } from '../design/sprayDryerFixture.js';

function setup(patch: Record<string, Partial<Factor>> = {}) {
  const factors = sampleFactors().map((f) => ({ ...f, ...(patch[f.id] ?? {}) }));
  return { factors, levels: planLevels(factors, sampleTiers(), DEFAULT_DESIGN.levels) };
}

describe('candidate region of the spray-dryer sample', () => {
  const { factors, levels } = setup();
  const region = buildCandidateRegion(factors, levels, [sampleConstraint]);

  it('is the grid of the four varied factors', () => {
    expect(region.factorIds).toEqual(['inlet_temp', 'feed_solids', 'feed_rate', 'atomiser_speed']);
    expect(region.levels[0]).toEqual([-1, -0.35, 0.35, 1]);
    expect(region.levels[2]).toEqual([-1, 0, 1]);
    expect(region.gridSize).toBe(4 * 4 * 3 * 3);
  });

  it('excludes exactly the points with inlet 160 °C and feed rate 16 kg/h', () => {
    // Hand computation: the bound 0.2·T − 18 is 14 kg/h at T = 160, 16.6 at 173, 19.4 at 187, 22 at 200, so only
    // feed_rate = 16 at inlet_temp = 160 breaks it: 1 · 4 (solids) · 1 · 3 (speeds) = 12 of 144 points.
    expect(region.points).not.toBeNull();
    expect(region.points!.length).toBe(132);
    const excluded = region.points!.filter((p) => p[0] === -1 && p[2] === 1);
    expect(excluded).toEqual([]);
    expect(region.points!.filter((p) => p[0] === -1).length).toBe(4 * 2 * 3);
    expect(region.points!.filter((p) => p[2] === 1).length).toBe(3 * 4 * 3);
  });

  it('judges any coded point, converting it to engineering units without rounding', () => {
    // inlet_temp coded −0.8 is 164 °C → bound 14.8 kg/h; feed_rate coded 0.8 is 15.2 kg/h, 0.6 is 14.4 kg/h.
    expect(region.isFeasible([-0.8, 0, 0.8, 0])).toBe(false);
    expect(region.isFeasible([-0.8, 0, 0.6, 0])).toBe(true);
    expect(region.isFeasible([-0.8, 0, 0.7, 0])).toBe(true); // 14.8 exactly: on the boundary, kept
    expect(region.isFeasible([-0.9, 0, 0.7, 0])).toBe(false); // 162 °C → bound 14.4
  });

  it('enforces the equipment limits as well', () => {
    // inlet_temp limits 140–220 °C: coded 1.9 is 218 °C, coded 2.5 is 230 °C.
    expect(region.isFeasible([1.9, 0, 0, 0])).toBe(true);
    expect(region.isFeasible([2.5, 0, 0, 0])).toBe(false);
    // feed_rate limits 4–20 kg/h: coded −2.5 is 2 kg/h.
    expect(region.isFeasible([0, 0, -2.5, 0])).toBe(false);
  });

  it('keeps a grid point that lies exactly on a constraint boundary', () => {
    // 0.2·170 − 18 = 16 (16.000000000000004 in binary): feed_rate 16 at inlet_temp 170 satisfies ≤.
    const s = setup({ inlet_temp: { levels: [160, 170, 190, 200] } });
    const r = buildCandidateRegion(s.factors, s.levels, [sampleConstraint]);
    expect(r.isFeasible([-0.5, 0, 1, 0])).toBe(true);
    expect(r.isFeasible([-0.55, 0, 1, 0])).toBe(false); // 169 °C → bound 15.8
  });
});

describe('constraint expressions', () => {
  const { factors, levels } = setup();

  it('works without constraints', () => {
    const r = buildCandidateRegion(factors, levels, []);
    expect(r.points!.length).toBe(144);
  });

  it('accepts and, or, not, chained comparisons and functions', () => {
    // feed_rate 8 and 12 (not 16), inlet_temp 173, 187, 200: 3 · 4 · 2 · 3 = 72 points.
    const r = buildCandidateRegion(factors, levels, ['8 <= feed_rate <= 14 and inlet_temp > 165']);
    expect(r.points!.length).toBe(72);
    // Either condition: complement is feed_rate = 16 and inlet_temp = 160 → 144 − 12.
    const or = buildCandidateRegion(factors, levels, ['feed_rate < 14 or inlet_temp >= 173']);
    expect(or.points!.length).toBe(132);
    const not = buildCandidateRegion(factors, levels, ['not (feed_solids > 42)']);
    expect(not.points!.length).toBe(3 * 4 * 3 * 3);
    const fn = buildCandidateRegion(factors, levels, ['sqrt(feed_rate) < 3.9']); // excludes feed_rate 16
    expect(fn.points!.length).toBe(96);
  });

  it('lets fixed factors appear at their fixed setting', () => {
    expect(buildCandidateRegion(factors, levels, ['air_flow >= 380']).points!.length).toBe(144);
    const e = expectInputError(() => buildCandidateRegion(factors, levels, ['air_flow >= 420']));
    expect(e.location.key).toBe('constraints');
    expect(e.message).toContain('exclude every one of the 144 grid points');
  });

  it('refuses model parameters and unknown names, with a suggestion', () => {
    const model = expectInputError(() => buildCandidateRegion(factors, levels, [sampleConstraint, 'd_eff < 3']));
    expect(model.location.key).toBe('constraints[1]');
    expect(model.message).toContain('d_eff, a model parameter');
    const typo = expectInputError(() => buildCandidateRegion(factors, levels, ['feed_rat <= 12']));
    expect(typo.location.key).toBe('constraints[0]');
    expect(typo.message).toContain('did you mean `feed_rate`?');
    const fn = expectInputError(() => buildCandidateRegion(factors, levels, ['frobnicate(feed_rate) <= 12']));
    expect(fn.message).toContain('unknown function frobnicate');
  });

  it('names the expression on a syntax error', () => {
    const e = expectInputError(() => buildCandidateRegion(factors, levels, ['feed_rate <= ']));
    expect(e.location.key).toBe('constraints[0]');
    expect(e.message).toContain('cannot read constraint "feed_rate <= "');
  });

  it('refuses expressions that do not yield true or false, and assignments', () => {
    const e = expectInputError(() => buildCandidateRegion(factors, levels, ['0.2 * inlet_temp - 18']));
    expect(e.location.key).toBe('constraints[0]');
    expect(e.message).toContain('does not yield true or false');
    const a = expectInputError(() => buildCandidateRegion(factors, levels, ['feed_rate = 12']));
    expect(a.message).toContain('assigns a value');
  });
});

describe('large grids', () => {
  const { factors, levels } = setup();

  it('are not enumerated above the limit but still judged', () => {
    const r = buildCandidateRegion(factors, levels, [sampleConstraint], { enumerateLimit: 100 });
    expect(r.points).toBeNull();
    expect(r.gridSize).toBe(144);
    expect(r.isFeasible([-1, 0, 1, 0])).toBe(false);
    expect(r.isFeasible([-1, 0, 0, 0])).toBe(true);
  });

  it('are spot-checked on a seeded sample and refused when nothing is feasible', () => {
    const e = expectInputError(() => buildCandidateRegion(factors, levels, ['feed_rate > 20'], { enumerateLimit: 100 }));
    expect(e.location.key).toBe('constraints');
    expect(e.message).toContain('none of 4000 grid points');
  });

  it('handle a 12-factor grid of 3^12 = 531 441 points without enumerating it', () => {
    const many: Factor[] = Array.from({ length: 12 }, (_, i) => ({
      id: `x${i + 1}`, name: `x${i + 1}`, unit: '-', role: 'operating', low: 0, high: 2, nominal: 1, precision: 1,
    }));
    const tiers = { ...sampleTiers(), factors: many.map((f) => ({ ...sampleTiers().factors[2], id: f.id })) };
    const lv = planLevels(many, tiers, DEFAULT_DESIGN.levels);
    const r = buildCandidateRegion(many, lv, ['x1 + x2 <= 3']);
    expect(r.gridSize).toBe(531441);
    expect(r.points).toBeNull();
    expect(r.isFeasible(new Array(12).fill(1))).toBe(false); // x1 = x2 = 2
    expect(r.isFeasible(new Array(12).fill(0))).toBe(true);
  });
});
