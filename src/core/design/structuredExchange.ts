/**
 * Exact D-optimal design search for a campaign with structure: runs in whole plots that share
 * the setting of the hard-to-change factors, whole plots in sessions with fixed effects, runs
 * whose settings are already fixed (centre replicates, runs already done), and an optional
 * prior information matrix (potential terms, or the information of earlier runs).
 *
 * Criterion: ln det(A), A = X'V⁻¹X adjusted for the session effects, plus the prior
 * (glsInformation.ts gives the closed forms and the sources). With one whole plot per run,
 * η = 0 and one session, A = X'X and the search is ordinary coordinate exchange.
 *
 * Method: coordinate exchange with two kinds of move (Jones & Goos, 2007, "A
 * candidate-set-free algorithm for generating D-optimal split-plot designs", Applied
 * Statistics 56, 347–364): a whole-plot move sets one hard-to-change factor to another level
 * for every run of a whole plot; a within-plot move sets one factor of one run (any factor
 * when the run is alone in its whole plot). A within-plot move changes one row f_x → f_y, its
 * whole-plot sum s and its session sum a, so A changes by U C U' with U = [f_x, f_y, s, a] and
 * a 4 × 4 matrix C written out below; the determinant ratio is det(I + C U'A⁻¹U) (the matrix
 * determinant lemma; Harville, 1997, "Matrix Algebra From a Statistician's Perspective",
 * §18.1), O(p·t) per trial with t the terms that contain the factor. A whole-plot move is
 * scored from scratch (A plus its change, Cholesky), O(n_w p² + p³), and such moves are few.
 * A⁻¹ is recomputed from scratch after every accepted move, so the updates never drift.
 * Starts: random feasible settings with the hard-to-change ones shared inside each whole plot.
 *
 * Singular starts: A + ridge·I is searched until A itself is nonsingular, as in the
 * unstructured search (exchangeState.ts).
 */
import { uniformInt } from 'pure-rand/distribution/uniformInt';
import { InputError } from '../inputError.js';
import { createRandom, type RandomGenerator } from '../random.js';
import { expandInto, termValue, type CompiledModel } from '../model/modelMatrix.js';
import { wholePlotSizes, type ErrorStructure } from '../model/glsInformation.js';
import { choleskyFactor, choleskyLogDeterminant, invertSymmetric } from '../linalg/cholesky.js';
import { addScaledOuter, dot, multiplyInto } from '../linalg/symmetricKernels.js';
import type { CandidateRegion } from '../region/candidateRegion.js';
import { randomFeasiblePoint } from '../region/gridSampling.js';

const RIDGE = 1e-4;
const SINGULAR_PIVOT = 1e-10;
const IMPROVEMENT = 1e-9;
const MAX_PASSES = 200;
/** Draws of the easy-to-change settings of a run before it copies its whole plot's first run. */
const WITHIN_ATTEMPTS = 50;
/** Largest N·n·p² (multiply-adds per point-exchange pass) for which the point exchange is run. */
const POINT_EXCHANGE_BUDGET = 2e7;
/** Share of the free whole plots a restart from the incumbent draws afresh (our tuning on the sample). */
const PERTURBED_SHARE = 0.25;

export interface StructuredSearchRequest {
  model: CompiledModel;
  region: CandidateRegion;
  /** Whole plots and sessions of the runs in the model, and η. */
  structure: ErrorStructure;
  /** Per run: its fixed coded point, or null when the search chooses it. */
  fixed: (readonly number[] | null)[];
  /** Per design factor: true when it is hard to change (shared inside a whole plot). */
  hard: readonly boolean[];
  /** Added to the adjusted information (size × size, see `informationSize`); optional. */
  prior?: Float64Array;
  seed: number;
  starts: number;
  /** A first start to try before the random ones (N × k coded, whole plots respected). */
  warmStart?: Float64Array;
  onProgress?: (done: number, total: number) => void;
}

