/**
 * Regular 2^(k−p) fractions: construction from generators, defining relation, word-length
 * pattern, and the minimum-aberration search — checked against published tables.
 *
 * Sources (all recalled from memory; the tables could not be consulted during this work):
 * - NIST/SEMATECH e-Handbook of Statistical Methods, §5.3.3.4.7 "Summary tables of useful
 *   fractional factorial designs" (run sizes, resolutions, generators).
 * - Box, Hunter & Hunter (2005), Statistics for Experimenters, 2nd ed., Table 6.22 (same designs).
 * - Chen, Sun & Wu (1993), "A catalogue of two-level and three-level fractional factorial designs
 *   with small runs", International Statistical Review 61 (word-length patterns of the
 *   minimum-aberration designs).
 * - tests/reference/classical/published-fractions.json: the defining words of the published
 *   generators found by numpy directly from the runs (generate.py beside it), an independent route.
 */
import { describe, expect, it } from 'vitest';
import { fractionFromGenerators, minimumAberrationFraction } from '../../../src/core/classical/fractionalFactorial.js';
import published from '../../reference/classical/published-fractions.json' with { type: 'json' };

describe('smallest fraction of a required resolution (NIST §5.3.3.4.7 and BHH Table 6.22, from memory)', () => {
  // k → runs of the smallest fraction with resolution ≥ IV; 2^(5−1) is already resolution V.
  const resolutionIV: [number, number, number][] = [
    [5, 16, 5], [6, 16, 4], [7, 16, 4], [8, 16, 4], [9, 32, 4], [10, 32, 4], [11, 32, 4],
  ];
  // k → runs of the smallest fraction with resolution ≥ V: 2^(5−1) V, 2^(6−1) VI, 2^(7−1) VII,
  // 2^(8−2) V, 2^(9−2) VI, 2^(10−3) V, 2^(11−4) V.
  const resolutionV: [number, number, number][] = [
    [5, 16, 5], [6, 32, 6], [7, 64, 7], [8, 64, 5], [9, 128, 6], [10, 128, 5], [11, 128, 5],
  ];
  it.each(resolutionIV)('resolution ≥ IV, %i factors: %i runs, resolution %i', (k, runs, resolution) => {
    const fraction = minimumAberrationFraction(k, 4)!;
    expect(fraction.runs).toBe(runs);
    expect(fraction.p).toBe(k - Math.log2(runs));
    expect(fraction.resolution).toBe(resolution);
    expect(fraction.search?.exhaustive).toBe(true);
  });
  it.each(resolutionV)('resolution ≥ V, %i factors: %i runs, resolution %i', (k, runs, resolution) => {
    const fraction = minimumAberrationFraction(k, 5)!;
    expect(fraction.runs).toBe(runs);
    expect(fraction.resolution).toBe(resolution);
    expect(fraction.search?.exhaustive).toBe(true);
  });
  it('resolution ≥ III: saturated in 8 runs up to 7 factors and 16 runs up to 15', () => {
    // NIST §5.3.3.4.7: 2^(7−4) III is the largest 8-run fraction, 2^(15−11) III the largest 16-run one.
    for (let k = 4; k <= 7; k++) expect(minimumAberrationFraction(k, 3)!.runs).toBe(8);
    for (let k = 8; k <= 15; k++) expect(minimumAberrationFraction(k, 3)!.runs).toBe(16);
    expect(minimumAberrationFraction(16, 3)!.runs).toBe(32);
  });
  it('12 factors at resolution V need 256 runs: no 128-run fraction reaches V (the search proves it)', () => {
    // From memory (NIST §5.3.3.4.7): 11 factors is the most a 128-run resolution V fraction holds.
    const fraction = minimumAberrationFraction(12, 5)!;
    expect(fraction.runs).toBe(256);
    expect(fraction.search?.exhaustive).toBe(true);
  });
});

describe('published generators, analysed (numpy fixture from the runs themselves)', () => {
  it.each(published.fractions.map((f) => [`2^(${f.k}−${f.generators.length}) ${f.generators.join(' ')}`, f] as const))(
    '%s',
    (_label, reference) => {
      const fraction = fractionFromGenerators(reference.k, reference.generators);
      expect(fraction.runs).toBe(reference.runs);
      expect(fraction.resolution).toBe(reference.resolution);
      expect(fraction.wordLengthPattern).toEqual(reference.wordLengthPattern);
      expect([...fraction.definingWords].sort()).toEqual([...reference.definingWords].sort());
      expect(new Set(fraction.points.map((point) => point.join())).size).toBe(reference.distinctRuns);
    },
  );
});

