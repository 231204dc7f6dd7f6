import { describe, expect, it } from 'vitest';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { buildCandidateRegion } from '../../../src/core/region/candidateRegion.js';
import { chooseHoldoutRuns, defaultHoldoutCount } from '../../../src/core/design/holdoutRuns.js';
import { planLevels } from '../../../src/core/design/levels.js';
import { expectInputError } from '../../support/expectInputError.js';
import type { Factor } from '../../../src/core/study.js';
import { DEFAULT_DESIGN } from '../../../src/core/study.js';
import { sampleConstraint, sampleFactors, sampleTiers } from './sprayDryerFixture.js';
import reference from '../../reference/holdouts/holdouts.json' with { type: 'json' };

function square(k: number, precision: number): { factors: Factor[]; tiers: ReturnType<typeof sampleTiers> } {
  const factors: Factor[] = Array.from({ length: k }, (_, i) => ({
    id: `x${i + 1}`, name: `x${i + 1}`, unit: '-', role: 'operating', low: 0, high: 2, nominal: 1, precision,
  }));
  // Moderate tier → 3 levels 0, 1, 2 (coded −1, 0, 1).
  const tiers = { ...sampleTiers(), factors: factors.map((f) => ({ ...sampleTiers().factors[2], id: f.id })) };
  return { factors, tiers };
}

function nearestDistance(point: number[], others: number[][]): number {
  return Math.min(...others.map((o) => Math.hypot(...point.map((x, j) => x - o[j]))));
}

describe('defaultHoldoutCount', () => {
  it('is about 20 % of the fitting runs, at least 2 (common practice)', () => {
    expect(defaultHoldoutCount(0)).toBe(2);
    expect(defaultHoldoutCount(10)).toBe(2);
    expect(defaultHoldoutCount(12)).toBe(2); // 2.4
    expect(defaultHoldoutCount(13)).toBe(3); // 2.6
    expect(defaultHoldoutCount(20)).toBe(4);
    expect(defaultHoldoutCount(37)).toBe(7); // 7.4
  });
});

describe('chooseHoldoutRuns, worked by hand on a 3 × 3 grid', () => {
  // Levels 0, 1, 2 (coded −1, 0, 1), settable in 0.5 steps: interior candidates are {−0.5, 0, 0.5}².
  // With the whole 3 × 3 grid occupied, the diagonal candidates (±0.5, ±0.5) are √0.5 ≈ 0.707 from the nearest
  // occupied point, the edge midpoints (0, ±0.5) only 0.5 and (0, 0) is occupied. After one diagonal is taken the
  // others stay √0.5 from their nearest point (the taken one is 1 away), so maximin takes diagonals first.
  const { factors, tiers } = square(2, 0.5);
  const levels = planLevels(factors, tiers, DEFAULT_DESIGN.levels);
  const region = buildCandidateRegion(factors, levels, []);
  const grid = region.points!;

  it('takes the diagonal midpoints first', () => {
    const chosen = chooseHoldoutRuns(region, grid, 4, 11);
    expect(chosen).toHaveLength(4);
    for (const p of chosen) expect(p.map(Math.abs)).toEqual([0.5, 0.5]);
    expect(new Set(chosen.map((p) => p.join(','))).size).toBe(4);
  });

  // The four diagonal midpoints tie for the first pick (symmetry of the square); the seeded
  // tie-break must not always favour the same one, or holdouts would lean to one corner.
  it('breaks the tie between the diagonal midpoints by the seed', () => {
    const firsts = new Set(Array.from({ length: 24 }, (_, seed) => chooseHoldoutRuns(region, grid, 1, seed + 1)[0].join(',')));
    expect([...firsts].sort()).toEqual(['-0.5,-0.5', '-0.5,0.5', '0.5,-0.5', '0.5,0.5']);
  });

  it('is deterministic for a seed', () => {
    expect(chooseHoldoutRuns(region, grid, 3, 5)).toEqual(chooseHoldoutRuns(region, grid, 3, 5));
  });

  it('refuses more holdouts than free interior points', () => {
    const e = expectInputError(() => chooseHoldoutRuns(region, grid, 9, 1));
    expect(e.location.key).toBe('design.holdoutRuns');
    expect(e.message).toContain('only 8 interior points are free');
    expect(chooseHoldoutRuns(region, grid, 0, 1)).toEqual([]);
  });

  it('returns what there is when asked for at most a count', () => {
    expect(chooseHoldoutRuns(region, grid, 12, 1, { atMost: true })).toHaveLength(8);
    // Levels 0, 1 in whole steps have no setting strictly between them.
    const { factors: two, tiers: twoTiers } = square(2, 1);
    const bare = planLevels(two.map((f) => ({ ...f, high: 1, levels: 2 })), twoTiers, DEFAULT_DESIGN.levels);
    const r = buildCandidateRegion(two.map((f) => ({ ...f, high: 1 })), bare, []);
    expect(chooseHoldoutRuns(r, r.points!, 2, 1, { atMost: true })).toEqual([]);
    expect(expectInputError(() => chooseHoldoutRuns(r, r.points!, 2, 1)).message).toContain('no settable value strictly between');
  });

  it('avoids constraint faces', () => {
    // x1 + x2 ≤ 2 in engineering units is x1 + x2 ≤ 0 coded: (0, 0), (−0.5, 0.5) and (0.5, −0.5) lie on the face.
    const cut = buildCandidateRegion(factors, levels, ['x1 + x2 <= 2']);
    const chosen = chooseHoldoutRuns(cut, cut.points!, 3, 3);
    for (const p of chosen) {
      expect(p[0] + p[1]).toBeLessThan(-1e-9);
      expect(cut.isFeasible(p)).toBe(true);
    }
  });
});

