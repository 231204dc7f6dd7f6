/**
 * The plan pipeline sized to the precision target, on a small invented three-factor study
 * (fixed seed, a 48-point grid): every power in the precision block is recomputed from the
 * plan's own runs with the formula of the joint F test (λ = b′C_TT⁻¹b/σ², C = (X′X)⁻¹ over
 * the fitted runs — fitting runs and centre replicates, holdouts excluded — inverted here
 * with ml-matrix, not with the planner's own kernels), and one run fewer, re-optimised with
 * four times the starts, no longer meets the target.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, inverse } from 'ml-matrix';
import { buildPlan } from '../../../src/core/plan/buildPlan.js';
import { fTestPower } from '../../../src/core/distribution/noncentralF.js';
import { DEFAULT_DESIGN, DEFAULT_POLICY, type Factor, type Study } from '../../../src/core/study.js';

const factor = (id: string, low: number, high: number): Factor => ({ id, name: id, unit: 'u', role: 'operating', low, high, nominal: (low + high) / 2 });

function study(overrides: Partial<Study['design']> = {}, noise: number | null = 0.9): Study {
  return {
    title: 'Three-factor precision case (invented)',
    factors: [factor('a', 0, 10), factor('b', 0, 10), factor('c', 0, 10), factor('d', 0, 10)],
    responses: [{ id: 'y', name: 'Yield', unit: '%', weight: 1, spread: 2, ...(noise === null ? {} : { noise }) }],
    indices: [
      { factor: 'a', response: 'y', first: 0.45, total: 0.5 },
      { factor: 'b', response: 'y', first: 0.3, total: 0.35 },
      { factor: 'c', response: 'y', first: 0.08, total: 0.1 },
      { factor: 'd', response: 'y', first: 0.01, total: 0.01 },
    ],
    interactions: [],
    policy: DEFAULT_POLICY,
    design: { ...DEFAULT_DESIGN, seed: 7, starts: 8, holdoutRuns: 0, ...overrides },
    constraints: [],
    source: { studyFile: 'case.yaml', indicesFile: 'case.csv' },
    warnings: [],
  };
}

/** One model-matrix row from the term strings of plan.json (`a`, `a^2`, `a*b`), intercept first. */
function modelRow(terms: string[], coded: Record<string, number>): number[] {
  return [1, ...terms.map((term) => term.split('*').reduce((product, part) => {
    const [id, power] = part.split('^');
    return product * coded[id] ** Number(power ?? 1);
  }, 1))];
}

describe('plans sized to the precision target', () => {
  const plan = buildPlan(study(), { toolVersion: 'test', skipComparison: true });
  const { precision } = plan;

  it('chooses the smallest run count that meets the target, above the estimability floor', () => {
    expect(precision.basis).toBe('predicted');
    expect(precision.met).toBe(true);
    expect(plan.model.potential).toEqual(['a^3', 'b^3']);
    const N = plan.metrics.N;
    expect(N).toBeGreaterThan(plan.metrics.p);
    const last = precision.runCurve.find((point) => point.runs === N)!;
    const fewer = precision.runCurve.find((point) => point.runs === N - 1)!;
    expect(last.weakestPower!).toBeGreaterThanOrEqual(0.8);
    expect(fewer.weakestPower!).toBeLessThan(0.8);
    expect(precision.weakest).toEqual(precision.factors.find((entry) => entry.power === Math.min(...precision.factors.map((e) => e.power!))));
  });

  it('reports powers that the formula gives from the plan’s own fitted runs', () => {
    const fitted = plan.runs.filter((run) => run.purpose !== 'holdout');
    expect(fitted.length).toBe(plan.metrics.N + plan.study.design.centreRuns);
    const terms = plan.model.terms;
    const X = new Matrix(fitted.map((run) => modelRow(terms, run.coded)));
    const C = inverse(X.transpose().mmul(X));
    const nu = fitted.length - X.columns;
    expect(precision.factors.map((entry) => entry.factor)).toEqual(['a', 'b', 'c']);
    for (const entry of precision.factors) {
      // β = √(3·S)·spread (the linear trend a first-order index implies), σ = noise.
      const S = plan.study.indices.find((row) => row.factor === entry.factor)!.first;
      expect(entry.effect).toBeCloseTo(Math.sqrt(3 * S) * 2, 12);
      const block = terms.map((term, t) => ({ term, column: t + 1 })).filter(({ term }) => term === entry.factor || term.startsWith(`${entry.factor}^`));
      const columns = block.map(({ column }) => column);
      const CTT = new Matrix(columns.map((i) => columns.map((j) => C.get(i, j))));
      const b = Matrix.columnVector(block.map(({ term }) => (term === entry.factor ? entry.effect : 0)));
      const lambda = b.transpose().mmul(inverse(CTT)).mmul(b).get(0, 0) / 0.9 ** 2;
      expect(entry.power!).toBeCloseTo(fTestPower(columns.length, nu, lambda, 0.05), 9);
    }
  });

  it('misses the target with one run fewer, re-optimised with four times the starts', () => {
    const fewer = buildPlan(study({ runs: plan.metrics.N - 1, starts: 32, seed: 8 }), { toolVersion: 'test', skipComparison: true });
    expect(fewer.metrics.N).toBe(plan.metrics.N - 1);
    expect(fewer.precision.met).toBe(false);
    expect(fewer.precision.weakest!.power!).toBeLessThan(0.8);
  });

  it('falls back to the run-count rule without noise, saying so in one sentence', () => {
    const unjudged = buildPlan(study({}, null), { toolVersion: 'test', skipComparison: true });
    expect(unjudged.precision.basis).toBe('none');
    expect(unjudged.precision.met).toBe(false);
    expect(unjudged.precision.factors).toEqual([]);
    expect(unjudged.precision.statement).toMatch(/^No response gives noise .*precision cannot be judged.*rule of thumb.*\.$/);
    expect(unjudged.precision.statement!.split('. ').length).toBe(1);
    const p = unjudged.metrics.p;
    expect(unjudged.metrics.N).toBe(p + Math.max(3, Math.ceil(p / 4)));
  });
});
