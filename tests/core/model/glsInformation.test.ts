/**
 * GLS information of split-plot designs in sessions: the closed forms against a dense numpy
 * computation with V and the session indicators built explicitly
 * (tests/reference/splitplot/generate.py → gls.json), and the identities that pin the
 * definitions (Goos & Vandebroek, 2003, Technometrics 45).
 */
import { describe, expect, it } from 'vitest';
import { glsFixture as fixture, glsModel as model, structureOf } from '../../support/glsFixture.js';
import { compileModel, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { crossProduct } from '../../../src/core/linalg/crossProduct.js';
import {
  blockAdjustedInformation,
  glsInformation,
  independentRuns,
  interceptAdjusted,
  type ErrorStructure,
} from '../../../src/core/model/glsInformation.js';
import { choleskyFactor, choleskyInverse, choleskyLogDeterminant } from '../../../src/core/linalg/cholesky.js';

function logDet(M: Float64Array, size: number): number {
  const L = choleskyFactor(M, size);
  if (!L) throw new Error('singular');
  return choleskyLogDeterminant(L, size);
}

describe('GLS information against numpy (dense V, explicit session indicators)', () => {
  it.each(fixture.cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const X = modelMatrix(model, c.points);
    const N = c.points.length;
    const p = model.p;
    const structure = structureOf(c);
    const M = glsInformation(X, N, p, structure);
    c.glsInformation.flat().forEach((value, i) => expect(M[i]).toBeCloseTo(value, 10));
    expect(logDet(M, p) - p * Math.log(N)).toBeCloseTo(c.logDetPerRun, 10);
    const adjusted = blockAdjustedInformation(X, N, p, structure);
    const covariance = choleskyInverse(choleskyFactor(adjusted.matrix, adjusted.size) as Float64Array, adjusted.size);
    c.covariance.flat().forEach((value, i) => expect(covariance[i]).toBeCloseTo(value, 10));
    if (c.informationKept !== undefined) {
      const kept = Math.exp((logDet(adjusted.matrix, p - 1) - logDet(interceptAdjusted(M, p), p - 1)) / (p - 1));
      expect(kept).toBeCloseTo(c.informationKept, 10);
    }
  });
});

describe('GLS information identities', () => {
  const points = [
    [-1, -1], [-1, 0], [-1, 1], [0, -1], [0, 1], [1, -1], [1, 0], [1, 1], [0, 0],
  ];
  const X = modelMatrix(model, points);
  it('equals X′X when eta is 0, whatever the whole plots', () => {
    const structure: ErrorStructure = { ...independentRuns(9), wholePlotOf: Int32Array.from([0, 0, 0, 1, 1, 2, 2, 2, 1]), wholePlots: 3, sessionOfWholePlot: new Int32Array(3) };
    const M = glsInformation(X, 9, model.p, structure);
    const plain = crossProduct(X, 9, model.p);
    plain.forEach((value, i) => expect(M[i]).toBeCloseTo(value, 12));
  });
  it('equals X′X / (1 + eta) when every whole plot holds one run', () => {
    const eta = 1.7;
    const M = glsInformation(X, 9, model.p, { ...independentRuns(9), varianceRatio: eta });
    const plain = crossProduct(X, 9, model.p);
    plain.forEach((value, i) => expect(M[i]).toBeCloseTo(value / (1 + eta), 12));
  });
});

describe('blocking a two-level factorial on its highest-order interaction', () => {
  // The textbook construction (Montgomery, Design and Analysis of Experiments, ch. 7): the 2³
  // factorial in two blocks of four split on the sign of ABC. Main effects and two-factor
  // interactions are orthogonal to the blocks, so blocking costs them no information.
  const three = compileModel(
    [{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { c: 1 } }, { powers: { a: 1, b: 1 } }, { powers: { a: 1, c: 1 } }, { powers: { b: 1, c: 1 } }],
    ['a', 'b', 'c'],
  );
  const runs: number[][] = [];
  for (const a of [-1, 1]) for (const b of [-1, 1]) for (const c of [-1, 1]) runs.push([a, b, c]);
  const ordered = [...runs.filter((r) => r[0] * r[1] * r[2] < 0), ...runs.filter((r) => r[0] * r[1] * r[2] > 0)];
  const X = modelMatrix(three, ordered);
  const structure: ErrorStructure = { ...independentRuns(8), sessionOfWholePlot: Int32Array.from([0, 0, 0, 0, 1, 1, 1, 1]), sessions: 2 };
  it('keeps all the information on main effects and two-factor interactions', () => {
    const adjusted = blockAdjustedInformation(X, 8, three.p, structure);
    const unblocked = interceptAdjusted(glsInformation(X, 8, three.p, structure), three.p);
    expect(Math.exp((logDet(adjusted.matrix, 6) - logDet(unblocked, 6)) / 6)).toBeCloseTo(1, 12);
  });
  it('loses the three-factor interaction to the blocks', () => {
    const withAbc = compileModel([{ powers: {} }, { powers: { a: 1 } }, { powers: { a: 1, b: 1, c: 1 } }], ['a', 'b', 'c']);
    const adjusted = blockAdjustedInformation(modelMatrix(withAbc, ordered), 8, withAbc.p, structure);
    expect(choleskyFactor(adjusted.matrix, adjusted.size)).toBeNull();
  });
});
