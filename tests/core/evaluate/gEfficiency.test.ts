import { describe, expect, it } from 'vitest';
import { gEfficiency } from '../../../src/core/evaluate/gEfficiency.js';
import { predictionSample } from '../../../src/core/evaluate/predictionVariance.js';
import { informationMatrix } from '../../../src/core/model/modelMatrix.js';
import { symmetricInverse } from '../../../src/core/linalg/cholesky.js';
import { gridRegion, modelFromExponents, TWO_LEVELS } from '../design/gridRegions.js';
import reference from '../../reference/design-search/design-search.json' with { type: 'json' };

// First-order model in three factors on a 5-run design that leaves the vertex (1, 1, 1) out.
// The prediction variance of a first-order model is a convex quadratic in x, so its maximum
// over the cube is at a vertex; numpy takes it over the 8 vertices
// (tests/reference/design-search/generate.py): f'(X'X)⁻¹f = 3.875 at (1, 1, 1), G = 20.645 %.
describe('G-efficiency over the sampled region', () => {
  const ref = reference.gEfficiency;
  const model = modelFromExponents(ref.exponents);
  const inverse = symmetricInverse(informationMatrix(model, ref.design), model.p)!;
  const sample = predictionSample(3);

  it('finds the peak at the cube vertex the design leaves out', () => {
    const result = gEfficiency(model, inverse, ref.design, sample);
    expect(ref.argmax).toEqual([1, 1, 1]);
    expect(result.maxScaledVariance).toBeCloseTo(ref.maxScaledVariance, 9);
    expect(result.gEfficiency).toBeCloseTo(ref.gEfficiency, 9);
    expect(result.note).toMatch(/and 8 cube vertices/);
  });

  it('takes the same maximum over the enumerated 2^3 grid', () => {
    const result = gEfficiency(model, inverse, ref.design, sample, gridRegion(Array(3).fill(TWO_LEVELS)));
    expect(result.gEfficiency).toBeCloseTo(ref.gEfficiency, 9);
    expect(result.note).toMatch(/all 8 candidate points/);
  });
});
