/**
 * The design an exchange search is improving: N coded points, their model rows, (X'X)⁻¹ and
 * the criterion, with the cost of a trial exchange computed from rank-one/rank-two formulas.
 *
 * Trial scores (larger is better):
 * - D: the determinant ratio (1 + d(y))(1 − d(x)) + d(x,y)² (Fedorov, 1972, "Theory of
 *   Optimal Experiments", §3.1); see ../linalg/inverseUpdate.ts.
 * - I: minus the change of trace(M⁻¹W). Adding y then removing x: with g = M⁻¹f,
 *   A1 = M⁻¹ − g_y g_y'/(1+d(y)), h = A1 f(x) = g_x − c g_y, c = d(x,y)/(1+d(y)),
 *   d1 = d(x) − c·d(x,y), and trace change −g_y'Wg_y/(1+d(y)) + h'Wh/(1 − d1)
 *   (two Sherman–Morrison steps, Sherman & Morrison, 1950).
 *
 * Prior information: a constant p × p matrix P may be added to X'X throughout (the
 * potential-term prior of potentialPrior.ts, or later the information of runs already made);
 * the updates are unchanged, because P does not depend on the design rows.
 *
 * Singular designs: when X'X is singular the state works on X'X + ridge·I and on the
 * D-criterion whatever was asked, so exchanges first raise the rank (each missing dimension
 * costs ln ridge in the log-determinant); the ridge is dropped at the next refresh at which
 * X'X itself is nonsingular.
 */
import type { Criterion } from '../study.js';
import { expandInto, type CompiledModel } from '../model/modelMatrix.js';
import { crossProduct } from '../linalg/crossProduct.js';
import { invertSymmetric } from '../linalg/cholesky.js';
import { exchangeRatio, exchangeUpdate } from '../linalg/inverseUpdate.js';
import { dot, multiplyInto, traceOfProduct } from '../linalg/symmetricKernels.js';

/** Relative ridge added to a singular X'X (times N). */
const RIDGE = 1e-4;
/**
 * Relative pivot floor of the from-scratch inversions: stricter than the evaluation's guard,
 * because the rank-one updates of a nearly singular X'X lose most of their digits, so such a
 * design is searched with the ridge until exchanges have made it well conditioned.
 */
const SINGULAR_PIVOT = 1e-10;
/** A trial must improve the criterion by more than this (relative) to be accepted. */
const IMPROVEMENT = 1e-9;

export class ExchangeState {
  readonly N: number;
  readonly k: number;
  readonly p: number;
  readonly points: Float64Array;
  readonly rows: Float64Array;
  readonly inverse: Float64Array;
  /** ln det(X'X + P + ridge·I). */
  logDet = Number.NEGATIVE_INFINITY;
  /** trace((X'X + ridge·I)⁻¹ W), when W is given. */
  trace = Number.POSITIVE_INFINITY;
  ridge = 0;

  private readonly gx: Float64Array;
  private readonly gy: Float64Array;
  private readonly wgx: Float64Array;
  private readonly wgy: Float64Array;
  private readonly work1: Float64Array;
  private readonly work2: Float64Array;
  /** M⁻¹W, kept only while the I-criterion is active (for one-coordinate trials). */
  private readonly inverseTimesMoments: Float64Array;
  private dx = 0;
  private gxWgx = 0;
  private row = 0;

  constructor(
    private readonly model: CompiledModel,
    initial: Float64Array,
    private readonly criterion: Criterion,
    private readonly moments: Float64Array | null,
    private readonly prior: Float64Array | null = null,
  ) {
    this.k = model.factorIds.length;
    this.p = model.p;
    this.N = initial.length / this.k;
    this.points = Float64Array.from(initial);
    this.rows = new Float64Array(this.N * this.p);
    this.inverse = new Float64Array(this.p * this.p);
    const p = this.p;
    this.gx = new Float64Array(p);
    this.gy = new Float64Array(p);
    this.wgx = new Float64Array(p);
    this.wgy = new Float64Array(p);
    this.work1 = new Float64Array(p);
    this.work2 = new Float64Array(p);
    this.inverseTimesMoments = new Float64Array(moments === null ? 0 : p * p);
    this.lastUpdate = { g: new Float64Array(p), h: new Float64Array(p), gScale: Number.NaN, hScale: Number.NaN };
    for (let i = 0; i < this.N; i++) {
      expandInto(model, this.points.subarray(i * this.k, (i + 1) * this.k), this.rows.subarray(i * p, (i + 1) * p));
    }
    this.refresh();
  }