describe('minimum aberration at each published run size', () => {
  // The NIST / BHH designs are minimum-aberration fractions, so the search must reach exactly
  // their word-length pattern at their run size. Its generators may differ from the published
  // ones: minimum-aberration designs are unique only up to relabelling the factors.
  it.each(published.fractions.map((f) => [`2^(${f.k}−${f.generators.length})`, f] as const))('%s', (_label, reference) => {
    const fraction = minimumAberrationFraction(reference.k, 3, { minRuns: reference.runs, maxRuns: reference.runs })!;
    expect(fraction.runs).toBe(reference.runs);
    expect(fraction.resolution).toBe(reference.resolution);
    expect(fraction.wordLengthPattern).toEqual(reference.wordLengthPattern);
  });

  it('first word-length pattern entries quoted by Chen, Sun & Wu (1993) (from memory)', () => {
    const firstEntries = (k: number, runs: number, n: number) =>
      minimumAberrationFraction(k, 3, { minRuns: runs, maxRuns: runs })!.wordLengthPattern.slice(0, n);
    expect(firstEntries(6, 16, 2)).toEqual([0, 3]); // 6-2.1
    expect(firstEntries(7, 16, 2)).toEqual([0, 7]); // 7-3.1
    expect(firstEntries(8, 16, 2)).toEqual([0, 14]); // 8-4.1
    expect(firstEntries(7, 32, 3)).toEqual([0, 1, 2]); // 7-2.1
    expect(firstEntries(8, 32, 3)).toEqual([0, 3, 4]); // 8-3.1
    expect(firstEntries(9, 32, 3)).toEqual([0, 6, 8]); // 9-4.1
    expect(firstEntries(10, 32, 3)).toEqual([0, 10, 16]); // 10-5.1
    expect(firstEntries(11, 32, 2)).toEqual([0, 25]); // 11-6.1
    expect(firstEntries(8, 64, 4)).toEqual([0, 0, 2, 1]); // 8-2.1
  });
});

describe('construction', () => {
  it('points are ±1, balanced, main-effect columns orthogonal, added columns the generator products', () => {
    const fraction = fractionFromGenerators(8, ['E=BCD', 'F=ACD', 'G=ABC', 'H=ABD']);
    const { points } = fraction;
    expect(points).toHaveLength(16);
    for (const point of points) for (const value of point) expect(Math.abs(value)).toBe(1);
    for (let a = 0; a < 8; a++) {
      expect(points.reduce((sum, point) => sum + point[a], 0)).toBe(0);
      for (let b = a + 1; b < 8; b++) expect(points.reduce((sum, point) => sum + point[a] * point[b], 0)).toBe(0);
    }
    for (const [A, B, C, D, E, F, G, H] of points) {
      expect(E).toBe(B * C * D);
      expect(F).toBe(A * C * D);
      expect(G).toBe(A * B * C);
      expect(H).toBe(A * B * D);
    }
  });

  it('base factors in standard order, first factor alternating fastest', () => {
    const { points } = fractionFromGenerators(4, ['D=ABC']);
    expect(points.slice(0, 4)).toEqual([
      [-1, -1, -1, -1],
      [1, -1, -1, 1],
      [-1, 1, -1, 1],
      [1, 1, -1, -1],
    ]);
  });

  it('a negative generator selects the other half and carries its sign into the defining words', () => {
    const fraction = fractionFromGenerators(6, ['E=-ABC', 'F=BCD']);
    expect(fraction.generators).toEqual(['E=-ABC', 'F=BCD']);
    // I = −ABCE = BCDF = −ADEF (the product of a negative and a positive word is negative).
    expect([...fraction.definingWords].sort()).toEqual(['-ABCE', '-ADEF', 'BCDF']);
    for (const [A, B, C, , E] of fraction.points) expect(E).toBe(-A * B * C);
  });

  it('added factors need not be the last letters; output generators are normalised', () => {
    const fraction = fractionFromGenerators(4, [' A = DCB ']);
    expect(fraction.generators).toEqual(['A=BCD']);
    expect(fraction.definingWords).toEqual(['ABCD']);
    expect(fraction.resolution).toBe(4);
  });

  it('a full factorial has no defining word and the documented resolution sentinel k + 1', () => {
    const full = fractionFromGenerators(3, []);
    expect(full.runs).toBe(8);
    expect(full.resolution).toBe(4);
    expect(full.wordLengthPattern).toEqual([0]);
    expect(full.definingWords).toEqual([]);
    // Asking for more resolution than any 4-factor fraction has falls back to the full factorial.
    const fallback = minimumAberrationFraction(4, 5)!;
    expect(fallback.p).toBe(0);
    expect(fallback.runs).toBe(16);
    expect(fallback.resolution).toBe(5);
  });

  it('rejects malformed or inconsistent generators', () => {
    expect(() => fractionFromGenerators(5, ['E-ABC'])).toThrow(/form/);
    expect(() => fractionFromGenerators(5, ['E=ABI'])).toThrow(/factor letters/);
    expect(() => fractionFromGenerators(5, ['E=ABB'])).toThrow(/twice/);
    expect(() => fractionFromGenerators(5, ['E=ABC', 'E=ABD'])).toThrow(/two generators/);
    expect(() => fractionFromGenerators(6, ['E=ABC', 'F=ABE'])).toThrow(/added factor/);
    expect(() => fractionFromGenerators(5, ['F=ABC'])).toThrow(/not one of/);
    expect(() => fractionFromGenerators(18, ['R=ABC'])).toThrow(/more than the 65536/);
  });
});

