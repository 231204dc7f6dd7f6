// Runs without a result and the terms they leave inestimable; the verdict rule case by
// case. Hand-worked: on the 3×3 grid with the x1 = +1 runs missing, x1 takes only the
// values −1 and 0, where x1² = −x1, so the quadratic model loses exactly one term, and the
// later one (x1^2) is the one reported (order-keeping pivot rule, householderQr.ts).
import { describe, expect, it } from 'vitest';
import { analyzeResponse } from '../../../src/core/analysis/analyzeResponse.js';
import { calibrationVerdict } from '../../../src/core/analysis/calibrationVerdict.js';
import type { HoldoutPrediction, HoldoutSummary } from '../../../src/core/analysis/analysisTypes.js';
import { InputError } from '../../../src/core/inputError.js';
import { modelOf, runsOf } from '../../support/analysisCases.js';

const { model, terms } = modelOf([[0, 0], [1, 0], [0, 1], [2, 0], [0, 2], [1, 1]], ['x1', 'x2']);
const grid = [-1, 0, 1].flatMap((a) => [-1, 0, 1].map((b) => [a, b]));
const points = [...grid, [0, 0], [0, 0]];
const wobble = [0.1, -0.2, 0.05, 0.15, -0.1, 0.0, -0.05, 0.12, -0.07, 0.08, -0.03];
const truth = ([a, b]: number[]) => 10 + 2 * a - b + 0.5 * a * a - 1.5 * b * b + 0.7 * a * b;
const observed: (number | null)[] = points.map((x, i) => (x[0] === 1 ? null : truth(x) + wobble[i]));
const ranges = [{ low: 0, high: 10 }, { low: 100, high: 200 }];

describe('runs without a result', () => {
  const holdouts = runsOf([[0, 0.5], [0.5, 0]], [10.2, 11.3], 20, 'H');
  const analysis = analyzeResponse({ id: 'y', model, terms, ranges, runs: runsOf(points, observed), holdouts });

  it('fits on the runs that have one and lists the others', () => {
    expect(analysis.n).toBe(8);
    expect(analysis.missingRuns).toEqual([7, 8, 9]);
  });

  it('reports x1^2 inestimable (x1² = −x1 on the remaining levels), with null rows', () => {
    expect(analysis.inestimable).toEqual(['x1^2']);
    const row = analysis.coefficients.find((c) => c.term === 'x1^2')!;
    expect(row).toMatchObject({ estimate: null, standardError: null, t: null, p: null, lower: null, upper: null });
    // The other terms are estimated; residual df = 8 runs − 5 estimable terms.
    expect(analysis.coefficients.filter((c) => c.estimate !== null)).toHaveLength(5);
    expect(analysis.anova.residual!.df).toBe(3);
  });

  it('predicts a missing run only where the prediction is estimable', () => {
    // f·n for the null direction n = (x1, x1²) ∝ (1, 1): zero at x1 = −1 or 0, not at x1 = +1.
    const missing = analysis.runs.filter((r) => r.observed === null);
    expect(missing.map((r) => r.fitted)).toEqual([null, null, null]);
    // At x1 = 0 the holdout is estimable; at x1 = 0.5 it is not (0.5 + 0.25 ≠ 0).
    expect(analysis.holdout[0].predicted).not.toBeNull();
    expect(analysis.holdout[1]).toMatchObject({ predicted: null, lower: null, upper: null, inside: null });
  });

  it('leaves engineering coefficients fed by x1^2 and the sensitivity indices out', () => {
    const engineering = Object.fromEntries(analysis.engineering.map((e) => [e.term, e.estimate]));
    expect(engineering['x1^2']).toBeNull();
    expect(engineering['x1']).toBeNull(); // x1 in engineering units takes a share of β_x1²
    expect(engineering['x2^2']).not.toBeNull();
    expect(analysis.sensitivity).toBeNull();
  });

  it('says not yet: a term is inestimable', () => {
    expect(analysis.verdict).toBe('not yet');
    expect(analysis.verdictReasons[0]).toEqual({
      kind: 'inestimableTerms',
      message: 'the runs with results cannot estimate x1^2: complete the missing runs or drop these terms',
    });
  });

  it('refuses a response with no result at all as a user error', () => {
    expect(() => analyzeResponse({ id: 'y', model, terms, ranges, runs: runsOf(points, points.map(() => null)), holdouts: [] })).toThrow(InputError);
  });
});

