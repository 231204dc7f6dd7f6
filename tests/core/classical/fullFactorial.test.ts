/**
 * Two-level full factorials and mixed-level full grids.
 *
 * Sources: Yates (1937), "The design and analysis of factorial experiments" (standard order,
 * 2^k runs); common practice: every effect column of a 2^k factorial (main effects and all
 * interactions) is orthogonal to every other, and a full grid holds each combination of levels
 * exactly once.
 */
import { describe, expect, it } from 'vitest';
import { twoLevelFullFactorial } from '../../../src/core/classical/fullFactorial.js';
import { fullGrid } from '../../../src/core/classical/fullGrid.js';

describe('two-level full factorial', () => {
  it('2^3 in standard (Yates) order', () => {
    expect(twoLevelFullFactorial(3)).toEqual([
      [-1, -1, -1], [1, -1, -1], [-1, 1, -1], [1, 1, -1],
      [-1, -1, 1], [1, -1, 1], [-1, 1, 1], [1, 1, 1],
    ]);
  });

  it.each([1, 2, 4, 6])('2^%i: all 2^k − 1 effect columns orthogonal and balanced', (k) => {
    const points = twoLevelFullFactorial(k);
    expect(points).toHaveLength(2 ** k);
    const column = (effect: number) => points.map((x) => x.reduce((product, value, j) => ((effect >>> j) & 1 ? product * value : product), 1));
    for (let e = 1; e < 2 ** k; e++) {
      const a = column(e);
      expect(a.reduce((sum, value) => sum + value, 0)).toBe(0);
      for (let f = e + 1; f < 2 ** k; f++) {
        const b = column(f);
        expect(a.reduce((sum, value, i) => sum + value * b[i], 0)).toBe(0);
      }
    }
  });

  it('rejects impossible sizes', () => {
    expect(() => twoLevelFullFactorial(0)).toThrow(RangeError);
    expect(() => twoLevelFullFactorial(2.5)).toThrow(RangeError);
    expect(() => twoLevelFullFactorial(21)).toThrow(RangeError);
  });
});

describe('full grid', () => {
  it('3 × 2 grid, first factor fastest', () => {
    expect(fullGrid([[-1, 0, 1], [-1, 1]])).toEqual([
      [-1, -1], [0, -1], [1, -1],
      [-1, 1], [0, 1], [1, 1],
    ]);
  });

  it('3 × 4 × 2 grid: 24 distinct points, every level combination once, linear columns orthogonal', () => {
    const levels = [[-1, 0, 1], [-1, -1 / 3, 1 / 3, 1], [-1, 1]];
    const points = fullGrid(levels);
    expect(points).toHaveLength(24);
    expect(new Set(points.map((x) => x.join())).size).toBe(24);
    for (let a = 0; a < 3; a++) {
      expect(points.reduce((sum, x) => sum + x[a], 0)).toBeCloseTo(0, 12);
      for (let b = a + 1; b < 3; b++) expect(points.reduce((sum, x) => sum + x[a] * x[b], 0)).toBeCloseTo(0, 12);
    }
  });

  it('two levels per factor give the two-level full factorial in the same order', () => {
    expect(fullGrid([[-1, 1], [-1, 1], [-1, 1], [-1, 1]])).toEqual(twoLevelFullFactorial(4));
  });

  it('rejects an empty factor list or a factor with no levels', () => {
    expect(() => fullGrid([])).toThrow(RangeError);
    expect(() => fullGrid([[-1, 1], []])).toThrow(RangeError);
  });
});
