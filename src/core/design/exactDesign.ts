/**
 * Exact optimal design search: N points of the candidate region maximising det(X'X)
 * (D-criterion) or minimising trace((X'X)⁻¹W) (I-criterion) for a compiled model.
 *
 * Method: multi-start local search. Each start is a random feasible design improved by
 * passes of coordinate exchange (Meyer & Nachtsheim, 1995, Technometrics 37) and, when the
 * feasible grid is enumerated and small enough (N·n·p² per pass within FEDOROV_BUDGET),
 * of the modified Fedorov point exchange over the n grid points (Cook & Nachtsheim, 1980,
 * Technometrics 22), until a full pass changes nothing. Then as many restarts as starts from
 * the best plan with a tenth of its runs moved at random (iterated local search), because on
 * nearly saturated plans the single-exchange optima are many and far apart. (X'X)⁻¹ is re-inverted after every
 * pass to stop drift of the rank-one/rank-two updates. The best start wins; ties go to the
 * earlier start. An enumerated region that certainly cannot support the model is refused
 * first, with its cause (../region/regionSupport.ts).
 *
 * Potential terms: with a prior-information matrix P (potentialPrior.ts) every start
 * maximises |X'X + P| (or minimises trace((X'X + P)⁻¹W)), the Bayesian criterion of
 * DuMouchel & Jones (1994); the reported criteria are those of the primary terms alone
 * (`primaryColumns`), the model that will be fitted. A warm start (a plan found for another
 * run count, trimmed or filled to N) is searched first, before the random starts.
 *
 * Determinism: start s draws from the seeded stream of ../random.ts jumped s times,
 * so starts are independent streams and the same seed gives the same plan. The returned
 * points are sorted lexicographically (the run order is randomised later).
 */
import { InputError } from '../inputError.js';
import type { Criterion } from '../study.js';
import { aboveLimit, limitOf } from '../inputLimits.js';
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { informationMatrix, modelMatrix, subMatrix, subModel, type CompiledModel } from '../model/modelMatrix.js';
import { regionMoments } from '../evaluate/regionMoments.js';
import { dEfficiency, iCriterion, logDetPerRun } from '../evaluate/designCriteria.js';
import { invertSymmetric } from '../linalg/cholesky.js';
import { traceOfProduct } from '../linalg/symmetricKernels.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { ExchangeState } from './exchangeState.js';
import { coordinateExchangePass } from './coordinateExchange.js';
import { fedorovExchangePass, type CandidateSet } from './fedorovExchange.js';
import { randomFeasiblePoint } from '../region/gridSampling.js';
import { checkRegionSupport } from '../region/regionSupport.js';
import { createRandom } from '../random.js';

/** Largest N·n·p² (multiply-adds per point-exchange pass) for which the Fedorov pass is run. */
const FEDOROV_BUDGET = 2e7;
/**
 * Work units of one constraint evaluation (a compiled mathjs expression, about 1 µs against
 * about 2.5 ns per multiply-add on the reference machine; bench/limits.ts).
 */
const CONSTRAINT_WORK = 400;
/** Work units of setting up one start, whatever its size. */
const START_WORK = 1e4;
/** Share of the runs moved at random in each restart from the incumbent (our tuning on the sample). */
const RESTART_SHARE = 0.1;
/** Safety cap on passes per start; searches converge in far fewer. */
const MAX_PASSES = 200;

export interface ExactDesignRequest {
  model: CompiledModel;
  region: CandidateRegion;
  runs: number;
  criterion: Criterion;
  seed: number;
  starts: number;
  /** Region moment matrix W (p × p); computed with `regionMoments` when absent. */
  moments?: Float64Array;
  /** Constant p × p information added to X'X (potential-term prior); none when absent. */
  priorInformation?: Float64Array;
  /** The columns of the fitted (primary) model, for the reported criteria; all when absent. */
  primaryColumns?: readonly number[];
  /** A plan to search first (any size: trimmed or filled with random feasible points to N). */
  warmStart?: readonly (readonly number[])[];
  onProgress?: (done: number, total: number) => void;
}

