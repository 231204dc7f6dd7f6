/**
 * Whether an enumerated candidate region can support a model at all, checked before the
 * exact design search so that a hopeless request is refused with its cause named instead of
 * after every search start has failed.
 *
 * Method: rank bounds on the model matrix X. X has at most as many independent rows as
 * distinct feasible points; a column that is a function of some coordinates only has, together
 * with the other such columns, at most as many independent values as there are distinct
 * feasible combinations of those coordinates; and on m distinct values x^d (d ≥ m) is a
 * polynomial of degree m − 1 in x (Lagrange interpolation; any linear-algebra text, e.g.
 * Golub & Van Loan, 2013, "Matrix Computations", 4th ed., on Vandermonde systems). Every
 * refusal is certain; passing the checks does not prove the model estimable (the search
 * still reports anything left).
 *
 * Conventions: coded points as in `CandidateRegion`; key `constraints` when the constraints
 * removed points from the grid, `design.model` when the full grid itself is too poor.
 */
import { InputError } from '../inputError.js';
import type { CompiledModel } from '../model/modelMatrix.js';
import type { CandidateRegion } from './candidateRegion.js';

/** Largest (pairs × feasible points) visited by the two-factor check. */
const PAIR_CHECK_BUDGET = 5e6;

/**
 * Refuses, before any search, an enumerated region that certainly cannot support the model,
 * naming the cause: fewer distinct feasible points than parameters (X has at most that rank),
 * or a factor with m distinct feasible settings and a term x^d·g, d ≥ m, whose lower
 * companions x^i·g, i < m, are all in the model — on m values x^d is a polynomial of degree
 * m − 1 in x (Lagrange interpolation), so that column is a combination of the companions'.
 * Then the same for pairs of factors (`checkPairs`). Other deficiencies are left to the
 * search, which reports them without a named cause.
 */
export function checkRegionSupport(model: CompiledModel, region: CandidateRegion): void {
  const points = region.points;
  if (points === null) return;
  const { p, exponents } = model;
  const k = model.factorIds.length;
  if (points.length < p) {
    throw new InputError(
      `the candidate region cannot support the model: it has only ${points.length} feasible grid point${points.length === 1 ? '' : 's'}, ` +
        `fewer than the ${p} model parameters; ` +
        'loosen the constraints, add levels or simplify the model',
      { key: points.length < region.gridSize ? 'constraints' : 'design.model' },
    );
  }
  const termKeys = new Set<string>();
  for (let t = 0; t < p; t++) termKeys.add(exponents.subarray(t * k, (t + 1) * k).join(','));
  for (let j = 0; j < k; j++) {
    const settings = new Set(points.map((point) => point[j]));
    const m = settings.size;
    for (let t = 0; t < p; t++) {
      const power = exponents[t * k + j];
      if (power < m) continue;
      const companion = Array.from(exponents.subarray(t * k, (t + 1) * k));
      let allPresent = true;
      for (let i = 0; i < m && allPresent; i++) {
        companion[j] = i;
        allPresent = termKeys.has(companion.join(','));
      }
      if (!allPresent) continue;
      const id = model.factorIds[j];
      const cut = m < region.levels[j].length;
      throw new InputError(
        `the candidate region cannot support the model: ${id} has only ${m} feasible setting${m === 1 ? '' : 's'}` +
          `${cut ? ` of its ${region.levels[j].length} levels` : ''}, too few for the term ${termText(model, t)} ` +
          `(power ${power} needs ${power + 1} distinct settings); ` +
          (cut ? 'loosen the constraints that exclude the other levels or drop the term' : 'add levels or drop the term'),
        { key: cut ? 'constraints' : 'design.model' },
      );
    }
  }
  checkPairs(model, points, region.gridSize);
}

/**
 * The same rank argument for two factors at a time: the columns of the terms that involve
 * only factors a and b are functions of the point's (a, b) settings, so their rank is at most
 * the number of distinct feasible (a, b) combinations — a corner cut off a two-level square
 * leaves three combinations for the four terms 1, a, b, a·b. Skipped on grids where the pass
 * would cost more than PAIR_CHECK_BUDGET point visits.
 */
function checkPairs(model: CompiledModel, points: readonly number[][], gridSize: number): void {
  const { p, exponents } = model;
  const k = model.factorIds.length;
  const pairs: [number, number, number[]][] = [];
  for (let a = 0; a < k; a++) {
    for (let b = a + 1; b < k; b++) {
      const inside: number[] = [];
      let joint = false;
      for (let t = 0; t < p; t++) {
        let onlyAB = true;
        for (let j = 0; j < k && onlyAB; j++) if (j !== a && j !== b && exponents[t * k + j] > 0) onlyAB = false;
        if (!onlyAB) continue;
        inside.push(t);
        if (exponents[t * k + a] > 0 && exponents[t * k + b] > 0) joint = true;
      }
      // Without a term in both factors the single-factor check already covers the pair.
      if (joint) pairs.push([a, b, inside]);
    }
  }
  if (pairs.length === 0 || pairs.length * points.length > PAIR_CHECK_BUDGET) return;
  // Level index of every coordinate, so a pair's combinations are counted in a small table.
  const n = points.length;
  const levelIndex = new Int32Array(n * k);
  const levelCount = new Int32Array(k);
  for (let j = 0; j < k; j++) {
    const index = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      const value = points[i][j];
      let at = index.get(value);
      if (at === undefined) index.set(value, (at = index.size));
      levelIndex[i * k + j] = at;
    }
    levelCount[j] = index.size;
  }
  for (const [a, b, inside] of pairs) {
    const seen = new Uint8Array(levelCount[a] * levelCount[b]);
    let combinations = 0;
    for (let i = 0; i < n; i++) {
      const cell = levelIndex[i * k + a] * levelCount[b] + levelIndex[i * k + b];
      if (seen[cell] === 0) {
        seen[cell] = 1;
        combinations++;
      }
    }
    if (combinations >= inside.length) continue;
    const ids = `${model.factorIds[a]} and ${model.factorIds[b]}`;
    throw new InputError(
      `the candidate region cannot support the model: ${ids} have only ${combinations} feasible combinations of settings, ` +
        `too few for the ${inside.length} terms in them (${inside.map((t) => termText(model, t)).join(', ')}); ` +
        (points.length < gridSize ? 'loosen the constraints, add levels or drop a term' : 'add levels or drop a term'),
      { key: points.length < gridSize ? 'constraints' : 'design.model' },
    );
  }
}

function termText(model: CompiledModel, t: number): string {
  const k = model.factorIds.length;
  const parts: string[] = [];
  for (let j = 0; j < k; j++) {
    const power = model.exponents[t * k + j];
    if (power > 0) parts.push(power === 1 ? model.factorIds[j] : `${model.factorIds[j]}^${power}`);
  }
  return parts.length === 0 ? '1' : parts.join('*');
}
