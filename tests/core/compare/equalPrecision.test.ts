// Equal-precision run counts, checked against a hand enumeration with the noncentral F power
// (itself checked against scipy.stats.ncf in tests/core/distribution): for a replicated 2^3
// factorial and a main-effects model, C_jj = 1/(8r) whatever the centre runs, so
// λ = 8r·β²/σ² and ν = n − 4.
import { describe, expect, it } from 'vitest';
import { equalPrecision } from '../../../src/core/compare/equalPrecision.js';
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { fTestPower } from '../../../src/core/distribution/noncentralF.js';
import { twoLevelFullFactorial } from '../../../src/core/classical/fullFactorial.js';

const model = compileModel([{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { c: 1 } }], ['a', 'b', 'c']);
const labels = ['1', 'a', 'b', 'c'];
const effects = (beta: number) => ({ factors: [{ factor: 'a', response: 'y', index: 0.3, effect: beta, noise: 1, basis: 'predicted' as const }], interactions: [] });

function byHand(beta: number, centres: number): number {
  let best = Infinity;
  for (let r = 1; r <= 20; r++) for (let m = 0; m <= 20; m++) {
    const n = 8 * r + centres + m;
    if (n < best && fTestPower(1, n - 4, 8 * r * beta * beta, 0.05) >= 0.8) best = n;
  }
  return best;
}

describe('equalPrecision', () => {
  const points = [...twoLevelFullFactorial(3), [0, 0, 0]];

  for (const beta of [1, 0.7, 0.45]) {
    it(`a 2^3 + 1 centre run reaches 80 % for β = ${beta}σ with the fewest runs a hand scan finds`, () => {
      const [entry] = equalPrecision({ model, termLabels: labels, effects: effects(beta), power: 0.8, alpha: 0.05, candidates: [{ id: 'full-factorial', points, addCentres: true, offLimitsRuns: 0 }] });
      expect(entry.runs).toBe(byHand(beta, 1));
      expect(entry.weakestPower!).toBeGreaterThanOrEqual(0.8);
      expect(8 * entry.replicates! + 1 + entry.addedCentreRuns!).toBe(entry.runs);
    });
  }

  it('says why a plan cannot: not built, cannot fit, or off limits', () => {
    const entries = equalPrecision({
      model,
      termLabels: labels,
      effects: effects(1),
      power: 0.8,
      alpha: 0.05,
      candidates: [
        { id: 'box-behnken', points: null, cannot: 'no Box–Behnken plan for 2 factors', addCentres: true, offLimitsRuns: 0 },
        { id: 'conventional', points, cannot: 'a two-level plan cannot estimate x²', addCentres: true, offLimitsRuns: 0 },
        { id: 'ccd-face', points, addCentres: true, offLimitsRuns: 2 },
      ],
    });
    expect(entries.map((entry) => entry.runs)).toEqual([null, null, null]);
    expect(entries[2].reason).toMatch(/2 of its 9 runs break/);
    expect(entries[2].weakestPower).toBeCloseTo(fTestPower(1, 5, 8, 0.05), 9);
  });

  it('grows the full grid by whole replicates only', () => {
    const [entry] = equalPrecision({ model, termLabels: labels, effects: effects(0.7), power: 0.8, alpha: 0.05, candidates: [{ id: 'full-grid', points: twoLevelFullFactorial(3), addCentres: false, offLimitsRuns: 0 }] });
    let expected = 0;
    for (let r = 1; !expected; r++) if (fTestPower(1, 8 * r - 4, 8 * r * 0.49, 0.05) >= 0.8) expected = 8 * r;
    expect(entry.runs).toBe(expected);
    expect(entry.addedCentreRuns).toBe(0);
  });
});
