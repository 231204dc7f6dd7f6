/**
 * A count with its noun in the right number — "1 run", "3 runs", "1 degree of freedom",
 * "2 degrees of freedom" — for every sentence the notes, verdicts and summaries write, so
 * that no text says "1 more runs".
 *
 * Convention: English plural by `s` unless the caller gives the plural form; only a count of
 * exactly 1 takes the singular ("0 runs", "1.5 h" is not a count).
 */
export function counted(count: number, singular: string, plural = `${singular}s`): string {
  return `${count} ${count === 1 ? singular : plural}`;
}
