import { describe, expect, it } from 'vitest';
import { gEfficiency } from '../../../src/core/evaluate/gEfficiency.js';
import { predictionSample } from '../../../src/core/evaluate/predictionVariance.js';
import { informationMatrix } from '../../../src/core/model/modelMatrix.js';
import { symmetricInverse } from '../../../src/core/linalg/cholesky.js';
import { firstOrderExponents, gridRegion, modelFromExponents, TWO_LEVELS } from '../design/gridRegions.js';
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

  // Mirroring every factor (x → −x) maps f(x) to D·f(x), D = diag(1, −1, −1, −1), so the
  // mirrored design has the same variance at −x: the peak moves to (−1, −1, −1), the first vertex.
  it('finds the peak at (−1, −1, −1) for the mirrored design', () => {
    const mirrored = ref.design.map((x) => x.map((v) => (v === 0 ? 0 : -v)));
    const mirroredInverse = symmetricInverse(informationMatrix(model, mirrored), model.p)!;
    const result = gEfficiency(model, mirroredInverse, mirrored, sample);
    expect(result.maxScaledVariance).toBeCloseTo(ref.maxScaledVariance, 9);
  });

  // Without (1, 1, 1) in the region (and no sample), the maximum is the largest numpy variance
  // over the 7 other vertices, 1.875 (the design points are among them or inside).
  it('takes the maximum over the feasible vertices only when a constraint cuts a vertex off', () => {
    const feasible = (x: ArrayLike<number>) => !(x[0] === 1 && x[1] === 1 && x[2] === 1);
    const region = gridRegion(Array(3).fill(TWO_LEVELS), feasible, false);
    const result = gEfficiency(model, inverse, ref.design, [], region);
    const others = ref.vertexVariances.filter((_, i) => feasible(ref.vertices[i]));
    expect(others).toHaveLength(7);
    expect(result.maxScaledVariance).toBeCloseTo(ref.design.length * Math.max(...others), 9);
    expect(result.note).toMatch(/and 7 cube vertices/);
  });
});

// With C = I the variance of the first-order model is f'f = 1 + Σ x_j², largest (1 + k) at
// the cube vertices (closed form), so the vertices, when used, set the maximum.
describe('G-efficiency: which points are searched', () => {
  const identity = (p: number) => Float64Array.from({ length: p * p }, (_, i) => (i % (p + 1) === 0 ? 1 : 0));

  it('uses a candidate list of exactly 20 000 points, and the sample beyond that', () => {
    const model = modelFromExponents(firstOrderExponents(3));
    const levels = (n: number) => Array.from({ length: n }, (_, i) => -1 + (2 * i) / (n - 1));
    const at = gridRegion([levels(20), levels(20), levels(50)]);
    expect(gEfficiency(model, identity(4), [[0, 0, 0]], [], at).note).toBe('maximum over all 20000 candidate points');
    const beyond = gridRegion([levels(20), levels(20), levels(51)]);
    expect(gEfficiency(model, identity(4), [[0, 0, 0]], [], beyond).note).toMatch(/^maximum over 0 quasi-random points, the design points and 8 cube vertices/);
  });

  it('adds the 4096 cube vertices up to 12 factors and none for 13', () => {
    const twelve = modelFromExponents(firstOrderExponents(12));
    const withVertices = gEfficiency(twelve, identity(13), [Array(12).fill(0)], predictionSample(12));
    expect(withVertices.note).toMatch(/and 4096 cube vertices/);
    expect(withVertices.maxScaledVariance).toBeCloseTo(13, 12);
    const thirteen = modelFromExponents(firstOrderExponents(13));
    const without = gEfficiency(thirteen, identity(14), [Array(13).fill(0)], predictionSample(13));
    expect(without.note).toMatch(/and 0 cube vertices/);
    expect(without.maxScaledVariance).toBeLessThan(14);
  });
});
