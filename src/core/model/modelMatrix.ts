/**
 * Model matrix of a polynomial model: one row f(x) per design point, one column per term.
 *
 * Points are in coded units, one coordinate per design factor in a fixed order. The terms are
 * compiled once to an exponent table so that expanding a point is a tight loop over a
 * Float64Array — the exchange searches call `expandInto` millions of times.
 */
import type { ModelTerm } from './modelTerm.js';
import { crossProduct } from '../linalg/crossProduct.js';

export interface CompiledModel {
  /** Design factor ids, in coordinate order. */
  factorIds: readonly string[];
  /** Number of terms, intercept included. */
  p: number;
  /** Row-major p × k table of exponents. */
  exponents: Int32Array;
  /** Highest power of each factor in any term (length k). */
  maxPower: Int32Array;
}

export function compileModel(terms: readonly Pick<ModelTerm, 'powers'>[], factorIds: readonly string[]): CompiledModel {
  const k = factorIds.length;
  const p = terms.length;
  const exponents = new Int32Array(p * k);
  const maxPower = new Int32Array(k);
  terms.forEach((term, t) => {
    for (const [id, power] of Object.entries(term.powers)) {
      const j = factorIds.indexOf(id);
      if (j < 0) throw new Error(`model term uses ${id}, which is not a design factor`);
      exponents[t * k + j] = power;
      if (power > maxPower[j]) maxPower[j] = power;
    }
  });
  return { factorIds, p, exponents, maxPower };
}

/** Value of term `t` at the coded point `x` (length k). */
export function termValue(model: CompiledModel, t: number, x: ArrayLike<number>): number {
  const { exponents } = model;
  const k = model.factorIds.length;
  const base = t * k;
  let value = 1;
  for (let j = 0; j < k; j++) {
    const e = exponents[base + j];
    if (e !== 0) value *= e === 1 ? x[j] : x[j] ** e;
  }
  return value;
}

/** Writes f(x) for the coded point `x` (length k) into `out` (length p). */
export function expandInto(model: CompiledModel, x: ArrayLike<number>, out: Float64Array): void {
  for (let t = 0; t < model.p; t++) out[t] = termValue(model, t, x);
}

/** The N × p model matrix of coded points, row-major. */
export function modelMatrix(model: CompiledModel, points: readonly ArrayLike<number>[]): Float64Array {
  const X = new Float64Array(points.length * model.p);
  const row = new Float64Array(model.p);
  points.forEach((x, i) => {
    expandInto(model, x, row);
    X.set(row, i * model.p);
  });
  return X;
}

/** Information matrix X'X (p × p, row-major) of coded points. */
export function informationMatrix(model: CompiledModel, points: readonly ArrayLike<number>[]): Float64Array {
  return crossProduct(modelMatrix(model, points), points.length, model.p);
}

/** The model made of some of the terms (`columns`, in that order): the primary part of a model with potential terms. */
export function subModel(model: CompiledModel, columns: readonly number[]): CompiledModel {
  const k = model.factorIds.length;
  const exponents = new Int32Array(columns.length * k);
  const maxPower = new Int32Array(k);
  columns.forEach((c, t) => {
    for (let j = 0; j < k; j++) {
      const e = model.exponents[c * k + j];
      exponents[t * k + j] = e;
      if (e > maxPower[j]) maxPower[j] = e;
    }
  });
  return { factorIds: model.factorIds, p: columns.length, exponents, maxPower };
}

/** The rows and columns `columns` of a p × p row-major matrix (e.g. the moments of a sub-model). */
export function subMatrix(matrix: ArrayLike<number>, p: number, columns: readonly number[]): Float64Array {
  const q = columns.length;
  const out = new Float64Array(q * q);
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) out[a * q + b] = matrix[columns[a] * p + columns[b]];
  return out;
}
