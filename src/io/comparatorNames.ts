/**
 * Short names of the comparison's plans, for chart legends, the report's tables and the
 * workbook, from their one home in core (comparatorNames.ts); sentence forms are worded here.
 */
import { COMPARATOR_SHORT_NAME } from '../core/compare/comparatorNames.js';

export { COMPARATOR_SHORT_NAME };

/** The short name of a plan id, or the id itself for one this table does not know. */
export function comparatorName(id: string): string {
  return (COMPARATOR_SHORT_NAME as Record<string, string>)[id] ?? id;
}

/** The short name inside a sentence: lower case, except names after people (Box–Behnken, Plackett–Burman). */
export function comparatorNameInSentence(id: string): string {
  const name = comparatorName(id);
  return id === 'box-behnken' || id === 'plackett-burman' ? name : name.charAt(0).toLowerCase() + name.slice(1);
}
