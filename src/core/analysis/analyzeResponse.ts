/**
 * The analysis of one response: fit, tests, diagnostics, holdout validation, sensitivity of
 * the fitted polynomial and the verdict, as one `ResponseAnalysis` (analysis.json's
 * `responses[]` entry).
 *
 * Stages, each in its own module:
 *   runs with results → model matrix (+ session blocks: sessionBlocks.ts)
 *   → least squares by pivoted Householder QR (leastSquaresFit.ts), or REML with a random
 *     whole-plot intercept for split-plot runs (wholePlotReml.ts)
 *   → coefficient table (coefficientTable.ts) and engineering units (engineeringCoefficients.ts)
 *   → ANOVA with lack of fit against pure error (varianceAnalysis.ts, replicateGroups.ts)
 *   → R², adjusted and predicted R², PRESS (fitStatistics.ts); per-run diagnostics (runDiagnostics.ts)
 *   → holdout prediction intervals (holdoutValidation.ts)
 *   → Sobol' indices of the fitted polynomial (polynomialSensitivity.ts)
 *   → verdict (calibrationVerdict.ts).
 *
 * Conventions fixed here:
 * - a run whose result is null or NaN is left out (listed in `missingRuns`); terms the
 *   remaining runs cannot estimate are listed in `inestimable` and their rows are null;
 * - the method is REML when every fitted run carries a whole plot, some whole plot holds
 *   two or more of them (otherwise the whole plots add nothing to estimate) and the fit has
 *   residual degrees of freedom, else least squares; sessions become fixed blocks when the fitted runs span two or more sessions;
 * - replicate groups are identical coded points within one session;
 * - under REML the ANOVA lines, R², PRESS and the per-run leverage, studentised residual and
 *   Cook's distance are null (they are least-squares quantities), fitted values are X β̂;
 * - sensitivity indices are those of the fitted model terms (blocks excluded) over the coded
 *   box [−1, 1]^k, null when a term is inestimable or the fitted polynomial is constant.
 */
import { InputError } from '../inputError.js';
import { householderQr, isEstimableRow, type QrFactor } from '../linalg/householderQr.js';
import { expandInto, type CompiledModel } from '../model/modelMatrix.js';
import type {
  AnalysisRun,
  AnovaTable,
  CoefficientRow,
  EngineeringRow,
  NoiseComparison,
  PolynomialSensitivity,
  ResponseAnalysis,
  RunDiagnostics,
} from './analysisTypes.js';
import { calibrationVerdict } from './calibrationVerdict.js';
import { coefficientRows } from './coefficientTable.js';
import { engineeringPolynomial, type FactorRange } from './engineeringCoefficients.js';
import { fitStatistics, type FitStatistics } from './fitStatistics.js';
import { holdoutValidation, type HoldoutCase } from './holdoutValidation.js';
import { fitLeastSquares, predictNewRun, type PredictionInterval } from './leastSquaresFit.js';
import { polynomialSensitivity } from './polynomialSensitivity.js';
import { replicateGroups } from './replicateGroups.js';
import { runDiagnostics } from './runDiagnostics.js';
import { blockRow, sessionBlocks, type SessionBlocks } from './sessionBlocks.js';
import { varianceAnalysis } from './varianceAnalysis.js';
import { fitWholePlotReml, predictNewRunReml } from './wholePlotReml.js';

export interface ResponseAnalysisInput {
  /** Response id. */
  id: string;
  model: CompiledModel;
  /** Term labels in the plan's syntax and order, one per model column, intercept `1` first. */
  terms: readonly string[];
  /** Engineering low / high of each model factor (coding of `model.factorIds`). */
  ranges: readonly FactorRange[];
  /** Fitting runs and centre replicates. */
  runs: readonly AnalysisRun[];
  holdouts: readonly AnalysisRun[];
  /** Acceptable RMS prediction error, engineering units (the response's `tolerance`). */
  tolerance?: number;
  /** The study's repeatability SD for this response (`noise`). */
  noise?: number;
  /** Level of intervals (default 0.95). */
  level?: number;
  /** Significance level of the lack-of-fit test in the verdict (default 0.05). */
  alpha?: number;
}

