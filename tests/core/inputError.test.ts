/**
 * The one-line form of user errors: whatever the user's file holds (line breaks in a key,
 * a header of a thousand characters), `describe()` is one short line.
 */
import { describe, expect, it } from 'vitest';
import { excerpt, InputError } from '../../src/core/inputError.js';

describe('describe()', () => {
  it('keeps file, row, column and key in order', () => {
    expect(new InputError('must be a number', { file: 'indices.csv', row: 4, column: 'total' }).describe()).toBe('indices.csv, row 4, column total: must be a number');
    expect(new InputError('is required', { file: 'study.yaml', key: 'design.runs' }).describe()).toBe('study.yaml, key design.runs: is required');
  });

  it('shortens a long column name or key and flattens line breaks', () => {
    const line = new InputError('unknown column', { file: 'indices.csv', row: 2, column: `factor${'9'.repeat(1000)}` }).describe();
    expect(line).toBe(`indices.csv, row 2, column factor${'9'.repeat(53)}…: unknown column`);
    expect(new InputError('bad\nvalue', { key: 'a\nb' }).describe()).toBe('key a b: bad value');
  });
});

describe('excerpt', () => {
  it('cuts at the length with an ellipsis and shows line breaks and tabs as spaces', () => {
    expect(excerpt('short')).toBe('short');
    expect(excerpt('x'.repeat(61))).toBe(`${'x'.repeat(59)}…`);
    expect(excerpt('a\r\n\tb')).toBe('a b');
  });
});
