/**
 * Tail probabilities and quantiles of Student's t and Fisher's F for the tests and intervals
 * of a fitted model.
 *
 * Both tails are written through the regularised incomplete beta function (Abramowitz &
 * Stegun, 1964, "Handbook of Mathematical Functions", 26.5.27 and 26.6.2):
 *   P(|T_ν| > t) = I_{ν/(ν+t²)}(ν/2, 1/2),   P(F_{d₁,d₂} > f) = I_{d₂/(d₂+d₁f)}(d₂/2, d₁/2),
 * so very small p-values keep their relative accuracy instead of becoming 1 − 1. The
 * incomplete beta comes from jstat, whose continued fraction stops at a relative change of
 * 3e-7 (Numerical Recipes' single-precision setting): p-values carry about 7 significant
 * digits, more than any decision needs. The t quantile starts from jstat's inverse (good to
 * about 1e-8) and is polished by two Newton steps on jstat's t cdf, which is accurate to
 * about 1e-12 near the usual quantiles, so interval half-widths carry 11–12 digits.
 */
import jStat from 'jstat';

/** Two-sided p-value of a t statistic with ν degrees of freedom. */
export function twoSidedTProbability(t: number, df: number): number {
  if (!Number.isFinite(t)) return Number.isNaN(t) ? Number.NaN : 0;
  return jStat.ibeta(df / (df + t * t), df / 2, 0.5);
}

/** Upper-tail probability P(F_{d1,d2} > f). */
export function fUpperProbability(f: number, d1: number, d2: number): number {
  if (!(f > 0)) return Number.isNaN(f) ? Number.NaN : 1;
  if (!Number.isFinite(f)) return 0;
  return jStat.ibeta(d2 / (d2 + d1 * f), d2 / 2, d1 / 2);
}

/** The t quantile t_{ν, q} for q in (0.5, 1), e.g. q = 0.975 for a 95 % interval. */
export function tQuantile(q: number, df: number): number {
  let x = jStat.studentt.inv(q, df);
  for (let step = 0; step < 2; step++) {
    const density = jStat.studentt.pdf(x, df);
    if (!(density > 0)) break;
    x -= (jStat.studentt.cdf(x, df) - q) / density;
  }
  return x;
}