  /** The criterion the trials are scored on now (D while the ridge is needed). */
  get activeCriterion(): Criterion {
    return this.ridge > 0 || this.moments === null ? 'D' : this.criterion;
  }

  /** Re-inverts X'X from the rows (stops drift of the updates) and decides the ridge. */
  refresh(): void {
    const { p, N } = this;
    const M = crossProduct(this.rows, N, p);
    if (this.prior) for (let i = 0; i < p * p; i++) M[i] += this.prior[i];
    let logDet = invertSymmetric(M, p, this.inverse, SINGULAR_PIVOT);
    this.ridge = 0;
    if (logDet === Number.NEGATIVE_INFINITY) {
      this.ridge = RIDGE * Math.max(N, 1);
      for (let a = 0; a < p; a++) M[a * p + a] += this.ridge;
      logDet = invertSymmetric(M, p, this.inverse, SINGULAR_PIVOT);
    }
    this.logDet = logDet;
    this.trace = this.computeTrace();
    if (this.activeCriterion === 'I') this.computeInverseTimesMoments();
  }

  /** Prepares the trials that replace design row i. */
  prepareRow(i: number): void {
    const p = this.p;
    this.row = i;
    const fx = this.rows.subarray(i * p, (i + 1) * p);
    multiplyInto(this.inverse, p, fx, this.gx);
    this.dx = dot(fx, this.gx, p);
    if (this.activeCriterion === 'I') {
      multiplyInto(this.moments as Float64Array, p, this.gx, this.wgx);
      this.gxWgx = dot(this.gx, this.wgx, p);
    }
  }

  /** d(x) = f(x)'M⁻¹f(x) of the prepared row. */
  get preparedVariance(): number {
    return this.dx;
  }

  /** M⁻¹f(x) of the prepared row (read only). */
  get preparedDirection(): Float64Array {
    return this.gx;
  }

  /**
   * Score of replacing the prepared row by the point whose model row starts at rows[offset]
   * (larger is better): O(p²).
   */
  score(rows: Float64Array, offset = 0): number {
    const { p, inverse, gy, gx } = this;
    multiplyInto(inverse, p, rows, gy, offset);
    const dy = dot(rows, gy, p, offset);
    const dxy = dot(gx, rows, p, 0, offset);
    if (this.activeCriterion === 'D') return exchangeRatio(this.dx, dy, dxy);
    multiplyInto(this.moments as Float64Array, p, gy, this.wgy);
    return this.traceScore(dy, dxy);
  }

  /**
   * The same score for a point fy that differs from the prepared row only in the model terms
   * listed in `changed` (a one-coordinate move changes only the terms containing that
   * factor): M⁻¹f(y) = M⁻¹f(x) + Σ_t M⁻¹[:, t]·(f_t(y) − f_t(x)), O(p·|changed|).
   */
  scoreChanged(fy: Float64Array, changed: Int32Array): number {
    const { p, inverse, gy, gx } = this;
    const rowBase = this.row * p;
    gy.set(gx);
    let dxy = this.dx;
    const active = this.activeCriterion;
    if (active === 'I') this.wgy.set(this.wgx);
    for (let m = 0; m < changed.length; m++) {
      const t = changed[m];
      const delta = fy[t] - this.rows[rowBase + t];
      if (delta === 0) continue;
      dxy += gx[t] * delta;
      // M⁻¹ is symmetric, so column t is row t, which is contiguous.
      const base = t * p;
      for (let a = 0; a < p; a++) gy[a] += inverse[base + a] * delta;
      if (active === 'I') {
        const wBase = t * p;
        for (let a = 0; a < p; a++) this.wgy[a] += this.inverseTimesMoments[wBase + a] * delta;
      }
    }
    const dy = dot(fy, gy, p);
    if (active === 'D') return exchangeRatio(this.dx, dy, dxy);
    return this.traceScore(dy, dxy);
  }