describe('chooseHoldoutRuns on the spray-dryer sample', () => {
  const factors = sampleFactors();
  const levels = planLevels(factors, sampleTiers(), DEFAULT_DESIGN.levels);
  const region = buildCandidateRegion(factors, levels, [sampleConstraint]);
  // A stand-in fitting design: every feasible corner of the 4-factor box, plus the centre.
  const corners = region.points!.filter((p) => p.every((x) => Math.abs(x) === 1));
  const occupied = [...corners, [0, 0, 0, 0]];
  const holdouts = chooseHoldoutRuns(region, occupied, 3, 20261201);

  it('gives feasible, interior, settable points', () => {
    expect(corners).toHaveLength(16 - 4);
    expect(holdouts).toHaveLength(3);
    for (const p of holdouts) {
      expect(region.isFeasible(p)).toBe(true);
      for (const x of p) expect(Math.abs(x)).toBeLessThan(1);
      // Settable: inlet_temp whole °C, feed_solids 0.5 % steps, feed_rate 0.1 kg/h, atomiser_speed 100 rpm.
      const inlet = 180 + 20 * p[0];
      const solids = 37.5 + 7.5 * p[1];
      const feed = 12 + 4 * p[2];
      const speed = 20000 + 5000 * p[3];
      expect(Math.abs(inlet - Math.round(inlet))).toBeLessThan(1e-9);
      expect(Math.abs(solids * 2 - Math.round(solids * 2))).toBeLessThan(1e-9);
      expect(Math.abs(feed * 10 - Math.round(feed * 10))).toBeLessThan(1e-9);
      expect(Math.abs(speed / 100 - Math.round(speed / 100))).toBeLessThan(1e-9);
    }
  });

  it('keeps farther from the fitting points than random interior choices', () => {
    // Random baseline: the same interior candidate set (interior levels and midpoints), drawn uniformly.
    const sets = [
      [-0.65, -0.35, 0, 0.35, 0.65], // 167, 173, 180, 187, 193 °C (halves towards the middle)
      [-2 / 3, -1 / 3, 0, 1 / 3, 2 / 3],
      [-0.5, 0, 0.5],
      [-0.5, 0, 0.5],
    ];
    const ours = Math.min(...holdouts.map((p) => nearestDistance(p, occupied)));
    const rng = xoroshiro128plus(99);
    let total = 0;
    let beaten = 0;
    const trials = 300;
    for (let t = 0; t < trials; t++) {
      const pick: number[][] = [];
      while (pick.length < 3) {
        const p = sets.map((s) => s[uniformInt(rng, 0, s.length - 1)]);
        if (region.isFeasible(p)) pick.push(p);
      }
      const theirs = Math.min(...pick.map((p) => nearestDistance(p, occupied)));
      total += theirs;
      if (theirs >= ours - 1e-12) beaten++;
    }
    expect(ours).toBeGreaterThan(total / trials);
    expect(beaten / trials).toBeLessThan(0.1);
  });
});

describe('chooseHoldoutRuns against an independent reference', () => {
  // tests/reference/holdouts/generate.py rebuilds the candidate set in Python and measures distances with
  // scipy.spatial.distance.cdist (SciPy 1.17): free candidate count and the first maximin distance and points.
  const factors = sampleFactors();
  const levels = planLevels(factors, sampleTiers(), DEFAULT_DESIGN.levels);
  for (const ref of reference.cases) {
    it(`matches for ${ref.constraint}`, () => {
      const region = buildCandidateRegion(factors, levels, [ref.constraint]);
      const corners = region.points!.filter((p) => p.every((x) => Math.abs(x) === 1));
      expect(corners).toHaveLength(ref.corners);
      const occupied = [...corners, [0, 0, 0, 0]];
      const all = chooseHoldoutRuns(region, occupied, 1000, 1, { atMost: true });
      expect(all).toHaveLength(ref.freeCandidates);
      const [first] = chooseHoldoutRuns(region, occupied, 1, 1);
      expect(nearestDistance(first, occupied)).toBeCloseTo(ref.firstMaximinDistance, 10);
      const match = ref.firstMaximinPoints.some((p) => p.every((x, j) => Math.abs(x - first[j]) < 1e-9));
      expect(match).toBe(true);
    });
  }
});

describe('chooseHoldoutRuns on a grid too large to enumerate', () => {
  it('draws a seeded candidate sample and still returns interior feasible points', () => {
    // 12 factors, interior settings {−0.5, 0, 0.5} each: 3^12 = 531 441 candidates, above the enumeration limit.
    const { factors, tiers } = square(12, 0.5);
    const levels = planLevels(factors, tiers, DEFAULT_DESIGN.levels);
    const region = buildCandidateRegion(factors, levels, ['x1 + x2 <= 3']);
    const chosen = chooseHoldoutRuns(region, [new Array(12).fill(0)], 3, 4);
    expect(chosen).toHaveLength(3);
    for (const p of chosen) {
      expect(region.isFeasible(p)).toBe(true);
      expect(p.every((x) => Math.abs(x) === 0.5 || x === 0)).toBe(true);
      expect(Math.hypot(...p)).toBeGreaterThan(1); // pushed well away from the one occupied point
    }
    expect(chooseHoldoutRuns(region, [new Array(12).fill(0)], 3, 4)).toEqual(chosen);
  });
});
