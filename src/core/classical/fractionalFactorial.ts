/**
 * Regular two-level fractional factorials 2^(k−p): building one from its generators, and
 * searching for the minimum-aberration fraction of the smallest run size with a required
 * resolution.
 *
 * Method: Box & Hunter 1961 ("The 2^(k−p) fractional factorial designs", Technometrics 3) for the
 * construction — m = k − p base factors run as a full factorial, each of the p added factors set
 * to a product (interaction column) of base factors. Minimum aberration (Fries & Hunter 1980,
 * "Minimum aberration 2^(k−p) designs", Technometrics 22): among fractions of the same run size
 * and at least the required resolution, the one whose word-length pattern (A3, A4, …) is
 * lexicographically smallest. The search below finds it by enumerating generator sets and
 * computing each pattern; no table of designs is stored.
 *
 * Conventions fixed here:
 * - Coded units, low −1 and high +1; points in standard order of the base factors (first base
 *   factor alternates fastest), unrandomised; one array per run, factor order A, B, C, …
 * - Letters A, B, C, … in factor order, I skipped (see wordLengthPattern.ts). Search results use
 *   the first m factors as base factors and the last p as added factors.
 * - `wordLengthPattern` is [A3, A4, …, Ak] (length k − 2).
 * - A full factorial (p = 0) has no defining word; its resolution is reported as k + 1, a
 *   sentinel meaning "every effect is estimable" (JSON cannot carry Infinity).
 * - Ties in the pattern go to the generator set met first in the canonical enumeration order
 *   described at `searchGeneratorColumns`; the result is deterministic.
 */
import {
  definingRelationGroup,
  factorLetter,
  FACTOR_LETTERS,
  MAX_LETTERED_FACTORS,
  parseWord,
  wordLength,
  wordLengthCounts,
  wordToString,
} from './wordLengthPattern.js';

export interface FractionalFactorial {
  k: number;
  p: number;
  runs: number;
  /** runs × k coded points, ±1. */
  points: number[][];
  /** One per added factor, e.g. "E=ABC" or "E=-ABC", ordered by the added factor. */
  generators: string[];
  /** Length of the shortest defining word; k + 1 for a full factorial (p = 0). */
  resolution: number;
  /** [A3, A4, …, Ak]: numbers of defining words of each length. */
  wordLengthPattern: number[];
  /**
   * The defining words, shortest first then in letter order, with "-" when the word's sign is
   * negative: all 2^p − 1 of them when p ≤ 12, else the 4095 shortest (a list of millions of
   * words helps nobody; the pattern still counts them all).
   */
  definingWords: string[];
  /**
   * Only on search results: how much of the search ran (defining words formed, the unit of
   * work). `exhaustive` is false when the budget stopped the search early; the fraction then has
   * the required resolution but its aberration is only the best found, not proven minimal, and
   * its run size may not be the smallest. (Optional addition to the contract.)
   */
  search?: { wordsFormed: number; exhaustive: boolean };
}

export interface FractionSearchOptions {
  /** Largest run size acceptable; the search gives up (null) beyond it. Default and ceiling: min(2^k, 65 536). */
  maxRuns?: number;
  /**
   * Smallest run size to consider (optional addition to the contract). With minResolution 3,
   * `minRuns: 32` gives the minimum-aberration fraction of 32 runs, whatever resolution it reaches.
   */
  minRuns?: number;
  /**
   * Defining words each search (one run size, one target resolution) may form before it settles
   * for the best found. Default 20 000 000 (about a second); never reached up to 12 factors at
   * resolution IV or V.
   */
  searchBudget?: number;
}

const DEFAULT_SEARCH_BUDGET = 20_000_000;

const MAX_GENERATORS = 20;
/** Largest fraction the search builds: far past any lab campaign, still small in memory. */
const MAX_FRACTION_RUNS = 2 ** 16;
/** Beyond this many defining words only the shortest are listed (see `definingWords`). */
const MAX_LISTED_WORDS = 4095;

const GENERATOR_PATTERN = /^\s*([A-Z])\s*=\s*([+-]?)\s*([A-Z]+)\s*$/;

