/**
 * Interaction pairs worth a model term, from the second-order Sobol' index table.
 *
 * One lab plan serves every response, so a pair counts with the LARGEST second-order
 * index it has over the responses: a pair that matters for any response earns its
 * interaction term. Second-order indices Sᵢⱼ as defined by Sobol' (2001), "Global
 * sensitivity indices for nonlinear mathematical models and their Monte Carlo estimates".
 *
 * Conventions: pairs are unordered (a row a,b and a row b,a are the same pair); within a
 * pair the factor listed first in the study comes first; the result is sorted by index,
 * largest first, ties in study order; a pair's `responses` follow the study's response
 * order. A pair reaches the threshold when its index is ≥ it (1e-12 rounding allowed).
 */
import type { InteractionRow } from '../study.js';
import type { InteractionPair } from './tierTypes.js';
import { reaches } from './tierRules.js';

export function interactionPairs(
  rows: readonly InteractionRow[],
  threshold: number,
  factorOrder: readonly string[],
  responseOrder: readonly string[],
): InteractionPair[] {
  const rank = (ids: readonly string[]) => {
    const positions = new Map(ids.map((id, i) => [id, i]));
    return (id: string) => positions.get(id) ?? ids.length;
  };
  const factorRank = rank(factorOrder);
  const responseRank = rank(responseOrder);

  const pairs = new Map<string, { factorA: string; factorB: string; index: number; byResponse: Map<string, number> }>();
  for (const row of rows) {
    if (row.factorA === row.factorB) continue;
    const swap =
      factorRank(row.factorA) > factorRank(row.factorB) ||
      (factorRank(row.factorA) === factorRank(row.factorB) && row.factorA > row.factorB);
    const [factorA, factorB] = swap ? [row.factorB, row.factorA] : [row.factorA, row.factorB];
    const key = `${factorA}\u0000${factorB}`;
    let pair = pairs.get(key);
    if (!pair) {
      pair = { factorA, factorB, index: -Infinity, byResponse: new Map() };
      pairs.set(key, pair);
    }
    pair.index = Math.max(pair.index, row.index);
    pair.byResponse.set(row.response, Math.max(pair.byResponse.get(row.response) ?? -Infinity, row.index));
  }

  const result: InteractionPair[] = [];
  for (const pair of pairs.values()) {
    if (!reaches(pair.index, threshold)) continue;
    const responses = [...pair.byResponse]
      .filter(([, index]) => reaches(index, threshold))
      .map(([response]) => response)
      .sort((a, b) => responseRank(a) - responseRank(b) || (a < b ? -1 : a > b ? 1 : 0));
    result.push({ factorA: pair.factorA, factorB: pair.factorB, index: pair.index, responses });
  }
  return result.sort(
    (a, b) =>
      b.index - a.index ||
      factorRank(a.factorA) - factorRank(b.factorA) ||
      factorRank(a.factorB) - factorRank(b.factorB),
  );
}
