/**
 * The augmentation takes the runs already done (X₀) where they were actually made: a run
 * whose sheet records an "as run" value enters X₀ at that value, not at its set-point.
 * Plan: the hand-made fixture of tests/fixtures/plan (INVENTED); results: an invented smooth
 * function of the settings, no noise. The determinant |X₀′X₀ + X′X| is computed with an
 * outside library (ml-matrix's LU determinant), not with the kernels under test.
 */
import { Matrix, determinant } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import type { PlanDocument } from '../../../src/core/plan/planDocument.js';
import { analyzeCampaign, type SheetResults } from '../../../src/core/results/campaignAnalysis.js';
import { augmentPlan } from '../../../src/core/results/augmentPlan.js';
import { scheduleRuns } from '../../../src/core/schedule/scheduleRuns.js';
import { sprayDryerPlan } from '../../fixtures/plan/sprayDryerPlan.js';

function fixturePlan(): PlanDocument {
  const plan = sprayDryerPlan();
  plan.schedule = scheduleRuns(plan, 20261201);
  return plan;
}

/** Every run done, an invented result per response, and the given as-run values per point. */
function sheetOf(plan: PlanDocument, asRun: Record<string, Record<string, number>> = {}): SheetResults {
  const pointOf = new Map(plan.runs.map((run) => [run.point, run]));
  return {
    planId: plan.planId,
    checksum: plan.checksum,
    warnings: [],
    runs: plan.schedule!.order.map((scheduled) => {
      const { coded } = pointOf.get(scheduled.point)!;
      const value = 5 + coded.inlet_temp - 0.5 * coded.feed_rate + 0.3 * coded.atomiser_speed + 0.4 * coded.inlet_temp ** 2;
      return {
        run: scheduled.sequence,
        point: scheduled.point,
        asRun: asRun[scheduled.point] ?? {},
        results: Object.fromEntries(plan.study.responses.map((response) => [response.id, value])),
        notDone: false,
      };
    }),
  };
}

/** Model row of a coded point for terms in the plan's syntax (`a`, `a*b`, `a^2`). */
function modelRow(terms: string[], point: Record<string, number>): number[] {
  return [1, ...terms.map((term) => term.split('*').reduce((v, part) => v * point[part.split('^')[0]] ** Number(part.split('^')[1] ?? 1), 1))];
}

function logDet(rows: number[][]): number {
  const X = new Matrix(rows);
  return Math.log(determinant(X.transpose().mmul(X)));
}

describe('augmentation from the runs as they were made', () => {
  it('puts a run with an as-run value into X₀ at that value, and chooses the added runs for it', () => {
    const plan = fixturePlan();
    const terms = plan.model.terms;
    // F01 was planned at a corner; at the bench the inlet ran 20 °C inside it (coded 0.5 in from ±1).
    const deviated = plan.runs.find((run) => run.purpose === 'fit' && Math.abs(run.coded.inlet_temp) === 1)!;
    const inletAsRun = deviated.settings.inlet_temp - 10 * deviated.coded.inlet_temp;
    const asRunSheet = sheetOf(plan, { [deviated.point]: { inlet_temp: inletAsRun, feed_rate: 11 } });
    const plainSheet = sheetOf(plan);
    const analysis = analyzeCampaign(plan, plainSheet, { file: 'invented.csv', sheet: null, toolVersion: 'test' });
    const request = { runs: 2, model: terms };
    const asRun = augmentPlan(plan, asRunSheet, analysis, request).plan;
    const setPoints = augmentPlan(plan, plainSheet, analysis, request).plan;
    const addedOf = (revision: PlanDocument) => revision.runs.slice(plan.runs.length).map((run) => run.coded);
    // The revision keeps the planned points of the parent's runs either way.
    expect(asRun.runs.slice(0, plan.runs.length)).toEqual(plan.runs);

    // X₀ as made: (inlet as run − 180) / 20 = the planned coded value halved; feed rate 11 kg/h = coded 0.
    const madeAt = plan.runs.map((run) =>
      run.point === deviated.point ? { ...run.coded, inlet_temp: (inletAsRun - 180) / 20, feed_rate: 0 } : run.coded,
    );
    expect(madeAt.find((_, i) => plan.runs[i].point === deviated.point)!.inlet_temp).toBeCloseTo(deviated.coded.inlet_temp / 2, 12);
    const X0 = madeAt.map((point) => modelRow(terms, point));
    const withAdded = (added: Record<string, number>[]) => logDet([...X0, ...added.map((point) => modelRow(terms, point))]);
    // The set-point augmentation answers another X₀: its choice is not the as-run one, and is worse for the runs as made.
    expect(addedOf(asRun)).not.toEqual(addedOf(setPoints));
    expect(withAdded(addedOf(asRun))).toBeGreaterThan(withAdded(addedOf(setPoints)) + 1e-6);
    // And no pair of grid points does better for the runs as made (exhaustive over the 18-point grid).
    const grid: Record<string, number>[] = [];
    for (const a of [-1, 0, 1]) for (const b of [-1, 0, 1]) for (const c of [-1, 1]) grid.push({ inlet_temp: a, feed_rate: b, atomiser_speed: c });
    let best = Number.NEGATIVE_INFINITY;
    for (let i = 0; i < grid.length; i++) for (let j = i; j < grid.length; j++) best = Math.max(best, withAdded([grid[i], grid[j]]));
    expect(withAdded(addedOf(asRun))).toBeCloseTo(best, 9);
  });
});
