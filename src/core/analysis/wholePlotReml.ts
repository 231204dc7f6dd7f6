/**
 * REML fit of a split-plot experiment: fixed effects (model terms, and session blocks when
 * there are sessions) plus a random intercept per whole plot,
 *   y = Xβ + Zu + e,  u ~ N(0, σ²_w I),  e ~ N(0, σ² I),  V = σ²(I + γ ZZ′),  γ = σ²_w / σ².
 *
 * Method: restricted maximum likelihood (Patterson & Thompson, 1971, "Recovery of
 * inter-block information when block sizes are unequal", Biometrika 58, 545–554; Harville,
 * 1977, "Maximum likelihood approaches to variance component estimation and to related
 * problems", JASA 72, 320–340). With H = I + γZZ′ and σ² profiled out,
 *   ℓ_R(γ) = −½ [(n − r)(ln 2π + ln σ̂²(γ) + 1) + ln|H| + ln|X′H⁻¹X|],
 *   σ̂²(γ) = r′H⁻¹r / (n − r),  r = y − Xβ̂(γ),  r = rank X.
 * H is block diagonal; for a whole plot of m runs H_g^{−1/2} = I − c·11′/m with
 * c = 1 − 1/√(1 + γm), so ỹ = H^{−1/2}y and X̃ = H^{−1/2}X are the data with c times the
 * whole-plot mean removed, and one Householder QR of X̃ gives β̂(γ) (generalised least
 * squares), σ̂²(γ) and ln|X′H⁻¹X| — no inverse of V is ever formed.
 *
 * Search: ℓ_R over γ = 0 and a grid in ln γ from 1e−6 to 1e6 in steps of 0.5, then golden
 * section between the neighbours of the best grid point (to 1e−10 in ln γ; on [0, γ₂] in γ
 * itself when the best point is the smallest). The profile of a single variance ratio is
 * usually unimodal; the grid guards against starting on the wrong side of a shallow
 * maximum. γ̂ = 0 (on the boundary) means no whole-plot variance beyond the run variance:
 * the fit is then ordinary least squares.
 *
 * Standard errors: Cov β̂ = σ̂²(X′Ĥ⁻¹X)⁻¹, the usual plug-in GLS covariance (Harville 1977;
 * no small-sample correction). Denominator df by the containment rule: a fixed column that
 * is constant within every whole plot (intercept, whole-plot factors and their products,
 * session blocks) is tested against whole-plot error with W − r_w df (W whole plots, r_w
 * such columns); every other column against within-plot error with n − W − (r − r_w) df
 * (Goos, 2002, "The Optimal Design of Blocked and Split-Plot Experiments", ch. 7; Jones &
 * Nachtsheim, 2009, "Split-plot designs: what, why, and how", J. Quality Technology 41,
 * 340–361). Without positive df a column has no t test (null).
 *
 * Prediction of one new run in a new whole plot: Var = σ̂²·f′(X′Ĥ⁻¹X)⁻¹f + σ̂²_w + σ̂², with
 * the whole-plot df when σ̂²_w > 0 (the conservative choice: the whole-plot share is
 * estimated from fewer units) and the within-plot df otherwise.
 */
import {
  householderQr,
  isEstimableRow,
  logDetCrossProduct,
  rowVarianceFactor,
  solveLeastSquares,
  unscaledCovariance,
  type QrFactor,
} from '../linalg/householderQr.js';
import type { VarianceComponents } from './analysisTypes.js';
import type { PredictionInterval } from './leastSquaresFit.js';
import { tQuantile } from './tailProbabilities.js';

/** Grid of ln γ: from ln 1e−6 to ln 1e6 in steps of 0.5. */
const LOG_RATIO_LOW = Math.log(1e-6);
const LOG_RATIO_HIGH = Math.log(1e6);
const LOG_RATIO_STEP = 0.5;
const GOLDEN_TOLERANCE = 1e-10;
/** A column is whole-plot level when it varies by at most this (relative) within every whole plot. */
const CONSTANT_TOLERANCE = 1e-12;

