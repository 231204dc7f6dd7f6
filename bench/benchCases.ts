/**
 * The benchmark cases: models and candidate regions of the sizes the exact design search
 * must handle, built directly in coded units (uncut boxes of evenly spaced levels).
 */
import { compileModel, type CompiledModel } from '../src/core/model/modelMatrix.js';
import type { CandidateRegion } from '../src/core/region/candidateRegion.js';

export interface BenchCase {
  name: string;
  model: CompiledModel;
  region: CandidateRegion;
  runs: number;
  /** The plan must be exactly orthogonal (100 % textbook D-efficiency). */
  mustBeOrthogonal?: boolean;
  /** Run the 50× comparison only with --thorough. */
  heavy?: boolean;
}

/** Evenly spaced coded levels from −1 to +1. */
export function codedLevels(count: number): number[] {
  return Array.from({ length: count }, (_, i) => -1 + (2 * i) / (count - 1));
}

/** The uncut grid of the given level counts; enumerated when it has at most `enumerateUpTo` points. */
export function boxRegion(levelCounts: number[], enumerateUpTo = 20_000): CandidateRegion {
  const levels = levelCounts.map(codedLevels);
  const gridSize = levelCounts.reduce((product, count) => product * count, 1);
  let points: number[][] | null = null;
  if (gridSize <= enumerateUpTo) {
    points = [[]];
    for (const factorLevels of levels) points = points.flatMap((prefix) => factorLevels.map((value) => [...prefix, value]));
  }
  return {
    factorIds: levelCounts.map((_, j) => `x${j + 1}`),
    levels,
    isFeasible: () => true,
    gridSize,
    points,
  };
}

type Powers = Record<string, number>;

/** Intercept, main effects, squares and all two-factor interactions of k factors. */
export function fullQuadraticTerms(k: number): Powers[] {
  const ids = Array.from({ length: k }, (_, j) => `x${j + 1}`);
  const terms: Powers[] = [{}];
  for (const id of ids) terms.push({ [id]: 1 });
  for (const id of ids) terms.push({ [id]: 2 });
  for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) terms.push({ [ids[a]]: 1, [ids[b]]: 1 });
  return terms;
}

/** Intercept, main effects and all two-factor interactions of k factors. */
export function interactionTerms(k: number): Powers[] {
  return fullQuadraticTerms(k).filter((term) => !Object.values(term).includes(2));
}

/** Intercept and main effects of k factors. */
export function firstOrderTerms(k: number): Powers[] {
  return fullQuadraticTerms(k).filter((term) => Object.keys(term).length <= 1 && !Object.values(term).includes(2));
}

function model(terms: Powers[], k: number): CompiledModel {
  const ids = Array.from({ length: k }, (_, j) => `x${j + 1}`);
  return compileModel(
    terms.map((powers) => ({ powers })),
    ids,
  );
}

export function benchCases(): BenchCase[] {
  const mixedTerms: Powers[] = [
    {},
    { x1: 1 },
    { x1: 2 },
    { x1: 3 },
    { x2: 1 },
    { x2: 2 },
    { x3: 1 },
    { x3: 2 },
    { x1: 1, x2: 1 },
    { x1: 1, x3: 1 },
  ];
  return [
    { name: '3 factors, full quadratic, 3 levels, N=14', model: model(fullQuadraticTerms(3), 3), region: boxRegion([3, 3, 3]), runs: 14 },
    { name: '5 factors, full quadratic, 3 levels, N=26', model: model(fullQuadraticTerms(5), 5), region: boxRegion([3, 3, 3, 3, 3]), runs: 26 },
    { name: '4-level cubic + two 3-level quadratic, N=13', model: model(mixedTerms, 3), region: boxRegion([4, 3, 3]), runs: 13 },
    {
      name: '6 two-level factors, all 2FI, N=32',
      model: model(interactionTerms(6), 6),
      region: boxRegion([2, 2, 2, 2, 2, 2]),
      runs: 32,
      mustBeOrthogonal: true,
    },
    {
      name: '10 factors, full quadratic, 3 levels, N=80',
      model: model(fullQuadraticTerms(10), 10),
      region: boxRegion(Array(10).fill(3), 0),
      runs: 80,
      heavy: true,
    },
  ];
}