export function analyzeResponse(input: ResponseAnalysisInput): ResponseAnalysis {
  const { model, terms } = input;
  const level = input.level ?? 0.95;
  const p = model.p;
  if (terms.length !== p) throw new Error(`analyzeResponse: ${terms.length} term labels for ${p} model columns`);
  const used = input.runs.filter((run) => hasResult(run.observed));
  const missingRuns = input.runs.filter((run) => !hasResult(run.observed)).map((run) => run.run);
  if (used.length === 0) throw new InputError(`response ${input.id} has no results to fit`);
  const n = used.length;
  const blocks = sessionBlocks(used.every((run) => run.session !== undefined) ? used.map((run) => run.session!) : undefined);
  const q = p + blocks.columns;
  const rowOf = (run: AnalysisRun): Float64Array => {
    const row = new Float64Array(q);
    expandInto(model, run.coded, row.subarray(0, p));
    blockRow(blocks, run.session, row, p);
    return row;
  };
  const X = new Float64Array(n * q);
  used.forEach((run, i) => X.set(rowOf(run), i * q));
  const y = Float64Array.from(used, (run) => run.observed as number);
  const holdoutCases: HoldoutCase[] = input.holdouts.map((run) => ({
    run: run.run,
    point: run.point,
    observed: hasResult(run.observed) ? (run.observed as number) : null,
    row: rowOf(run),
  }));

  // REML needs residual degrees of freedom; a saturated fit goes the least-squares way and
  // reports that nothing can be tested.
  const useReml =
    used.every((run) => run.wholePlot !== undefined) &&
    new Set(used.map((run) => run.wholePlot)).size < n &&
    householderQr(X, n, q).rank < n;
  const core = useReml ? remlCore(X, y, n, q, used, level) : leastSquaresCore(X, y, n, q, used, blocks, level);

  const inestimable = terms.filter((_, j) => !Number.isFinite(core.coefficients[j]));
  const modelCoefficients = core.coefficients.subarray(0, p);
  const modelCovariance = new Float64Array(p * p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) modelCovariance[a * p + b] = core.covariance[a * q + b];
  const coefficients: CoefficientRow[] = coefficientRows(terms, modelCoefficients, modelCovariance, core.df.slice(0, p), level);
  const engineeringFit = engineeringPolynomial(model, input.ranges, modelCoefficients, modelCovariance);
  const engineering: EngineeringRow[] = engineeringFit.terms.map((term, r) => ({
    term: term.label,
    estimate: finiteOrNull(engineeringFit.estimates[r]),
    standardError: finiteOrNull(Math.sqrt(engineeringFit.covariance![r * engineeringFit.terms.length + r])),
  }));

  const diagnosticsByRun = new Map(used.map((run, i) => [run, core.runs[i]]));
  const runs: RunDiagnostics[] = input.runs.map((run) => {
    const fittedRun = diagnosticsByRun.get(run);
    if (fittedRun) return { run: run.run, point: run.point, observed: run.observed as number, ...fittedRun };
    const row = rowOf(run);
    return {
      run: run.run,
      point: run.point,
      observed: null,
      fitted: isEstimableRow(core.factor, row) ? dot(row, core.coefficients) : null,
      residual: null,
      leverage: null,
      studentised: null,
      cooksDistance: null,
      flags: [],
    };
  });

  const { holdout, summary } = holdoutValidation(holdoutCases, core.predict, core.residualSd, level);
  const sensitivity = inestimable.length === 0 ? sensitivityOrNull(model, modelCoefficients) : null;
  const noise = noiseComparison(input.noise, core.anova, core.residualSd, useReml);
  const verdict = calibrationVerdict({
    inestimable,
    residualDf: core.residualDf,
    anova: core.anova,
    lackOfFitApplies: !useReml,
    holdout,
    validation: summary,
    tolerance: input.tolerance,
    alpha: input.alpha,
  });
  return {
    id: input.id,
    n,
    terms: [...terms],
    method: useReml ? 'REML' : 'least squares',
    inestimable,
    missingRuns,
    coefficients,
    engineering,
    anova: core.anova,
    rSquared: core.statistics.rSquared,
    adjustedRSquared: core.statistics.adjustedRSquared,
    predictedRSquared: core.statistics.predictedRSquared,
    press: core.statistics.press,
    residualSd: core.residualSd,
    varianceComponents: core.varianceComponents,
    runs,
    holdout,
    validation: summary,
    sensitivity,
    noise,
    verdict: verdict.status,
    verdictReasons: verdict.reasons,
    verdictPassed: verdict.passed,
  };
}

/** What both fitting paths hand to the common stages. */
interface FitCore {
  coefficients: Float64Array;
  covariance: Float64Array;
  df: (number | null)[];
  residualDf: number;
  residualSd: number | null;
  factor: QrFactor;
  anova: AnovaTable;
  statistics: FitStatistics;
  runs: Omit<RunDiagnostics, 'run' | 'point' | 'observed'>[];
  predict: (row: Float64Array) => PredictionInterval | null;
  varianceComponents: ResponseAnalysis['varianceComponents'];
}

