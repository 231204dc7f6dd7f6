// The two-factor central composite example of Montgomery, "Design and Analysis of
// Experiments" (ch. 11, the chemical-process yield: time 80–90 min, temperature 170–180 °C,
// axial distance √2, five centre runs). Data and published values are FROM MEMORY; numpy
// reproduces the same values from these data (tests/reference/analysis/generate.py →
// analysis.json, case montgomeryCcd), which is the independent cross-check.
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/analysis/analysis.json' with { type: 'json' };
import { analyzeResponse } from '../../../src/core/analysis/analyzeResponse.js';
import { modelOf, runsOf } from '../../support/analysisCases.js';

const ccd = fixture.montgomeryCcd;
const { model, terms } = modelOf(ccd.terms, ['time', 'temperature']);
const analysis = analyzeResponse({
  id: 'yield',
  model,
  terms,
  ranges: ccd.ranges.map(([low, high]) => ({ low, high })),
  runs: runsOf(ccd.points, ccd.observed),
  holdouts: [],
});

/** |value − published| within half a unit of the last printed digit. */
function asPrinted(value: number | null | undefined, published: number, decimals: number): void {
  expect(value).not.toBeNull();
  expect(Math.abs((value as number) - published)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
}

describe("Montgomery's central composite yield example: published values (from memory)", () => {
  it('fit: ŷ = 79.94 + 0.99 x1 + 0.52 x2 − 1.38 x1² − 1.00 x2² + 0.25 x1x2', () => {
    expect(terms).toEqual(['1', 'time', 'temperature', 'time^2', 'temperature^2', 'time*temperature']);
    const published = [79.94, 0.99, 0.52, -1.38, -1.0, 0.25];
    analysis.coefficients.forEach((row, j) => asPrinted(row.estimate, published[j], 2));
  });

  it('ANOVA: model SS 28.25 on 5 df, F 79.85; residual 0.50 on 7 df', () => {
    asPrinted(analysis.anova.model?.ss, 28.25, 2);
    expect(analysis.anova.model?.df).toBe(5);
    asPrinted(analysis.anova.model?.F, 79.85, 2);
    asPrinted(analysis.anova.residual?.ss, 0.5, 2);
    expect(analysis.anova.residual?.df).toBe(7);
  });

  it('lack of fit 0.28 on 3 df against pure error 0.21 on 4 df: F 1.78, p 0.2897', () => {
    asPrinted(analysis.anova.lackOfFit?.ss, 0.28, 2);
    expect(analysis.anova.lackOfFit?.df).toBe(3);
    asPrinted(analysis.anova.lackOfFit?.F, 1.78, 2);
    asPrinted(analysis.anova.lackOfFit?.p, 0.2897, 4);
    asPrinted(analysis.anova.pureError?.ss, 0.21, 2);
    expect(analysis.anova.pureError?.df).toBe(4);
  });

  it('R² 0.9828, adjusted R² 0.9705, predicted R² 0.9184, PRESS 2.35, SD 0.27', () => {
    asPrinted(analysis.rSquared, 0.9828, 4);
    asPrinted(analysis.adjustedRSquared, 0.9705, 4);
    asPrinted(analysis.predictedRSquared, 0.9184, 4);
    asPrinted(analysis.press, 2.35, 2);
    asPrinted(analysis.residualSd, 0.27, 2);
  });
});

describe('the same example against numpy / scipy to full precision (generate.py)', () => {
  it('coefficients, standard errors, t, p and 95 % intervals', () => {
    analysis.coefficients.forEach((row, j) => {
      expect(row.estimate).toBeCloseTo(ccd.coefficients[j], 11);
      expect(row.standardError).toBeCloseTo(ccd.standardErrors[j], 11);
      expect(row.t! / ccd.t[j]).toBeCloseTo(1, 9);
      expect(row.p! / ccd.p[j]).toBeCloseTo(1, 6); // jstat incomplete beta: about 7 digits
      expect(row.lower).toBeCloseTo(ccd.lower[j], 10);
      expect(row.upper).toBeCloseTo(ccd.upper[j], 10);
    });
  });

  it('ANOVA lines, PRESS (numpy refits without each run) and the ratios', () => {
    const { model: m, lackOfFit: lof, pureError: pe, residual: res } = ccd.anova;
    expect(analysis.anova.model).toMatchObject({ df: m.df });
    expect(analysis.anova.model!.ss).toBeCloseTo(m.ss, 11);
    expect(analysis.anova.model!.F).toBeCloseTo(m.F, 8);
    expect(analysis.anova.model!.p! / m.p).toBeCloseTo(1, 6);
    expect(analysis.anova.residual!.ss).toBeCloseTo(res.ss, 12);
    expect(analysis.anova.lackOfFit!.ss).toBeCloseTo(lof.ss, 12);
    expect(analysis.anova.lackOfFit!.F).toBeCloseTo(lof.F, 10);
    expect(analysis.anova.lackOfFit!.p! / lof.p).toBeCloseTo(1, 6);
    expect(analysis.anova.pureError!.ss).toBeCloseTo(pe.ss, 12);
    expect(analysis.press).toBeCloseTo(ccd.press, 11);
    expect(analysis.predictedRSquared).toBeCloseTo(ccd.predictedRSquared, 12);
    expect(analysis.adjustedRSquared).toBeCloseTo(ccd.adjustedRSquared, 12);
  });

  it('says why it is not yet calibrated: no holdout run was made', () => {
    expect(analysis.verdict).toBe('not yet');
    expect(analysis.verdictReasons.map((r) => r.kind)).toEqual(['noHoldout']);
    expect(analysis.verdictPassed).toContain('no significant lack of fit (p = 0.29 ≥ 0.05)');
  });
});
