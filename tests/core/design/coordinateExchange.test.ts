import { describe, expect, it } from 'vitest';
import reference from '../../reference/design/design.json' with { type: 'json' };
import { coordinateExchangePass } from '../../../src/core/design/coordinateExchange.js';
import { ExchangeState } from '../../../src/core/design/exchangeState.js';
import { expandInto, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { logDetPerRun, iCriterion } from '../../../src/core/evaluate/designCriteria.js';
import { gridRegion, modelFromExponents, quadraticExponents, THREE_LEVELS } from './gridRegions.js';

describe('coordinate exchange', () => {
  const fixture = reference.updates;
  const model = modelFromExponents(fixture.exponents);
  const p = model.p;
  const W = Float64Array.from(reference.criteria[1].moments);

  // Expected: numpy re-inversion of the changed X'X (tests/reference/design/generate.py).
  it('scores an exchange by the numpy determinant ratio and trace change, by both trial paths', () => {
    const state = new ExchangeState(model, Float64Array.from(fixture.points.flat()), 'I', W);
    state.prepareRow(fixture.replaceRow);
    const fy = modelMatrix(model, [fixture.replacement]);
    const traceBefore = reference.criteria[1].iCriterion;
    const expectedGain = traceBefore - fixture.traceAfterExchange;
    expect(state.score(fy) / expectedGain).toBeCloseTo(1, 9);
    // One-coordinate path: the replacement differs from row 4 in the listed terms only.
    const all = Int32Array.from({ length: p }, (_, t) => t);
    expect(state.scoreChanged(fy, all) / expectedGain).toBeCloseTo(1, 9);
    const dState = new ExchangeState(model, Float64Array.from(fixture.points.flat()), 'D', null);
    dState.prepareRow(fixture.replaceRow);
    expect(dState.score(fy)).toBeCloseTo(fixture.determinantRatio, 10);
    dState.exchange(fixture.replaceRow, fixture.replacement, fy);
    expect(dState.logDet).toBeCloseTo(reference.criteria[1].logDetXtX + Math.log(fixture.determinantRatio), 9);
  });

  it('never lowers the determinant, keeps points on the levels and in the region, and tracks ln det and the trace', () => {
    const feasible = (x: ArrayLike<number>) => x[0] - x[1] <= 1;
    const region = gridRegion(Array(3).fill(THREE_LEVELS), feasible, false);
    const qModel = modelFromExponents(quadraticExponents(3));
    // A deliberately poor but feasible start: 14 points with repeats.
    const start = [
      [0, 0, 0], [0, 0, 1], [0, 1, 0], [1, 0, 0], [0, 0, -1], [0, -1, 0], [-1, 0, 0],
      [1, 1, 1], [-1, -1, -1], [1, 1, -1], [-1, 1, 1], [0, 1, 1], [1, 1, 0], [-1, -1, 0],
    ];
    const state = new ExchangeState(qModel, Float64Array.from(start.flat()), 'D', null);
    let previous = state.logDet;
    for (let pass = 0; pass < 4; pass++) {
      coordinateExchangePass(state, qModel, region);
      const tracked = state.logDet;
      state.refresh();
      expect(tracked).toBeCloseTo(state.logDet, 8);
      expect(state.logDet).toBeGreaterThanOrEqual(previous - 1e-12);
      previous = state.logDet;
    }
    const points = Array.from({ length: 14 }, (_, i) => Array.from(state.points.subarray(i * 3, i * 3 + 3)));
    for (const point of points) {
      expect(feasible(point)).toBe(true);
      for (const value of point) expect(THREE_LEVELS).toContain(value);
    }
    expect(state.logDet - qModel.p * Math.log(14)).toBeCloseTo(logDetPerRun(qModel, points), 9);

    const W3 = Float64Array.from(reference.criteria[1].moments);
    const iState = new ExchangeState(qModel, state.points, 'I', W3);
    const before = iState.trace;
    coordinateExchangePass(iState, qModel, region);
    expect(iState.trace).toBeLessThanOrEqual(before + 1e-12);
    const iPoints = Array.from({ length: 14 }, (_, i) => Array.from(iState.points.subarray(i * 3, i * 3 + 3)));
    expect(iState.trace).toBeCloseTo(iCriterion(qModel, iPoints, W3), 8);
  });

  it('leaves the ridge once a singular start becomes estimable', () => {
    const qModel = modelFromExponents(quadraticExponents(2));
    const region = gridRegion([THREE_LEVELS, THREE_LEVELS], () => true, false);
    const start = Array(8).fill([1, 1]).flat();
    const state = new ExchangeState(qModel, Float64Array.from(start), 'D', null);
    expect(state.ridge).toBeGreaterThan(0);
    for (let pass = 0; pass < 10 && state.ridge > 0; pass++) {
      coordinateExchangePass(state, qModel, region);
      state.refresh();
    }
    expect(state.ridge).toBe(0);
    const f = new Float64Array(qModel.p);
    expandInto(qModel, [0, 0], f);
    expect(Number.isFinite(state.logDet)).toBe(true);
  });
});
