import { describe, expect, it } from 'vitest';
import { planLevels } from '../../../src/core/design/levels.js';
import { deriveModel } from '../../../src/core/design/modelFromTiers.js';
import { termLabel } from '../../../src/core/model/modelTerm.js';
import { expectInputError } from '../../support/expectInputError.js';
import type { Factor } from '../../../src/core/study.js';
import { DEFAULT_DESIGN } from '../../../src/core/study.js';
import { samplePolicy, sampleFactors, sampleTiers } from './sprayDryerFixture.js';

const ids = ['inlet_temp', 'feed_solids', 'feed_rate', 'atomiser_speed', 'air_flow'];

function sampleLevels(patch: Record<string, Partial<Factor>> = {}) {
  const factors = sampleFactors().map((f) => ({ ...f, ...(patch[f.id] ?? {}) }));
  return planLevels(factors, sampleTiers(), DEFAULT_DESIGN.levels);
}

function labels(terms: { powers: Record<string, number> }[]): string[] {
  return terms.map((t) => termLabel(t, ids));
}

describe('deriveModel from the tiers (spray-dryer sample)', () => {
  const model = deriveModel(sampleLevels(), sampleTiers(), samplePolicy, undefined, { interactionTable: true });

  it('lists intercept, mains, powers capped by tier and the pairs from the second-order table', () => {
    // Hand derivation: critical inlet_temp and feed_solids have 4 levels → quadratic primary terms
    // (the cubic becomes a potential term, design/potentialTerms.ts);
    // moderate feed_rate and atomiser_speed have 3 → squares; air_flow is fixed → no term;
    // pairs with second-order index ≥ 0.05 between varied factors (e_denat×inlet_temp involves a model parameter).
    expect(model.source).toBe('tiers');
    expect(labels(model.terms)).toEqual([
      '1',
      'inlet_temp',
      'feed_solids',
      'feed_rate',
      'atomiser_speed',
      'inlet_temp^2',
      'feed_solids^2',
      'feed_rate^2',
      'atomiser_speed^2',
      'inlet_temp*feed_solids',
      'inlet_temp*feed_rate',
      'feed_solids*atomiser_speed',
    ]);
  });

  it('gives every term a reason a reader can check', () => {
    const reasons = Object.fromEntries(model.terms.map((t) => [termLabel(t, ids), t.reason]));
    expect(reasons['1']).toContain('intercept');
    expect(reasons.inlet_temp).toBe('main effect of inlet_temp: critical factor at 4 levels');
    expect(reasons['inlet_temp^2']).toBe('curvature of inlet_temp: critical factor at 4 levels (powers up to quadratic)');
    expect(reasons['inlet_temp^3']).toBeUndefined();
    expect(reasons['feed_rate^2']).toBe('curvature of feed_rate: moderate factor at 3 levels (powers up to quadratic)');
    expect(reasons['inlet_temp*feed_rate']).toBe('interaction inlet_temp×feed_rate: second-order index 0.08 ≥ 0.05 for moisture');
    expect(reasons['feed_solids*atomiser_speed']).toContain('0.07 ≥ 0.05 for d50');
    expect(model.notes).toContain(
      'pair e_denat×inlet_temp reaches the interaction threshold (second-order index 0.05) but e_denat is a model parameter, not a setting, so the plan has no term for it',
    );
    // A pair with a fixed operating factor is reported the same way.
    const tiers = sampleTiers();
    tiers.interactionPairs.push({ factorA: 'inlet_temp', factorB: 'air_flow', index: 0.09, responses: ['moisture'] });
    const withFixed = deriveModel(sampleLevels(), tiers, samplePolicy);
    expect(withFixed.notes.join(' ')).toContain('air_flow is fixed at 400, so the plan has no term for it');
  });

  it('takes a non-empty pair list as proof of a second-order table when not told', () => {
    const told = deriveModel(sampleLevels(), sampleTiers(), samplePolicy);
    expect(labels(told.terms)).toEqual(labels(model.terms));
  });

  it('caps moderate factors at quadratic and follows the level count', () => {
    const five = deriveModel(sampleLevels({ feed_rate: { levels: 5 }, inlet_temp: { levels: 2 } }), sampleTiers(), samplePolicy);
    const l = labels(five.terms);
    expect(l).toContain('feed_rate^2');
    expect(l).not.toContain('feed_rate^3');
    expect(l).not.toContain('inlet_temp^2');
  });

  it('gives a negligible factor varied on request its main effect only', () => {
    const m = deriveModel(sampleLevels({ air_flow: { levels: 3 } }), sampleTiers(), samplePolicy);
    const l = labels(m.terms);
    expect(l).toContain('air_flow');
    expect(l).not.toContain('air_flow^2');
    expect(m.terms.find((t) => termLabel(t, ids) === 'air_flow')!.reason).toContain('negligible factor varied on request');
  });

  it('with a second-order table but no pair above the threshold, adds no interaction', () => {
    const tiers = { ...sampleTiers(), interactionPairs: [] };
    const m = deriveModel(sampleLevels(), tiers, samplePolicy, undefined, { interactionTable: true });
    expect(labels(m.terms).filter((t) => t.includes('*'))).toEqual([]);
  });

  it('without a second-order table, pairs factors whose interaction shares both reach the threshold', () => {
    // Shares (total − first, fixture header): inlet_temp 0.1705, feed_solids 0.1275, feed_rate 0.09475,
    // atomiser_speed 0.035 → pairs among the first three only.
    const tiers = { ...sampleTiers(), interactionPairs: [] };
    const m = deriveModel(sampleLevels(), tiers, samplePolicy, undefined, { interactionTable: false });
    expect(labels(m.terms).filter((t) => t.includes('*'))).toEqual([
      'inlet_temp*feed_solids',
      'inlet_temp*feed_rate',
      'feed_solids*feed_rate',
    ]);
    expect(m.terms.find((t) => termLabel(t, ids) === 'inlet_temp*feed_rate')!.reason).toContain('(inlet_temp 0.17, feed_rate 0.09)');
    expect(m.notes.some((n) => n.includes('no second-order index table'))).toBe(true);
  });
});