export interface ExactDesignResult {
  /** N coded points, sorted lexicographically. */
  points: number[][];
  /** ln det(X'X / N) of the primary terms. */
  logDetPerRun: number;
  /** The searched D-criterion: ln det((X'X + P) / N) over all terms (equals logDetPerRun without a prior). */
  searchLogDetPerRun: number;
  /** The searched I-criterion trace((X'X + P)⁻¹W) over all terms (equals iCriterion without a prior). */
  searchICriterion: number;
  /** Textbook D-efficiency 100·|X'X|^(1/p) / N, percent. */
  dEfficiency: number;
  /** trace((X'X)⁻¹ W). */
  iCriterion: number;
  /**
   * The criterion reached by each start, in start order: logDetPerRun for the D-criterion,
   * iCriterion for the I-criterion; −Infinity (D) or Infinity (I) for a start left singular.
   */
  perStart: number[];
  /** The method used, in words. */
  algorithm: string;
  /** Exchange passes made, summed over starts. */
  passes?: number;
}

/**
 * Work of one exchange pass of one start, in multiply-adds: for each of the N rows, its
 * preparation and the rank-two update (2p²) and every level trial of every factor (p·t_j for
 * the t_j terms containing factor j, copying the row and the feasibility check with its
 * constraints); then the
 * refresh (N·p² + p³) and, when it runs, the point-exchange pass (at most FEDOROV_BUDGET).
 * Searches converge in 5 to 40 passes (bench/limits.ts), so starts × this, the search work,
 * bounds the time of the whole search.
 */
export function passWork(model: CompiledModel, region: CandidateRegion, runs: number): number {
  const { p } = model;
  const k = model.factorIds.length;
  let trials = 0;
  for (let j = 0; j < k; j++) {
    let terms = 0;
    for (let t = 0; t < p; t++) if (model.exponents[t * k + j] !== 0) terms++;
    const others = (region.levels[j]?.length ?? 1) - 1;
    // A trial also copies the row (p) and snaps every coordinate to its level in the feasibility check (about 10k).
    trials += others * (p * terms + 2 * p + 10 * k + CONSTRAINT_WORK * (region.constraintCount ?? 0));
  }
  // The point exchange runs only within its own budget (see fedorovCandidates).
  const pointExchange = region.points === null ? Number.POSITIVE_INFINITY : runs * region.points.length * p * p;
  const fedorov = pointExchange <= FEDOROV_BUDGET ? pointExchange : 0;
  // The fixed part covers a start's set-up: drawing its random points, sorting, bookkeeping.
  return runs * (3 * p * p + trials) + p * p * p + fedorov + START_WORK;
}

/**
 * Refuses, before any work, a search whose work (starts × passWork) is past the
 * `searchWork` limit, naming the largest number of starts that fits or, when not even one
 * does, what to make smaller.
 */
export function checkSearchWork(model: CompiledModel, region: CandidateRegion, runs: number, starts: number): void {
  const perStart = passWork(model, region, runs);
  const limit = limitOf('searchWork');
  if (starts * perStart <= limit) return;
  const fits = Math.floor(limit / perStart);
  const size = `${starts} start${starts === 1 ? '' : 's'} of a ${runs}-run search for ${model.p} model terms over ${model.factorIds.length} factors`;
  const advice =
    fits >= 1
      ? `use at most ${fits} start${fits === 1 ? '' : 's'}, fewer runs or a smaller model`
      : 'even one start is too much: use fewer runs, a smaller model, fewer levels or fewer varied factors';
  throw new InputError(`${size} is ${(starts * perStart).toExponential(1).replace('e+', 'e')} work units, ${aboveLimit('searchWork')}; ${advice}`, {
    key: 'design.starts',
  });
}

