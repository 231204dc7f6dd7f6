/**
 * Coefficients of a fitted polynomial in engineering units, from its coded-unit fit.
 *
 * Coding: x_j = (X_j − m_j) / h_j with m_j = (low + high) / 2 and h_j = (high − low) / 2
 * (low → −1, high → +1; the same coding as `toCoded` in src/core/design/levels.ts). Each coded
 * term ∏ x_j^{e_j} expands by the binomial theorem into
 *   ∏_j Σ_{a=0}^{e_j} C(e_j, a) X_j^a (−m_j)^{e_j − a} / h_j^{e_j},
 * so the engineering polynomial has one term per exponent vector a ≤ e of some model term.
 * The map is linear, γ = T β, and the covariance maps as T C T′ (Seber & Lee, 2003, "Linear
 * Regression Analysis", 2nd ed., §3.3, linear functions of β̂). Both polynomials give the
 * same prediction at every point, which the tests check.
 *
 * Term order: the model's own terms first, in model order; then the lower-order terms the
 * expansion creates that the model lacks (a non-hierarchical model, e.g. x² without x), by
 * degree and then factor order. An engineering coefficient that receives a contribution
 * from an inestimable (NaN) coded coefficient is NaN.
 */
import type { CompiledModel } from '../model/modelMatrix.js';
import { termLabel } from '../model/modelTerm.js';

export interface FactorRange {
  low: number;
  high: number;
}

export interface EngineeringPolynomial {
  /** Exponents per factor (model factor order) and the term in study syntax. */
  terms: { exponents: number[]; label: string }[];
  estimates: Float64Array;
  /** T C T′ (q × q row-major) when a coded covariance was given. */
  covariance: Float64Array | null;
  /** q × p row-major map from coded to engineering coefficients. */
  transform: Float64Array;
}

export function engineeringPolynomial(
  model: CompiledModel,
  ranges: readonly FactorRange[],
  coefficients: ArrayLike<number>,
  covariance?: ArrayLike<number>,
): EngineeringPolynomial {
  const k = model.factorIds.length;
  const p = model.p;
  const mid = ranges.map((r) => (r.low + r.high) / 2);
  const half = ranges.map((r) => (r.high - r.low) / 2);
  const keys = new Map<string, number>();
  const exponentsList: number[][] = [];
  const add = (exponents: number[]): number => {
    const key = exponents.join(',');
    let at = keys.get(key);
    if (at === undefined) {
      at = exponentsList.length;
      keys.set(key, at);
      exponentsList.push(exponents);
    }
    return at;
  };
  const modelExponents: number[][] = [];
  for (let t = 0; t < p; t++) {
    const e = Array.from(model.exponents.subarray(t * k, (t + 1) * k));
    modelExponents.push(e);
    add(e);
  }
  // The lower-order terms the expansion creates, in a fixed order.
  const extra: number[][] = [];
  for (const e of modelExponents) {
    for (const a of belowOrEqual(e)) if (!keys.has(a.join(','))) extra.push(a);
  }
  const unique = [...new Map(extra.map((a) => [a.join(','), a])).values()];
  unique.sort((a, b) => degree(a) - degree(b) || compareExponents(a, b));
  for (const a of unique) add(a);

  const q = exponentsList.length;
  const transform = new Float64Array(q * p);
  modelExponents.forEach((e, t) => {
    for (const a of belowOrEqual(e)) {
      let weight = 1;
      for (let j = 0; j < k; j++) {
        if (e[j] === 0) continue;
        weight *= (binomial(e[j], a[j]) * (-mid[j]) ** (e[j] - a[j])) / half[j] ** e[j];
      }
      transform[keys.get(a.join(','))! * p + t] += weight;
    }
  });
  const estimates = new Float64Array(q);
  for (let r = 0; r < q; r++) {
    let sum = 0;
    for (let t = 0; t < p; t++) if (transform[r * p + t] !== 0) sum += transform[r * p + t] * coefficients[t];
    estimates[r] = sum;
  }
  let mapped: Float64Array | null = null;
  if (covariance) {
    const TC = new Float64Array(q * p);
    for (let r = 0; r < q; r++) {
      for (let c = 0; c < p; c++) {
        let sum = 0;
        for (let t = 0; t < p; t++) if (transform[r * p + t] !== 0) sum += transform[r * p + t] * covariance[t * p + c];
        TC[r * p + c] = sum;
      }
    }
    mapped = new Float64Array(q * q);
    for (let r = 0; r < q; r++) {
      for (let s = 0; s < q; s++) {
        let sum = 0;
        for (let c = 0; c < p; c++) if (transform[s * p + c] !== 0) sum += TC[r * p + c] * transform[s * p + c];
        mapped[r * q + s] = sum;
      }
    }
  }
  const terms = exponentsList.map((exponents) => ({ exponents, label: labelOf(exponents, model.factorIds) }));
  return { terms, estimates, covariance: mapped, transform };
}

/** Value of the engineering polynomial at engineering settings X (model factor order). */
export function engineeringValue(polynomial: EngineeringPolynomial, settings: readonly number[]): number {
  let sum = 0;
  polynomial.terms.forEach((term, r) => {
    let value = polynomial.estimates[r];
    term.exponents.forEach((e, j) => {
      if (e > 0) value *= settings[j] ** e;
    });
    sum += value;
  });
  return sum;
}

function labelOf(exponents: number[], factorIds: readonly string[]): string {
  const powers: Record<string, number> = {};
  exponents.forEach((e, j) => {
    if (e > 0) powers[factorIds[j]] = e;
  });
  return termLabel({ powers }, factorIds);
}

/** Every exponent vector a with 0 ≤ a_j ≤ e_j. */
function belowOrEqual(e: number[]): number[][] {
  let out: number[][] = [[]];
  for (const ej of e) {
    const next: number[][] = [];
    for (const prefix of out) for (let a = 0; a <= ej; a++) next.push([...prefix, a]);
    out = next;
  }
  return out;
}

function degree(a: number[]): number {
  return a.reduce((s, v) => s + v, 0);
}

/** Higher powers of earlier factors first, as the model's own term order reads. */
function compareExponents(a: number[], b: number[]): number {
  for (let j = 0; j < a.length; j++) if (a[j] !== b[j]) return b[j] - a[j];
  return 0;
}

function binomial(n: number, r: number): number {
  let value = 1;
  for (let i = 1; i <= r; i++) value = (value * (n - r + i)) / i;
  return value;
}
