import { describe, expect, it } from 'vitest';
import { dot, multiplyInto, quadraticForm, traceOfProduct } from '../../../src/core/linalg/symmetricKernels.js';
import { crossProduct, weightedCrossProduct } from '../../../src/core/linalg/crossProduct.js';

// Expected values worked by hand from the definitions (small integer matrices, exact in binary).
const A = Float64Array.from([2, 1, 0, 1, 3, -1, 0, -1, 4]);

describe('symmetric kernels', () => {
  it('multiplies, dots and takes the quadratic form of a row inside a longer array', () => {
    const rows = Float64Array.from([9, 9, 9, 1, 2, 3]);
    const out = new Float64Array(3);
    multiplyInto(A, 3, rows, out, 3);
    expect(Array.from(out)).toEqual([4, 4, 10]);
    expect(dot(out, rows, 3, 0, 3)).toBe(42);
    // f'Af = 2·1 + 3·4 + 4·9 + 2·(1·2) + 2·(−1·6) = 42.
    expect(quadraticForm(A, 3, rows, 3)).toBe(42);
    expect(quadraticForm(A, 3, [0, 1, 0])).toBe(3);
  });

  it('takes trace(AB) of two symmetric matrices', () => {
    const B = Float64Array.from([1, 0, 2, 0, 1, 0, 2, 0, 1]);
    // AB has diagonal 2 + 0 + 0, 0 + 3 + 0, 0 + 0 + 4 → 9.
    expect(traceOfProduct(A, B)).toBe(9);
  });

  it('forms X′X and X′WX, exactly symmetric', () => {
    const X = [1, -1, 1, 0, 1, 1];
    expect(Array.from(crossProduct(X, 3, 2))).toEqual([3, 0, 0, 2]);
    expect(Array.from(weightedCrossProduct(X, [0.5, 0, 2], 3, 2))).toEqual([2.5, 1.5, 1.5, 2.5]);
    const reused = new Float64Array(4).fill(7);
    expect(crossProduct(X, 3, 2, reused)).toBe(reused);
    expect(Array.from(reused)).toEqual([3, 0, 0, 2]);
  });
});
