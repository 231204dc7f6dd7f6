// Least-squares analysis of one response against numpy / scipy
// (tests/reference/analysis/generate.py → analysis.json): an invented three-factor
// face-centred composite design with centre replicates and holdouts ("diagnostics"), and the
// same runs split into two sessions as fixed blocks ("blocked"). numpy computes the hat
// matrix from an explicit inverse and PRESS by refitting without each run, so agreement
// checks the QR route and the leverage shortcut independently.
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/analysis/analysis.json' with { type: 'json' };
import { analyzeResponse } from '../../../src/core/analysis/analyzeResponse.js';
import { COOKS_DISTANCE_LIMIT, LEVERAGE_LIMIT_FACTOR } from '../../../src/core/analysis/runDiagnostics.js';
import { modelOf, runsOf } from '../../support/analysisCases.js';

const factorIds = ['inlet', 'feed', 'solids'];

describe('diagnostics case: fit, ANOVA, per-run diagnostics and holdouts', () => {
  const ref = fixture.diagnostics;
  const { model, terms } = modelOf(ref.terms, factorIds);
  const runs = runsOf(ref.points, ref.observed);
  const holdouts = runsOf(ref.holdoutPoints, ref.holdoutObserved, runs.length + 1, 'H');
  const ranges = ref.ranges.map(([low, high]) => ({ low, high }));
  const analysis = analyzeResponse({ id: 'moisture', model, terms, ranges, runs, holdouts, noise: 0.5 });

  it('coefficients, standard errors and 95 % intervals (numpy lstsq, scipy t)', () => {
    expect(analysis.n).toBe(18);
    expect(analysis.method).toBe('least squares');
    analysis.coefficients.forEach((row, j) => {
      expect(row.estimate).toBeCloseTo(ref.coefficients[j], 11);
      expect(row.standardError).toBeCloseTo(ref.standardErrors[j], 11);
      expect(row.lower).toBeCloseTo(ref.lower[j], 10);
      expect(row.upper).toBeCloseTo(ref.upper[j], 10);
      expect(row.df).toBe(ref.residualDf);
      expect(row.p! / ref.p[j]).toBeCloseTo(1, 6); // jstat incomplete beta: about 7 digits
    });
  });

  it('ANOVA: model, residual, lack of fit (5 df) against pure error (3 df, four centre runs)', () => {
    const a = ref.anova;
    expect(analysis.anova.model!.df).toBe(a.model.df);
    expect(analysis.anova.model!.ss).toBeCloseTo(a.model.ss, 10);
    expect(analysis.anova.residual!.ss).toBeCloseTo(a.residual.ss, 12);
    expect(analysis.anova.lackOfFit!.df).toBe(5);
    expect(analysis.anova.pureError!.df).toBe(3);
    expect(analysis.anova.lackOfFit!.ss).toBeCloseTo(a.lackOfFit.ss, 12);
    expect(analysis.anova.pureError!.ss).toBeCloseTo(a.pureError.ss, 12);
    expect(analysis.anova.lackOfFit!.F).toBeCloseTo(a.lackOfFit.F, 10);
    expect(analysis.anova.lackOfFit!.p! / a.lackOfFit.p).toBeCloseTo(1, 6);
  });

  it('R², adjusted R², PRESS from leverages = PRESS by refitting, predicted R²', () => {
    expect(analysis.rSquared).toBeCloseTo(ref.rSquared, 13);
    expect(analysis.adjustedRSquared).toBeCloseTo(ref.adjustedRSquared, 13);
    expect(analysis.press).toBeCloseTo(ref.press, 10);
    expect(analysis.predictedRSquared).toBeCloseTo(ref.predictedRSquared, 12);
    expect(analysis.residualSd).toBeCloseTo(ref.residualSd, 13);
  });

  it('per run: fitted, residual, leverage, studentised residual, Cook’s distance', () => {
    analysis.runs.forEach((run, i) => {
      expect(run.run).toBe(i + 1);
      expect(run.fitted).toBeCloseTo(ref.fitted[i], 11);
      expect(run.residual).toBeCloseTo(ref.residuals[i], 11);
      expect(run.leverage).toBeCloseTo(ref.leverages[i], 13);
      expect(run.studentised).toBeCloseTo(ref.studentised[i], 11);
      expect(run.cooksDistance).toBeCloseTo(ref.cooksDistance[i], 11);
    });
  });

  it('flags exactly the runs above the documented limits (2p/n leverage, Cook’s D > 1)', () => {
    const p = ref.coefficients.length;
    const n = ref.observed.length;
    analysis.runs.forEach((run, i) => {
      expect(run.flags.includes('leverage')).toBe(ref.leverages[i] > (LEVERAGE_LIMIT_FACTOR * p) / n);
      expect(run.flags.includes('cooksDistance')).toBe(ref.cooksDistance[i] > COOKS_DISTANCE_LIMIT);
    });
    expect(analysis.runs.some((run) => run.flags.includes('cooksDistance'))).toBe(true);
  });

  it('holdout predictions with 95 % prediction intervals ŷ ± t·s·√(1 + x′(X′X)⁻¹x) (numpy inverse)', () => {
    analysis.holdout.forEach((h, i) => {
      expect(h.run).toBe(19 + i);
      expect(h.point).toBe(`H0${i + 1}`);
      expect(h.predicted).toBeCloseTo(ref.holdout.predicted[i], 11);
      expect(h.lower).toBeCloseTo(ref.holdout.lower[i], 10);
      expect(h.upper).toBeCloseTo(ref.holdout.upper[i], 10);
      expect(h.inside).toBe(ref.holdout.inside[i]);
    });
    expect(analysis.validation.rmsPredictionError).toBeCloseTo(ref.holdout.rmsPredictionError, 11);
    expect(analysis.validation.coverage).toBe(1);
    expect(analysis.validation.errorRatio).toBeCloseTo(ref.holdout.rmsPredictionError / ref.residualSd, 11);
  });

  it('engineering coefficients equal a direct fit in engineering units (numpy)', () => {
    expect(analysis.engineering.map((row) => row.term)).toEqual(terms);
    analysis.engineering.forEach((row, r) => expect(row.estimate! / ref.engineering[r]).toBeCloseTo(1, 8));
  });

  it('compares the noise estimate (pure error: four centre runs) with the study noise', () => {
    const pureSd = Math.sqrt(ref.anova.pureError.ss / ref.anova.pureError.df);
    expect(analysis.noise).toEqual({ study: 0.5, estimated: expect.closeTo(pureSd, 12), basis: 'pure error', ratio: expect.closeTo(pureSd / 0.5, 12) });
  });

  it('is calibrated: no lack of fit, all holdouts inside; and not yet under a tight tolerance', () => {
    expect(analysis.verdict).toBe('calibrated');
    expect(analysis.verdictReasons).toEqual([]);
    const strict = analyzeResponse({ id: 'moisture', model, terms, ranges, runs, holdouts, tolerance: 0.01 });
    expect(strict.verdict).toBe('not yet');
    expect(strict.verdictReasons.map((r) => r.kind)).toEqual(['predictionError']);
  });
});