export interface StructuredSearchResult {
  /** One coded point per run, in the order of `fixed`. */
  points: number[][];
  /** ln det(A) of the best start (A with the prior, adjusted for sessions). */
  logDet: number;
  /** ln det(A) reached by each start, in start order (−Infinity when left singular). */
  perStart: number[];
  /** Size of A: p, or p − 1 when the sessions absorb the intercept. */
  size: number;
  passes: number;
}

/** Size of the adjusted information of a model under a structure. */
export function informationSize(p: number, structure: ErrorStructure): number {
  return structure.sessions > 1 ? p - 1 : p;
}

export function findStructuredDesign(request: StructuredSearchRequest): StructuredSearchResult {
  const { model, region, structure, fixed, hard, seed, starts } = request;
  const k = model.factorIds.length;
  const N = fixed.length;
  if (structure.wholePlotOf.length !== N) throw new Error('structured search: one whole plot per run is needed');
  const plots = plotMembers(structure);
  for (const members of plots) {
    const kinds = new Set(members.map((i) => fixed[i] === null));
    if (kinds.size > 1) throw new Error('structured search: a whole plot mixes fixed and free runs');
  }
  const stream = createRandom(seed);
  const candidates = candidateRows(model, region, structure, N);
  const perStart: number[] = [];
  const incumbent = { points: new Float64Array(0), logDet: Number.NEGATIVE_INFINITY };
  let passes = 0;
  const restarts = starts > 1 ? Math.floor(starts / 2) : 0;
  const total = starts + (request.warmStart ? 1 : 0);
  const rounds = total + restarts;
  const consider = (initial: Float64Array): void => {
    const state = new StructuredState(model, region, structure, plots, fixed, hard, initial, request.prior ?? null, candidates);
    passes += state.improve();
    const logDet = state.ridge > 0 ? Number.NEGATIVE_INFINITY : state.logDet;
    perStart.push(logDet);
    if (incumbent.points.length === 0 || logDet > incumbent.logDet + IMPROVEMENT) {
      incumbent.points = Float64Array.from(state.points);
      incumbent.logDet = logDet;
    }
  };
  for (let s = 0; s < rounds; s++) {
    const rng = stream.clone();
    stream.jump();
    if (s === 0 && request.warmStart) consider(Float64Array.from(request.warmStart));
    else if (s < total || incumbent.logDet === Number.NEGATIVE_INFINITY) consider(randomStart(region, fixed, plots, hard, k, rng));
    else consider(perturbed(incumbent.points, region, fixed, plots, hard, k, rng));
    request.onProgress?.(s + 1, rounds);
  }
  const chosen = incumbent;
  if (chosen.logDet === Number.NEGATIVE_INFINITY) {
    throw new InputError(
      `the whole plots and sessions cannot support the model: every one of ${rounds} searches left terms confounded with the whole plots or sessions ` +
        '(too few whole plots for the hard-to-change terms, or too few runs per session); use more whole plots or runs, or a smaller model',
      { key: 'design.wholePlots' },
    );
  }
  const points: number[][] = [];
  for (let i = 0; i < N; i++) points.push(Array.from(chosen.points.subarray(i * k, (i + 1) * k)));
  return { points, logDet: chosen.logDet, perStart, size: informationSize(model.p, structure), passes };
}

function plotMembers(structure: ErrorStructure): number[][] {
  const plots: number[][] = Array.from({ length: structure.wholePlots }, () => []);
  structure.wholePlotOf.forEach((w, i) => plots[w].push(i));
  return plots;
}

/** The enumerated feasible grid points and their reduced model rows, when the budget allows a point exchange. */
function candidateRows(model: CompiledModel, region: CandidateRegion, structure: ErrorStructure, N: number): Candidates | null {
  if (region.points === null) return null;
  const count = region.points.length;
  const q = informationSize(model.p, structure);
  if (N * count * q * q > POINT_EXCHANGE_BUDGET) return null;
  const k = model.factorIds.length;
  const from = model.p - q;
  const points = new Float64Array(count * k);
  const rows = new Float64Array(count * q);
  const full = new Float64Array(model.p);
  region.points.forEach((point, c) => {
    points.set(point, c * k);
    expandInto(model, point, full);
    rows.set(full.subarray(from), c * q);
  });
  return { count, points, rows };
}

