/**
 * The noncentral F distribution: its cdf, the power of an F test, and the noncentrality a
 * test needs for a given power.
 *
 * If F = (χ²_q(λ)/q) / (χ²_ν/ν) with a noncentral χ² of noncentrality λ in the numerator, then
 *   P(F ≤ f) = Σ_{j≥0} w_j · I_x(q/2 + j, ν/2),  x = q f / (q f + ν),  w_j = e^{−λ/2}(λ/2)^j / j!,
 * a Poisson mixture of central F (incomplete beta) probabilities (Johnson, Kotz &
 * Balakrishnan, 1995, "Continuous Univariate Distributions", vol. 2, 2nd ed., ch. 30).
 * The power of the level-α F test is 1 − P(F ≤ F_crit) with F_crit the central F quantile
 * (Scheffé, 1959, "The Analysis of Variance", §2.8).
 *
 * Convergence rule (ours, in the spirit of Lenth, 1987, "Algorithm AS 226: Computing
 * noncentral beta probabilities", Applied Statistics 36, whose error bound uses the fact that
 * I_x(a + j, b) falls as j grows): the series is summed outward from the Poisson mode
 * m = ⌊λ/2⌋, so large noncentralities do not underflow.
 * - Downward, at term j < μ = λ/2 the terms left below are at most w_j·r/(1 − r), r = j/μ
 *   (the weights fall at least geometrically and I ≤ 1).
 * - Upward, at term J > μ the terms left above are at most I_x(a + J, b)·w_J·s/(1 − s),
 *   s = μ/(J + 1), for the same reasons.
 * Each side stops when its bound is below TRUNCATION / 2, so the truncation error is below
 * TRUNCATION = 1e-12. The incomplete beta and the central F quantile come from jstat, whose
 * continued fraction stops at a relative step of 3e-7 (Press et al., "Numerical Recipes",
 * §6.4): in practice about 1e-8 absolute, which bounds the accuracy of every figure here.
 */
import jStat from 'jstat';

/** Largest truncation error of the Poisson series (see header). */
const TRUNCATION = 1e-12;
/** Guard against a non-terminating sum; ~40√μ terms are needed, so this is never reached. */
const MAX_TERMS = 200_000;

/** P(F ≤ f) for F noncentral F with q numerator and ν denominator degrees of freedom and noncentrality λ. */
export function noncentralFCdf(f: number, q: number, nu: number, lambda: number): number {
  if (!(q > 0) || !(nu > 0) || !(lambda >= 0)) throw new RangeError(`noncentral F needs q > 0, ν > 0, λ ≥ 0 (got ${q}, ${nu}, ${lambda})`);
  if (!(f > 0)) return 0;
  if (f === Number.POSITIVE_INFINITY) return 1;
  const x = (q * f) / (q * f + nu);
  const a = q / 2;
  const b = nu / 2;
  if (lambda === 0) return jStat.ibeta(x, a, b);

  const mu = lambda / 2;
  const mode = Math.floor(mu);
  const modeWeight = Math.exp(-mu + mode * Math.log(mu) - jStat.gammaln(mode + 1));
  let sum = modeWeight * jStat.ibeta(x, a + mode, b);
  let terms = 1;

  // Downward from the mode.
  let weight = modeWeight;
  for (let j = mode; j > 0; j--) {
    const ratio = j / mu;
    if (weight * (ratio / (1 - ratio)) < TRUNCATION / 2) break;
    weight *= ratio;
    sum += weight * jStat.ibeta(x, a + j - 1, b);
    if (++terms > MAX_TERMS) throw new Error(`noncentral F series did not converge (λ = ${lambda})`);
  }

  // Upward from the mode.
  weight = modeWeight;
  for (let j = mode + 1; ; j++) {
    weight *= mu / j;
    const beta = jStat.ibeta(x, a + j, b);
    sum += weight * beta;
    const s = mu / (j + 1);
    if (s < 1 && beta * weight * (s / (1 - s)) < TRUNCATION / 2) break;
    if (++terms > MAX_TERMS) throw new Error(`noncentral F series did not converge (λ = ${lambda})`);
  }
  return Math.min(1, Math.max(0, sum));
}

/** The central F quantile F_{1−α}(q, ν): the critical value of the level-α test. */
export function fCritical(q: number, nu: number, alpha: number): number {
  if (!(alpha > 0 && alpha < 1)) throw new RangeError(`the test level must lie in (0, 1), got ${alpha}`);
  return jStat.centralF.inv(1 - alpha, q, nu);
}

/** Power of the level-α F test with q and ν degrees of freedom at noncentrality λ: 1 − F_nc(F_crit; q, ν, λ). */
export function fTestPower(q: number, nu: number, lambda: number, alpha: number): number {
  return 1 - noncentralFCdf(fCritical(q, nu, alpha), q, nu, lambda);
}

/**
 * The noncentrality at which the level-α F test reaches `power` (bisection on λ; the power
 * rises with λ). Returns Infinity when the power is unreachable (power ≥ 1).
 */
export function noncentralityForPower(q: number, nu: number, alpha: number, power: number): number {
  if (!(power < 1)) return Number.POSITIVE_INFINITY;
  if (power <= alpha) return 0;
  const critical = fCritical(q, nu, alpha);
  const powerAt = (lambda: number) => 1 - noncentralFCdf(critical, q, nu, lambda);
  let low = 0;
  let high = 1;
  while (powerAt(high) < power) {
    low = high;
    high *= 2;
    if (high > 1e9) return Number.POSITIVE_INFINITY;
  }
  for (let step = 0; step < 200 && high - low > 1e-9 * high; step++) {
    const middle = (low + high) / 2;
    if (powerAt(middle) < power) low = middle;
    else high = middle;
  }
  return high;
}
