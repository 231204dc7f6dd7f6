// REML for split-plot runs (random whole-plot intercept, fixed effects, sessions as fixed
// blocks) against tests/reference/reml/generate.py → reml.json: statsmodels MixedLM
// (reml=True), the general-purpose reference, and an independent dense-matrix maximisation
// of Harville's (1977) restricted log-likelihood with scipy.optimize.
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/reml/reml.json' with { type: 'json' };
import { fitWholePlotReml, predictNewRunReml } from '../../../src/core/analysis/wholePlotReml.js';
import { fitLeastSquares } from '../../../src/core/analysis/leastSquaresFit.js';
import { analyzeResponse } from '../../../src/core/analysis/analyzeResponse.js';
import { modelOf } from '../../support/analysisCases.js';

type RemlCase = (typeof fixture)['splitPlot'];

function fitCase(c: RemlCase) {
  const n = c.y.length;
  const p = c.X[0].length;
  return fitWholePlotReml(Float64Array.from(c.X.flat()), c.y, n, p, c.wholePlot);
}

for (const name of ['splitPlot', 'sessions'] as const) {
  const c = fixture[name] as RemlCase;
  describe(`${name}: ${c.wholePlot.length} runs in ${new Set(c.wholePlot).size} whole plots`, () => {
    const fit = fitCase(c);

    it('variance components and restricted log-likelihood equal the direct maximisation (scipy)', () => {
      expect(fit.components.ratio / c.direct.ratio).toBeCloseTo(1, 6);
      expect(fit.components.wholePlot / c.direct.wholePlotVariance).toBeCloseTo(1, 6);
      expect(fit.components.run / c.direct.runVariance).toBeCloseTo(1, 7);
      expect(fit.components.restrictedLogLikelihood).toBeCloseTo(c.direct.restrictedLogLikelihood, 9);
      expect(fit.components.atZero).toBe(false);
      // Our maximum is at least as high as the reference one.
      expect(fit.components.restrictedLogLikelihood).toBeGreaterThanOrEqual(c.direct.restrictedLogLikelihood - 1e-10);
    });

    it('agree with statsmodels MixedLM to its optimiser’s precision', () => {
      const sm = c.statsmodels!;
      expect(fit.components.wholePlot / sm.wholePlotVariance).toBeCloseTo(1, 4);
      expect(fit.components.run / sm.runVariance).toBeCloseTo(1, 4);
      expect(fit.components.restrictedLogLikelihood).toBeCloseTo(sm.restrictedLogLikelihood, 7);
      fit.coefficients.forEach((b, j) => expect(b).toBeCloseTo(sm.coefficients[j], 5));
      fit.covariance.forEach((_, at) => {
        const j = Math.floor(at / fit.p);
        if (at % fit.p === j) expect(Math.sqrt(fit.covariance[at]) / sm.plugInStandardErrors[j]).toBeCloseTo(1, 4);
      });
    });

    it('GLS coefficients and plug-in standard errors at the estimate (scipy reference)', () => {
      fit.coefficients.forEach((b, j) => {
        // γ̂ agrees to about 1e-6 (the profile is flat at its maximum), which moves β̂ by ~1e-9.
        expect(b).toBeCloseTo(c.direct.coefficients[j], 7);
        expect(Math.sqrt(fit.covariance[j * fit.p + j]) / c.direct.standardErrors[j]).toBeCloseTo(1, 6);
      });
    });

    it('containment df: whole-plot columns against whole-plot error, the rest within plots', () => {
      expect(fit.wholePlotLevel).toEqual(c.wholePlotLevel);
      expect(fit.components.wholePlotDf).toBe(c.wholePlotDf);
      expect(fit.components.withinPlotDf).toBe(c.withinPlotDf);
      fit.df.forEach((d, j) => expect(d).toBe(c.wholePlotLevel[j] ? c.wholePlotDf : c.withinPlotDf));
    });

    it('predicts one new run in a new whole plot with whole-plot and run variance added', () => {
      c.newRows.forEach((row, i) => {
        const interval = predictNewRunReml(fit, row)!;
        expect(interval.predicted).toBeCloseTo(c.prediction.predicted[i], 8);
        expect(interval.lower).toBeCloseTo(c.prediction.lower[i], 6);
        expect(interval.upper).toBeCloseTo(c.prediction.upper[i], 6);
      });
    });
  });
}