describe('deriveModel presets', () => {
  it('linear: intercept and mains', () => {
    const m = deriveModel(sampleLevels(), sampleTiers(), samplePolicy, 'linear');
    expect(m.source).toBe('linear');
    expect(labels(m.terms)).toEqual(['1', 'inlet_temp', 'feed_solids', 'feed_rate', 'atomiser_speed']);
  });

  it('interactions: mains and all six two-factor interactions of four factors', () => {
    const m = deriveModel(sampleLevels(), sampleTiers(), samplePolicy, 'interactions');
    expect(m.terms).toHaveLength(1 + 4 + 6);
    expect(labels(m.terms).slice(5)).toEqual([
      'inlet_temp*feed_solids',
      'inlet_temp*feed_rate',
      'inlet_temp*atomiser_speed',
      'feed_solids*feed_rate',
      'feed_solids*atomiser_speed',
      'feed_rate*atomiser_speed',
    ]);
  });

  it('quadratic: squares too, skipped with a note on a 2-level factor', () => {
    const full = deriveModel(sampleLevels(), sampleTiers(), samplePolicy, 'quadratic');
    // A full second-order model in k factors has (k+1)(k+2)/2 parameters: 15 for k = 4 (Box & Draper, Response
    // Surfaces, Mixtures, and Ridge Analyses, 2nd ed., 2007).
    expect(full.terms).toHaveLength(1 + 4 + 4 + 6);
    const twoLevel = deriveModel(sampleLevels({ atomiser_speed: { levels: 2 } }), sampleTiers(), samplePolicy, 'quadratic');
    expect(labels(twoLevel.terms)).not.toContain('atomiser_speed^2');
    expect(twoLevel.notes[0]).toContain('atomiser_speed has only 2 levels');
  });
});

describe('deriveModel explicit lists', () => {
  it('reads study syntax, implies the intercept and orders the terms', () => {
    const m = deriveModel(sampleLevels(), sampleTiers(), samplePolicy, [
      'feed_rate*inlet_temp',
      'inlet_temp^2',
      'feed_rate',
      'inlet_temp',
    ]);
    expect(m.source).toBe('explicit');
    expect(labels(m.terms)).toEqual(['1', 'inlet_temp', 'feed_rate', 'inlet_temp^2', 'inlet_temp*feed_rate']);
    expect(m.terms[4].reason).toBe('listed in the study file (design.model[0])');
    expect(m.notes).toEqual([]);
  });

  it('notes a list that is not hierarchical', () => {
    const m = deriveModel(sampleLevels(), sampleTiers(), samplePolicy, ['inlet_temp', 'inlet_temp*feed_rate']);
    expect(m.notes.join(' ')).toContain('inlet_temp*feed_rate is listed without feed_rate');
  });

  it('refuses duplicates, fixed factors, powers beyond the levels, unknown ids and bad syntax, with the key', () => {
    const cases: [string[], string, string][] = [
      [['inlet_temp', 'feed_rate', 'inlet_temp'], 'design.model[2]', 'listed twice'],
      [['inlet_temp*feed_rate', 'feed_rate*inlet_temp'], 'design.model[1]', 'listed twice'],
      [['inlet_temp', 'air_flow'], 'design.model[1]', 'fixed at 400'],
      [['feed_rate^3'], 'design.model[0]', 'at least 4 levels of feed_rate, which has 3'],
      [['inlet_temp^4'], 'design.model[0]', 'at least 5 levels'],
      [['inlet_temp', 'feed_rat'], 'design.model[1]', 'did you mean `feed_rate`?'],
      [['inlet_temp', 'd_eff'], 'design.model[1]', 'unknown factor "d_eff"'],
      [['inlet_temp', 'inlet_temp**2'], 'design.model[1]', 'written with ^'],
      [['inlet_temp', 'sqrt(feed_rate)'], 'design.model[1]', 'cannot read'],
      [[], 'design.model', 'empty'],
    ];
    for (const [list, key, text] of cases) {
      const e = expectInputError(() => deriveModel(sampleLevels(), sampleTiers(), samplePolicy, list));
      expect(e.location.key, list.join(',')).toBe(key);
      expect(e.message, list.join(',')).toContain(text);
    }
  });
});
