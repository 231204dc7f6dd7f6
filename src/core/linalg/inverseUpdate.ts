/**
 * Inverse and log-determinant of an information matrix M = X'X, kept current when a design
 * point is exchanged — a rank-two update made of two rank-one (Sherman–Morrison) steps —
 * instead of re-inverting.
 *
 * Sources: the Sherman–Morrison formula (Sherman & Morrison, 1950, "Adjustment of an inverse
 * matrix corresponding to a change in one element of a given matrix", Ann. Math. Statist. 21)
 * with the matrix determinant lemma det(M + u u') = det M · (1 + u'M⁻¹u); for replacing a
 * design point x by y, Fedorov's delta function (Fedorov, 1972, "Theory of Optimal
 * Experiments", §3.1): det M_new / det M = (1 + d(y))(1 − d(x)) + d(x,y)², with
 * d(x) = f(x)'M⁻¹f(x), d(y) likewise and d(x,y) = f(x)'M⁻¹f(y). (Written out:
 * 1 + [d(y) − d(x)] − [d(x)d(y) − d(x,y)²]; the bracket is subtracted once, not twice.)
 * The from-scratch inverse these updates start from (and are reset to) is
 * `invertSymmetric` in cholesky.ts.
 *
 * Conventions: matrices are row-major p × p Float64Arrays, symmetric; the updates work in
 * place so the exchange searches allocate nothing per trial. Updates drift numerically;
 * callers re-invert from scratch periodically (after each full pass of a search).
 */
import { dot, multiplyInto } from './symmetricKernels.js';

/** Determinant ratio det M_new / det M when design point x is replaced by y (Fedorov's delta + 1). */
export function exchangeRatio(dx: number, dy: number, dxy: number): number {
  return (1 + dy) * (1 - dx) + dxy * dxy;
}

/**
 * Replaces M⁻¹ by (M − fx fx' + fy fy')⁻¹ in place — design point x exchanged for y — as two
 * Sherman–Morrison steps (add y first so the intermediate matrix stays nonsingular), and
 * returns the log-determinant change, or NaN (inverse untouched) when the result is singular.
 * `work1`, `work2` are scratch vectors of length p.
 */
export function exchangeUpdate(
  inverse: Float64Array,
  p: number,
  fx: ArrayLike<number>,
  fy: ArrayLike<number>,
  work1: Float64Array,
  work2: Float64Array,
): number {
  multiplyInto(inverse, p, fx, work1);
  multiplyInto(inverse, p, fy, work2);
  const dx = dot(fx, work1, p);
  const dy = dot(fy, work2, p);
  const dxy = dot(fx, work2, p);
  const ratio = exchangeRatio(dx, dy, dxy);
  if (!(ratio > 1e-12)) return Number.NaN;
  // After adding y: A1 = M⁻¹ − gy gy'/(1+dy); A1 fx = gx − gy·dxy/(1+dy); fx'A1fx = dx − dxy²/(1+dy).
  const c = dxy / (1 + dy);
  const dxAfter = dx - dxy * c;
  const addScale = 1 / (1 + dy);
  const removeScale = 1 / (1 - dxAfter);
  for (let i = 0; i < p; i++) work1[i] -= c * work2[i];
  for (let i = 0; i < p; i++) {
    const base = i * p;
    const gi = work2[i] * addScale;
    const hi = work1[i] * removeScale;
    for (let j = 0; j < p; j++) inverse[base + j] += hi * work1[j] - gi * work2[j];
  }
  return Math.log(ratio);
}
