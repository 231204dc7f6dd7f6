/**
 * Small models and candidate regions for the design-search tests, built directly in coded
 * units so the tests do not depend on the level and model stages.
 */
import { compileModel, type CompiledModel } from '../../../src/core/model/modelMatrix.js';
import type { CandidateRegion } from '../../../src/core/region/candidateRegion.js';

export function factorIds(k: number): string[] {
  return Array.from({ length: k }, (_, j) => `x${j + 1}`);
}

/** A model from an exponent table (one row per term, one column per factor). */
export function modelFromExponents(exponents: number[][]): CompiledModel {
  const k = exponents[0].length;
  const ids = factorIds(k);
  return compileModel(
    exponents.map((row) => ({ powers: Object.fromEntries(row.flatMap((e, j) => (e > 0 ? [[ids[j], e]] : []))) })),
    ids,
  );
}

export function quadraticExponents(k: number, squares = true): number[][] {
  const unit = (j: number, e: number) => Array.from({ length: k }, (_, m) => (m === j ? e : 0));
  const terms: number[][] = [Array(k).fill(0)];
  for (let j = 0; j < k; j++) terms.push(unit(j, 1));
  if (squares) for (let j = 0; j < k; j++) terms.push(unit(j, 2));
  for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) terms.push(Array.from({ length: k }, (_, m) => (m === a || m === b ? 1 : 0)));
  return terms;
}

export function firstOrderExponents(k: number): number[][] {
  return quadraticExponents(k, false).slice(0, k + 1);
}

/** Grid of the given coded levels cut by `feasible`; enumerated unless `enumerate` is false. */
export function gridRegion(levels: number[][], feasible: (x: ArrayLike<number>) => boolean = () => true, enumerate = true): CandidateRegion {
  let all: number[][] = [[]];
  for (const factorLevels of levels) all = all.flatMap((prefix) => factorLevels.map((value) => [...prefix, value]));
  return {
    factorIds: factorIds(levels.length),
    levels,
    isFeasible: feasible,
    gridSize: all.length,
    points: enumerate ? all.filter((x) => feasible(x)) : null,
  };
}

export const THREE_LEVELS = [-1, 0, 1];
export const TWO_LEVELS = [-1, 1];
