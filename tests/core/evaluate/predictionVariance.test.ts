// Fraction-of-design-space curve (Zahran, Anderson-Cook & Myers 2003) on the face-centred
// composite design in two factors with 3 centre runs; references from numpy on scipy's
// unscrambled Halton sample (tests/reference/evaluate/generate.py).
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/evaluate/evaluate.json' with { type: 'json' };
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { assessDesignQuality } from '../../../src/core/evaluate/designQuality.js';
import { cubeMoments } from '../../../src/core/evaluate/cubeMoments.js';
import { haltonPoints } from '../../../src/core/evaluate/haltonPoints.js';
import { FDS_FRACTIONS, PREDICTION_SAMPLE_SIZE, predictionSample } from '../../../src/core/evaluate/predictionVariance.js';
import { gridRegion, THREE_LEVELS } from '../design/gridRegions.js';

const ref = fixture.ccdFace2FdsSample;
const model = compileModel(
  [{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { a: 1, b: 1 } }, { powers: { a: 2 } }, { powers: { b: 2 } }],
  ['a', 'b'],
);
// Evaluated inside each test, not at import, so that `npm run mutate` sees every mutant in it.
const evaluate = () => assessDesignQuality(model, ref.points, { moments: cubeMoments(model), termLabels: ['1', 'a', 'b', 'a*b', 'a^2', 'b^2'] });

describe('Halton sample', () => {
  it('starts where scipy.stats.qmc.Halton(scramble=False) does after skipping 21 points', () => {
    const [first] = haltonPoints(1, 2);
    expect(first[0]).toBeCloseTo(ref.firstSamplePoint[0], 14);
    expect(first[1]).toBeCloseTo(ref.firstSamplePoint[1], 14);
    expect(PREDICTION_SAMPLE_SIZE).toBe(4096);
  });

  it('is thinned to the feasible points of a constrained region, and kept whole when none is feasible', () => {
    const all = haltonPoints(PREDICTION_SAMPLE_SIZE, 2);
    expect(predictionSample(2)).toEqual(all);
    const below = (x: ArrayLike<number>) => x[0] + x[1] <= 0;
    const thinned = predictionSample(2, gridRegion([THREE_LEVELS, THREE_LEVELS], below, false));
    expect(thinned).toEqual(all.filter(below));
    expect(predictionSample(2, gridRegion([THREE_LEVELS, THREE_LEVELS], () => false, false))).toEqual(all);
  });
});

describe('FDS curve', () => {
  it('has the documented fractions and is non-decreasing', () => {
    const fds = evaluate().fds!;
    expect(fds.fraction).toHaveLength(FDS_FRACTIONS);
    expect(fds.fraction[0]).toBe(0);
    expect(fds.fraction[FDS_FRACTIONS - 1]).toBe(1);
    for (let i = 1; i < FDS_FRACTIONS; i++) expect(fds.variance[i]).toBeGreaterThanOrEqual(fds.variance[i - 1]);
  });

  it('median, 90th percentile, minimum and maximum match numpy on the same sample', () => {
    const fds = evaluate().fds!;
    const half = fds.fraction.indexOf(0.5);
    expect(fds.variance[half]).toBeCloseTo(ref.medianVariance, 10);
    expect(fds.variance[fds.fraction.indexOf(0.9)]).toBeCloseTo(ref.quantile90Variance, 10);
    expect(fds.variance[0]).toBeCloseTo(ref.minVariance, 10);
    expect(fds.variance[FDS_FRACTIONS - 1]).toBeCloseTo(ref.maxVariance, 10);
    expect(fds.scaledVariance[half]).toBeCloseTo(11 * ref.medianVariance, 9);
  });

  it('G-efficiency uses the largest variance seen, at least the sample maximum', () => {
    expect(evaluate().maxScaledPredictionVariance!).toBeGreaterThanOrEqual(11 * ref.maxVariance - 1e-9);
  });
});

describe('VIF of the face-centred composite (numpy, regression definition 1/(1 − R²))', () => {
  it('matches for every term', () => {
    evaluate().terms.slice(1).forEach((term, j) => expect(term.vif).toBeCloseTo(ref.vif[j], 10));
  });
});