interface Candidates {
  count: number;
  /** count × k coded points. */
  points: Float64Array;
  /** count × q reduced model rows. */
  rows: Float64Array;
}

/** Scratch and prepared quantities of the run whose trials are being scored. */
interface PreparedRun {
  run: number;
  fx: Float64Array;
  s: Float64Array;
  a: Float64Array;
  hx: Float64Array;
  hs: Float64Array;
  ha: Float64Array;
  hy: Float64Array;
  fy: Float64Array;
  trial: Float64Array;
  xx: number;
  xs: number;
  xa: number;
  ss: number;
  sa: number;
  aa: number;
  c: number;
  h: number;
  e: number;
  G: Float64Array;
  C: Float64Array;
  work: Float64Array;
}

function randomStart(
  region: CandidateRegion,
  fixed: (readonly number[] | null)[],
  plots: number[][],
  hard: readonly boolean[],
  k: number,
  rng: RandomGenerator,
): Float64Array {
  const points = new Float64Array(fixed.length * k);
  const scratch = { point: new Float64Array(k), trial: new Float64Array(k) };
  for (const members of plots) {
    if (fixed[members[0]] !== null) for (const i of members) points.set(fixed[i] as readonly number[], i * k);
    else drawPlot(points, members, region, hard, k, rng, scratch);
  }
  return points;
}

/**
 * A restart from the best design so far (iterated local search): `PERTURBED_SHARE` of its free
 * whole plots (at least one) are drawn afresh, the rest kept. Restarts from a perturbed
 * optimum find better designs than the same number of random starts on rugged problems
 * (Lourenço, Martin & Stützle, 2003, "Iterated local search", Handbook of Metaheuristics).
 */
function perturbed(
  best: Float64Array,
  region: CandidateRegion,
  fixed: (readonly number[] | null)[],
  plots: number[][],
  hard: readonly boolean[],
  k: number,
  rng: RandomGenerator,
): Float64Array {
  const points = Float64Array.from(best);
  const free = plots.filter((members) => fixed[members[0]] === null);
  if (free.length === 0) return points;
  const scratch = { point: new Float64Array(k), trial: new Float64Array(k) };
  const count = Math.max(1, Math.round(free.length * PERTURBED_SHARE));
  for (let c = 0; c < count; c++) {
    const pick = uniformInt(rng, c, free.length - 1);
    [free[c], free[pick]] = [free[pick], free[c]];
    drawPlot(points, free[c], region, hard, k, rng, scratch);
  }
  return points;
}

/** Random feasible settings for one whole plot: the hard-to-change ones shared by its runs. */
function drawPlot(
  points: Float64Array,
  members: number[],
  region: CandidateRegion,
  hard: readonly boolean[],
  k: number,
  rng: RandomGenerator,
  scratch: { point: Float64Array; trial: Float64Array },
): void {
  const { point, trial } = scratch;
  if (!randomFeasiblePoint(region, rng, point)) {
    throw new InputError('no feasible setting was found in the candidate region; check the constraints and equipment limits', { key: 'constraints' });
  }
  points.set(point, members[0] * k);
  for (let r = 1; r < members.length; r++) {
    let placed = false;
    for (let attempt = 0; attempt < WITHIN_ATTEMPTS && !placed; attempt++) {
      for (let j = 0; j < k; j++) trial[j] = hard[j] ? point[j] : region.levels[j][uniformInt(rng, 0, region.levels[j].length - 1)];
      placed = region.isFeasible(trial);
    }
    points.set(placed ? trial : point, members[r] * k);
  }
}