/**
 * Builds and analyses the fraction with the given generators, e.g. (6, ["E=ABC", "F=BCD"]).
 * The letters on the left are the added factors; every other factor is a base factor, and the
 * right-hand sides may use base factors only. A leading "-" selects the other half (sign −1).
 */
export function fractionFromGenerators(k: number, generators: readonly string[]): FractionalFactorial {
  if (!Number.isInteger(k) || k < 1 || k > MAX_LETTERED_FACTORS) {
    throw new RangeError(`a fraction needs an integer number of factors from 1 to ${MAX_LETTERED_FACTORS}, got ${k}`);
  }
  const p = generators.length;
  if (p >= k) throw new RangeError(`${p} generators leave no base factor among ${k} factors`);
  // More than 20 generators means at most 5 base factors for 25 letters: resolution II at best.
  if (p > MAX_GENERATORS) throw new RangeError(`at most ${MAX_GENERATORS} generators are supported, got ${p}`);

  const parsed = generators.map((text) => {
    const match = GENERATOR_PATTERN.exec(text);
    if (!match) throw new RangeError(`generator "${text}" is not of the form E=ABC or E=-ABC`);
    const added = FACTOR_LETTERS.indexOf(match[1]);
    if (added < 0 || added >= k) throw new RangeError(`generator "${text}" defines ${match[1]}, which is not one of the ${k} factor letters`);
    return { added, sign: match[2] === '-' ? -1 : 1, columns: parseWord(match[3], k) };
  });
  let addedMask = 0;
  for (const { added } of parsed) {
    if ((addedMask >>> added) & 1) throw new RangeError(`factor ${factorLetter(added)} is defined by two generators`);
    addedMask |= 1 << added;
  }
  for (const [i, { columns }] of parsed.entries()) {
    if (columns & addedMask) {
      throw new RangeError(`generator "${generators[i]}" uses an added factor on its right-hand side; use base factors only`);
    }
  }
  parsed.sort((a, b) => a.added - b.added);

  const baseFactors: number[] = [];
  for (let j = 0; j < k; j++) if (!((addedMask >>> j) & 1)) baseFactors.push(j);
  const m = baseFactors.length;
  const runs = 2 ** m;
  if (runs > MAX_FRACTION_RUNS) throw new RangeError(`${k} factors with ${p} generators give ${runs} runs, more than the ${MAX_FRACTION_RUNS} built here`);

  const points: number[][] = new Array(runs);
  for (let i = 0; i < runs; i++) {
    const point = new Array<number>(k);
    baseFactors.forEach((factor, b) => {
      point[factor] = (i >>> b) & 1 ? 1 : -1;
    });
    for (const { added, sign, columns } of parsed) {
      let value = sign;
      for (const factor of baseFactors) if ((columns >>> factor) & 1) value *= point[factor];
      point[added] = value;
    }
    points[i] = point;
  }

  const generatorWords = parsed.map(({ added, columns }) => columns | (1 << added));
  const words = definingRelationGroup(generatorWords);
  // The sign of a product of generator words is the product of their signs, in the same subset order.
  const signs = definingRelationGroup(parsed.map(({ sign }) => (sign < 0 ? 1 : 0)));
  const counts = wordLengthCounts(words, k);
  const shortest = counts.findIndex((count) => count > 0);

  // Sort on one numeric key per word (length, then letter order) — a fraction with many
  // generators has 2^p − 1 words, and a comparator-based sort of objects is too slow there.
  const order = new Float64Array(words.length);
  words.forEach((word, i) => {
    order[i] = (wordLength(word) * 2 ** MAX_LETTERED_FACTORS + letterOrderKey(word)) * 2 ** 21 + i;
  });
  order.sort();
  const definingWords = Array.from(order.subarray(0, MAX_LISTED_WORDS), (key) => {
    const i = key % 2 ** 21;
    return (signs[i] ? '-' : '') + wordToString(words[i]);
  });

  return {
    k,
    p,
    runs,
    points,
    generators: parsed.map(({ added, sign, columns }) => `${factorLetter(added)}=${sign < 0 ? '-' : ''}${wordToString(columns)}`),
    resolution: shortest < 0 ? k + 1 : shortest + 1,
    wordLengthPattern: counts.slice(2),
    definingWords,
  };
}

