// Comparator construction and the comparison rows on hand-made plan documents
// (comparisonPlanFixture.ts). Counts are worked by hand from the design definitions named
// beside each check.
import { describe, expect, it } from 'vitest';
import { buildComparison } from '../../../src/core/compare/buildComparison.js';
import type { ComparatorId, ComparatorRow } from '../../../src/core/compare/comparisonTypes.js';
import { dEfficiency } from '../../../src/core/evaluate/designCriteria.js';
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { operatingFactor, planFixture } from './comparisonPlanFixture.js';
import { buildComparators } from '../../../src/core/compare/comparators.js';

const faceCentred3 = [
  [-1, -1, -1], [1, -1, -1], [-1, 1, -1], [1, 1, -1], [-1, -1, 1], [1, -1, 1], [-1, 1, 1], [1, 1, 1],
  [-1, 0, 0], [1, 0, 0], [0, -1, 0], [0, 1, 0], [0, 0, -1], [0, 0, 1],
];
const quadratic3 = ['a', 'b', 'c', 'a*b', 'a*c', 'b*c', 'a^2', 'b^2', 'c^2'];

const quadraticPlan = planFixture({
  factors: [
    operatingFactor('a', 100, 200, { limits: { low: 60, high: 240 }, hardToChange: true }),
    operatingFactor('b', 10, 20, { limits: { low: 8, high: 22 } }),
    operatingFactor('c', 0, 1),
    operatingFactor('d', 5, 15),
  ],
  varied: { a: [-1, 0, 1], b: [-1, 0, 1], c: [-1, 0, 1] },
  terms: quadratic3,
  fit: faceCentred3,
  centre: 2,
  holdout: [[0.5, 0.5, -0.5], [-0.5, 0, 0.5]],
  costs: { currency: 'EUR', perRun: 100, hoursPerRun: 2, perLevelChange: { cost: 50, hours: 1 } },
});
const comparison = buildComparison(quadraticPlan);
const rowOf = (id: ComparatorId): ComparatorRow => comparison.comparators.find((r) => r.id === id)!;