describe('search limits', () => {
  it('returns null when the required resolution needs more runs than allowed', () => {
    // 7 factors at resolution V need 64 runs (2^(7−1) VII; NIST §5.3.3.4.7, from memory).
    expect(minimumAberrationFraction(7, 5, { maxRuns: 32 })).toBeNull();
    expect(minimumAberrationFraction(7, 5, { maxRuns: 64 })!.runs).toBe(64);
  });

  it('a tiny budget still returns a fraction of the required resolution, flagged as not exhaustive', () => {
    const fraction = minimumAberrationFraction(11, 4, { searchBudget: 50 })!;
    expect(fraction.resolution).toBeGreaterThanOrEqual(4);
    expect(fraction.search?.exhaustive).toBe(false);
  });

  it('many factors: a small budget still yields a fraction of the required resolution; long word lists are cut to the shortest 4095', () => {
    const fraction = minimumAberrationFraction(20, 3, { searchBudget: 100_000 })!;
    // 20 factors need 32 runs at resolution III (16 runs hold at most 15; NIST §5.3.3.4.7, from memory).
    expect(fraction.runs).toBe(32);
    expect(fraction.p).toBe(15);
    expect(fraction.resolution).toBeGreaterThanOrEqual(3);
    expect(fraction.wordLengthPattern.reduce((sum, count) => sum + count, 0)).toBe(2 ** 15 - 1);
    expect(fraction.definingWords).toHaveLength(4095);
    const lengths = fraction.definingWords.map((word) => word.length);
    expect(lengths[0]).toBe(fraction.resolution);
    expect([...lengths].sort((a, b) => a - b)).toEqual(lengths);
  });

  it('letters follow factor order and skip I: the 12th factor is M', () => {
    const fraction = minimumAberrationFraction(12, 4)!;
    expect(fraction.generators.map((generator) => generator[0])).toEqual(['F', 'G', 'H', 'J', 'K', 'L', 'M']);
    expect(fraction.definingWords.join('')).not.toContain('I');
  });

  it('ties go to the first generator set of the canonical order (deterministic output)', () => {
    expect(minimumAberrationFraction(6, 4)!.generators).toEqual(['E=ABC', 'F=ABD']);
    expect(minimumAberrationFraction(7, 4)!.generators).toEqual(['E=ABC', 'F=ABD', 'G=ACD']);
    expect(minimumAberrationFraction(5, 4)!.generators).toEqual(['E=ABCD']);
  });

  it('rejects a resolution below III and an impossible factor count', () => {
    expect(() => minimumAberrationFraction(5, 2)).toThrow(RangeError);
    expect(() => minimumAberrationFraction(0, 4)).toThrow(RangeError);
    expect(() => minimumAberrationFraction(26, 4)).toThrow(RangeError);
  });
});