/** The design being improved: points, reduced model rows, sums per whole plot and session, A and A⁻¹. */
class StructuredState {
  readonly k: number;
  readonly p: number;
  /** Width of a reduced row: p, or p − 1 without the intercept when sessions absorb it. */
  readonly q: number;
  readonly from: number;
  readonly N: number;
  readonly points: Float64Array;
  readonly rows: Float64Array;
  readonly plotSums: Float64Array;
  readonly sessionSums: Float64Array;
  readonly A: Float64Array;
  readonly inverse: Float64Array;
  logDet = Number.NEGATIVE_INFINITY;
  ridge = 0;

  private readonly c: Float64Array;
  private readonly g: Float64Array;
  private readonly d: Float64Array;
  private readonly full: Float64Array;
  private readonly changedTerms: Int32Array[];
  private readonly prepared: PreparedRun;
  /** Scratch of the whole-plot trials. */
  private readonly trialRows: Float64Array;
  private readonly trialPlotSums: Float64Array;
  private readonly trialSessionSums: Float64Array;
  private readonly trialA: Float64Array;

  constructor(
    private readonly model: CompiledModel,
    private readonly region: CandidateRegion,
    private readonly structure: ErrorStructure,
    private readonly plots: number[][],
    private readonly fixed: (readonly number[] | null)[],
    private readonly hard: readonly boolean[],
    initial: Float64Array,
    private readonly prior: Float64Array | null,
    private readonly candidates: Candidates | null,
  ) {
    this.k = model.factorIds.length;
    this.p = model.p;
    this.from = structure.sessions > 1 ? 1 : 0;
    this.q = this.p - this.from;
    this.N = fixed.length;
    this.points = Float64Array.from(initial);
    this.rows = new Float64Array(this.N * this.q);
    this.plotSums = new Float64Array(structure.wholePlots * this.q);
    this.sessionSums = new Float64Array(structure.sessions * this.q);
    this.A = new Float64Array(this.q * this.q);
    this.inverse = new Float64Array(this.q * this.q);
    this.full = new Float64Array(this.p);
    const q = this.q;
    this.prepared = {
      run: -1,
      fx: new Float64Array(q),
      s: new Float64Array(q),
      a: new Float64Array(q),
      hx: new Float64Array(q),
      hs: new Float64Array(q),
      ha: new Float64Array(q),
      hy: new Float64Array(q),
      fy: new Float64Array(q),
      trial: new Float64Array(this.k),
      xx: 0, xs: 0, xa: 0, ss: 0, sa: 0, aa: 0, c: 0, h: 0, e: 0,
      G: new Float64Array(16),
      C: new Float64Array(16),
      work: new Float64Array(16),
    };
    this.trialRows = new Float64Array(this.N * q);
    this.trialPlotSums = new Float64Array(structure.wholePlots * q);
    this.trialSessionSums = new Float64Array(structure.sessions * q);
    this.trialA = new Float64Array(q * q);
    const sizes = wholePlotSizes(structure);
    const eta = structure.varianceRatio;
    this.c = Float64Array.from(sizes, (n) => eta / (1 + eta * n));
    this.g = Float64Array.from(sizes, (n) => 1 / (1 + eta * n));
    this.d = new Float64Array(structure.sessions);
    sizes.forEach((n, w) => {
      this.d[structure.sessionOfWholePlot[w]] += n * this.g[w];
    });
    this.changedTerms = Array.from({ length: this.k }, (_, j) => {
      const terms: number[] = [];
      for (let t = this.from; t < this.p; t++) if (model.exponents[t * this.k + j] !== 0) terms.push(t - this.from);
      return Int32Array.from(terms);
    });
    for (let i = 0; i < this.N; i++) this.expandRow(this.points.subarray(i * this.k, (i + 1) * this.k), this.rows.subarray(i * this.q, (i + 1) * this.q));
    this.refresh();
  }

  private expandRow(x: ArrayLike<number>, out: Float64Array): void {
    expandInto(this.model, x, this.full);
    for (let a = 0; a < this.q; a++) out[a] = this.full[a + this.from];
  }

