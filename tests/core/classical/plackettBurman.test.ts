/**
 * Plackett–Burman designs of 12, 20 and 24 runs.
 *
 * Sources:
 * - Plackett & Burman (1946), "The design of optimum multifactorial experiments", Biometrika 33:
 *   the generator rows (typed here independently of the source module; recalled from memory)
 *   and the cyclic construction with a final all-low row.
 * - Lin & Draper (1992), "Projection properties of Plackett and Burman designs", Technometrics
 *   34 (from memory): every three columns of the 12-run design contain a full 2^3 factorial.
 * - Common practice: in the 12-run design every main-effect column is correlated ±1/3 with each
 *   two-factor interaction column not containing it (partial aliasing).
 */
import { describe, expect, it } from 'vitest';
import { plackettBurman, smallestPlackettBurman } from '../../../src/core/classical/plackettBurman.js';

const publishedFirstRows = {
  12: '+ + − + + + − − − + −',
  20: '+ + − − + + + + − + − + − − − − + + −',
  24: '+ + + + + − + − + + − − + + − − + − + − − − −',
} as const;

const signsOf = (text: string) => text.split(' ').map((sign) => (sign === '+' ? 1 : -1));

describe.each([12, 20, 24] as const)('%i-run design', (runs) => {
  const design = plackettBurman(runs, runs - 1);

  it('first row is the published generator and the last row is all low', () => {
    expect(design).toHaveLength(runs);
    expect(design[0]).toEqual(signsOf(publishedFirstRows[runs]));
    expect(design[runs - 1]).toEqual(new Array(runs - 1).fill(-1));
  });

  it('each row before the last is the previous one shifted cyclically one place to the right', () => {
    for (let row = 1; row < runs - 1; row++) {
      const previous = design[row - 1];
      expect(design[row]).toEqual([previous[runs - 2], ...previous.slice(0, runs - 2)]);
    }
  });

  it("columns are balanced and mutually orthogonal: X'X = N·I", () => {
    for (let a = 0; a < runs - 1; a++) {
      expect(design.reduce((sum, point) => sum + point[a], 0)).toBe(0);
      for (let b = a; b < runs - 1; b++) {
        expect(design.reduce((sum, point) => sum + point[a] * point[b], 0)).toBe(a === b ? runs : 0);
      }
    }
  });

  it('a design for fewer factors is the first columns', () => {
    const five = plackettBurman(runs, 5);
    expect(five).toEqual(design.map((point) => point.slice(0, 5)));
  });
});

describe('12-run projection and partial aliasing', () => {
  const design = plackettBurman(12, 11);

  it('every three columns contain all eight sign combinations (Lin & Draper 1992)', () => {
    for (let a = 0; a < 11; a++)
      for (let b = a + 1; b < 11; b++)
        for (let c = b + 1; c < 11; c++) {
          const seen = new Set(design.map((point) => `${point[a]}${point[b]}${point[c]}`));
          expect(seen.size).toBe(8);
        }
  });

  it('each main effect is correlated ±1/3 with every two-factor interaction not containing it', () => {
    for (let a = 0; a < 11; a++)
      for (let b = 0; b < 11; b++)
        for (let c = b + 1; c < 11; c++) {
          if (a === b || a === c) continue;
          const correlation = design.reduce((sum, point) => sum + point[a] * point[b] * point[c], 0) / 12;
          expect(Math.abs(correlation)).toBeCloseTo(1 / 3, 12);
        }
  });
});

describe('smallest design for k factors', () => {
  it.each([
    [1, 12], [11, 12], [12, 20], [19, 20], [20, 24], [23, 24],
  ])('%i factors → %i runs', (k, runs) => {
    const design = smallestPlackettBurman(k)!;
    expect(design.runs).toBe(runs);
    expect(design.points).toHaveLength(runs);
    expect(design.points[0]).toHaveLength(k);
  });

  it('none above 23 factors; errors for impossible requests', () => {
    expect(smallestPlackettBurman(24)).toBeNull();
    expect(() => plackettBurman(12, 12)).toThrow(RangeError);
    expect(() => plackettBurman(16 as 12, 3)).toThrow(RangeError);
    expect(() => smallestPlackettBurman(0)).toThrow(RangeError);
  });
});
