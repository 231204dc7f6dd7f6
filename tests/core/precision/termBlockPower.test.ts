// Joint F-test power of a term block against scipy (tests/reference/precision/generate.py):
// λ = b'C_TT⁻¹b/σ² with C from numpy.linalg.inv, power from scipy.stats.ncf.
import { describe, expect, it } from 'vitest';
import fixture from '../../reference/precision/precision.json' with { type: 'json' };
import { blockNoncentrality, covarianceBlock, termBlockPower } from '../../../src/core/precision/termBlockPower.js';
import { designPrecision, factorBlocks, leastSquaresCovariance } from '../../../src/core/precision/designPrecision.js';
import { compileModel } from '../../../src/core/model/modelMatrix.js';

const blockCase = fixture.blockPower;

describe('termBlockPower', () => {
  it('matches numpy/scipy for the x, x², x³ block of a 10-run design (λ and power)', () => {
    const block = Float64Array.from(blockCase.covarianceBlock.flat());
    const result = termBlockPower({ covarianceBlock: block, coefficients: blockCase.coefficients, sigma: 1, residualDf: blockCase.nu, alpha: 0.05 });
    expect(result.noncentrality).toBeCloseTo(blockCase.lambda, 9);
    expect(Math.abs(result.power! - blockCase.power)).toBeLessThan(1e-7);
    const half = termBlockPower({ covarianceBlock: block, coefficients: blockCase.coefficients, sigma: 0.5, residualDf: blockCase.nu, alpha: 0.05 });
    expect(Math.abs(half.power! - blockCase.powerHalfSigma)).toBeLessThan(1e-7);
  });

  it('reduces to β²/(σ² c_jj) for one term', () => {
    expect(blockNoncentrality(Float64Array.of(0.125), [1], 1)).toBeCloseTo(8, 12);
  });

  it('is null without residual degrees of freedom', () => {
    expect(termBlockPower({ covarianceBlock: Float64Array.of(0.1), coefficients: [1], sigma: 1, residualDf: 0, alpha: 0.05 }).power).toBeNull();
  });
});

describe('designPrecision from the fitted points', () => {
  const powersOf = (label: string): Record<string, number> => (label === '1' ? {} : label === 'z' ? { z: 1 } : { x: label === 'x' ? 1 : Number(label.slice(2)) });
  const model = compileModel(blockCase.terms.map((label) => ({ powers: powersOf(label) })), ['x', 'z']);

  it('finds the x, x², x³ block and its linear term', () => {
    expect(factorBlocks(model)[0]).toEqual({ terms: [1, 2, 3], linear: 1 });
    expect(factorBlocks(model)[1]).toEqual({ terms: [4], linear: 4 });
  });

  it('recomputes the fixture power from the points themselves (fit with numpy’s covariance block)', () => {
    const { covariance, residualDf } = leastSquaresCovariance(model, blockCase.points);
    expect(residualDf).toBe(blockCase.nu);
    const block = covarianceBlock(covariance!, model.p, blockCase.block);
    blockCase.covarianceBlock.flat().forEach((value, i) => expect(block[i]).toBeCloseTo(value, 9));
    const result = designPrecision({
      model,
      termLabels: blockCase.terms,
      covariance,
      residualDf,
      effects: { factors: [{ factor: 'x', response: 'y', index: 0.5, effect: 0.7, noise: 1, basis: 'predicted' }], interactions: [] },
      alpha: 0.05,
      power: 0.8,
    });
    expect(result.factors[0].terms).toEqual(['x', 'x^2', 'x^3']);
    expect(Math.abs(result.factors[0].power! - blockCase.power)).toBeLessThan(1e-7);
    expect(result.met).toBe(false);
    expect(result.weakest).toBe(result.factors[0]);
  });

  it('the 2^3 factorial, main-effects model, ν = 4: β = 1σ → 0.5716, β = 1.5σ → 0.8802 (scipy fixture)', () => {
    const main = compileModel([{ powers: {} }, { powers: { a: 1 } }, { powers: { b: 1 } }, { powers: { c: 1 } }], ['a', 'b', 'c']);
    const points: number[][] = [];
    for (const a of [-1, 1]) for (const b of [-1, 1]) for (const c of [-1, 1]) points.push([a, b, c]);
    const { covariance, residualDf } = leastSquaresCovariance(main, points);
    for (const c of fixture.factorial2cubed.cases) {
      const result = designPrecision({
        model: main,
        termLabels: ['1', 'a', 'b', 'c'],
        covariance,
        residualDf,
        effects: { factors: [{ factor: 'b', response: 'y', index: 0.3, effect: c.beta, noise: 1, basis: 'predicted' }], interactions: [] },
        alpha: 0.05,
        power: 0.8,
      });
      expect(Math.abs(result.factors[0].power! - c.power)).toBeLessThan(1e-7);
      expect(result.met).toBe(c.power >= 0.8);
    }
  });
});