describe('a saturated fit (as many runs with results as terms)', () => {
  it('fits, leaves every test null and says why it is not yet calibrated; also with whole plots', () => {
    const square = modelOf([[0, 0], [1, 0], [0, 1], [1, 1]], ['x1', 'x2']);
    const corners = [[-1, -1], [1, -1], [-1, 1], [1, 1]];
    for (const wholePlots of [undefined, [1, 1, 2, 2]]) {
      const runs = runsOf(corners, [3, 5, 4, 9]).map((run, i) => (wholePlots ? { ...run, wholePlot: wholePlots[i] } : run));
      const analysis = analyzeResponse({ id: 'y', ...square, ranges, runs, holdouts: runsOf([[0, 0]], [5], 5, 'H') });
      expect(analysis.method).toBe('least squares');
      // 2² factorial, y = 3, 5, 4, 9: β = (21/4, 7/4, 5/4, 3/4) exactly.
      [5.25, 1.75, 1.25, 0.75].forEach((b, j) => expect(analysis.coefficients[j].estimate).toBeCloseTo(b, 14));
      expect(analysis.coefficients.map((c) => c.standardError)).toEqual([null, null, null, null]);
      // The model line keeps its SS (all of SST) but has no F without residual df.
      expect(analysis.anova.model).toMatchObject({ df: 3, F: null, p: null });
      expect(analysis.anova.model!.ss).toBeCloseTo(4 * (1.75 ** 2 + 1.25 ** 2 + 0.75 ** 2), 12);
      expect([analysis.anova.residual, analysis.anova.lackOfFit, analysis.anova.pureError]).toEqual([null, null, null]);
      expect(analysis.press).toBeNull();
      expect(analysis.holdout[0].predicted).toBeNull();
      expect(analysis.verdictReasons.map((r) => r.kind)).toEqual(['noResidualDf', 'noHoldout']);
    }
  });
});

describe('calibration verdict rule', () => {
  const summary = (checked: number, inside: number, rms: number | null): HoldoutSummary => ({
    checked,
    inside,
    coverage: checked ? inside / checked : null,
    rmsPredictionError: rms,
    residualSd: 1,
    errorRatio: rms,
    level: 0.95,
  });
  const holdout = (inside: boolean | null, run: number): HoldoutPrediction => ({
    run,
    point: `H${run}`,
    observed: 1,
    predicted: 1,
    lower: 0,
    upper: 2,
    inside,
  });
  const anova = (p: number | null) => ({
    model: null,
    residual: { df: 6, ss: 1, F: null, p: null },
    lackOfFit: p === null ? null : { df: 3, ss: 1, F: 2, p },
    pureError: p === null ? null : { df: 3, ss: 1, F: null, p: null },
  });
  const base = { inestimable: [], residualDf: 6, lackOfFitApplies: true };

  it('calibrated when lack of fit is not significant and every holdout is inside', () => {
    const verdict = calibrationVerdict({ ...base, anova: anova(0.3), holdout: [holdout(true, 1), holdout(true, 2)], validation: summary(2, 2, 0.4) });
    expect(verdict.status).toBe('calibrated');
    expect(verdict.passed).toEqual(['every model term is estimable', 'no significant lack of fit (p = 0.3 ≥ 0.05)', 'all 2 holdout runs inside their 95 % prediction intervals']);
  });

  it('not yet, with each reason: lack of fit, a holdout outside, error above tolerance', () => {
    const verdict = calibrationVerdict({
      ...base,
      anova: anova(0.012),
      holdout: [holdout(true, 1), holdout(false, 7)],
      validation: summary(2, 1, 1.8),
      tolerance: 1.5,
    });
    expect(verdict.status).toBe('not yet');
    expect(verdict.reasons.map((r) => r.kind)).toEqual(['lackOfFit', 'holdoutOutside', 'predictionError']);
    expect(verdict.reasons[1].message).toBe('run 7 lies outside its 95 % prediction interval');
    expect(verdict.reasons[2].message).toBe('the RMS prediction error 1.8 exceeds the tolerance 1.5');
  });

  it('a lack-of-fit p exactly at α passes (p ≥ α); without replicates it cannot fail', () => {
    expect(calibrationVerdict({ ...base, anova: anova(0.05), holdout: [holdout(true, 1)], validation: summary(1, 1, 0.1) }).status).toBe('calibrated');
    const untestable = calibrationVerdict({ ...base, anova: anova(null), holdout: [holdout(true, 1)], validation: summary(1, 1, 0.1) });
    expect(untestable.status).toBe('calibrated');
    expect(untestable.passed[1]).toMatch(/not testable/);
  });

  it('not yet without any holdout result, and without residual df', () => {
    expect(calibrationVerdict({ ...base, anova: anova(0.5), holdout: [holdout(null, 1)], validation: summary(0, 0, null) }).reasons.map((r) => r.kind)).toEqual(['noHoldout']);
    expect(calibrationVerdict({ ...base, residualDf: 0, anova: anova(null), holdout: [], validation: summary(0, 0, null) }).reasons.map((r) => r.kind)).toEqual(['noResidualDf', 'noHoldout']);
  });
});
