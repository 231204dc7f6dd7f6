// Savings arithmetic and level-change counting.
import { describe, expect, it } from 'vitest';
import { campaignCost, distinctSettings, groupedLevelChanges } from '../../../src/core/compare/campaignCost.js';
import { buildComparison } from '../../../src/core/compare/buildComparison.js';
import { describeTerms } from '../../../src/core/compare/verdict.js';
import { operatingFactor, planFixture } from './comparisonPlanFixture.js';

describe('savings against a 2^4 full factorial with 3 centre points (common practice, no source)', () => {
  // Proposed: the 2^(4−1) half fraction D = ABC (8 runs) + 3 centre runs = 11 runs.
  const half: number[][] = [];
  for (let code = 0; code < 8; code++) {
    const a = code & 1 ? 1 : -1;
    const b = code & 2 ? 1 : -1;
    const c = code & 4 ? 1 : -1;
    half.push([a, b, c, a * b * c]);
  }
  const plan = planFixture({
    factors: ['a', 'b', 'c', 'd'].map((id) => operatingFactor(id, 0, 1)),
    varied: { a: [-1, 1], b: [-1, 1], c: [-1, 1], d: [-1, 1] },
    terms: ['a', 'b', 'c', 'd'],
    fit: half,
    centre: 3,
    holdout: [],
    costs: { currency: 'EUR', perRun: 100, hoursPerRun: 1.5 },
  });
  const comparison = buildComparison(plan);
  const full = comparison.comparators.find((row) => row.id === 'full-factorial')!;

  it('19 runs against 11: 8 runs and 42.1 % fewer', () => {
    expect(comparison.comparators[0].runs).toBe(11);
    expect(full.runs).toBe(19);
    expect(full.runsSaved).toBe(8);
    expect(full.percentRunsSaved).toBeCloseTo(42.105, 3);
  });

  it('costs scale with runs when no factor is hard to change', () => {
    expect(full.cost).toBe(1900);
    expect(full.hours).toBeCloseTo(28.5, 12);
    expect(full.levelChanges).toBeNull();
    expect(full.costSaved).toBe(800);
    expect(full.percentCostSaved).toBeCloseTo(42.105, 3);
  });

  it('both orthogonal plans have D-efficiency 100 % for the main-effects model without centre runs… and less with them', () => {
    // With 3 centre runs X'X = diag(N, 8, 8, 8, 8) for the half fraction: D = 100·(11·8^4)^(1/5)/11.
    expect(comparison.comparators[0].dEfficiency).toBeCloseTo((100 * (11 * 8 ** 4) ** (1 / 5)) / 11, 10);
    expect(full.dEfficiency).toBeCloseTo((100 * (19 * 16 ** 4) ** (1 / 5)) / 19, 10);
    // (det X'X_full / det X'X_half)^(1/5) = ((19·16^4)/(11·8^4))^(1/5).
    expect(full.relativeInformationTotal).toBeCloseTo(((19 * 16 ** 4) / (11 * 8 ** 4)) ** (1 / 5), 10);
  });

  it('summary states the saving against the conventional plan', () => {
    expect(comparison.summary).toMatch(/^The proposed plan needs 11 runs where the conventional full factorial needs 19: 8 fewer runs \(42\.1 %\), saving EUR 800 and 12 h of bench time\./);
  });
});

describe('campaignCost', () => {
  const costs = { currency: 'EUR', perRun: 850, hoursPerRun: 3, perLevelChange: { cost: 120, hours: 0.7 } };
  it('adds set-up cost and time per level change', () => {
    expect(campaignCost(25, 6, costs)).toEqual({ cost: 25 * 850 + 6 * 120, hours: 25 * 3 + 6 * 0.7 });
    expect(campaignCost(25, null, costs)).toEqual({ cost: 25 * 850, hours: 75 });
    expect(campaignCost(25, 6, undefined)).toEqual({ cost: null, hours: null });
  });

  it('counts grouped level changes as distinct settings minus one, fixed factors none', () => {
    const points = [[-1, 0], [1, 0], [0.5, 1], [-1, 1], [1 + 1e-12, -1]];
    expect(distinctSettings(points, 0)).toBe(3); // −1, 0.5, 1 (1 + 1e-12 is the same setting)
    expect(groupedLevelChanges(points, ['x', 'fixed'], (id) => (id === 'x' ? 0 : -1))).toBe(2);
  });
});

describe('describeTerms', () => {
  it('groups missing terms by kind', () => {
    expect(describeTerms(['a^2', 'b^2', 'a^3', 'a*b', 'a^2*b'])).toBe(
      'the squared terms of a and b, the cubic term of a, the interaction a*b and the term a^2*b',
    );
  });
});
