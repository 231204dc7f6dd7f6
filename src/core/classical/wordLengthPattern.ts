/**
 * Defining relation and word-length pattern of a regular two-level fraction.
 *
 * A regular 2^(k−p) fraction is fixed by p generator words; its defining relation is the group
 * of all 2^p − 1 products of those words (Box & Hunter 1961, "The 2^(k−p) fractional factorial
 * designs", Technometrics 3). The word-length pattern A_j counts the words of length j; the
 * resolution is the length of the shortest word, and of two designs with the same run size the
 * one with the lexicographically smaller pattern (A3, A4, …) has less aberration (Fries & Hunter
 * 1980, "Minimum aberration 2^(k−p) designs", Technometrics 22).
 *
 * Conventions fixed here:
 * - A word is a bit mask over the factors: bit j set ⇔ factor j is in the word. Multiplying words
 *   is XOR because every letter squares to the identity I. Masks are 32-bit integers, so at most
 *   25 factors — the letters below run out there anyway.
 * - Factor letters are A, B, C, … in factor order, skipping I (it names the identity), so the
 *   12th factor is M and the 25th is Z.
 * - Signs of words (a generator such as E = −ABC) do not change lengths; they are carried
 *   separately by callers that need them.
 */

/** Letters of the factors in order, I skipped: A B C D E F G H J K … Z (25 letters). */
export const FACTOR_LETTERS = 'ABCDEFGHJKLMNOPQRSTUVWXYZ';

/** The most factors a word can name. */
export const MAX_LETTERED_FACTORS = FACTOR_LETTERS.length;

export function factorLetter(index: number): string {
  const letter = FACTOR_LETTERS[index];
  if (letter === undefined) throw new RangeError(`factor index ${index} has no letter (at most ${MAX_LETTERED_FACTORS} factors)`);
  return letter;
}

/** Number of letters in a word. */
export function wordLength(word: number): number {
  // Population count on 32 bits (Hacker's Delight, Warren 2002, §5-1).
  let v = word - ((word >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return (((v + (v >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** The word as letters in factor order, e.g. 0b10111 → "ABCE"; the identity is "I". */
export function wordToString(word: number): string {
  if (word === 0) return 'I';
  let text = '';
  for (let j = 0; word >>> j !== 0; j++) if ((word >>> j) & 1) text += factorLetter(j);
  return text;
}

/**
 * Parses letters such as "ABCE" into a mask. Throws on a letter outside the first `k` factors,
 * on I, and on a repeated letter (a repeated letter would silently cancel).
 */
export function parseWord(text: string, k: number): number {
  let word = 0;
  for (const letter of text) {
    const index = FACTOR_LETTERS.indexOf(letter);
    if (index < 0 || index >= k) {
      throw new RangeError(`"${letter}" in "${text}" is not one of the ${k} factor letters ${FACTOR_LETTERS.slice(0, k)}`);
    }
    if ((word >>> index) & 1) throw new RangeError(`letter ${letter} appears twice in "${text}"`);
    word |= 1 << index;
  }
  return word;
}

/**
 * Every non-identity word of the defining relation: all products of a non-empty subset of the
 * generator words, in subset order (subset bit i ⇔ generator i takes part).
 */
export function definingRelationGroup(generatorWords: readonly number[]): number[] {
  const group: number[] = [];
  for (const generator of generatorWords) {
    const size = group.length;
    group.push(generator);
    for (let i = 0; i < size; i++) group.push(group[i] ^ generator);
  }
  return group;
}

/**
 * Counts of words by length: element j − 1 is the number of words of length j, for j = 1..k.
 * The published pattern (A3, A4, …) is `counts.slice(2)`.
 */
export function wordLengthCounts(words: readonly number[], k: number): number[] {
  const counts = new Array<number>(k).fill(0);
  for (const word of words) {
    const length = wordLength(word);
    if (length === 0) throw new RangeError('the identity cannot be a defining word: the generators are dependent');
    counts[length - 1]++;
  }
  return counts;
}
