/**
 * The table of limits (src/core/inputLimits.ts) and its one wording: the README lists every
 * limit with the same value, and the messages name the limit on one line.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { INPUT_LIMITS, checkLimit, limitMessage, limitText, type LimitName } from '../../src/core/inputLimits.js';
import { InputError } from '../../src/core/inputError.js';
import { repoRoot } from '../support/runCli.js';

function readmeLimitRows(): Map<string, string> {
  const readme = readFileSync(join(repoRoot, 'README.md'), 'utf8');
  const section = readme.slice(readme.indexOf('\n## Limits'), readme.indexOf('\n## ', readme.indexOf('\n## Limits') + 5));
  const rows = new Map<string, string>();
  for (const line of section.split('\n')) {
    const cells = line.split('|').map((cell) => cell.trim());
    if (cells.length >= 4 && cells[1] !== '' && !cells[1].startsWith('---') && cells[1] !== 'Input') rows.set(cells[1], cells[2]);
  }
  return rows;
}

describe('the README table', () => {
  it('lists every limit with its value, and nothing else', () => {
    const rows = readmeLimitRows();
    const expected = new Map(Object.entries(INPUT_LIMITS).map(([name, limit]) => [limit.appliesTo, limitText(name as LimitName)]));
    expect(rows).toEqual(expected);
  });
});

describe('the message', () => {
  it('names the value and the limit, with its unit', () => {
    expect(limitMessage('fittingRuns', 1001)).toBe('1001 runs is above the limit of 1000 runs (see "Limits" in the README)');
    expect(limitMessage('tableRows', 200_001, 'data rows')).toBe('200001 data rows is above the limit of 200000 rows (see "Limits" in the README)');
    expect(limitMessage('numberMagnitude', -1e16)).toBe('-10000000000000000 is outside the limit of ±1e15 (see "Limits" in the README)');
    expect(limitText('studyFileBytes')).toBe('1 MiB');
  });

  it('is thrown past the limit only, with the location', () => {
    expect(() => checkLimit('starts', 1000, { key: 'design.starts' })).not.toThrow();
    let caught: unknown;
    try {
      checkLimit('starts', 1001, { key: 'design.starts' });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect((caught as InputError).describe()).toBe('key design.starts: 1001 starts is above the limit of 1000 starts (see "Limits" in the README)');
  });
});
