import { describe, expect, it } from 'vitest';
import { interactionPairs } from '../../../src/core/sensitivity/interactionPairs.js';
import type { InteractionRow } from '../../../src/core/study.js';

const pairRow = (factorA: string, factorB: string, response: string, index: number): InteractionRow => ({
  factorA,
  factorB,
  response,
  index,
});

describe('interactionPairs', () => {
  const factors = ['a', 'b', 'c', 'd'];
  const responses = ['r1', 'r2', 'r3'];

  it('takes the largest index over responses for each unordered pair', () => {
    const rows = [
      pairRow('a', 'b', 'r1', 0.02),
      pairRow('b', 'a', 'r2', 0.09),
      pairRow('a', 'b', 'r3', 0.06),
      pairRow('c', 'd', 'r1', 0.05),
      pairRow('a', 'c', 'r2', 0.049),
    ];
    expect(interactionPairs(rows, 0.05, factors, responses)).toEqual([
      // a-b: max(0.02, 0.09, 0.06) = 0.09, reaches 0.05 in r2 and r3
      { factorA: 'a', factorB: 'b', index: 0.09, responses: ['r2', 'r3'] },
      // c-d: exactly at the threshold counts
      { factorA: 'c', factorB: 'd', index: 0.05, responses: ['r1'] },
    ]);
  });

  it('puts the factor listed first in the study first and sorts ties in study order', () => {
    const rows = [pairRow('d', 'c', 'r1', 0.1), pairRow('b', 'a', 'r1', 0.1)];
    expect(interactionPairs(rows, 0.05, factors, responses).map((pair) => `${pair.factorA}*${pair.factorB}`)).toEqual([
      'a*b',
      'c*d',
    ]);
  });

  it('returns nothing without a second-order table or when every pair is below the threshold', () => {
    expect(interactionPairs([], 0.05, factors, responses)).toEqual([]);
    expect(interactionPairs([pairRow('a', 'b', 'r1', 0.01)], 0.05, factors, responses)).toEqual([]);
  });
});
