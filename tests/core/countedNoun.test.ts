/**
 * Counts in sentences: singular for exactly one, the given or regular plural otherwise.
 */
import { describe, expect, it } from 'vitest';
import { counted } from '../../src/core/countedNoun.js';

describe('counted', () => {
  it.each([
    [0, 'run', undefined, '0 runs'],
    [1, 'run', undefined, '1 run'],
    [2, 'more run', undefined, '2 more runs'],
    [1, 'degree of freedom', 'degrees of freedom', '1 degree of freedom'],
    [7, 'degree of freedom', 'degrees of freedom', '7 degrees of freedom'],
  ])('%d %s', (count, singular, plural, expected) => {
    expect(counted(count, singular, plural)).toBe(expected);
  });
});
