/**
 * "Did you mean …?" for misspelt keys, column headers and ids.
 *
 * Closeness is the Levenshtein edit distance (Levenshtein, 1966, "Binary codes capable of
 * correcting deletions, insertions and reversals"), computed by fastest-levenshtein on
 * lower-cased text so that `Nominal` and `nominal` are one edit apart at most. A
 * suggestion is offered only when it is plausibly the same word: at most a third of the
 * longer word's letters differ (at least two edits allowed, so short keys such as `low`
 * still get help), and never every letter. A far-off guess would mislead more than it helps.
 */
import { distance } from 'fastest-levenshtein';

/** Longest word for which a suggestion is looked for. */
const MAX_SUGGESTED_LENGTH = 200;

/** The candidate closest to `word`, or undefined when none is close enough to suggest. */
export function suggestKey(word: string, candidates: readonly string[]): string | undefined {
  // Keys and ids are short; a pasted paragraph is no misspelling, and comparing it with
  // thousands of candidates would cost seconds.
  if (word.length > MAX_SUGGESTED_LENGTH) return undefined;
  const typed = word.toLowerCase();
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const edits = distance(typed, candidate.toLowerCase());
    if (edits < bestDistance) {
      best = candidate;
      bestDistance = edits;
    }
  }
  if (best === undefined) return undefined;
  const longer = Math.max(typed.length, best.length);
  const allowed = Math.max(2, Math.floor(longer / 3));
  // The two-edit floor must not let a short word be replaced outright (`id` → `s1`).
  return bestDistance <= allowed && bestDistance < longer ? best : undefined;
}

/** `; did you mean \`nominal\`?` or, with no close candidate, `; expected one of a, b, c`. */
export function didYouMean(word: string, candidates: readonly string[]): string {
  const suggestion = suggestKey(word, candidates);
  if (suggestion !== undefined) return `; did you mean \`${suggestion}\`?`;
  if (candidates.length === 0) return '';
  const shown = candidates.slice(0, 12).join(', ');
  return `; expected one of ${shown}${candidates.length > 12 ? ', …' : ''}`;
}
