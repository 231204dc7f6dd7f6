import { describe, expect, it } from 'vitest';
import reference from '../../reference/design/design.json' with { type: 'json' };
import { informationMatrix, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { exchangeRatio, exchangeUpdate } from '../../../src/core/linalg/inverseUpdate.js';
import { invertSymmetric } from '../../../src/core/linalg/cholesky.js';
import { dot, multiplyInto, quadraticForm } from '../../../src/core/linalg/symmetricKernels.js';
import { modelFromExponents } from '../design/gridRegions.js';

// Expected values: numpy.linalg inverses and determinants of the re-built X'X
// (tests/reference/design/generate.py → design.json).
const fixture = reference.updates;
const model = modelFromExponents(fixture.exponents);
const p = model.p;

function setup() {
  const M = informationMatrix(model, fixture.points);
  const inverse = new Float64Array(p * p);
  const logDet = invertSymmetric(M, p, inverse);
  const X = modelMatrix(model, fixture.points);
  const fx = X.slice(fixture.replaceRow * p, (fixture.replaceRow + 1) * p);
  const fy = modelMatrix(model, [fixture.replacement]);
  return { inverse, logDet, fx, fy };
}

function expectClose(actual: ArrayLike<number>, expected: number[], relative: number) {
  const scale = Math.max(...expected.map(Math.abs));
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expect(Math.abs(actual[i] - expected[i])).toBeLessThan(relative * scale);
}

describe('inverse and determinant updates', () => {
  it('inverts X′X like numpy.linalg.inv (fixture)', () => {
    const { inverse, logDet } = setup();
    expectClose(inverse, fixture.inverse, 1e-10);
    expect(Number.isFinite(logDet)).toBe(true);
  });

  it('gives Fedorov’s determinant ratio of an exchange (numpy det ratio, fixture)', () => {
    const { inverse, fx, fy } = setup();
    const gy = new Float64Array(p);
    multiplyInto(inverse, p, fy, gy);
    const dx = quadraticForm(inverse, p, fx);
    const dy = quadraticForm(inverse, p, fy);
    const dxy = dot(fx, gy, p);
    expect(dot(fy, gy, p)).toBeCloseTo(fixture.dy, 10);
    expect(dx).toBeCloseTo(fixture.dx, 10);
    expect(dy).toBeCloseTo(fixture.dy, 10);
    expect(dxy).toBeCloseTo(fixture.dxy, 10);
    expect(exchangeRatio(dx, dy, dxy)).toBeCloseTo(fixture.determinantRatio, 10);
  });

  it('updates the inverse after an exchange like re-inverting from scratch (fixture)', () => {
    const { inverse, fx, fy } = setup();
    const change = exchangeUpdate(inverse, p, fx, fy, new Float64Array(p), new Float64Array(p));
    expect(change).toBeCloseTo(Math.log(fixture.determinantRatio), 10);
    expectClose(inverse, fixture.inverseAfterExchange, 1e-9);
  });

  it('reports a singular matrix as −Infinity', () => {
    // Rank 1: [[1, 2], [2, 4]].
    expect(invertSymmetric(Float64Array.from([1, 2, 2, 4]), 2, new Float64Array(4))).toBe(Number.NEGATIVE_INFINITY);
  });

  it('refuses an exchange that would make the matrix singular', () => {
    // M = I from the points (1, 0) and (0, 1): exchanging (1, 0) for (0, 1) leaves diag(0, 2).
    const M = Float64Array.from([1, 0, 0, 1]);
    const inverse = new Float64Array(4);
    invertSymmetric(M, 2, inverse);
    expect(Number.isNaN(exchangeUpdate(inverse, 2, [1, 0], [0, 1], new Float64Array(2), new Float64Array(2)))).toBe(true);
    expect(Array.from(inverse)).toEqual([1, 0, 0, 1]);
  });
});
