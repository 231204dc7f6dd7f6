/**
 * The precision inputs of a structured plan: covariance in noise² units, the recorded
 * `metrics.gls` and `metrics.blocks`, against the dense numpy computation of
 * tests/reference/splitplot/generate.py (gls.json) and the identities that pin the units.
 */
import { describe, expect, it } from 'vitest';
import { glsFixture as fixture, glsModel as model, structureOf } from '../../support/glsFixture.js';
import { compileModel, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { crossProduct } from '../../../src/core/linalg/crossProduct.js';
import { choleskyFactor, choleskyInverse, choleskyLogDeterminant } from '../../../src/core/linalg/cholesky.js';
import { independentRuns, type ErrorStructure } from '../../../src/core/model/glsInformation.js';
import { structuredPrecision, wholePlotTerms } from '../../../src/core/evaluate/structuredPrecision.js';

/** The fixture's x1 is hard to change. */
const hard = [true, false];

describe('structured precision against numpy', () => {
  it.each(fixture.cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const structure = structureOf(c);
    const result = structuredPrecision(model, c.points, structure, hard);
    expect(result.gls.logDetPerRun as number).toBeCloseTo(c.logDetPerRun, 10);
    expect(result.gls.varianceRatio).toBe(c.varianceRatio);
    const p = model.p;
    const from = structure.sessions > 1 ? 1 : 0;
    const size = p - from;
    const covariance = result.covariance as Float64Array;
    // numpy's covariance is in σ_ε² units; ours is in noise² = σ_ε²(1 + η) units.
    for (let a = 0; a < size; a++) {
      for (let b = 0; b < size; b++) expect(covariance[(a + from) * p + b + from] * (1 + c.varianceRatio)).toBeCloseTo(c.covariance[a][b], 10);
    }
    if (from === 1) for (let b = 0; b < p; b++) expect(covariance[b]).toBe(0);
    if (c.informationKept !== undefined) expect(result.blocks.informationKept as number).toBeCloseTo(c.informationKept, 10);
    else expect(result.blocks.informationKept).toBe(1);
  });
});

describe('units and identities', () => {
  const points = [[-1, -1], [-1, 0], [-1, 1], [0, -1], [0, 1], [1, -1], [1, 0], [1, 1], [0, 0], [0, 0]];
  const X = modelMatrix(model, points);
  const plainInverse = choleskyInverse(choleskyFactor(crossProduct(X, 10, model.p), model.p) as Float64Array, model.p);
  it('a completely randomised plan has covariance (X′X)⁻¹ in noise² units whatever eta is', () => {
    const result = structuredPrecision(model, points, { ...independentRuns(10), varianceRatio: 3 }, hard);
    plainInverse.forEach((value, i) => expect((result.covariance as Float64Array)[i]).toBeCloseTo(value, 12));
  });
  it('with eta 0 and one session, logDetPerRun is ln det(X′X / n) and nothing is lost to blocks', () => {
    const structure: ErrorStructure = { wholePlotOf: Int32Array.from([0, 0, 0, 1, 1, 2, 2, 2, 3, 4]), sessionOfWholePlot: new Int32Array(5), wholePlots: 5, sessions: 1, varianceRatio: 0 };
    const result = structuredPrecision(model, points, structure, hard);
    const scaled = Float64Array.from(crossProduct(X, 10, model.p), (v) => v / 10);
    expect(result.gls.logDetPerRun as number).toBeCloseTo(choleskyLogDeterminant(choleskyFactor(scaled, model.p) as Float64Array, model.p), 12);
    expect(result.blocks.informationKept).toBe(1);
    // Three whole plots of several runs plus two single-run plots: a split design.
    expect(result.df.split).toBe(true);
  });
  it('marks the terms in hard-to-change factors only as whole-plot terms', () => {
    expect(wholePlotTerms(model, hard)).toEqual([true, true, false, false, true, false]);
  });
  it('reports no information kept when a term is confounded with the sessions', () => {
    // x1 = −1 throughout session 1 and +1 throughout session 2: the x1 column lies in the session span.
    const confounded = [[-1, -1], [-1, 1], [-1, 0], [-1, 0], [1, -1], [1, 1], [1, 0], [1, 0]];
    const structure: ErrorStructure = { ...independentRuns(8), sessionOfWholePlot: Int32Array.from([0, 0, 0, 0, 1, 1, 1, 1]), sessions: 2 };
    const linear = compileModel([{ powers: {} }, { powers: { x1: 1 } }, { powers: { x2: 1 } }], ['x1', 'x2']);
    const result = structuredPrecision(linear, confounded, structure, hard);
    expect(result.blocks.informationKept).toBe(0);
    expect(result.covariance).toBeNull();
  });
});
