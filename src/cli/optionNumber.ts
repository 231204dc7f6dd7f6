/**
 * Numbers typed on the command line, read one way for every command: decimal notation only.
 * `Number()` alone would also take "0x10" (16), "0b1", "Infinity" and a blank (0), none of
 * which a user means as a seed, a run count or a threshold.
 */

const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** The value of a decimal number, or NaN for anything else. */
export function optionNumber(text: string): number {
  const trimmed = text.trim();
  return DECIMAL.test(trimmed) ? Number(trimmed) : Number.NaN;
}
