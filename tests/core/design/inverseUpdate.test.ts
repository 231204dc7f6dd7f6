import { describe, expect, it } from 'vitest';
import reference from '../../reference/design/design.json' with { type: 'json' };
import { informationMatrix, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { exchangeRatio, exchangeUpdate, rankOneUpdate } from '../../../src/core/design/inverseUpdate.js';
import { invertSymmetric } from '../../../src/core/evaluate/cholesky.js';
import { modelFromExponents } from './gridRegions.js';

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
    const gx = new Float64Array(p);
    const gy = new Float64Array(p);
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) {
      gx[a] += inverse[a * p + b] * fx[b];
      gy[a] += inverse[a * p + b] * fy[b];
    }
    const dx = fx.reduce((s, v, i) => s + v * gx[i], 0);
    const dy = fy.reduce((s, v, i) => s + v * gy[i], 0);
    const dxy = fx.reduce((s, v, i) => s + v * gy[i], 0);
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

  it('adds a point by Sherman–Morrison and tracks ln det (fixture)', () => {
    const { inverse, fy } = setup();
    const change = rankOneUpdate(inverse, p, fy, 1, new Float64Array(p));
    expect(change).toBeCloseTo(fixture.logDetChangeAdd, 10);
    expectClose(inverse, fixture.inverseAfterAdd, 1e-9);
  });

  it('reports a singular matrix as −Infinity', () => {
    // Rank 1: [[1, 2], [2, 4]].
    expect(invertSymmetric(Float64Array.from([1, 2, 2, 4]), 2, new Float64Array(4))).toBe(Number.NEGATIVE_INFINITY);
  });

  it('refuses a removal that would make the matrix singular', () => {
    // M = f f' + I-ish: removing a point that carries a whole dimension leaves a singular matrix.
    const M = Float64Array.from([1, 0, 0, 1]);
    const inverse = new Float64Array(4);
    invertSymmetric(M, 2, inverse);
    expect(Number.isNaN(rankOneUpdate(inverse, 2, [1, 0], -1, new Float64Array(2)))).toBe(true);
    expect(Array.from(inverse)).toEqual([1, 0, 0, 1]);
  });
});