  /** A from the rows, its inverse and log-determinant, and the ridge decision. */
  refresh(): void {
    const { q, N } = this;
    this.accumulateSums(this.rows, this.plotSums, this.sessionSums);
    this.buildInformation(this.A, this.rows, this.plotSums, this.sessionSums);
    const M = Float64Array.from(this.A);
    let logDet = invertSymmetric(M, q, this.inverse, SINGULAR_PIVOT);
    this.ridge = 0;
    if (logDet === Number.NEGATIVE_INFINITY) {
      this.ridge = RIDGE * Math.max(N, 1);
      for (let a = 0; a < q; a++) M[a * q + a] += this.ridge;
      logDet = invertSymmetric(M, q, this.inverse, SINGULAR_PIVOT);
    }
    this.logDet = logDet;
  }

  private buildInformation(out: Float64Array, rows: Float64Array, plotSums: Float64Array, sessionSums: Float64Array): void {
    const { q, N, structure } = this;
    out.fill(0);
    for (let i = 0; i < N; i++) addScaledOuter(out, q, rows, 1, i * q);
    for (let w = 0; w < structure.wholePlots; w++) if (this.c[w] !== 0) addScaledOuter(out, q, plotSums, -this.c[w], w * q);
    if (this.from === 1) for (let b = 0; b < structure.sessions; b++) if (this.d[b] > 0) addScaledOuter(out, q, sessionSums, -1 / this.d[b], b * q);
    if (this.prior) for (let a = 0; a < q * q; a++) out[a] += this.prior[a];
  }

  /** Passes until a full pass changes nothing; returns the number of passes. */
  improve(): number {
    for (let pass = 1; pass <= MAX_PASSES; pass++) {
      const ridgeBefore = this.ridge;
      let moved = 0;
      for (let w = 0; w < this.plots.length; w++) {
        const members = this.plots[w];
        if (this.fixed[members[0]] !== null) continue;
        if (members.length > 1) moved += this.wholePlotMoves(w);
        for (const i of members) {
          moved += this.withinMoves(i, members.length === 1);
          moved += this.pointMoves(i, members.length === 1);
        }
      }
      if (this.structure.sessions > 1) moved += this.sessionSwaps();
      this.refresh();
      if (moved === 0 && ridgeBefore === this.ridge) return pass;
    }
    return MAX_PASSES;
  }

  /** Tries every other level of each hard-to-change factor for whole plot w; returns 1 when one is taken. */
  private wholePlotMoves(w: number): number {
    const { k, q } = this;
    const members = this.plots[w];
    const trial = this.prepared.trial;
    let moved = 0;
    for (let j = 0; j < k; j++) {
      if (!this.hard[j]) continue;
      const current = this.points[members[0] * k + j];
      let bestLogDet = this.logDet;
      let bestLevel = current;
      for (const level of this.region.levels[j]) {
        if (level === current) continue;
        this.trialRows.set(this.rows);
        let feasible = true;
        for (const i of members) {
          for (let m = 0; m < k; m++) trial[m] = m === j ? level : this.points[i * k + m];
          if (!this.region.isFeasible(trial)) {
            feasible = false;
            break;
          }
          this.expandRow(trial, this.trialRows.subarray(i * q, (i + 1) * q));
        }
        if (!feasible) continue;
        const logDet = this.trialLogDet();
        if (logDet > bestLogDet + IMPROVEMENT * Math.max(1, Math.abs(bestLogDet))) {
          bestLogDet = logDet;
          bestLevel = level;
        }
      }
      if (bestLevel !== current) {
        for (const i of members) {
          this.points[i * k + j] = bestLevel;
          this.expandRow(this.points.subarray(i * k, (i + 1) * k), this.rows.subarray(i * q, (i + 1) * q));
        }
        this.refresh();
        moved = 1;
      }
    }
    return moved;
  }

