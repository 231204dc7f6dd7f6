/**
 * The structured (blocked / split-plot) exact search against exhaustive enumeration on grids
 * small enough to list every design, and against the unstructured criterion where the two
 * must agree.
 */
import { describe, expect, it } from 'vitest';
import { compileModel, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { blockAdjustedInformation, type ErrorStructure } from '../../../src/core/model/glsInformation.js';
import { choleskyFactor, choleskyInverse, choleskyLogDeterminant } from '../../../src/core/linalg/cholesky.js';
import { findStructuredDesign, withinPlotRatio } from '../../../src/core/design/structuredExchange.js';
import type { CandidateRegion } from '../../../src/core/region/candidateRegion.js';

const levels3 = [-1, 0, 1];
function boxRegion(k: number, levels: number[] = levels3): CandidateRegion {
  return { factorIds: Array.from({ length: k }, (_, j) => `x${j + 1}`), levels: Array.from({ length: k }, () => levels), isFeasible: () => true, gridSize: levels.length ** k, points: null };
}
const quadratic2 = compileModel(
  [{ powers: {} }, { powers: { x1: 1 } }, { powers: { x2: 1 } }, { powers: { x1: 1, x2: 1 } }, { powers: { x1: 2 } }, { powers: { x2: 2 } }],
  ['x1', 'x2'],
);

function logDetOf(points: number[][], structure: ErrorStructure): number {
  const X = modelMatrix(quadratic2, points);
  const { matrix, size } = blockAdjustedInformation(X, points.length, quadratic2.p, structure);
  const L = choleskyFactor(matrix, size, 1e-10);
  return L ? choleskyLogDeterminant(L, size) : Number.NEGATIVE_INFINITY;
}

/** Every design of `plots` whole plots of two runs: x1 shared in a plot, x2 free per run. */
function bestByEnumeration(plots: number, structure: ErrorStructure): number {
  const options: number[][][] = [];
  for (const h of levels3) for (let a = 0; a < 3; a++) for (let b = a; b < 3; b++) options.push([[h, levels3[a]], [h, levels3[b]]]);
  let best = Number.NEGATIVE_INFINITY;
  const pick = (from: number, chosen: number[][][]) => {
    if (chosen.length === plots) {
      best = Math.max(best, logDetOf(chosen.flat(), structure));
      return;
    }
    // With one session the plots are exchangeable (multisets suffice); with more, order matters.
    for (let o = structure.sessions > 1 ? 0 : from; o < options.length; o++) pick(o, [...chosen, options[o]]);
  };
  pick(0, []);
  return best;
}

function structureOf(plots: number, size: number, sessions: number, eta: number): ErrorStructure {
  return {
    wholePlotOf: Int32Array.from({ length: plots * size }, (_, i) => Math.floor(i / size)),
    sessionOfWholePlot: Int32Array.from({ length: plots }, (_, w) => Math.floor((w * sessions) / plots)),
    wholePlots: plots,
    sessions,
    varianceRatio: eta,
  };
}

describe('structured exact search', () => {
  it.each([
    [4, 1, 1],
    [4, 1, 10],
    [4, 2, 1],
    [5, 1, 0.5],
  ])('reaches the enumerated D-optimum of %i two-run whole plots in %i session(s), eta %f', (plots, sessions, eta) => {
    const structure = structureOf(plots, 2, sessions, eta);
    const optimum = bestByEnumeration(plots, structure);
    const result = findStructuredDesign({
      model: quadratic2,
      region: boxRegion(2),
      structure,
      fixed: Array.from({ length: plots * 2 }, () => null),
      hard: [true, false],
      seed: 7,
      starts: 30,
    });
    expect(result.logDet).toBeCloseTo(optimum, 9);
    expect(logDetOf(result.points, structure)).toBeCloseTo(result.logDet, 9);
    // The hard-to-change factor is shared inside every whole plot.
    for (let w = 0; w < plots; w++) expect(result.points[2 * w][0]).toBe(result.points[2 * w + 1][0]);
  });
});

describe('within-plot move ratio', () => {
  // det(A_new)/det(A) from scratch against the 4 × 4 determinant-lemma form, for random
  // designs, structures and moves (the lemma: det(A + UCU') = det A · det(I + C U'A⁻¹U)).
  it.each([
    [1, 0],
    [1, 1.5],
    [3, 0],
    [3, 2],
  ])('matches the from-scratch ratio with %i session(s), eta %f', (sessions, eta) => {
    let seed = 12345 + sessions * 7 + eta * 3;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const plots = 6;
    const size = 3;
    const structure = structureOf(plots, size, sessions, eta);
    const points = Array.from({ length: plots * size }, () => [levels3[Math.floor(random() * 3)], levels3[Math.floor(random() * 3)]]);
    for (let trial = 0; trial < 20; trial++) {
      const i = Math.floor(random() * points.length);
      const moved = points.map((point) => [...point]);
      moved[i][1] = levels3[(levels3.indexOf(moved[i][1]) + 1 + Math.floor(random() * 2)) % 3];
      const before = blockAdjustedInformation(modelMatrix(quadratic2, points), points.length, quadratic2.p, structure);
      const after = blockAdjustedInformation(modelMatrix(quadratic2, moved), moved.length, quadratic2.p, structure);
      const q = before.size;
      const from = quadratic2.p - q;
      const Linv = choleskyFactor(before.matrix, q, 1e-12);
      if (!Linv) continue;
      const inverse = choleskyInverse(Linv, q);
      const reduced = (point: number[]) => Array.from(modelMatrix(quadratic2, [point]).subarray(from));
      const w = structure.wholePlotOf[i];
      const n = size;
      const g = 1 / (1 + eta * n);
      const c = eta / (1 + eta * n);
      const s = new Array<number>(q).fill(0);
      points.forEach((point, r) => {
        if (structure.wholePlotOf[r] === w) reduced(point).forEach((v, a) => (s[a] += v));
      });
      const b = structure.sessionOfWholePlot[w];
      const a = new Array<number>(q).fill(0);
      let d = 0;
      points.forEach((point, r) => {
        if (structure.sessionOfWholePlot[structure.wholePlotOf[r]] === b) {
          reduced(point).forEach((v, m) => (a[m] += g * v));
          d += g;
        }
      });
      const U = [reduced(points[i]), reduced(moved[i]), s, a];
      const G = new Float64Array(16);
      for (let r = 0; r < 4; r++)
        for (let col = 0; col < 4; col++) {
          let sum = 0;
          for (let x = 0; x < q; x++) for (let y = 0; y < q; y++) sum += U[r][x] * inverse[x * q + y] * U[col][y];
          G[r * 4 + col] = sum;
        }
      const multi = sessions > 1;
      const ratio = withinPlotRatio(G, c, multi ? g / d : 0, multi ? (g * g) / d : 0);
      const La = choleskyFactor(after.matrix, q, 1e-12);
      const expected = La ? Math.exp(choleskyLogDeterminant(La, q) - choleskyLogDeterminant(Linv, q)) : 0;
      expect(ratio).toBeCloseTo(expected, 9);
    }
  });
});
