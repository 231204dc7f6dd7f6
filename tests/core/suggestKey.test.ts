/**
 * "Did you mean": suggestions follow the Levenshtein edit distance (Levenshtein 1966) and
 * stay quiet when nothing is close. Worked example: kitten → sitting needs 3 edits
 * (the textbook example of edit distance, e.g. Jurafsky & Martin, "Speech and Language
 * Processing", ch. 2).
 */
import { describe, expect, it } from 'vitest';
import { didYouMean, suggestKey } from '../../src/core/suggestKey.js';

describe('suggestKey', () => {
  it('suggests the closest key within a third of the word length', () => {
    expect(suggestKey('nomnal', ['name', 'nominal', 'low'])).toBe('nominal');
    expect(suggestKey('hgh', ['low', 'high'])).toBe('high');
    // Case is ignored when measuring closeness.
    expect(suggestKey('Nominal', ['nominal'])).toBe('nominal');
  });

  it('allows 3 edits for a 7-letter word but not 3 edits for a 6-letter one', () => {
    // kitten → sitting: 3 edits, longer word has 7 letters → floor(7/3) = 2 < 3: no suggestion.
    expect(suggestKey('kitten', ['sitting'])).toBeUndefined();
    // 2 edits are always allowed for short words: 'lwo' → 'low'.
    expect(suggestKey('lwo', ['low'])).toBe('low');
    // 'criticality' vs 'critical': 3 deletions, longer word 11 letters → floor(11/3) = 3: suggested.
    expect(suggestKey('criticality', ['critical', 'moderate'])).toBe('critical');
  });

  it('returns nothing for far-off words or an empty candidate list', () => {
    expect(suggestKey('colour', ['maxRuns', 'label'])).toBeUndefined();
    expect(suggestKey('x', [])).toBeUndefined();
    // Two edits on a two-letter word replace it outright: an `id` column is not a typo of `s1`.
    expect(suggestKey('id', ['s1', 'st', 'si'])).toBeUndefined();
    // One edit on a two-letter word still helps.
    expect(suggestKey('sl', ['s1', 'st'])).toBe('s1');
  });

  it('formats the hint', () => {
    expect(didYouMean('totl', ['total', 'first'])).toBe('; did you mean `total`?');
    expect(didYouMean('colour', ['maxRuns', 'label'])).toBe('; expected one of maxRuns, label');
    expect(didYouMean('x', [])).toBe('');
  });
});
