/**
 * The limits the planner enforces (src/core/inputLimits.ts): varied factors, model terms and
 * the design-search work, each refused before any search with one line naming the key and the
 * limit; and the largest allowed factor count still planned.
 */
import { describe, expect, it } from 'vitest';
import { buildPlan } from '../../../src/core/plan/buildPlan.js';
import { checkSearchWork, passWork } from '../../../src/core/design/exactDesign.js';
import { compileModel } from '../../../src/core/model/modelMatrix.js';
import { limitOf } from '../../../src/core/inputLimits.js';
import { boxRegion } from '../../../bench/benchCases.js';
import { expectInputError } from '../../support/expectInputError.js';
import { manyFactorStudy } from './manyFactorStudy.js';

const SEE = '(see "Limits" in the README)';
const options = { toolVersion: 'test', skipComparison: true };

describe('varied factors', () => {
  it('plans 30 varied factors (linear model, 2 starts)', () => {
    const plan = buildPlan(manyFactorStudy(30, 0.2, { model: 'linear', starts: 2 }), options);
    expect(plan.levels.filter((level) => level.varied)).toHaveLength(30);
    expect(plan.metrics.p).toBe(31);
  });

  it('refuses 31 before tiering leads anywhere further', () => {
    const error = expectInputError(() => buildPlan(manyFactorStudy(31, 0.2, { model: 'linear', starts: 2 }), options));
    expect(error.describe()).toBe(
      `key factors: 31 operating factors would be varied, above the limit of 30 varied factors ${SEE}; fix the least important at their nominal (raise policy.moderate) or screen them first`,
    );
  });
});

describe('model terms', () => {
  it('refuses a derived model past 500 terms: 30 critical settings, cubic, every pair interacting', () => {
    // 1 + 30·3 + 435 = 526 terms.
    const error = expectInputError(() => buildPlan(manyFactorStudy(30, 0.4, { starts: 1 }), options));
    expect(error.describe()).toBe(`key design.model: 526 model terms is above the limit of 500 model terms ${SEE}`);
  });
});

describe('search work', () => {
  const twoFactorInteractions = (k: number) => {
    const ids = Array.from({ length: k }, (_, j) => `x${j + 1}`);
    const terms: Record<string, number>[] = [{}, ...ids.map((id) => ({ [id]: 1 }))];
    for (let a = 0; a < k; a++) for (let b = a + 1; b < k; b++) terms.push({ [ids[a]]: 1, [ids[b]]: 1 });
    return compileModel(terms.map((powers) => ({ powers })), ids);
  };

  it('counts the multiply-adds of one pass: runs × (3p² + trials) + p³ + set-up', () => {
    // Two 2-level factors, model 1 + a + b + ab: each factor in 2 terms, one other level to try.
    const model = twoFactorInteractions(2);
    expect(model.p).toBe(4);
    const region = boxRegion([2, 2], 0);
    // Per trial p·t + 2p + 10k = 4·2 + 8 + 20 = 36; two factors → 72 per run; N = 6.
    expect(passWork(model, region, 6)).toBe(6 * (3 * 16 + 72) + 64 + 1e4);
  });

  it('refuses 20 starts of a 20-factor interaction search with the starts that fit, and takes those', () => {
    const model = twoFactorInteractions(20);
    const region = boxRegion(Array(20).fill(3), 0);
    const runs = 264;
    const fits = Math.floor(limitOf('searchWork') / passWork(model, region, runs));
    expect(fits).toBe(4);
    const error = expectInputError(() => checkSearchWork(model, region, runs, 20));
    expect(error.describe()).toMatch(
      new RegExp(`^key design\\.starts: 20 starts of a 264-run search for 211 model terms over 20 factors is \\d\\.\\de9 work units, above the limit of 4e8 work units \\(see "Limits" in the README\\); use at most 4 starts, fewer runs or a smaller model$`),
    );
    expect(() => checkSearchWork(model, region, runs, fits)).not.toThrow();
  });

  it('says when not even one start fits', () => {
    const model = twoFactorInteractions(30);
    const error = expectInputError(() => checkSearchWork(model, boxRegion(Array(30).fill(50), 0), 1000, 1));
    expect(error.message).toMatch(/even one start is too much: use fewer runs, a smaller model, fewer levels or fewer varied factors$/);
  });

  it('is checked by the planner before the region moments and the search', () => {
    const error = expectInputError(() => buildPlan(manyFactorStudy(20, 0.2, { model: 'interactions' }), options));
    expect(error.location.key).toBe('design.starts');
    expect(error.message).toMatch(/use at most 4 starts/);
  });
});