describe('no whole-plot variance in the data (REML maximum on γ = 0)', () => {
  const c = fixture.boundary as unknown as RemlCase;
  const fit = fitCase(c);

  it('finds γ̂ = 0 and reduces to ordinary least squares', () => {
    expect(fit.components.ratio).toBe(0);
    expect(fit.components.atZero).toBe(true);
    expect(fit.components.restrictedLogLikelihood).toBeCloseTo(c.direct.restrictedLogLikelihood, 9);
    const n = c.y.length;
    const p = c.X[0].length;
    const ols = fitLeastSquares(Float64Array.from(c.X.flat()), c.y, n, p);
    fit.coefficients.forEach((b, j) => expect(b).toBeCloseTo(ols.coefficients[j], 12));
    expect(fit.components.run).toBeCloseTo(ols.residualSd ** 2, 12);
    // Still containment df: the whole-plot factor is judged against 6 whole-plot df.
    expect(fit.df[1]).toBe(c.wholePlotDf);
  });
});

describe('analyzeResponse on split-plot runs', () => {
  it('chooses REML, reports the variance components and the containment df per term, no least-squares ANOVA', () => {
    const c = fixture.splitPlot;
    const { model, terms } = modelOf(
      [[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 1, 0], [1, 0, 1], [0, 1, 1], [0, 2, 0]],
      ['wall', 'feed', 'speed'],
    );
    const runs = c.X.map((row, i) => ({ run: i + 1, point: `F${i + 1}`, coded: [row[1], row[2], row[3]], observed: c.y[i], wholePlot: c.wholePlot[i] }));
    const holdouts = c.newRows.map((row, i) => ({ run: 100 + i, point: `H${i + 1}`, coded: [row[1], row[2], row[3]], observed: c.prediction.predicted[i] }));
    const analysis = analyzeResponse({ id: 'y', model, terms, ranges: [{ low: -1, high: 1 }, { low: -1, high: 1 }, { low: -1, high: 1 }], runs, holdouts });
    expect(analysis.method).toBe('REML');
    expect(analysis.varianceComponents!.wholePlot / c.direct.wholePlotVariance).toBeCloseTo(1, 6);
    expect(analysis.coefficients.map((row) => row.df)).toEqual(c.wholePlotLevel.map((w) => (w ? c.wholePlotDf : c.withinPlotDf)));
    analysis.coefficients.forEach((row, j) => expect(row.p! / c.direct.p[j]).toBeCloseTo(1, 5));
    expect(analysis.anova).toEqual({ model: null, residual: null, lackOfFit: null, pureError: null });
    expect(analysis.residualSd! ** 2 / c.direct.runVariance).toBeCloseTo(1, 7);
    analysis.holdout.forEach((h, i) => {
      expect(h.lower).toBeCloseTo(c.prediction.lower[i], 6);
      expect(h.inside).toBe(true);
    });
    expect(analysis.verdict).toBe('calibrated');
    expect(analysis.verdictPassed[1]).toMatch(/not tested under the split-plot/);
  });

  it('uses the sessions as fixed blocks with the same effects coding as the reference', () => {
    const c = fixture.sessions;
    const { model, terms } = modelOf([[0, 0], [1, 0], [0, 1], [1, 1]], ['wall', 'feed']);
    const runs = c.X.map((row, i) => ({
      run: i + 1,
      point: `F${i + 1}`,
      coded: [row[1], row[2]],
      observed: c.y[i],
      wholePlot: c.wholePlot[i],
      session: c.session[i],
    }));
    const analysis = analyzeResponse({ id: 'y', model, terms, ranges: [{ low: -1, high: 1 }, { low: -1, high: 1 }], runs, holdouts: [] });
    expect(analysis.coefficients).toHaveLength(4);
    analysis.coefficients.forEach((row, j) => expect(row.estimate).toBeCloseTo(c.direct.coefficients[j], 8));
    expect(analysis.varianceComponents!.wholePlotDf).toBe(8);
  });
});
