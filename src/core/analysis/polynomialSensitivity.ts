/**
 * Closed-form Sobol' indices of a polynomial whose coded inputs are independent and uniform
 * on [−1, 1] — the fitted model over the studied region.
 *
 * Method (Sudret, 2008, "Global sensitivity analysis using polynomial chaos expansions",
 * Reliability Engineering & System Safety 93, 964–979): rewrite the polynomial in products
 * of normalised Legendre polynomials ψ_n = √(2n + 1) P_n, which are orthonormal under the
 * uniform density ½ on [−1, 1]. With y = Σ_α c_α ∏_j ψ_{α_j}(x_j), the mean is c_0, the
 * variance D = Σ_{α≠0} c_α², and the variance of the Sobol' component of a factor set u is
 * the sum of c_α² over the α whose support {j : α_j > 0} is exactly u (Sobol', 1993; 2001).
 * Hence
 *   first-order S_i = Σ_{supp α = {i}} c_α² / D,  total S_Ti = Σ_{supp α ∋ i} c_α² / D,
 *   second-order (pure pair) S_ij = Σ_{supp α = {i, j}} c_α² / D.
 *
 * Monomials go to Legendre form by the three-term recurrence x P_n = ((n + 1) P_{n+1} +
 * n P_{n−1}) / (2n + 1) (Abramowitz & Stegun, 1964, 22.7.10), so x^e has exact rational
 * coefficients up to rounding. Pairs are listed for every pair of factors that share a
 * term, in factor order. With D = 0 (a constant) the indices are NaN.
 */
import type { CompiledModel } from '../model/modelMatrix.js';
import type { PolynomialSensitivity } from './analysisTypes.js';

/** Row e: coefficients of x^e in P_0 … P_e. */
function monomialInLegendre(maxPower: number): number[][] {
  const rows: number[][] = [[1]];
  for (let e = 1; e <= maxPower; e++) {
    const previous = rows[e - 1];
    const row = new Array<number>(e + 1).fill(0);
    previous.forEach((c, n) => {
      if (c === 0) return;
      row[n + 1] += (c * (n + 1)) / (2 * n + 1);
      if (n > 0) row[n - 1] += (c * n) / (2 * n + 1);
    });
    rows.push(row);
  }
  return rows;
}

export function polynomialSensitivity(model: CompiledModel, coefficients: ArrayLike<number>): PolynomialSensitivity {
  const k = model.factorIds.length;
  const maxPower = Math.max(0, ...Array.from(model.maxPower));
  const legendre = monomialInLegendre(maxPower);
  // Mixed-radix key of a multi-index α (radix maxPower + 1 per factor).
  const radix = maxPower + 1;
  if (radix ** k > Number.MAX_SAFE_INTEGER) throw new Error(`polynomialSensitivity: ${k} factors of degree ${maxPower} exceed the index key range`);
  const chaos = new Map<number, number>();
  for (let t = 0; t < model.p; t++) {
    const beta = coefficients[t];
    if (beta === 0) continue;
    let partial = new Map<number, number>([[0, beta]]);
    let place = 1;
    for (let j = 0; j < k; j++) {
      const e = model.exponents[t * k + j];
      if (e > 0) {
        const next = new Map<number, number>();
        for (const [key, value] of partial) {
          legendre[e].forEach((a, n) => {
            if (a === 0) return;
            // P_n = ψ_n / √(2n + 1)
            const at = key + n * place;
            next.set(at, (next.get(at) ?? 0) + (value * a) / Math.sqrt(2 * n + 1));
          });
        }
        partial = next;
      }
      place *= radix;
    }
    for (const [key, value] of partial) chaos.set(key, (chaos.get(key) ?? 0) + value);
  }
  const mean = chaos.get(0) ?? 0;
  let variance = 0;
  const first = new Float64Array(k);
  const total = new Float64Array(k);
  const pairShare = new Map<number, number>();
  for (const [key, c] of chaos) {
    if (key === 0) continue;
    const share = c * c;
    variance += share;
    const support: number[] = [];
    let rest = key;
    for (let j = 0; j < k; j++) {
      if (rest % radix !== 0) support.push(j);
      rest = Math.floor(rest / radix);
    }
    for (const j of support) total[j] += share;
    if (support.length === 1) first[support[0]] += share;
    if (support.length === 2) {
      const pair = support[0] * k + support[1];
      pairShare.set(pair, (pairShare.get(pair) ?? 0) + share);
    }
  }
  // Every pair that shares a term is listed, even when its pure share is zero.
  for (let t = 0; t < model.p; t++) {
    const inTerm: number[] = [];
    for (let j = 0; j < k; j++) if (model.exponents[t * k + j] > 0) inTerm.push(j);
    for (let a = 0; a < inTerm.length; a++) {
      for (let b = a + 1; b < inTerm.length; b++) {
        const pair = inTerm[a] * k + inTerm[b];
        if (!pairShare.has(pair)) pairShare.set(pair, 0);
      }
    }
  }
  const factors = model.factorIds.map((factor, j) => ({ factor, first: first[j] / variance, total: total[j] / variance }));
  const pairs = [...pairShare.entries()]
    .sort((x, y) => x[0] - y[0])
    .map(([pair, share]) => ({
      factors: [model.factorIds[Math.floor(pair / k)], model.factorIds[pair % k]] as [string, string],
      index: share / variance,
    }));
  return { mean, variance, factors, pairs };
}