/**
 * The smallest regular 2^(k−p) fraction with resolution ≥ `minResolution` (and at least
 * `minRuns` runs), and among those the one of minimum aberration. Returns the full factorial
 * when no proper fraction qualifies (its resolution is then the sentinel k + 1), and null when
 * even that needs more than `maxRuns`. When a search is cut short by the budget without finding
 * a fraction of some run size, the next size is tried, so the result may then be larger than
 * the smallest possible; `search.exhaustive` says whether everything was proven.
 */
export function minimumAberrationFraction(
  k: number,
  minResolution: number,
  options: FractionSearchOptions = {},
): FractionalFactorial | null {
  if (!Number.isInteger(k) || k < 1 || k > MAX_LETTERED_FACTORS) {
    throw new RangeError(`a fraction needs an integer number of factors from 1 to ${MAX_LETTERED_FACTORS}, got ${k}`);
  }
  if (!Number.isInteger(minResolution) || minResolution < 3) {
    throw new RangeError(`the required resolution must be an integer of at least 3 (III), got ${minResolution}`);
  }
  const maxRuns = Math.min(options.maxRuns ?? 2 ** k, MAX_FRACTION_RUNS);
  const minRuns = options.minRuns ?? 1;
  const budget = options.searchBudget ?? DEFAULT_SEARCH_BUDGET;

  // Each search gets the whole budget: when a stricter search is cut short, the search at the
  // required resolution must still have the means to find a fraction. Time is bounded by the
  // number of run sizes and targets tried, each about a budget's worth at most.
  let wordsFormed = 0;
  let exhaustive = true;
  for (let m = 1; m <= k; m++) {
    if (2 ** m > maxRuns) return null;
    if (2 ** m < minRuns) continue;
    if (m === k) return { ...fractionFromGenerators(k, []), search: { wordsFormed, exhaustive } };
    // A fraction of higher resolution always has less aberration (its A_R is 0), so look for
    // the highest resolution this run size reaches before settling for the required one; the
    // stricter searches are the small ones, and the last success is the answer.
    let result: ColumnSearchResult | null = null;
    for (let target = minResolution + 1; target <= k; ) {
      const attempt = searchGeneratorColumns(m, k - m, target, budget);
      wordsFormed += attempt.wordsFormed;
      exhaustive &&= attempt.exhaustive;
      if (!attempt.columns) break;
      result = attempt;
      target = attempt.resolution + 1;
    }
    if (!result) {
      result = searchGeneratorColumns(m, k - m, minResolution, budget);
      wordsFormed += result.wordsFormed;
      exhaustive &&= result.exhaustive;
    }
    if (result.columns) {
      const generators = result.columns.map((columns, i) => `${factorLetter(m + i)}=${wordToString(columns)}`);
      return { ...fractionFromGenerators(k, generators), search: { wordsFormed, exhaustive } };
    }
  }
  return null;
}

interface ColumnSearchResult {
  /** Interaction columns of the base factors (bit masks), one per added factor, or null if none qualify. */
  columns: number[] | null;
  /** Shortest word length of the fraction found (0 when none). */
  resolution: number;
  wordsFormed: number;
  exhaustive: boolean;
}

/**
 * Branch-and-bound search for p generator columns over m base factors.
 *
 * Candidates: interaction columns with at least `resolution − 1` letters (the added factor makes
 * the word one letter longer, so shorter columns cannot reach the resolution). Symmetry: any
 * set of columns can be mapped, by permuting the base factors, to one that contains the
 * canonical column "the first w base factors" where w is its largest column weight; so we
 * enumerate, for each w ascending, sets {canonical_w} ∪ (p − 1 columns of weight ≤ w) in
 * combination order of the candidates sorted by (weight, mask). Word-length patterns are
 * invariant under such relabelling, so the minimum found is the minimum over all fractions.
 *
 * Bound: adding generators only adds words, so the partial counts are elementwise below the
 * final ones; once the partial pattern is lexicographically ≥ the best complete pattern, no
 * completion can beat it (or win the tie, since the earlier set keeps ties) and the branch is cut.
 */
