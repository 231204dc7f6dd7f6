/**
 * Power of the two-sided t-test of one model coefficient.
 *
 * The estimate b_j has standard error σ·√c_jj with c_jj the j-th diagonal entry of (X'X)⁻¹.
 * Testing H0: β_j = 0 at level α with ν = N − p residual degrees of freedom, the statistic
 * b_j / (s √c_jj) follows a noncentral t with ν degrees of freedom and noncentrality
 * λ = β_j / (σ √c_jj), so power = P(T > t_{1−α/2,ν}) + P(T < −t_{1−α/2,ν})
 * (Montgomery, 2017, "Design and Analysis of Experiments", 9th ed., §3.7 and §10.3;
 * noncentral t distribution from jstat, checked against scipy.stats.nct).
 *
 * What "an effect of δσ" means: Montgomery (§6.2) defines the effect of a two-level factor as
 * the change in mean response from its low to its high level, which is twice its coded
 * regression coefficient. We apply the same reading to every term: the term alone moves the
 * response by δσ across the coded cube, so β_j = δσ / range_j, where range_j is the range of
 * the term over [−1, 1]^k: 2 when any factor appears to an odd power (x, x·z, x³), 1 when all
 * powers are even (x², x²z²). A main effect of δ = 2 is therefore a coefficient of 1·σ.
 */
import jStat from 'jstat';

/** Range of a term's column over the coded cube, from its exponents. */
export function termRange(exponents: ArrayLike<number>): number {
  for (let j = 0; j < exponents.length; j++) if (exponents[j] % 2 === 1) return 2;
  return 1;
}

/**
 * Power to detect an effect of `delta`·σ (see header) for a term whose coefficient has
 * standard error `standardError`·σ, with `residualDf` residual degrees of freedom.
 * Null when there are no residual degrees of freedom (no test is possible).
 */
export function termPower(standardError: number, range: number, delta: number, alpha: number, residualDf: number): number | null {
  if (residualDf < 1 || !Number.isFinite(standardError) || standardError <= 0) return null;
  const noncentrality = delta / range / standardError;
  return twoSidedTPower(noncentrality, residualDf, alpha);
}

/** P(|T| > t_{1−α/2,ν}) for T noncentral t with ν degrees of freedom and noncentrality λ. */
export function twoSidedTPower(noncentrality: number, residualDf: number, alpha: number): number {
  const critical = jStat.studentt.inv(1 - alpha / 2, residualDf);
  const upper = 1 - jStat.noncentralt.cdf(critical, residualDf, noncentrality);
  const lower = jStat.noncentralt.cdf(-critical, residualDf, noncentrality);
  return Math.min(1, Math.max(0, upper + lower));
}
