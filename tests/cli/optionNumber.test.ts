/**
 * Command-line numbers are decimal notation only, for every command.
 */
import { describe, expect, it } from 'vitest';
import { optionNumber } from '../../src/cli/optionNumber.js';

describe('optionNumber', () => {
  it.each([
    ['20261201', 20261201],
    [' 0.3 ', 0.3],
    ['.5', 0.5],
    ['1e3', 1000],
    ['-2', -2],
  ])('reads %j as %d', (text, value) => expect(optionNumber(text)).toBe(value));

  // Number() would take these as 16, 1, Infinity and 0: none is what a user means.
  it.each(['0x10', '0b1', 'Infinity', '', ' ', '1e1x', '2,5'])('refuses %j', (text) => expect(optionNumber(text)).toBeNaN());
});