describe('buildComparison: 3 varied factors, quadratic model, 1 fixed factor', () => {
  it('lists every comparator id once, proposed first', () => {
    expect(comparison.comparators.map((r) => r.id)).toEqual([
      'proposed', 'conventional', 'full-factorial', 'fractional', 'plackett-burman', 'full-grid', 'ccd-face', 'ccd-rotatable', 'box-behnken',
    ]);
    expect(comparison.p).toBe(10);
    expect(comparison.modelTerms).toEqual(quadratic3);
  });

  it('counts runs as the design definitions give them (+2 centre runs each, grid without)', () => {
    expect(rowOf('proposed').runs).toBe(18); // 14 fit + 2 centre + 2 holdout
    expect(rowOf('conventional').runs).toBe(18); // 2^4 over a, b, c, d + 2
    expect(rowOf('full-factorial').runs).toBe(10); // 2^3 + 2
    expect(rowOf('fractional').runs).toBe(10); // no resolution-V fraction of 3 factors: the full 2^3 + 2
    expect(rowOf('plackett-burman').runs).toBe(14); // 12-run Plackett–Burman + 2
    expect(rowOf('full-grid').runs).toBe(27); // 3 × 3 × 3
    expect(rowOf('ccd-face').runs).toBe(16); // 8 + 6 axial + 2
    expect(rowOf('ccd-rotatable').runs).toBe(16);
    expect(rowOf('box-behnken').runs).toBe(14); // 12 edge midpoints + 2 (Box & Behnken 1960)
  });

  it('two-level plans with centre runs cannot estimate the squared terms separately (common practice)', () => {
    for (const id of ['conventional', 'full-factorial', 'plackett-burman'] as const) {
      expect(rowOf(id).fitsModel).toBe(false);
      expect(rowOf(id).missingTerms).toEqual(expect.arrayContaining(['b^2', 'c^2']));
      expect(rowOf(id).dEfficiency).toBeNull();
    }
    expect(rowOf('conventional').verdict).toMatch(/^Cannot estimate the squared terms of b and c; as many runs as the proposed plan/);
    expect(rowOf('conventional').verdict).toMatch(/Varies 1 factor the model does not need/);
  });

  it('judges the proposed plan on its fitting and centre runs only', () => {
    // The face-centred composite row has the same fitting points as the proposed plan.
    const face = rowOf('ccd-face');
    expect(face.fitsModel).toBe(true);
    expect(face.relativeInformationTotal).toBeCloseTo(1, 12);
    expect(face.dEfficiency).toBeCloseTo(rowOf('proposed').dEfficiency!, 12);
    expect(face.runsSaved).toBe(-2);
    // Cross-check with the search engineer's criterion module on the same 16 points.
    const model = compileModel([{ powers: {} }, ...([{ a: 1 }, { b: 1 }, { c: 1 }, { a: 1, b: 1 }, { a: 1, c: 1 }, { b: 1, c: 1 }, { a: 2 }, { b: 2 }, { c: 2 }] as Record<string, number>[]).map((powers) => ({ powers }))], ['a', 'b', 'c']);
    expect(rowOf('proposed').dEfficiency).toBeCloseTo(dEfficiency(model, [...faceCentred3, [0, 0, 0], [0, 0, 0]]), 10);
  });

  it('costs runs and grouped level changes of the hard-to-change factor', () => {
    const proposed = rowOf('proposed');
    // a takes −1, −0.5, 0, 0.5, 1 over the 18 runs: 5 settings, 4 changes.
    expect(proposed.levelChanges).toBe(4);
    expect(proposed.cost).toBe(18 * 100 + 4 * 50);
    expect(proposed.hours).toBe(18 * 2 + 4 * 1);
    const conventional = rowOf('conventional');
    expect(conventional.levelChanges).toBe(2); // −1, 0, +1
    expect(conventional.cost).toBe(18 * 100 + 2 * 50);
    expect(conventional.costSaved).toBe(1900 - 2000);
    expect(rowOf('full-grid').levelChanges).toBe(2);
  });

  it('notes that rotatable axial runs leave the studied range and pass the equipment limits of b', () => {
    const rotatable = rowOf('ccd-rotatable');
    expect(rotatable.label).toContain('1.682');
    expect(rotatable.verdict).toMatch(/outside the studied range/);
    expect(rotatable.verdict).toMatch(/beyond the equipment limits of b \(6\.591–23\.41 u against limits 8–22\)/);
    expect(rotatable.verdict).not.toMatch(/limits of a/);
  });

  it('the fractional row carries generators, resolution and word-length pattern', () => {
    const fractional = rowOf('fractional');
    expect(fractional.generators).toEqual([]);
    expect(fractional.resolution).toBe(4); // full factorial sentinel k + 1
    expect(fractional.label).toMatch(/No smaller regular fraction of 3 factors reaches resolution V/);
  });

  it('gives FDS curves for every row that fits, and the proposed row a verdict and a summary', () => {
    const fitting = comparison.comparators.filter((r) => r.fitsModel).map((r) => r.id);
    expect(comparison.fdsCurves.map((c) => c.id).sort()).toEqual([...fitting].sort());
    for (const curve of comparison.fdsCurves) {
      for (let i = 1; i < curve.variance.length; i++) expect(curve.variance[i]).toBeGreaterThanOrEqual(curve.variance[i - 1]);
    }
    expect(rowOf('proposed').verdict).toMatch(/^Estimates all 9 model terms from 16 fitting runs, plus 2 holdout runs/);
    // Noncentrality δ/range/se (termPower.ts): interactions 1/(1/√8) = 2.83 (orthogonal ±1
    // column over the 8 cube runs), main effects 1/(1/√10) = 3.16, squared terms 2/0.6159 = 3.25
    // (se from numpy on these 16 points): the interactions are the weakest terms.
    expect(rowOf('proposed').minPowerTerm).toMatch(/^[abc]\*[abc]$/);
    expect(rowOf('proposed').verdict).toContain(`the weakest is ${rowOf('proposed').minPowerTerm} at `);
    expect(comparison.summary).toMatch(/^The proposed plan needs 18 runs where the conventional full factorial needs 18: as many runs, costing EUR 100 more\./);
    expect(comparison.summary).toMatch(/cannot estimate the squared terms of b and c/);
  });
});

