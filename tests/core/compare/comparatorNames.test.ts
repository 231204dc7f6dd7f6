/**
 * The names of the comparison's plans, from their one home: the compact names of the
 * terminal tables, the full labels, and the plurals of the decision sentence.
 * Run counts follow the design definitions (2^k corners plus centre runs, common practice).
 */
import { describe, expect, it } from 'vitest';
import { COMPARATOR_SHORT_NAME, comparatorLabel, comparatorTableName, romanNumeral } from '../../../src/core/compare/comparatorNames.js';
import { comparisonSummary } from '../../../src/core/compare/verdict.js';
import type { ComparatorId, ComparatorRow, Comparison } from '../../../src/core/compare/comparisonTypes.js';

function row(id: ComparatorId, fields: Partial<ComparatorRow> = {}): ComparatorRow {
  return {
    id,
    label: id,
    runs: 10,
    fitsModel: true,
    missingTerms: [],
    dEfficiency: 50,
    relativeInformationPerRun: 1,
    relativeInformationTotal: 1,
    averagePredictionVariance: 0.5,
    minPower: null,
    cost: null,
    hours: null,
    levelChanges: null,
    runsSaved: null,
    percentRunsSaved: null,
    costSaved: null,
    percentCostSaved: null,
    verdict: '',
    ...fields,
  };
}

const naming = { variedFactors: 4, operatingFactors: 5, centreRuns: 3, levelCounts: [4, 4, 3, 3] };

describe('comparatorTableName', () => {
  it.each([
    [row('proposed'), 'Proposed'],
    [row('conventional'), 'Conventional 2^5'],
    [row('full-factorial'), 'Full 2^4'],
    [row('fractional', { generators: ['E = ABCD'], resolution: 5 }), '2^(4-1) res V'],
    [row('fractional', { generators: [] }), 'Fraction (= full 2^4)'],
    [row('fractional', { runs: null }), 'Fraction'],
    [row('plackett-burman', { runs: 15 }), 'Plackett–Burman 12'],
    [row('full-grid'), 'Full grid 4×4×3×3'],
    [row('ccd-face'), 'CCD face-centred'],
    [row('box-behnken'), 'Box–Behnken'],
  ])('%#: %s', (comparator, expected) => {
    expect(comparatorTableName(comparator, naming)).toBe(expected);
  });

  it('has a family name for every plan', () => {
    expect(Object.keys(COMPARATOR_SHORT_NAME)).toHaveLength(9);
  });
});

describe('comparatorLabel', () => {
  it('spells the centre runs and the plurals out', () => {
    expect(comparatorLabel.conventional(5, 3)).toBe('Two-level full factorial over all 5 operating factors + 3 centre runs');
    expect(comparatorLabel.fullFactorial(4, 1)).toBe('Two-level full factorial over the 4 varied factors + 1 centre run');
    expect(comparatorLabel.boxBehnken(0)).toBe('Box–Behnken + no centre runs');
    expect(comparatorLabel.proposed(18, 3, 1)).toBe('Optimal exact design: 18 model runs + 3 centre + 1 holdout run');
    expect(comparatorLabel.fraction(5, ['E = ABCD'], 5, 3)).toBe('2^(5−1) fraction, resolution V (E = ABCD) + 3 centre runs');
    expect([3, 4, 5].map(romanNumeral)).toEqual(['III', 'IV', 'V']);
  });
});

describe('comparisonSummary plurals', () => {
  const summary = (proposedRuns: number, conventionalRuns: number) =>
    comparisonSummary({
      modelTerms: ['a'],
      p: 2,
      delta: 2,
      alpha: 0.05,
      predictionVarianceMethod: 'exact',
      currency: null,
      comparators: [row('proposed', { runs: proposedRuns }), row('conventional', { runs: conventionalRuns, percentRunsSaved: 10 })],
      fdsCurves: [],
    } satisfies Omit<Comparison, 'summary'>);

  it('says "1 more run" and "1 fewer run", never "1 more runs"', () => {
    expect(summary(11, 10)).toContain('The proposed plan needs 11 runs where the conventional full factorial needs 10: 1 more run.');
    expect(summary(9, 10)).toContain(': 1 fewer run (10.0 %).');
    expect(summary(8, 10)).toContain(': 2 fewer runs (10.0 %).');
  });

  it('says "the one model term" for a model of one term', () => {
    expect(summary(9, 10)).toContain('It still estimates the one model term.');
  });
});