export interface WholePlotRemlFit {
  n: number;
  p: number;
  rank: number;
  coefficients: Float64Array;
  /** σ̂²(X′Ĥ⁻¹X)⁻¹, p × p row-major; NaN for inestimable columns. */
  covariance: Float64Array;
  /** Containment df per column (null when not positive or inestimable). */
  df: (number | null)[];
  /** Whether each column is constant within whole plots. */
  wholePlotLevel: boolean[];
  components: VarianceComponents;
  /** X β̂ and y − X β̂ (marginal: no whole-plot effect predicted). */
  fitted: Float64Array;
  residuals: Float64Array;
  /** QR factor of X (inestimable columns and estimability of new rows). */
  factor: QrFactor;
  /** QR factor of the whitened estimable columns at γ̂. */
  whitened: QrFactor;
  /** Original indices of the estimable columns, in the order of `whitened`. */
  estimableColumns: number[];
}

interface Profile {
  logLikelihood: number;
  sigma2: number;
  factor: QrFactor;
  coefficients: Float64Array;
}

export function fitWholePlotReml(
  X: ArrayLike<number>,
  y: ArrayLike<number>,
  n: number,
  p: number,
  wholePlot: readonly number[],
): WholePlotRemlFit {
  const factor = householderQr(X, n, p);
  const estimableColumns = Array.from(factor.permutation.subarray(0, factor.rank)).sort((a, b) => a - b);
  const r = estimableColumns.length;
  const Xe = new Float64Array(n * r);
  for (let i = 0; i < n; i++) estimableColumns.forEach((j, c) => (Xe[i * r + c] = X[i * p + j]));
  const labels = [...new Set(wholePlot)];
  const plotOf = Int32Array.from(wholePlot, (w) => labels.indexOf(w));
  const W = labels.length;
  const sizes = new Int32Array(W);
  for (const g of plotOf) sizes[g] += 1;
  const residualDf = n - r;
  if (!(residualDf > 0)) throw new Error('fitWholePlotReml: no residual degrees of freedom');

  const profile = (gamma: number): Profile => {
    const shrink = Float64Array.from(sizes, (m) => 1 - 1 / Math.sqrt(1 + gamma * m));
    const Xt = whiten(Xe, n, r, plotOf, sizes, shrink);
    const yt = whiten(y, n, 1, plotOf, sizes, shrink);
    const qr = householderQr(Xt, n, r);
    const solution = solveLeastSquares(qr, yt);
    const sigma2 = solution.residualSs / residualDf;
    let logDetH = 0;
    for (let g = 0; g < W; g++) logDetH += Math.log1p(gamma * sizes[g]);
    const logLikelihood = -0.5 * (residualDf * (Math.log(2 * Math.PI) + Math.log(sigma2) + 1) + logDetH + logDetCrossProduct(qr));
    return { logLikelihood, sigma2, factor: qr, coefficients: solution.coefficients };
  };

  const gamma = maximiseProfile((g) => profile(g).logLikelihood);
  const best = profile(gamma);
  const coefficients = new Float64Array(p).fill(Number.NaN);
  estimableColumns.forEach((j, c) => (coefficients[j] = best.coefficients[c]));
  const unscaled = unscaledCovariance(best.factor);
  const covariance = new Float64Array(p * p).fill(Number.NaN);
  estimableColumns.forEach((a, ca) =>
    estimableColumns.forEach((b, cb) => (covariance[a * p + b] = best.sigma2 * unscaled[ca * r + cb])),
  );

  const wholePlotLevel = Array.from({ length: p }, (_, j) => constantWithinPlots(X, n, p, j, plotOf, W));
  const wholeRank = estimableColumns.filter((j) => wholePlotLevel[j]).length;
  const wholePlotDf = W - wholeRank;
  const withinPlotDf = n - W - (r - wholeRank);
  const df = Array.from({ length: p }, (_, j) => {
    if (!estimableColumns.includes(j)) return null;
    const d = wholePlotLevel[j] ? wholePlotDf : withinPlotDf;
    return d > 0 ? d : null;
  });

  const fitted = new Float64Array(n);
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let sum = 0;
    for (const j of estimableColumns) sum += X[i * p + j] * coefficients[j];
    fitted[i] = sum;
    residuals[i] = y[i] - sum;
  }
  const components: VarianceComponents = {
    wholePlot: gamma * best.sigma2,
    run: best.sigma2,
    ratio: gamma,
    restrictedLogLikelihood: best.logLikelihood,
    atZero: gamma === 0,
    wholePlots: W,
    wholePlotDf,
    withinPlotDf,
  };
  return {
    n,
    p,
    rank: r,
    coefficients,
    covariance,
    df,
    wholePlotLevel,
    components,
    fitted,
    residuals,
    factor,
    whitened: best.factor,
    estimableColumns,
  };
}