function searchGeneratorColumns(m: number, p: number, resolution: number, budget: number): ColumnSearchResult {
  const k = m + p;
  const minColumnWeight = Math.max(2, resolution - 1);
  const candidates: number[] = [];
  for (let column = 1; column < 2 ** m; column++) if (wordLength(column) >= minColumnWeight) candidates.push(column);
  candidates.sort((a, b) => wordLength(a) - wordLength(b) || a - b);
  if (candidates.length < p) return { columns: null, resolution: 0, wordsFormed: 0, exhaustive: true };

  // counts[j] = number of words of length j in the partial defining relation (index 0 unused).
  const counts = new Int32Array(k + 1);
  let bestCounts: Int32Array | null = null;
  let bestColumns: number[] | null = null;
  const group = new Int32Array(2 ** p);
  const chosen: number[] = [];
  let wordsFormed = 0;
  let exhaustive = true;

  const atLeastBest = (): boolean => {
    if (!bestCounts) return false;
    for (let length = resolution; length <= k; length++) {
      if (counts[length] !== bestCounts[length]) return counts[length] > bestCounts[length];
    }
    return true;
  };

  /** Adds generator word g to a group of `size` words; false (and nothing changed) when a word is too short. */
  const addGenerator = (g: number, size: number): boolean => {
    wordsFormed += size + 1;
    group[size] = g;
    for (let t = 0; t < size; t++) group[size + 1 + t] = group[t] ^ g;
    const end = 2 * size + 1;
    for (let t = size; t < end; t++) {
      const length = wordLength(group[t]);
      if (length < resolution) {
        for (let u = size; u < t; u++) counts[wordLength(group[u])]--;
        return false;
      }
      counts[length]++;
    }
    return true;
  };
  const removeGenerator = (size: number): void => {
    for (let t = size; t < 2 * size + 1; t++) counts[wordLength(group[t])]--;
  };

  const extend = (rest: readonly number[], start: number, size: number): void => {
    const depth = chosen.length;
    if (depth === p) {
      // Reaching here means the pattern beat the best (the bound cut every other branch).
      bestCounts = counts.slice();
      bestColumns = chosen.slice();
      return;
    }
    for (let i = start; i <= rest.length - (p - depth); i++) {
      if (wordsFormed >= budget) {
        exhaustive = false;
        return;
      }
      const g = rest[i] | (1 << (m + depth));
      if (!addGenerator(g, size)) continue;
      if (!atLeastBest()) {
        chosen.push(rest[i]);
        extend(rest, i + 1, 2 * size + 1);
        chosen.pop();
      }
      removeGenerator(size);
    }
  };

  const weights = [...new Set(candidates.map(wordLength))];
  for (const w of weights) {
    const canonical = (1 << w) - 1;
    const rest = candidates.filter((column) => wordLength(column) <= w && column !== canonical);
    if (rest.length < p - 1) continue;
    if (!addGenerator(canonical | (1 << m), 0)) continue;
    chosen.push(canonical);
    if (!atLeastBest()) extend(rest, 0, 1);
    chosen.pop();
    removeGenerator(0);
    if (!exhaustive) break;
  }

  const columns = bestColumns as number[] | null;
  const found = bestCounts as Int32Array | null;
  return {
    columns: columns ? [...columns].sort((a, b) => wordLength(a) - wordLength(b) || a - b) : null,
    resolution: found ? found.findIndex((count, length) => length > 0 && count > 0) : 0,
    wordsFormed,
    exhaustive,
  };
}

/**
 * Key that sorts words of equal length in letter order: the word holding the earlier letter at
 * the first letter where two words differ comes first. Reversing the bits puts letter A in the
 * most significant place; the complement makes "holds it" sort low.
 */
function letterOrderKey(word: number): number {
  const letters = MAX_LETTERED_FACTORS;
  let reversed = 0;
  for (let j = 0; word >>> j !== 0; j++) if ((word >>> j) & 1) reversed |= 1 << (letters - 1 - j);
  return 2 ** letters - 1 - reversed;
}