function leastSquaresCore(
  X: Float64Array,
  y: Float64Array,
  n: number,
  q: number,
  used: readonly AnalysisRun[],
  blocks: SessionBlocks,
  level: number,
): FitCore {
  const fit = fitLeastSquares(X, y, n, q);
  const baseline = baselineFit(X, y, n, q, blocks);
  const groups = replicateGroups(
    used.map((run) => run.coded),
    blocks.columns > 0 ? used.map((run) => run.session!) : undefined,
  );
  const anova = varianceAnalysis({ observed: y, residualSs: fit.residualSs, rank: fit.rank, baseline, groups });
  const diagnostics = runDiagnostics(fit);
  const residualSd = finiteOrNull(fit.residualSd);
  return {
    coefficients: fit.coefficients,
    covariance: fit.covariance,
    df: Array.from({ length: q }, () => (fit.residualDf > 0 ? fit.residualDf : null)),
    residualDf: fit.residualDf,
    residualSd,
    factor: fit.factor,
    anova,
    statistics: fitStatistics(y, fit),
    runs: diagnostics.map((d, i) => ({
      fitted: fit.fitted[i],
      residual: fit.residuals[i],
      leverage: d.leverage,
      studentised: d.studentised,
      cooksDistance: d.cooksDistance,
      flags: d.flags,
    })),
    predict: (row) => predictNewRun(fit, row, level),
    varianceComponents: null,
  };
}

/** RSS and rank of the intercept-plus-blocks model that the model SS is measured from. */
function baselineFit(X: Float64Array, y: Float64Array, n: number, q: number, blocks: SessionBlocks): { residualSs: number; rank: number } {
  // Column 0 is the intercept when the model has one (plan models always do); the block
  // columns are the last `blocks.columns`.
  const columns: number[] = [];
  let hasIntercept = true;
  for (let i = 0; i < n; i++) if (X[i * q] !== 1) hasIntercept = false;
  if (hasIntercept) columns.push(0);
  for (let c = q - blocks.columns; c < q; c++) columns.push(c);
  if (columns.length === 0) return { residualSs: y.reduce((s, v) => s + v * v, 0), rank: 0 };
  const B = new Float64Array(n * columns.length);
  for (let i = 0; i < n; i++) columns.forEach((c, k) => (B[i * columns.length + k] = X[i * q + c]));
  const fit = fitLeastSquares(B, y, n, columns.length);
  return { residualSs: fit.residualSs, rank: fit.rank };
}

function remlCore(X: Float64Array, y: Float64Array, n: number, q: number, used: readonly AnalysisRun[], level: number): FitCore {
  const fit = fitWholePlotReml(X, y, n, q, used.map((run) => run.wholePlot!));
  const none: AnovaTable = { model: null, residual: null, lackOfFit: null, pureError: null };
  return {
    coefficients: fit.coefficients,
    covariance: fit.covariance,
    df: fit.df,
    residualDf: n - fit.rank,
    residualSd: Math.sqrt(fit.components.run),
    factor: fit.factor,
    anova: none,
    statistics: { rSquared: null, adjustedRSquared: null, press: null, predictedRSquared: null },
    runs: Array.from({ length: n }, (_, i) => ({
      fitted: fit.fitted[i],
      residual: fit.residuals[i],
      leverage: null,
      studentised: null,
      cooksDistance: null,
      flags: [],
    })),
    predict: (row) => predictNewRunReml(fit, row, level),
    varianceComponents: fit.components,
  };
}

function sensitivityOrNull(model: CompiledModel, coefficients: Float64Array): PolynomialSensitivity | null {
  const result = polynomialSensitivity(model, coefficients);
  return result.variance > 0 ? result : null;
}

function noiseComparison(study: number | undefined, anova: AnovaTable, residualSd: number | null, reml: boolean): NoiseComparison | null {
  if (study === undefined || !(study > 0)) return null;
  const pure = anova.pureError;
  if (pure && pure.df > 0) {
    const estimated = Math.sqrt(pure.ss / pure.df);
    return { study, estimated, basis: 'pure error', ratio: estimated / study };
  }
  if (residualSd === null) return null;
  return { study, estimated: residualSd, basis: reml ? 'within whole plot' : 'residual', ratio: residualSd / study };
}

function hasResult(value: number | null): boolean {
  return value !== null && Number.isFinite(value);
}

function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

/** f′β̂ with the basic solution's zeros for inestimable columns (unique for an estimable f). */
function dot(row: Float64Array, coefficients: Float64Array): number {
  let sum = 0;
  for (let j = 0; j < row.length; j++) if (row[j] !== 0 && Number.isFinite(coefficients[j])) sum += row[j] * coefficients[j];
  return sum;
}
