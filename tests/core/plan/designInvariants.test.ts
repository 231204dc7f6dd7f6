/**
 * Property tests of the plan's invariants over generated small studies (fast-check, fixed
 * seed): every planned run satisfies the constraints and the equipment limits; the requested
 * run counts are met exactly; the same seed gives the same plan; coded and engineering values
 * agree. A study the planner refuses with an InputError (an infeasible region, say) is a valid
 * outcome and is skipped; the test checks that most studies are planned.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildPlan } from '../../../src/core/plan/buildPlan.js';
import { buildCandidateRegion } from '../../../src/core/region/candidateRegion.js';
import { toCoded, toEngineering } from '../../../src/core/region/codedUnits.js';
import { defaultRunCount } from '../../../src/core/design/runCount.js';
import { InputError } from '../../../src/core/inputError.js';
import { DEFAULT_DESIGN, DEFAULT_POLICY, type Factor, type IndexRow, type Study } from '../../../src/core/study.js';
import type { PlanDocument } from '../../../src/core/plan/planDocument.js';

const SEED = 20260418;
const RUNS = 150;

const factorArbitrary = (j: number) =>
  fc.record({
    low: fc.constantFrom(0, -10, 20, 150),
    span: fc.constantFrom(1, 6, 40),
    precision: fc.option(fc.constantFrom(0.01, 0.1, 0.5), { nil: undefined }),
    limitMargin: fc.option(fc.constantFrom(0, 0.5), { nil: undefined }),
    levels: fc.option(fc.integer({ min: 2, max: 4 }), { nil: undefined }),
    total: fc.constantFrom(0.02, 0.1, 0.2, 0.4),
    hardToChange: fc.boolean(),
  }).map((drawn): { factor: Factor; row: IndexRow } => {
    const id = `x${j + 1}`;
    const high = drawn.low + drawn.span;
    const factor: Factor = { id, name: `Setting ${j + 1}`, unit: '-', role: 'operating', low: drawn.low, high, nominal: drawn.low + drawn.span / 2 };
    if (drawn.precision !== undefined) factor.precision = drawn.precision;
    if (drawn.limitMargin !== undefined) factor.limits = { low: drawn.low - drawn.limitMargin * drawn.span, high: high + drawn.limitMargin * drawn.span };
    if (drawn.levels !== undefined) factor.levels = drawn.levels;
    if (drawn.hardToChange) factor.hardToChange = true;
    return { factor, row: { factor: id, response: 'y', first: drawn.total * 0.8, total: drawn.total } };
  });

const studyArbitrary: fc.Arbitrary<Study> = fc
  .integer({ min: 1, max: 3 })
  .chain((k) =>
    fc.record({
      factors: fc.tuple(...Array.from({ length: k }, (_, j) => factorArbitrary(j))),
      cut: fc.option(fc.constantFrom(0.6, 0.8, 0.95), { nil: undefined }),
      runs: fc.option(fc.integer({ min: 0, max: 8 }), { nil: undefined }),
      centreRuns: fc.integer({ min: 0, max: 3 }),
      holdoutRuns: fc.oneof(fc.constant('auto' as const), fc.integer({ min: 0, max: 2 })),
      criterion: fc.constantFrom('D' as const, 'I' as const),
      seed: fc.integer({ min: 0, max: 2 ** 32 - 1 }),
      starts: fc.integer({ min: 1, max: 3 }),
    }),
  )
  .map((drawn) => {
    const factors = drawn.factors.map((entry) => entry.factor);
    const constraints: string[] = [];
    if (drawn.cut !== undefined && factors.length >= 2) {
      // Cuts off the corner where both settings are high.
      const [a, b] = factors;
      const limit = a.low + b.low + drawn.cut * (a.high - a.low + b.high - b.low);
      constraints.push(`${a.id} + ${b.id} <= ${limit}`);
    }
    return {
      title: 'Invented invariant study',
      factors,
      responses: [{ id: 'y', name: 'Yield', unit: '%', weight: 1 }],
      indices: drawn.factors.map((entry) => entry.row),
      interactions: [],
      policy: { ...DEFAULT_POLICY },
      // runs: a number of extra runs over the model size when drawn, else auto.
      design: { ...DEFAULT_DESIGN, runs: 'auto', centreRuns: drawn.centreRuns, holdoutRuns: drawn.holdoutRuns, criterion: drawn.criterion, seed: drawn.seed, starts: drawn.starts, extraRuns: drawn.runs },
      constraints,
      source: { studyFile: 'study.yaml', indicesFile: 'indices.csv' },
      warnings: [],
    } as Study & { design: { extraRuns?: number } };
  });

/** The plan, or null when the planner refuses the study with an InputError. */
function planOrRefusal(study: Study): PlanDocument | null {
  try {
    return buildPlan(study, { toolVersion: 'test', skipComparison: true });
  } catch (error) {
    if (error instanceof InputError) return null;
    throw error;
  }
}