export function findExactDesign(request: ExactDesignRequest): ExactDesignResult {
  const { model, region, runs, criterion, seed, starts } = request;
  const { p } = model;
  const k = model.factorIds.length;
  const prior = request.priorInformation ?? null;
  const primaryColumns = request.primaryColumns ?? Array.from({ length: p }, (_, t) => t);
  const needed = primaryColumns.length;
  if (!Number.isInteger(runs) || runs < needed) {
    throw new InputError(`${runs} fitting runs cannot estimate ${needed} model parameters; use at least ${needed} runs or a smaller model`, {
      key: 'design.runs',
    });
  }
  if (!Number.isInteger(starts) || starts < 1) {
    throw new InputError(`the number of search starts must be a whole number of at least 1, not ${starts}`, { key: 'design.starts' });
  }
  checkSearchWork(model, region, runs, starts);
  checkRegionSupport(primaryColumns.length === p ? model : subModel(model, primaryColumns), region);
  const candidates = fedorovCandidates(model, region, runs);
  // Computed on first use, so an empty region is reported as such rather than as a moment failure.
  let moments = request.moments ?? null;
  const searchMoments = () => (moments ??= regionMoments(model, region, seed).matrix);

  const stream = createRandom(seed);
  const perStart: number[] = [];
  let best: Float64Array | null = null;
  let bestObjective = Number.NEGATIVE_INFINITY;
  let passes = 0;
  const start = new Float64Array(runs * k);
  const point = new Float64Array(k);
  const fillRandom = (rng: ReturnType<typeof stream.clone>, from: number) => {
    for (let i = from; i < runs; i++) {
      if (!randomFeasiblePoint(region, rng, point)) {
        throw new InputError('no feasible setting was found in the candidate region; check the constraints and equipment limits', {
          key: 'constraints',
        });
      }
      start.set(point, i * k);
    }
  };
  let restarting = false;
  const search = (): number => {
    const state = new ExchangeState(model, start, criterion, criterion === 'I' ? searchMoments() : null, prior);
    passes += improve(state, model, region, candidates);
    const singular = state.ridge > 0;
    const objective = singular ? Number.NEGATIVE_INFINITY : state.objective();
    // In the restarts an equally good plan replaces the incumbent, so the walk can cross plateaus.
    if (objective > bestObjective || (restarting && objective >= bestObjective - 1e-12 * Math.abs(bestObjective))) {
      bestObjective = objective;
      best = Float64Array.from(state.points);
    }
    if (criterion === 'D') return singular ? Number.NEGATIVE_INFINITY : state.logDet - p * Math.log(runs);
    return singular ? Number.POSITIVE_INFINITY : state.trace;
  };
  if (request.warmStart && request.warmStart.length > 0) {
    // The warm plan's own stream is drawn from the seed past the random starts' streams.
    const warm = request.warmStart;
    const kept = Math.min(runs, warm.length);
    // Keep an evenly spread subset when trimming, so the kept points still span the region.
    for (let i = 0; i < kept; i++) start.set(warm[Math.floor((i * warm.length) / kept)], i * k);
    const rng = stream.clone();
    for (let s = 0; s < starts; s++) rng.jump();
    fillRandom(rng, kept);
    search();
  }
  for (let s = 0; s < starts; s++) {
    const rng = stream.clone();
    stream.jump();
    fillRandom(rng, 0);
    perStart.push(search());
    request.onProgress?.(s + 1, starts);
  }
  // Restarts from perturbed optima (iterated local search; Lourenço, Martin & Stützle, 2003,
  // "Iterated local search", Handbook of Metaheuristics): as many rounds as starts, each
  // moving RESTART_SHARE of the incumbent's runs (at least 2) to random feasible points and
  // searching again.
  if (best !== null) {
    // The stream past the random starts' and the warm start's.
    const rng = stream.clone();
    rng.jump();
    const moved = Math.min(runs, Math.max(2, Math.round(RESTART_SHARE * runs)));
    restarting = true;
    for (let r = 0; r < starts; r++) {
      const incumbent: Float64Array = best;
      start.set(incumbent);
      const rows = new Set<number>();
      while (rows.size < moved) rows.add(uniformInt(rng, 0, runs - 1));
      for (const i of rows) if (randomFeasiblePoint(region, rng, point)) start.set(point, i * k);
      search();
    }
  }
  if (best === null) {
    throw new InputError(
      `the candidate region cannot support the model: every one of ${starts} searches for ${runs} runs left the ${p} terms inestimable ` +
        '(too few distinct feasible settings or levels for the terms asked for); relax the constraints, add levels or simplify the model',
      { key: 'design.model' },
    );
  }

  const found: Float64Array = best;
  const points: number[][] = [];
  for (let i = 0; i < runs; i++) points.push(Array.from(found.subarray(i * k, (i + 1) * k)));
  points.sort(compareLexicographic);
  const primary = primaryColumns.length === p ? model : subModel(model, primaryColumns);
  const primaryMoments = () => (primaryColumns.length === p ? searchMoments() : subMatrix(searchMoments(), p, primaryColumns));
  const potentialText = prior && primaryColumns.length < p ? `; Bayesian ${criterion}-criterion with ${p - primaryColumns.length} potential terms (DuMouchel & Jones 1994)` : '';
  const method = candidates
    ? `coordinate exchange (Meyer & Nachtsheim 1995) then modified Fedorov exchange over ${candidates.points.length} feasible grid points (Cook & Nachtsheim 1980)`
    : 'coordinate exchange (Meyer & Nachtsheim 1995) over the factor levels, grid not enumerated';
  return {
    points,
    logDetPerRun: logDetPerRun(primary, points),
    searchLogDetPerRun: searchLogDet(model, points, prior) - p * Math.log(runs),
    searchICriterion: searchTrace(model, points, prior, searchMoments()),
    dEfficiency: dEfficiency(primary, points),
    iCriterion: iCriterion(primary, points, primaryMoments()),
    perStart,
    algorithm: `${method}; ${criterion}-criterion${potentialText}; best of ${starts} random feasible starts (seed ${seed})${request.warmStart ? ' and a warm start' : ''}`,
    passes,
  };
}