  /**
   * Swaps the whole contents of two free whole plots of the same size in different sessions
   * when that raises ln det A: the balance of settings across sessions, which no single
   * coordinate move can change without first making the design worse. Scored from scratch,
   * O(W² (N q² + q³)) per pass; returns the number of swaps taken.
   */
  private sessionSwaps(): number {
    const { k, q } = this;
    const free = this.plots.map((members, w) => w).filter((w) => this.fixed[this.plots[w][0]] === null);
    let moved = 0;
    for (let x = 0; x < free.length; x++) {
      for (let y = x + 1; y < free.length; y++) {
        const u = this.plots[free[x]];
        const v = this.plots[free[y]];
        if (u.length !== v.length || this.structure.sessionOfWholePlot[free[x]] === this.structure.sessionOfWholePlot[free[y]]) continue;
        this.trialRows.set(this.rows);
        for (let r = 0; r < u.length; r++) {
          this.trialRows.copyWithin(u[r] * q, v[r] * q, (v[r] + 1) * q);
          this.trialRows.set(this.rows.subarray(u[r] * q, (u[r] + 1) * q), v[r] * q);
        }
        const logDet = this.trialLogDet();
        if (logDet > this.logDet + IMPROVEMENT * Math.max(1, Math.abs(this.logDet))) {
          for (let r = 0; r < u.length; r++) {
            const held = this.points.slice(u[r] * k, (u[r] + 1) * k);
            this.points.copyWithin(u[r] * k, v[r] * k, (v[r] + 1) * k);
            this.points.set(held, v[r] * k);
          }
          this.rows.set(this.trialRows);
          this.refresh();
          moved++;
        }
      }
    }
    return moved;
  }

  /** ln det of A (with the current ridge) for the rows in `trialRows`, O(N q² + q³). */
  private trialLogDet(): number {
    const q = this.q;
    this.accumulateSums(this.trialRows, this.trialPlotSums, this.trialSessionSums);
    this.buildInformation(this.trialA, this.trialRows, this.trialPlotSums, this.trialSessionSums);
    for (let a = 0; a < q; a++) this.trialA[a * q + a] += this.ridge;
    const L = choleskyFactor(this.trialA, q, SINGULAR_PIVOT);
    return L ? choleskyLogDeterminant(L, q) : Number.NEGATIVE_INFINITY;
  }

  /** Whole-plot sums s_w of `rows` and session sums a_b = Σ_{w∈b} g_w s_w. */
  private accumulateSums(rows: Float64Array, plotSums: Float64Array, sessionSums: Float64Array): void {
    const { q, N, structure } = this;
    plotSums.fill(0);
    sessionSums.fill(0);
    for (let i = 0; i < N; i++) {
      const w = structure.wholePlotOf[i];
      for (let a = 0; a < q; a++) plotSums[w * q + a] += rows[i * q + a];
    }
    for (let w = 0; w < structure.wholePlots; w++) {
      const b = structure.sessionOfWholePlot[w];
      for (let a = 0; a < q; a++) sessionSums[b * q + a] += this.g[w] * plotSums[w * q + a];
    }
  }

  /**
   * Prepares the trials that change run i: A⁻¹f_x, A⁻¹s, A⁻¹a and their products (G without
   * the f_y entries) and the coefficients of C.
   */
  private prepareRun(i: number): void {
    const { q, structure, prepared: r } = this;
    const w = structure.wholePlotOf[i];
    const b = structure.sessionOfWholePlot[w];
    r.run = i;
    r.fx = this.rows.subarray(i * q, (i + 1) * q);
    r.s = this.plotSums.subarray(w * q, (w + 1) * q);
    r.a = this.sessionSums.subarray(b * q, (b + 1) * q);
    multiplyInto(this.inverse, q, r.fx, r.hx);
    multiplyInto(this.inverse, q, r.s, r.hs);
    multiplyInto(this.inverse, q, r.a, r.ha);
    r.xx = dot(r.fx, r.hx, q);
    r.xs = dot(r.fx, r.hs, q);
    r.xa = dot(r.fx, r.ha, q);
    r.ss = dot(r.s, r.hs, q);
    r.sa = dot(r.s, r.ha, q);
    r.aa = dot(r.a, r.ha, q);
    r.c = this.c[w];
    r.h = this.from === 1 ? this.g[w] / this.d[b] : 0;
    r.e = this.from === 1 ? (this.g[w] * this.g[w]) / this.d[b] : 0;
  }