describe('blocked case: sessions as fixed blocks', () => {
  const ref = fixture.blocked;
  const { model, terms } = modelOf(ref.terms, factorIds);
  const runs = runsOf(ref.points, ref.observed, 1, 'F', ref.sessions);
  const ranges = [{ low: -1, high: 1 }, { low: -1, high: 1 }, { low: -1, high: 1 }];
  const analysis = analyzeResponse({ id: 'moisture', model, terms, ranges, runs, holdouts: [] });

  it('model terms (block column absorbed), model SS over intercept + blocks, residual df n − p − 1', () => {
    analysis.coefficients.forEach((row, j) => {
      expect(row.estimate).toBeCloseTo(ref.coefficients[j], 11);
      expect(row.standardError).toBeCloseTo(ref.standardErrors[j], 11);
    });
    expect(analysis.coefficients).toHaveLength(terms.length);
    expect(analysis.anova.residual!.df).toBe(ref.residualDf);
    expect(analysis.anova.model!.ss).toBeCloseTo(ref.anova.model.ss, 10);
    expect(analysis.anova.model!.df).toBe(ref.anova.model.df);
  });

  it('pure error only within a session: the centre runs form two groups, 2 df', () => {
    expect(analysis.anova.pureError!.df).toBe(2);
    expect(analysis.anova.pureError!.ss).toBeCloseTo(ref.anova.pureError.ss, 12);
    expect(analysis.anova.lackOfFit!.df).toBe(ref.anova.lackOfFit.df);
    expect(analysis.anova.lackOfFit!.ss).toBeCloseTo(ref.anova.lackOfFit.ss, 12);
  });

  it('leverages and PRESS include the block column', () => {
    analysis.runs.forEach((run, i) => expect(run.leverage).toBeCloseTo(ref.leverages[i], 13));
    expect(analysis.press).toBeCloseTo(ref.press, 10);
  });
});