/** Fixes design.runs to p + extra when the generator drew an extra count (p is known only after a first plan). */
function withRunCount(study: Study & { design: { extraRuns?: number } }): { study: Study; plan: PlanDocument } | null {
  const { extraRuns, ...design } = study.design;
  const auto = planOrRefusal({ ...study, design });
  if (auto === null) return null;
  if (extraRuns === undefined) return { study: { ...study, design }, plan: auto };
  const fixed = { ...study, design: { ...design, runs: auto.metrics.p + extraRuns } };
  const plan = planOrRefusal(fixed);
  return plan === null ? null : { study: fixed, plan };
}

describe('design invariants', () => {
  it('every run feasible, run counts exact, same seed same plan, coded and engineering values agree', () => {
    let planned = 0;
    fc.assert(
      fc.property(studyArbitrary, (generated) => {
        const result = withRunCount(generated as Study & { design: { extraRuns?: number } });
        if (result === null) return;
        planned++;
        const { study, plan } = result;
        const byPurpose = (purpose: string) => plan.runs.filter((run) => run.purpose === purpose);

        // Requested run counts, exactly.
        const expectedFit = study.design.runs === 'auto' ? defaultRunCount(plan.metrics.p, study.design.centreRuns).runs : study.design.runs;
        expect(byPurpose('fit')).toHaveLength(expectedFit);
        expect(byPurpose('centre')).toHaveLength(study.design.centreRuns);
        if (study.design.holdoutRuns !== 'auto') expect(byPurpose('holdout')).toHaveLength(study.design.holdoutRuns);
        expect(plan.schedule?.order ?? plan.schedule).toBeTruthy();

        // Feasible: constraints and equipment limits, on the region rebuilt from the study.
        const region = buildCandidateRegion(study.factors, plan.levels, study.constraints);
        const varied = plan.levels.filter((level) => level.varied);
        for (const run of plan.runs) {
          expect(region.isFeasible(varied.map((level) => run.coded[level.id])), `${run.point} feasible`).toBe(true);
          for (const factor of study.factors) {
            const setting = run.settings[factor.id];
            expect(setting, `${run.point} sets ${factor.id}`).toBeTypeOf('number');
            if (factor.limits) {
              expect(setting).toBeGreaterThanOrEqual(factor.limits.low);
              expect(setting).toBeLessThanOrEqual(factor.limits.high);
            }
            expect(setting).toBeGreaterThanOrEqual(factor.low);
            expect(setting).toBeLessThanOrEqual(factor.high);
          }
        }

        // Coded and engineering values agree: a fit run sits on planned levels (value and code
        // as listed); every run's setting is its coded value in engineering units, rounded to
        // the precision (within half a step), and codes back to it.
        for (const run of plan.runs) {
          for (const level of varied) {
            const factor = study.factors.find((candidate) => candidate.id === level.id)!;
            const coded = run.coded[level.id];
            const setting = run.settings[level.id];
            if (run.purpose === 'fit') {
              const at = level.coded.findIndex((value) => Math.abs(value - coded) < 1e-12);
              expect(at, `${run.point} ${level.id} on a level`).toBeGreaterThanOrEqual(0);
              expect(setting).toBeCloseTo(level.values[at], 9);
            }
            const halfStep = (factor.precision ?? 0) / 2 + 1e-9 * Math.max(1, Math.abs(setting));
            expect(Math.abs(setting - toEngineering(factor, coded))).toBeLessThanOrEqual(halfStep);
            expect(toCoded(factor, setting)).toBeCloseTo(coded, 9);
          }
          for (const level of plan.levels.filter((candidate) => !candidate.varied)) expect(run.settings[level.id]).toBe(level.fixedAt);
        }

        // Same seed, same plan.
        const again = buildPlan(study, { toolVersion: 'test', skipComparison: true });
        expect(again.runs).toEqual(plan.runs);
        expect(again.schedule).toEqual(plan.schedule);
        expect(again.metrics).toEqual(plan.metrics);
      }),
      { seed: SEED, numRuns: RUNS },
    );
    // Not vacuous: most generated studies are planned.
    expect(planned).toBeGreaterThan(RUNS / 2);
  }, 120_000);
});
