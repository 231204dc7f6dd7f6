/**
 * Orthogonal-polynomial coding of a polynomial model: each term Π x_j^{e_j} is replaced by
 * Π P_{e_j}(x_j), with P_n the Legendre polynomials on [−1, 1] (P0 = 1, P1 = x,
 * P2 = (3x² − 1)/2, P3 = (5x³ − 3x)/2, …; Bonnet's recurrence
 * (n + 1)P_{n+1} = (2n + 1)x·P_n − n·P_{n−1}; Abramowitz & Stegun, 1964, "Handbook of
 * Mathematical Functions", 22.7.10).
 *
 * Why: raw powers of one factor overlap (x and x³ are highly correlated over [−1, 1]), so the
 * standard error of a raw linear coefficient in a cubic model says little about how well the
 * trend is seen. The Legendre polynomials are orthogonal under the uniform measure on
 * [−1, 1], so on a design that spreads its runs over the range the recoded columns barely
 * overlap. A hierarchical model spans the same column space in both codings, so fitted
 * values, joint tests of a factor's terms and the test of the highest-order term are the same.
 *
 * Conventions: coded units; the term order and count are the model's.
 */
import type { CompiledModel } from './modelMatrix.js';

/** P_n(x) by Bonnet's recurrence. */
export function legendre(n: number, x: number): number {
  if (n === 0) return 1;
  let previous = 1;
  let current = x;
  for (let m = 1; m < n; m++) {
    const next = ((2 * m + 1) * x * current - m * previous) / (m + 1);
    previous = current;
    current = next;
  }
  return current;
}

/** Value of term t recoded as Π P_{e_j}(x_j) at the coded point x. */
export function legendreTermValue(model: CompiledModel, t: number, x: ArrayLike<number>): number {
  const k = model.factorIds.length;
  let value = 1;
  for (let j = 0; j < k; j++) {
    const e = model.exponents[t * k + j];
    if (e !== 0) value *= legendre(e, x[j]);
  }
  return value;
}

/** The N × p model matrix in Legendre coding, row-major. */
export function legendreModelMatrix(model: CompiledModel, points: readonly ArrayLike<number>[]): Float64Array {
  const { p } = model;
  const X = new Float64Array(points.length * p);
  points.forEach((x, i) => {
    for (let t = 0; t < p; t++) X[i * p + t] = legendreTermValue(model, t, x);
  });
  return X;
}

/** The term written in Legendre coding, e.g. `P2(inlet_temp)·P1(feed_rate)`; `1` for the intercept. */
export function legendreLabel(model: CompiledModel, t: number): string {
  const k = model.factorIds.length;
  const parts: string[] = [];
  for (let j = 0; j < k; j++) {
    const e = model.exponents[t * k + j];
    if (e !== 0) parts.push(`P${e}(${model.factorIds[j]})`);
  }
  return parts.length === 0 ? '1' : parts.join('·');
}