  /** det A_new / det A when the prepared run takes the reduced row fy, with hy = A⁻¹fy. */
  private preparedRatio(fy: Float64Array, hy: Float64Array): number {
    const { q, prepared: r } = this;
    const yy = dot(fy, hy, q);
    const xy = dot(r.fx, hy, q);
    const sy = dot(r.s, hy, q);
    const ay = dot(r.a, hy, q);
    const G = r.G;
    G[0] = r.xx; G[1] = xy; G[2] = r.xs; G[3] = r.xa;
    G[4] = xy; G[5] = yy; G[6] = sy; G[7] = ay;
    G[8] = r.xs; G[9] = sy; G[10] = r.ss; G[11] = r.sa;
    G[12] = r.xa; G[13] = ay; G[14] = r.sa; G[15] = r.aa;
    return withinPlotRatio(G, r.c, r.h, r.e, r.C, r.work);
  }

  /** Sets run i to `point` (coded, length k) and refreshes A. */
  private setRun(i: number, point: ArrayLike<number>): void {
    const { k, q } = this;
    for (let m = 0; m < k; m++) this.points[i * k + m] = point[m];
    this.expandRow(this.points.subarray(i * k, (i + 1) * k), this.rows.subarray(i * q, (i + 1) * q));
    this.refresh();
  }

  /**
   * Tries every other level of each factor of run i (only the easy-to-change ones unless the
   * run is alone in its whole plot); takes the best improving one per factor.
   */
  private withinMoves(i: number, alone: boolean): number {
    const { k, q, prepared: r } = this;
    const trial = r.trial;
    const fy = r.fy;
    const hy = r.hy;
    let moved = 0;
    for (let j = 0; j < k; j++) {
      if (this.hard[j] && !alone) continue;
      this.prepareRun(i);
      for (let m = 0; m < k; m++) trial[m] = this.points[i * k + m];
      const current = trial[j];
      const changed = this.changedTerms[j];
      let bestRatio = 1 + IMPROVEMENT;
      let bestLevel = current;
      for (const level of this.region.levels[j]) {
        if (level === current) continue;
        trial[j] = level;
        if (!this.region.isFeasible(trial)) continue;
        fy.set(r.fx);
        hy.set(r.hx);
        for (let m = 0; m < changed.length; m++) {
          const t = changed[m];
          const value = termValue(this.model, t + this.from, trial);
          const delta = value - r.fx[t];
          fy[t] = value;
          if (delta === 0) continue;
          // A⁻¹ is symmetric: column t is row t, which is contiguous.
          const base = t * q;
          for (let a = 0; a < q; a++) hy[a] += this.inverse[base + a] * delta;
        }
        const ratio = this.preparedRatio(fy, hy);
        if (ratio > bestRatio) {
          bestRatio = ratio;
          bestLevel = level;
        }
      }
      if (bestLevel !== current) {
        trial[j] = bestLevel;
        this.setRun(i, trial);
        moved++;
      }
    }
    return moved;
  }

  /**
   * Point exchange for run i over the listed feasible grid points that keep its whole plot's
   * hard-to-change settings (any point when the run is alone): the modified Fedorov step
   * (Cook & Nachtsheim, 1980, Technometrics 22) inside the whole-plot structure. Moves
   * several coordinates at once, which coordinate exchange cannot.
   */
  private pointMoves(i: number, alone: boolean): number {
    const candidates = this.candidates;
    if (candidates === null) return 0;
    const { k, q, prepared: r } = this;
    this.prepareRun(i);
    let bestRatio = 1 + IMPROVEMENT;
    let best = -1;
    for (let c = 0; c < candidates.count; c++) {
      if (!alone && !this.sharesHardSettings(i, candidates.points, c * k)) continue;
      multiplyInto(this.inverse, q, candidates.rows, r.hy, c * q);
      const fy = candidates.rows.subarray(c * q, (c + 1) * q);
      const ratio = this.preparedRatio(fy, r.hy);
      if (ratio > bestRatio) {
        bestRatio = ratio;
        best = c;
      }
    }
    if (best < 0) return 0;
    this.setRun(i, candidates.points.subarray(best * k, (best + 1) * k));
    return 1;
  }

