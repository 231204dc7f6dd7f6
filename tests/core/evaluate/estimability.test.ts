// Aliasing of the 2^(3−1) fraction with generator C = AB (defining relation I = ABC):
// A is aliased with BC, B with AC, C with AB (Montgomery, 2017, "Design and Analysis of
// Experiments", 9th ed., §8.2, the one-half fraction of the 2^3 design).
import { describe, expect, it } from 'vitest';
import { compileModel, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { aliasMatrix, estimability } from '../../../src/core/evaluate/estimability.js';
import type { ModelTerm } from '../../../src/core/model/modelTerm.js';

type Powers = Pick<ModelTerm, 'powers'>;

const factors = ['A', 'B', 'C'];
// Principal fraction: C = AB.
const half = [
  [-1, -1, 1],
  [1, -1, -1],
  [-1, 1, -1],
  [1, 1, 1],
];
const mainEffects: Powers[] = [{ powers: {} }, { powers: { A: 1 } }, { powers: { B: 1 } }, { powers: { C: 1 } }];
const interactions: Powers[] = [{ powers: { A: 1, B: 1 } }, { powers: { A: 1, C: 1 } }, { powers: { B: 1, C: 1 } }];

describe('alias matrix (Box & Draper; Montgomery §8.2)', () => {
  it('puts each main effect on the two-factor interaction of the other two factors', () => {
    const X1 = modelMatrix(compileModel(mainEffects, factors), half);
    const X2 = modelMatrix(compileModel(interactions, factors), half);
    const A = Array.from(aliasMatrix(X1, X2, 4, 4, 3)).map((v) => Math.round(v * 1e12) / 1e12 + 0);
    // Rows 1, A, B, C; columns AB, AC, BC.
    expect(A).toEqual([0, 0, 0, 0, 0, 1, 0, 1, 0, 1, 0, 0]);
  });

  it('stays exact on a badly scaled design whose normal equations are singular in double precision', () => {
    // x = 1e8, 1e8 + 1, 1e8 + 2: X1'X1 has condition ~1e17 (Cholesky fails), yet the columns
    // [1, x] are independent; the dropped column 1 + 2x is exactly 1·(1) + 2·(x). The slope
    // is well determined; the intercept only to about 2e8·ε·κ, so it is checked loosely.
    const x = [1e8, 1e8 + 1, 1e8 + 2];
    const X1 = Float64Array.from(x.flatMap((v) => [1, v]));
    const X2 = Float64Array.from(x.map((v) => 1 + 2 * v));
    const A = aliasMatrix(X1, X2, 3, 2, 1);
    expect(Math.abs(A[0] - 1)).toBeLessThan(10);
    expect(A[1]).toBeCloseTo(2, 7);
  });
});

describe('estimability', () => {
  it('finds rank 4 and reports each interaction aliased with one main effect', () => {
    const model = compileModel([...mainEffects, ...interactions], factors);
    const labels = ['1', 'A', 'B', 'C', 'A*B', 'A*C', 'B*C'];
    const result = estimability(modelMatrix(model, half), 4, 7, labels);
    expect(result.rank).toBe(4);
    expect(result.estimableColumns).toEqual([0, 1, 2, 3]);
    expect(result.nonEstimable).toEqual([
      { term: 'A*B', aliasedWith: [{ term: 'C', coefficient: 1 }] },
      { term: 'A*C', aliasedWith: [{ term: 'B', coefficient: 1 }] },
      { term: 'B*C', aliasedWith: [{ term: 'A', coefficient: 1 }] },
    ]);
  });

  it('reports squared terms of a two-level design with centre runs as aliased with each other and the intercept', () => {
    // Common practice: a 2^2 factorial plus centre runs estimates only the sum of the pure quadratic effects.
    const model = compileModel([{ powers: {} }, { powers: { A: 1 } }, { powers: { B: 1 } }, { powers: { A: 2 } }, { powers: { B: 2 } }], ['A', 'B']);
    const points = [[-1, -1], [1, -1], [-1, 1], [1, 1], [0, 0], [0, 0]];
    const result = estimability(modelMatrix(model, points), 6, 5, ['1', 'A', 'B', 'A^2', 'B^2']);
    expect(result.rank).toBe(4);
    expect(result.nonEstimable).toEqual([{ term: 'B^2', aliasedWith: [{ term: 'A^2', coefficient: 1 }] }]);
  });

  it('reports a column that never varies from zero with no partners', () => {
    const model = compileModel([{ powers: {} }, { powers: { A: 1 } }], ['A']);
    const result = estimability(modelMatrix(model, [[0], [0], [0]]), 3, 2, ['1', 'A']);
    expect(result.rank).toBe(1);
    expect(result.nonEstimable).toEqual([{ term: 'A', aliasedWith: [] }]);
  });
});
