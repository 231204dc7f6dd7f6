import { describe, expect, it } from 'vitest';
import { colourEnabled, painter } from '../../src/io/terminalStyle.js';

describe('colourEnabled', () => {
  it('is on only for a TTY without NO_COLOR (no-color.org convention: any value, even empty)', () => {
    expect(colourEnabled({ isTTY: true }, {})).toBe(true);
    expect(colourEnabled({ isTTY: true }, { NO_COLOR: '' })).toBe(false);
    expect(colourEnabled({ isTTY: true }, { NO_COLOR: '1' })).toBe(false);
    expect(colourEnabled({ isTTY: false }, {})).toBe(false);
    expect(colourEnabled({}, {})).toBe(false);
    expect(colourEnabled({ isTTY: true }, { TERM: 'dumb' })).toBe(false);
  });
});

describe('painter', () => {
  it('returns plain text when colour is off', () => {
    const plain = painter(false);
    expect(plain.bold('x')).toBe('x');
    expect(plain.tier('critical')).toBe('critical');
    expect(plain.tier('moderate', 'mod')).toBe('mod');
    expect(plain.warn('careful')).toBe('careful');
  });

  it('wraps text in SGR sequences when colour is on', () => {
    const colour = painter(true);
    expect(colour.bold('x')).toBe('\u001b[1mx\u001b[0m');
    expect(colour.tier('negligible')).toBe('\u001b[2mnegligible\u001b[0m');
  });
});
