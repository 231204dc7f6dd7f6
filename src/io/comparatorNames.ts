/**
 * Short names of the comparison's plans, for chart legends, the report's tables and the
 * workbook: the one home for them (each row's `label` carries the full description).
 */
import type { ComparatorId } from '../core/compare/comparisonTypes.js';

export const COMPARATOR_SHORT_NAME: Record<ComparatorId, string> = {
  proposed: 'Proposed plan',
  conventional: 'Conventional plan',
  'full-factorial': 'Full factorial',
  fractional: 'Fractional factorial',
  'plackett-burman': 'Plackett–Burman',
  'full-grid': 'Full grid of levels',
  'ccd-face': 'Central composite (face-centred)',
  'ccd-rotatable': 'Central composite (rotatable)',
  'box-behnken': 'Box–Behnken',
};

/** The short name of a plan id, or the id itself for one this table does not know. */
export function comparatorName(id: string): string {
  return (COMPARATOR_SHORT_NAME as Record<string, string>)[id] ?? id;
}

/** The short name inside a sentence: lower case, except names after people (Box–Behnken, Plackett–Burman). */
export function comparatorNameInSentence(id: string): string {
  const name = comparatorName(id);
  return id === 'box-behnken' || id === 'plackett-burman' ? name : name.charAt(0).toLowerCase() + name.slice(1);
}