/** Prediction and interval for one new run in a new whole plot at model row `row` (length p). */
export function predictNewRunReml(fit: WholePlotRemlFit, row: ArrayLike<number>, level = 0.95): PredictionInterval | null {
  if (!isEstimableRow(fit.factor, row)) return null;
  const { components } = fit;
  const df = components.wholePlot > 0 ? components.wholePlotDf : components.withinPlotDf;
  if (!(df > 0)) return null;
  const reduced = fit.estimableColumns.map((j) => row[j]);
  const meanVariance = components.run * rowVarianceFactor(fit.whitened, reduced);
  let predicted = 0;
  for (const j of fit.estimableColumns) predicted += row[j] * fit.coefficients[j];
  const half = tQuantile(1 - (1 - level) / 2, df) * Math.sqrt(meanVariance + components.wholePlot + components.run);
  return { predicted, lower: predicted - half, upper: predicted + half };
}

/** H^{−1/2} A for a row-major n × q matrix A: subtract c_g times the whole-plot mean. */
function whiten(A: ArrayLike<number>, n: number, q: number, plotOf: Int32Array, sizes: Int32Array, shrink: Float64Array): Float64Array {
  const W = sizes.length;
  const means = new Float64Array(W * q);
  for (let i = 0; i < n; i++) for (let c = 0; c < q; c++) means[plotOf[i] * q + c] += A[i * q + c];
  for (let g = 0; g < W; g++) for (let c = 0; c < q; c++) means[g * q + c] /= sizes[g];
  const out = new Float64Array(n * q);
  for (let i = 0; i < n; i++) {
    const g = plotOf[i];
    for (let c = 0; c < q; c++) out[i * q + c] = A[i * q + c] - shrink[g] * means[g * q + c];
  }
  return out;
}

function constantWithinPlots(X: ArrayLike<number>, n: number, p: number, j: number, plotOf: Int32Array, W: number): boolean {
  const first = new Float64Array(W).fill(Number.NaN);
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(X[i * p + j]));
  const allowance = CONSTANT_TOLERANCE * Math.max(largest, 1);
  for (let i = 0; i < n; i++) {
    const g = plotOf[i];
    if (Number.isNaN(first[g])) first[g] = X[i * p + j];
    else if (Math.abs(X[i * p + j] - first[g]) > allowance) return false;
  }
  return true;
}

/** Argmax of ℓ(γ) over γ ≥ 0: grid in ln γ, then golden section (see the module header). */
function maximiseProfile(logLikelihood: (gamma: number) => number): number {
  const grid: number[] = [0];
  for (let t = LOG_RATIO_LOW; t <= LOG_RATIO_HIGH + 1e-9; t += LOG_RATIO_STEP) grid.push(Math.exp(t));
  const values = grid.map(logLikelihood);
  let best = 0;
  for (let i = 1; i < grid.length; i++) if (values[i] > values[best]) best = i;
  if (best === 0) return 0;
  if (best === grid.length - 1) return grid[best];
  if (best === 1) {
    const gamma = goldenSection(logLikelihood, 0, grid[2]);
    return logLikelihood(gamma) >= values[0] ? gamma : 0;
  }
  const logGamma = goldenSection((t) => logLikelihood(Math.exp(t)), Math.log(grid[best - 1]), Math.log(grid[best + 1]));
  return Math.exp(logGamma);
}

/** Maximiser of a unimodal f on [a, b] by golden-section search (Kiefer, 1953). */
function goldenSection(f: (x: number) => number, a: number, b: number): number {
  const ratio = (Math.sqrt(5) - 1) / 2;
  let lo = a;
  let hi = b;
  let x1 = hi - ratio * (hi - lo);
  let x2 = lo + ratio * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  while (hi - lo > GOLDEN_TOLERANCE * Math.max(1, Math.abs(lo) + Math.abs(hi))) {
    if (f1 >= f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - ratio * (hi - lo);
      f1 = f(x1);
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + ratio * (hi - lo);
      f2 = f(x2);
    }
  }
  return (lo + hi) / 2;
}
