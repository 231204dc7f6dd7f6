/**
 * Central composite designs.
 *
 * Sources:
 * - Box & Wilson (1951), "On the experimental attainment of optimum conditions", JRSS B 13, and
 *   Montgomery, Design and Analysis of Experiments (table of rotatable α values), from memory:
 *   full cube α = 1.414 (k = 2), 1.682 (3), 2.000 (4), 2.378 (5); half-fraction cube α = 2.000
 *   (k = 5), 2.378 (k = 6).
 * - Box & Hunter (1957), Annals of Mathematical Statistics 28: rotatable ⇔ the odd moments up to
 *   order four vanish and the pure fourth moment is three times the mixed one, [iiii] = 3[iijj].
 *   Checked numerically on the points.
 */
import { describe, expect, it } from 'vitest';
import { centralComposite } from '../../../src/core/classical/centralComposite.js';
import { fractionFromGenerators } from '../../../src/core/classical/fractionalFactorial.js';
import { fullQuadraticTerms, quadraticInformationRank } from './quadraticSupport.js';

const moment = (points: number[][], powers: Record<number, number>) =>
  points.reduce((sum, x) => sum + Object.entries(powers).reduce((product, [j, e]) => product * x[Number(j)] ** e, 1), 0);

function expectRotatable(points: number[][], k: number): void {
  const scale = points.length;
  for (let i = 0; i < k; i++) {
    expect(moment(points, { [i]: 1 }) / scale).toBeCloseTo(0, 12);
    expect(moment(points, { [i]: 3 }) / scale).toBeCloseTo(0, 12);
    for (let j = 0; j < k; j++) {
      if (j === i) continue;
      const mixed = moment(points, { [i]: 2, [j]: 2 });
      expect(moment(points, { [i]: 4 })).toBeCloseTo(3 * mixed, 9);
      expect(moment(points, { [i]: 1, [j]: 1 }) / scale).toBeCloseTo(0, 12);
      expect(moment(points, { [i]: 3, [j]: 1 }) / scale).toBeCloseTo(0, 12);
      for (let l = j + 1; l < k; l++) {
        if (l === i) continue;
        expect(moment(points, { [i]: 2, [j]: 1, [l]: 1 }) / scale).toBeCloseTo(0, 12);
      }
    }
  }
}

describe('rotatable α with a full cube (Box & Wilson 1951; Montgomery, from memory)', () => {
  it.each([
    [2, 1.414], [3, 1.682], [4, 2.0], [5, 2.378],
  ])('k = %i → α = %f', (k, alpha) => {
    const design = centralComposite(k, 'rotatable', 3);
    expect(design.alpha).toBeCloseTo(alpha, 3);
    expect(design.alpha).toBeCloseTo((2 ** k) ** 0.25, 12);
    expect(design.factorialRuns).toBe(2 ** k);
    expect(design.axialRuns).toBe(2 * k);
    expect(design.centreRuns).toBe(3);
    expect(design.points).toHaveLength(2 ** k + 2 * k + 3);
    expectRotatable(design.points, k);
  });
});

describe('rotatable α with a resolution V half-fraction cube (Montgomery, from memory)', () => {
  it.each([
    [5, 16, 2.0], [6, 32, 2.378],
  ])('k = %i: %i cube runs, α = %f', (k, cubeRuns, alpha) => {
    const design = centralComposite(k, 'rotatable', 1, { cube: 'smallest-resolution-v' });
    expect(design.factorialRuns).toBe(cubeRuns);
    expect(design.alpha).toBeCloseTo(alpha, 3);
    expectRotatable(design.points, k);
    expect(quadraticInformationRank(design.points)).toBe(fullQuadraticTerms(k));
  });

  it('an explicit fraction is used as the cube portion; a resolution IV one is refused', () => {
    const half = fractionFromGenerators(5, ['E=ABCD']);
    const design = centralComposite(5, 'face', 2, { fraction: half });
    expect(design.points.slice(0, 16)).toEqual(half.points);
    expect(design.points).toHaveLength(16 + 10 + 2);
    expect(() => centralComposite(6, 'rotatable', 0, { fraction: fractionFromGenerators(6, ['E=ABC', 'F=BCD']) })).toThrow(/resolution 4/);
    expect(() => centralComposite(4, 'rotatable', 0, { fraction: half })).toThrow(/5 factors/);
  });
});

describe('face-centred design', () => {
  it('three levels per factor, axial points on the faces, supports the full quadratic model', () => {
    const design = centralComposite(3, 'face', 6);
    expect(design.alpha).toBe(1);
    expect(design.points).toHaveLength(8 + 6 + 6);
    for (let j = 0; j < 3; j++) expect(new Set(design.points.map((x) => x[j]))).toEqual(new Set([-1, 0, 1]));
    expect(design.points.slice(8, 14)).toEqual([
      [-1, 0, 0], [1, 0, 0], [0, -1, 0], [0, 1, 0], [0, 0, -1], [0, 0, 1],
    ]);
    expect(quadraticInformationRank(design.points)).toBe(fullQuadraticTerms(3));
  });

  it('the face-centred design is not rotatable: [iiii] ≠ 3[iijj] (a check that can fail)', () => {
    const { points } = centralComposite(3, 'face', 1);
    expect(moment(points, { 0: 4 })).toBe(10); // 8 cube + 2 axial
    expect(moment(points, { 0: 2, 1: 2 })).toBe(8);
  });
});

describe('arguments', () => {
  it('rejects negative or fractional centre runs and unknown kinds', () => {
    expect(() => centralComposite(3, 'face', -1)).toThrow(RangeError);
    expect(() => centralComposite(3, 'face', 1.5)).toThrow(RangeError);
    expect(() => centralComposite(3, 'spherical' as 'face', 1)).toThrow(RangeError);
  });
});
