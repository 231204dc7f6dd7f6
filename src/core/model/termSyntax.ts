/**
 * Reads one model term written in study syntax: factor ids joined by `*`, each with an
 * optional integer power `^n` (`inlet_temp^2`, `inlet_temp*feed_rate`); `1` is the intercept.
 * The written form is the one `modelTerm.ts` prints, so `termLabel(parseTerm(t))` round-trips.
 *
 * A hand-written reader rather than a general expression parser: the grammar is tiny, and
 * a user who writes `inlet_temp**2` or `log(feed_rate)` should be told exactly what the
 * term syntax allows instead of getting a general algebra error. Unknown ids come back with
 * the closest known id (Levenshtein distance; Levenshtein, 1966, "Binary codes capable of
 * correcting deletions, insertions, and reversals").
 */
import { didYouMean } from '../suggestKey.js';
import { InputError } from '../inputError.js';

/**
 * Factor id → power of the term. A factor written twice multiplies (`a*a` is `a^2`).
 * Throws InputError with `key` on a syntax error or an unknown factor id.
 */
export function parseTerm(text: string, factorIds: readonly string[], key?: string): Record<string, number> {
  const where = key === undefined ? {} : { key };
  const trimmed = text.trim();
  if (trimmed === '') throw new InputError('empty model term', where);
  if (trimmed === '1') return {};

  if (trimmed.includes('**')) {
    throw new InputError(`model term "${trimmed}": powers are written with ^ (a^2), not **`, where);
  }
  const powers: Record<string, number> = {};
  for (const rawFactor of trimmed.split('*')) {
    const part = rawFactor.trim();
    if (part === '') {
      throw new InputError(`model term "${trimmed}": a factor is missing around "*" (write products as a*b)`, where);
    }
    const match = /^([A-Za-z_][A-Za-z0-9_.]*)\s*(?:\^\s*(\S+))?$/.exec(part);
    if (!match) {
      throw new InputError(
        `model term "${trimmed}": cannot read "${part}"; write factor ids joined by * with optional integer powers, e.g. a*b or a^2`,
        where,
      );
    }
    const id = match[1];
    let power = 1;
    if (match[2] !== undefined) {
      if (!/^\d+$/.test(match[2]) || Number(match[2]) < 1) {
        throw new InputError(`model term "${trimmed}": the power of ${id} must be a whole number of at least 1`, where);
      }
      power = Number(match[2]);
    }
    if (!factorIds.includes(id)) {
      throw new InputError(`model term "${trimmed}": unknown factor "${id}"${didYouMean(id, factorIds)}`, where);
    }
    powers[id] = (powers[id] ?? 0) + power;
  }
  return powers;
}