/** Passes until a full pass changes nothing; returns the number of passes. */
function improve(state: ExchangeState, model: CompiledModel, region: CandidateRegion, candidates: CandidateSet | null): number {
  for (let pass = 1; pass <= MAX_PASSES; pass++) {
    const ridgeBefore = state.ridge;
    let moved = coordinateExchangePass(state, model, region);
    state.refresh();
    if (candidates) {
      moved += fedorovExchangePass(state, candidates);
      state.refresh();
    }
    // Dropping the ridge switches the criterion back to the one asked for: keep going.
    if (moved === 0 && ridgeBefore === state.ridge) return pass;
  }
  return MAX_PASSES;
}

function fedorovCandidates(model: CompiledModel, region: CandidateRegion, runs: number): CandidateSet | null {
  if (region.points === null) return null;
  const n = region.points.length;
  if (runs * n * model.p * model.p > FEDOROV_BUDGET) return null;
  return { points: region.points, rows: modelMatrix(model, region.points) };
}

/** ln det(X'X + P) of the points (−Infinity when singular). */
function searchLogDet(model: CompiledModel, points: number[][], prior: Float64Array | null): number {
  const { p } = model;
  const M = informationMatrix(model, points);
  if (prior) for (let i = 0; i < p * p; i++) M[i] += prior[i];
  return invertSymmetric(M, p, new Float64Array(p * p));
}

/** trace((X'X + P)⁻¹W) of the points (Infinity when singular). */
function searchTrace(model: CompiledModel, points: number[][], prior: Float64Array | null, moments: Float64Array): number {
  const { p } = model;
  const M = informationMatrix(model, points);
  if (prior) for (let i = 0; i < p * p; i++) M[i] += prior[i];
  const inverse = new Float64Array(p * p);
  if (invertSymmetric(M, p, inverse) === Number.NEGATIVE_INFINITY) return Number.POSITIVE_INFINITY;
  return traceOfProduct(inverse, moments);
}

function compareLexicographic(a: number[], b: number[]): number {
  for (let j = 0; j < a.length; j++) if (a[j] !== b[j]) return a[j] - b[j];
  return 0;
}
