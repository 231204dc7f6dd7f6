/**
 * Model terms in words, from their structure (factor → power, as the model's own term reader
 * `parseTerm` returns it), never from the look of their label: a main effect, the curvature
 * (squared term), the cubic trend, an interaction of two or more factors, or a higher power.
 *
 * Conventions fixed here: factors are named by their study names when a name table is given,
 * else by their ids; lists are grouped by kind ("the curvature of A and B and the interaction
 * of A and C") so a long list stays readable.
 */
import { parseTerm } from '../core/model/termSyntax.js';
import { wordList } from '../core/wordList.js';

export type TermKind = 'main' | 'squared' | 'cubic' | 'power' | 'interaction';

export interface TermShape {
  kind: TermKind;
  /** Factor ids in the term, in the order written. */
  factors: string[];
  /** The power, for single-factor terms. */
  power: number;
}

/** The structure of a term label in study syntax (`a^2`, `a*b`), read by the model's term reader. */
export function termShape(label: string, factorIds: readonly string[]): TermShape {
  const powers = parseTerm(label, factorIds);
  const factors = Object.keys(powers);
  if (factors.length >= 2) return { kind: 'interaction', factors, power: 1 };
  const power = powers[factors[0]] ?? 0;
  const kind: TermKind = power === 1 ? 'main' : power === 2 ? 'squared' : power === 3 ? 'cubic' : 'power';
  return { kind, factors, power };
}

/** One term: "the curvature of Feed total solids". */
export function termPhrase(label: string, factorIds: readonly string[], nameOf: (id: string) => string = (id) => id): string {
  const shape = termShape(label, factorIds);
  const names = shape.factors.map(nameOf);
  switch (shape.kind) {
    case 'main':
      return `the main effect of ${names[0]}`;
    case 'squared':
      return `the curvature of ${names[0]}`;
    case 'cubic':
      return `the cubic trend of ${names[0]}`;
    case 'power':
      return `the power-${shape.power} trend of ${names[0]}`;
    case 'interaction':
      return `the interaction of ${wordList(names)}`;
  }
}

/** Several terms grouped by kind: "the curvature of A and B, the cubic trend of C and the interaction of A and C". */
export function termsPhrase(labels: readonly string[], factorIds: readonly string[], nameOf: (id: string) => string = (id) => id): string {
  const groups = new Map<string, string[]>();
  const interactions: string[][] = [];
  for (const label of labels) {
    const shape = termShape(label, factorIds);
    const names = shape.factors.map(nameOf);
    if (shape.kind === 'interaction') {
      interactions.push(names);
      continue;
    }
    const head = shape.kind === 'main' ? 'main effect' : shape.kind === 'squared' ? 'curvature' : shape.kind === 'cubic' ? 'cubic trend' : `power-${shape.power} trend`;
    groups.set(head, [...(groups.get(head) ?? []), names[0]]);
  }
  const parts = [...groups].map(([head, names]) => `the ${names.length > 1 && head === 'main effect' ? 'main effects' : head} of ${wordList(names)}`);
  if (interactions.length === 1) parts.push(`the interaction of ${wordList(interactions[0])}`);
  else if (interactions.length > 1) parts.push(`the interactions ${wordList(interactions.map((names) => names.join(' × ')))}`);
  return wordList(parts);
}
