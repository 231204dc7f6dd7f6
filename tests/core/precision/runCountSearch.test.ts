// The run-count search on invented power curves, checked against a plain scan of every N.
import { describe, expect, it } from 'vitest';
import { smallestRunCount } from '../../../src/core/precision/runCountSearch.js';

function curveSearch(power: (n: number) => number, floor: number, cap: number, target = 0.8) {
  const probed: number[] = [];
  const outcome = smallestRunCount<number>({
    floor,
    cap,
    probe: (runs) => {
      probed.push(runs);
      const value = power(runs);
      return { result: runs, weakestPower: value, met: value >= target, shortfall: value >= target ? 1 : 1.3 };
    },
  });
  return { outcome, probed };
}

describe('smallestRunCount', () => {
  const power = (n: number) => 1 - Math.exp(-n / 12);
  const scan = (floor: number, cap: number) => {
    for (let n = floor; n <= cap; n++) if (power(n) >= 0.8) return n;
    return null;
  };

  it('finds the same N as a scan of every run count, with fewer probes', () => {
    const { outcome, probed } = curveSearch(power, 8, 80);
    expect(outcome.runs).toBe(scan(8, 80));
    expect(outcome.met).toBe(true);
    expect(probed).toContain(outcome.runs - 1);
    expect(probed.length).toBeLessThan(outcome.runs - 8);
    expect(outcome.curve.map((point) => point.runs)).toEqual([...probed].sort((a, b) => a - b));
  });

  it('stops at the floor when the floor meets the target', () => {
    expect(curveSearch(() => 0.95, 10, 40).outcome).toMatchObject({ runs: 10, met: true });
  });

  it('returns the best probe, not met, when the cap cannot reach the target', () => {
    const { outcome } = curveSearch((n) => 0.5 + n / 1000, 10, 30);
    expect(outcome.met).toBe(false);
    expect(outcome.runs).toBe(30);
    expect(outcome.weakestPower).toBeCloseTo(0.53, 12);
  });

  it('passes the nearest plan found so far as the warm start', () => {
    const warm: (number | null)[] = [];
    smallestRunCount<number>({ floor: 5, cap: 50, probe: (runs, start) => (warm.push(start), { result: runs, weakestPower: runs / 40, met: runs >= 32, shortfall: 32 / runs }) });
    expect(warm[0]).toBeNull();
    expect(warm.slice(1).every((value) => value !== null)).toBe(true);
  });
});