  private sharesHardSettings(i: number, points: Float64Array, offset: number): boolean {
    const k = this.k;
    for (let j = 0; j < k; j++) if (this.hard[j] && points[offset + j] !== this.points[i * k + j]) return false;
    return true;
  }
}

/**
 * det A_new / det A for a within-plot move, from G = U'A⁻¹U (4 × 4, U = [f_x, f_y, s, a]) and
 * the coefficients c = c_w, h = g_w/d_b, e = g_w²/d_b (h = e = 0 with a single session).
 * `C` and `work` are 16-long scratch arrays.
 */
export function withinPlotRatio(G: ArrayLike<number>, c: number, h: number, e: number, C: Float64Array = new Float64Array(16), work: Float64Array = new Float64Array(16)): number {
  fillChange(C, c, h, e);
  return determinantOfIdentityPlus(C, G, work);
}

/**
 * C of the within-plot change A_new − A = U C U', U = [f_x, f_y, s, a], δ = f_y − f_x:
 * f_y f_y' − f_x f_x' − c[(s + δ)(s + δ)' − s s'] − (1/d)[(a + gδ)(a + gδ)' − a a'],
 * with h = g/d and e = g²/d (c, g, d as in glsInformation.ts). Index order x, y, s, a.
 */
function fillChange(C: Float64Array, c: number, h: number, e: number): void {
  const X = 0;
  const Y = 1;
  const S = 2;
  const A = 3;
  C.fill(0);
  const add = (r: number, col: number, value: number) => {
    C[r * 4 + col] += value;
  };
  add(Y, Y, 1);
  add(X, X, -1);
  // −c (s δ' + δ s' + δ δ')
  add(S, Y, -c);
  add(Y, S, -c);
  add(S, X, c);
  add(X, S, c);
  add(Y, Y, -c);
  add(X, X, -c);
  add(X, Y, c);
  add(Y, X, c);
  // −(g/d)(a δ' + δ a') − (g²/d) δ δ'
  add(A, Y, -h);
  add(Y, A, -h);
  add(A, X, h);
  add(X, A, h);
  add(Y, Y, -e);
  add(X, X, -e);
  add(X, Y, e);
  add(Y, X, e);
}

/** det(I + C G) for 4 × 4 row-major C and G (Gaussian elimination with partial pivoting). */
function determinantOfIdentityPlus(C: Float64Array, G: ArrayLike<number>, work: Float64Array): number {
  for (let r = 0; r < 4; r++) {
    for (let col = 0; col < 4; col++) {
      let sum = r === col ? 1 : 0;
      for (let m = 0; m < 4; m++) sum += C[r * 4 + m] * G[m * 4 + col];
      work[r * 4 + col] = sum;
    }
  }
  let det = 1;
  for (let col = 0; col < 4; col++) {
    let pivot = col;
    for (let r = col + 1; r < 4; r++) if (Math.abs(work[r * 4 + col]) > Math.abs(work[pivot * 4 + col])) pivot = r;
    const value = work[pivot * 4 + col];
    if (value === 0) return 0;
    if (pivot !== col) {
      for (let m = 0; m < 4; m++) {
        const tmp = work[col * 4 + m];
        work[col * 4 + m] = work[pivot * 4 + m];
        work[pivot * 4 + m] = tmp;
      }
      det = -det;
    }
    det *= value;
    for (let r = col + 1; r < 4; r++) {
      const factor = work[r * 4 + col] / value;
      if (factor === 0) continue;
      for (let m = col; m < 4; m++) work[r * 4 + m] -= factor * work[col * 4 + m];
    }
  }
  return det;
}