describe('buildComparison: evaluation details on each row', () => {
  it('aliases from the alias matrix: with centre runs the squared terms of a two-level plan coincide (Montgomery 2017, §6.8)', () => {
    // Term order a, b, c, a*b, a*c, b*c, a^2, b^2, c^2: a^2 is kept (the centre runs separate it
    // from the intercept), b^2 and c^2 equal a^2 on every run, alias coefficient 1.
    const aliases = rowOf('full-factorial').aliases!;
    expect(aliases.map((entry) => entry.term)).toEqual(['b^2', 'c^2']);
    for (const entry of aliases) expect(entry.aliasedWith).toEqual([{ term: 'a^2', coefficient: 1 }]);
    expect(rowOf('proposed').aliases).toEqual([]);
  });

  it('carries A-criterion, G-efficiency, max VIF and the per-term figures of every row that fits', () => {
    for (const row of comparison.comparators.filter((r) => r.fitsModel)) {
      expect(row.terms).toHaveLength(comparison.p);
      expect(row.aCriterion!).toBeGreaterThan(0);
      expect(row.gEfficiency!).toBeGreaterThan(0);
      expect(row.gEfficiency!).toBeLessThanOrEqual(100 + 1e-9); // G ≤ 100 % (Kiefer & Wolfowitz 1960)
      expect(row.maxVif!).toBeGreaterThanOrEqual(1 - 1e-12); // VIF ≥ 1 by definition (Marquardt 1970)
      const powers = row.terms!.filter((term) => term.power !== null).map((term) => term.power!);
      expect(Math.min(...powers)).toBeCloseTo(row.minPower!, 12);
    }
    expect(rowOf('proposed').fittingRuns).toBe(16); // 14 fit + 2 centre; holdout runs are not fitted
    expect(comparison.powerConvention).toMatch(/moves the response by 2σ across the studied range/);
  });

  it('counts runs outside the coded range and off limits', () => {
    // Rotatable composite in 3 factors: the 6 axial runs at ±1.682 leave [−1, 1] (Box & Hunter 1957).
    expect(rowOf('ccd-rotatable').runsOutsideRange).toBe(6);
    expect(rowOf('ccd-face').runsOutsideRange).toBe(0);
    expect(rowOf('proposed').offLimitsRuns).toBe(0);
  });
});

describe('buildComparison: 5 two-level factors, main effects and one interaction', () => {
  const ids = ['a', 'b', 'c', 'd', 'e'];
  const corners: number[][] = [];
  for (let code = 0; code < 8; code++) corners.push([(code & 1 ? 1 : -1), (code & 2 ? 1 : -1), (code & 4 ? 1 : -1), 1, (code & 1 ? 1 : -1) * (code & 2 ? 1 : -1)]);
  const plan = planFixture({
    factors: ids.map((id) => operatingFactor(id, 0, 10)),
    varied: Object.fromEntries(ids.map((id) => [id, [-1, 1]])),
    terms: ['a', 'b', 'c', 'd', 'e', 'a*b'],
    fit: [...corners, ...corners.map((x) => x.map((v, j) => (j === 3 ? -1 : v)))],
    centre: 1,
    holdout: [],
  });
  const result = buildComparison(plan);
  const row = (id: ComparatorId) => result.comparators.find((r) => r.id === id)!;

  it('builds the 2^(5−1) resolution V fraction E = ABCD (Montgomery 2017, Table 8.14)', () => {
    const fractional = row('fractional');
    expect(fractional.runs).toBe(17);
    expect(fractional.resolution).toBe(5);
    expect(fractional.generators).toHaveLength(1);
    expect(fractional.generators![0]).toMatch(/^E=-?ABCD$/);
    expect(fractional.wordLengthPattern).toEqual([0, 0, 1]);
    expect(fractional.fitsModel).toBe(true);
    expect(fractional.label).toMatch(/2\^\(5−1\) fraction, resolution V/);
  });

  it('lists the response-surface plans unbuilt, with the reason, for a model without squared terms', () => {
    for (const id of ['ccd-face', 'ccd-rotatable', 'box-behnken'] as const) {
      expect(row(id).runs).toBeNull();
      expect(row(id).reason).toMatch(/no squared terms/);
      expect(row(id).verdict).toMatch(/^Not built: the model has no squared terms/);
    }
    expect(row('plackett-burman').runs).toBe(13);
    expect(row('conventional').runs).toBe(33);
    expect(row('full-grid').runs).toBe(32);
  });

  it('leaves cost null without study costs', () => {
    expect(row('proposed').cost).toBeNull();
    expect(result.currency).toBeNull();
  });
});

