/**
 * A list in a sentence: "a", "a and b", "a, b and c" (no serial comma), as the notes,
 * verdicts and summaries write it.
 */
export function wordList(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
