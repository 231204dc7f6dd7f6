/**
 * A polynomial model term and its written form.
 *
 * A term is a product of factor powers, `{inlet_temp: 2}` or `{inlet_temp: 1, feed_rate: 1}`;
 * the empty product is the intercept. The written form is the study-file syntax: factor ids,
 * `*` for products, `^` for powers (`inlet_temp^2`, `inlet_temp*feed_rate`); the intercept is
 * written `1` and is implied in term lists. Factors inside a term are written in the order of
 * the factor list so that one term has one spelling.
 */

export interface ModelTerm {
  /** Factor id → power (≥ 1). Empty for the intercept. */
  powers: Record<string, number>;
  /** Why the term is in the model, in a sentence a reader can check. */
  reason: string;
}

export const INTERCEPT_LABEL = '1';

/** The term in study syntax, factors in `factorOrder`. */
export function termLabel(term: Pick<ModelTerm, 'powers'>, factorOrder: readonly string[]): string {
  const ids = Object.keys(term.powers).sort((a, b) => rank(factorOrder, a) - rank(factorOrder, b));
  if (ids.length === 0) return INTERCEPT_LABEL;
  return ids.map((id) => (term.powers[id] === 1 ? id : `${id}^${term.powers[id]}`)).join('*');
}

function rank(order: readonly string[], id: string): number {
  const at = order.indexOf(id);
  return at < 0 ? order.length : at;
}