describe('buildComparison: 2 varied factors with a constraint', () => {
  const plan = planFixture({
    factors: [operatingFactor('p', 0, 10), operatingFactor('q', 0, 10)],
    varied: { p: [-1, 0, 1], q: [-1, 0, 1] },
    terms: ['p', 'q', 'p*q', 'p^2', 'q^2'],
    fit: [[-1, -1], [0, -1], [1, -1], [-1, 0], [1, 0], [-1, 1], [0, 1]],
    centre: 2,
    holdout: [[0.5, -0.5]],
    constraints: ['p + q <= 15'],
  });
  const result = buildComparison(plan);
  const row = (id: ComparatorId) => result.comparators.find((r) => r.id === id)!;

  it('lists Box–Behnken with no runs and the reason instead of dropping it', () => {
    const bbd = row('box-behnken');
    expect(bbd.runs).toBeNull();
    expect(bbd.reason).toMatch(/at least 3 factors/);
    expect(bbd.verdict).toMatch(/^Not built: /);
  });

  it('applies the constraint to the full grid and flags comparator runs that break it', () => {
    expect(row('full-grid').runs).toBe(8); // (10, 10) is excluded
    expect(row('full-grid').label).toMatch(/constraints applied \(1 of 9 combinations excluded\)/);
    expect(row('full-factorial').verdict).toMatch(/1 of its 6 runs breaks the study's constraints/);
  });

  it('a plan that fits but breaks a constraint says so first', () => {
    const rotatable = row('ccd-rotatable');
    expect(rotatable.fitsModel).toBe(true);
    expect(rotatable.offLimitsRuns).toBeGreaterThan(0);
    expect(rotatable.verdict).toMatch(/^Cannot be run as listed: \d+ of its \d+ runs break/);
  });

  it('uses constrained-region moments for the average prediction variance', () => {
    expect(result.predictionVarianceMethod).not.toMatch(/uncut box/);
    expect(row('proposed').averagePredictionVariance).toBeGreaterThan(0);
  });
});

describe('buildComparison: a constraint on a factor the proposed plan holds fixed', () => {
  // r is negligible and held at its nominal 5, where p + r ≤ 15 always holds; the conventional
  // plan varies r too, and its corners with p = r = 10 break the constraint (2 of the 2^3
  // corners; the centre run p = q = r = 5 is fine). Counted by hand.
  const plan = planFixture({
    factors: [operatingFactor('p', 0, 10), operatingFactor('q', 0, 10), operatingFactor('r', 0, 10)],
    varied: { p: [-1, 0, 1], q: [-1, 0, 1] },
    terms: ['p', 'q', 'p*q'],
    fit: [[-1, -1], [1, -1], [-1, 1], [1, 1], [0, -1], [-1, 0]],
    centre: 1,
    holdout: [],
    constraints: ['p + r <= 15'],
  });
  const result = buildComparison(plan);
  const conventional = result.comparators.find((r) => r.id === 'conventional')!;

  it('checks the conventional plan with every operating factor varied, not only its projection', () => {
    expect(conventional.runs).toBe(9);
    expect(conventional.offLimitsRuns).toBe(2);
    expect(conventional.verdict).toMatch(/Cannot be run as listed: 2 of its 9 runs break/);
    expect(result.comparators.find((r) => r.id === 'full-factorial')!.offLimitsRuns).toBe(0);
  });
});

describe('buildComparators: 17 varied factors', () => {
  // Beyond 16 factors a two-level cube (2^17 = 131 072 runs) is listed with the reason instead
  // of being built; Plackett–Burman still is (20 runs take up to 19 factors, Plackett & Burman
  // 1946), and Box–Behnken exists only for 3 to 7 factors (Box & Behnken 1960).
  const ids = Array.from({ length: 17 }, (_, j) => `f${j + 1}`);
  const designs = buildComparators({
    variedIds: ids,
    operatingIds: ids,
    hardToChange: [],
    centreRuns: 1,
    plannedLevels: ids.map(() => [-1, 0, 1]),
    hasInteractions: false,
    hasSquares: true,
    p: 35,
    factors: ids.map((id) => operatingFactor(id, 0, 1)),
  });
  const design = (id: ComparatorId) => designs.find((d) => d.id === id)!;

  it('lists the oversized cubes and grid unbuilt with the reason and builds the rest', () => {
    for (const id of ['conventional', 'full-factorial'] as const) {
      expect(design(id).points).toBeNull();
      expect(design(id).reason).toMatch(/2\^17 = 131072 runs is too large/);
    }
    for (const id of ['ccd-face', 'ccd-rotatable'] as const) expect(design(id).reason).toMatch(/cube is too large/);
    expect(design('box-behnken').points).toBeNull();
    expect(design('full-grid').reason).toMatch(/129140163 combinations is too large/); // 3^17
    expect(design('plackett-burman').points).toHaveLength(21); // 20 runs + 1 centre run
    expect(design('fractional').resolution).toBeGreaterThanOrEqual(4);
  });
});

describe('buildComparators: any number of varied factors', () => {
  // Every comparator either builds its plan or says why not ("not built for k factors,
  // because …"); none may throw, from 1 factor to past the varied-factor limit.
  const context = (k: number, model: 'linear' | 'interactions' | 'quadratic') => {
    const ids = Array.from({ length: k }, (_, j) => `f${j + 1}`);
    const pairs = model === 'linear' ? 0 : (k * (k - 1)) / 2;
    return {
      variedIds: ids,
      operatingIds: ids,
      hardToChange: [],
      centreRuns: 3,
      plannedLevels: ids.map(() => [-1, 0, 1]),
      hasInteractions: model !== 'linear',
      hasSquares: model === 'quadratic',
      p: 1 + k + pairs + (model === 'quadratic' ? k : 0),
      factors: ids.map((id) => operatingFactor(id, 0, 1)),
    };
  };

  // Fraction searches of 16 to 25 factors take about a second each, so only the linear model visits them all.
  const FEW = [1, 2, 3, 4, 5, 6, 7, 8, 12, 26, 30, 40];
  it.each([
    ['linear', [...FEW, 16, 20, 25]],
    ['interactions', FEW],
    ['quadratic', FEW],
  ] as const)('%s models, 1 to 40 factors: every row built or explained', (model, counts) => {
    for (const k of counts) {
      const designs = buildComparators(context(k, model));
      expect(designs.map((d) => d.id)).toEqual(['conventional', 'full-factorial', 'fractional', 'plackett-burman', 'full-grid', 'ccd-face', 'ccd-rotatable', 'box-behnken']);
      for (const design of designs) {
        if (design.points === null) expect(design.reason, `${design.id}, k = ${k}`).toMatch(/\S/);
        else expect(design.points.every((point) => point.length === k), `${design.id}, k = ${k}`).toBe(true);
      }
    }
  });

  it('names why the fraction is not built past 25 factors', () => {
    const fraction = buildComparators(context(26, 'linear')).find((d) => d.id === 'fractional')!;
    expect(fraction.points).toBeNull();
    expect(fraction.reason).toBe('not built for 26 factors, because regular fractions are built here for at most 25 (one letter A–Z, I skipped, per factor)');
  });

  it('leaves a cube unevaluated when its runs × p² is past the evaluation budget', () => {
    // 2^16 + 3 runs on the 153-term quadratic of 16 factors is 1.5e9 multiply-adds per pass.
    const designs = buildComparators(context(16, 'quadratic'));
    const full = designs.find((d) => d.id === 'full-factorial')!;
    expect(full.points).toBeNull();
    expect(full.reason).toBe('65539 runs on a 153-term model is too large to evaluate within the time budget');
    // The same cube on the 17-term linear model is built.
    expect(buildComparators(context(16, 'linear')).find((d) => d.id === 'full-factorial')!.points).toHaveLength(65539);
  });
});