  /** −(change of trace(M⁻¹W)) once gy = M⁻¹f(y) and wgy = W·gy are set. */
  private traceScore(dy: number, dxy: number): number {
    const ratio = exchangeRatio(this.dx, dy, dxy);
    if (!(ratio > 1e-9)) return Number.NEGATIVE_INFINITY;
    const p = this.p;
    const gyWgy = dot(this.gy, this.wgy, p);
    const gxWgy = dot(this.wgx, this.gy, p);
    const c = dxy / (1 + dy);
    const dxAfter = this.dx - c * dxy;
    const hWh = this.gxWgx - 2 * c * gxWgy + c * c * gyWgy;
    return gyWgy / (1 + dy) - hWh / (1 - dxAfter);
  }

  /** Whether a score from `score` is a real improvement. */
  improves(score: number): boolean {
    if (this.activeCriterion === 'D') return score > 1 + IMPROVEMENT;
    return score > IMPROVEMENT * Math.abs(this.trace);
  }

  /**
   * Replaces row i by the coded point y with model row fy, updating the inverse. Afterwards
   * `lastUpdate` describes the change: M⁻¹_new = M⁻¹ − gScale·g g' + hScale·h h'.
   */
  exchange(i: number, y: ArrayLike<number>, fy: Float64Array): void {
    const { p, k } = this;
    const fx = this.rows.subarray(i * p, (i + 1) * p);
    const change = exchangeUpdate(this.inverse, p, fx, fy, this.work1, this.work2);
    const last = this.lastUpdate;
    if (!Number.isNaN(change)) {
      // exchangeUpdate leaves h = A1·f(x) in work1 and g = M⁻¹f(y) in work2.
      last.g.set(this.work2);
      last.h.set(this.work1);
      last.gScale = 1 / (1 + dot(fy, this.work2, p));
      last.hScale = 1 / (1 - dot(fx, this.work1, p));
    }
    for (let j = 0; j < k; j++) this.points[i * k + j] = y[j];
    fx.set(fy);
    if (Number.isNaN(change)) {
      last.gScale = Number.NaN;
      this.refresh();
      return;
    }
    this.logDet += change;
    if (this.moments !== null) {
      this.trace = this.computeTrace();
      if (this.activeCriterion === 'I') this.updateInverseTimesMoments();
    }
  }

  /** The last exchange as a rank-two change of M⁻¹ (gScale is NaN after a full refresh). */
  readonly lastUpdate: { g: Float64Array; h: Float64Array; gScale: number; hScale: number };

  private computeInverseTimesMoments(): void {
    const { p, inverse } = this;
    const W = this.moments as Float64Array;
    const Q = this.inverseTimesMoments;
    for (let a = 0; a < p; a++) {
      for (let b = 0; b < p; b++) {
        let sum = 0;
        for (let m = 0; m < p; m++) sum += inverse[a * p + m] * W[m * p + b];
        Q[a * p + b] = sum;
      }
    }
  }

  /** Q = M⁻¹W after M⁻¹ −= gScale g g' and += hScale h h': Q −= gScale g (Wg)' and += hScale h (Wh)'. */
  private updateInverseTimesMoments(): void {
    const { p } = this;
    const { g, h, gScale, hScale } = this.lastUpdate;
    const W = this.moments as Float64Array;
    multiplyInto(W, p, g, this.work1);
    multiplyInto(W, p, h, this.work2);
    const Q = this.inverseTimesMoments;
    for (let a = 0; a < p; a++) {
      const ga = gScale * g[a];
      const ha = hScale * h[a];
      const base = a * p;
      for (let b = 0; b < p; b++) Q[base + b] += ha * this.work2[b] - ga * this.work1[b];
    }
  }

  /** The value being optimised, larger is better: ln det for D, −trace for I. */
  objective(): number {
    return this.activeCriterion === 'D' ? this.logDet : -this.trace;
  }

  private computeTrace(): number {
    if (this.moments === null) return Number.NaN;
    return traceOfProduct(this.inverse, this.moments);
  }
}
