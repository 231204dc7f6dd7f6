/**
 * Box–Behnken designs.
 *
 * Source: Box & Behnken (1960), "Some new three level designs for the study of quantitative
 * variables", Technometrics 2 (run counts and block structure, from memory): without centre
 * runs k = 3 → 12, 4 → 24, 5 → 40 (pairs of factors), 6 → 48, 7 → 56 (blocks of three).
 * Rank of the full quadratic information matrix from ml-matrix's SVD.
 */
import { describe, expect, it } from 'vitest';
import { boxBehnken } from '../../../src/core/classical/boxBehnken.js';
import { fullQuadraticTerms, quadraticInformationRank } from './quadraticSupport.js';

const published: [number, number, number][] = [
  // k, runs without centre points, non-zero coordinates per run
  [3, 12, 2], [4, 24, 2], [5, 40, 2], [6, 48, 3], [7, 56, 3],
];

describe.each(published)('k = %i', (k, runs, nonZero) => {
  const design = boxBehnken(k, 0);
  const points = design.points!;

  it(`${runs} runs without centre points, each with ${nonZero} non-zero coordinates`, () => {
    expect(points).toHaveLength(runs);
    for (const x of points) {
      expect(x).toHaveLength(k);
      expect(x.filter((value) => value !== 0)).toHaveLength(nonZero);
      for (const value of x) expect([-1, 0, 1]).toContain(value);
    }
    expect(new Set(points.map((x) => x.join())).size).toBe(runs);
  });

  it('every factor balanced: as many runs high as low, the same count at zero for all factors', () => {
    const zeros = points.filter((x) => x[0] === 0).length;
    for (let j = 0; j < k; j++) {
      expect(points.filter((x) => x[j] === 1).length).toBe(points.filter((x) => x[j] === -1).length);
      expect(points.filter((x) => x[j] === 0).length).toBe(zeros);
    }
  });

  it('full quadratic model: not estimable without a centre run, estimable with one', () => {
    const terms = fullQuadraticTerms(k);
    expect(quadraticInformationRank(points)).toBe(terms - 1);
    const withCentre = boxBehnken(k, 3).points!;
    expect(withCentre).toHaveLength(runs + 3);
    expect(withCentre.slice(runs)).toEqual([new Array(k).fill(0), new Array(k).fill(0), new Array(k).fill(0)]);
    expect(quadraticInformationRank(withCentre)).toBe(terms);
  });
});

describe('pair structure', () => {
  it('k = 7: every pair of factors varies together in exactly one block of eight runs (balanced)', () => {
    const points = boxBehnken(7, 0).points!;
    for (let a = 0; a < 7; a++)
      for (let b = a + 1; b < 7; b++) expect(points.filter((x) => x[a] !== 0 && x[b] !== 0)).toHaveLength(8);
  });

  it('k = 3: the twelve edge midpoints of the cube, in pair order', () => {
    expect(boxBehnken(3, 0).points!.slice(0, 4)).toEqual([
      [-1, -1, 0], [1, -1, 0], [-1, 1, 0], [1, 1, 0],
    ]);
  });
});

describe('outside the built range', () => {
  it('fewer than three factors, or more than seven, give a reason instead of points', () => {
    for (const k of [1, 2, 8, 12]) {
      const design = boxBehnken(k, 3);
      expect(design.points).toBeNull();
      expect('reason' in design && design.reason).toMatch(/factors/);
    }
    expect(() => boxBehnken(4, -2)).toThrow(RangeError);
  });
});
