/**
 * Plans with hard-to-change factors and sessions, end to end through buildPlan: the whole
 * plots and sessions every run carries, the GLS figures of plan.json recomputed from the runs
 * alone, the whole-plot count rule, and the refusals and warnings of the study keys
 * design.wholePlots and design.varianceRatio.
 *
 * The recomputation is independent of the code under test: V = I + ηZZ' and its inverse are
 * formed explicitly with ml-matrix (a general-purpose reference library), X'V⁻¹X and the
 * session-adjusted information (the Schur complement of the session columns in [X B]'V⁻¹[X B];
 * Searle, 1971, "Linear Models", §5.2, for the absorption of nuisance effects) are computed
 * from their definitions, not from the closed forms of glsInformation.ts.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { Matrix, determinant, inverse } from 'ml-matrix';
import { buildPlan } from '../../../src/core/plan/buildPlan.js';
import { loadStudy } from '../../../src/io/studyFile.js';
import { compileModel, modelMatrix } from '../../../src/core/model/modelMatrix.js';
import { parseTerm } from '../../../src/core/model/termSyntax.js';
import type { PlanDocument } from '../../../src/core/plan/planDocument.js';
import type { Study } from '../../../src/core/study.js';
import { manyFactorStudy } from './manyFactorStudy.js';
import { expectInputError } from '../../support/expectInputError.js';

const options = { toolVersion: 'test', skipComparison: true };

/** The fitted runs' model matrix, whole plots and sessions, read off plan.json alone. */
function fittedOf(plan: PlanDocument) {
  const ids = plan.levels.filter((level) => level.varied).map((level) => level.id);
  const terms = [{ powers: {} }, ...plan.model.terms.map((label) => ({ powers: parseTerm(label, ids) }))];
  const model = compileModel(terms, ids);
  const order = plan.schedule!.order.map((entry) => plan.runs.find((run) => run.point === entry.point)!);
  const fitted = order.filter((run) => run.purpose !== 'holdout');
  const X = modelMatrix(model, fitted.map((run) => ids.map((id) => run.coded[id])));
  return { model, fitted, X: new Matrix(Array.from({ length: fitted.length }, (_, i) => Array.from(X.subarray(i * model.p, (i + 1) * model.p)))) };
}

/** ln det(X'V⁻¹X / n) and the information kept by the sessions, from their definitions. */
function glsByDefinition(plan: PlanDocument) {
  const { model, fitted, X } = fittedOf(plan);
  const n = fitted.length;
  const p = model.p;
  const eta = plan.metrics.gls!.varianceRatio;
  const V = Matrix.eye(n, n);
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      const plotA = fitted[a].wholePlot ?? `run ${a}`;
      const plotB = fitted[b].wholePlot ?? `run ${b}`;
      if (plotA === plotB) V.set(a, b, V.get(a, b) + eta);
    }
  }
  const Vi = inverse(V);
  const M = X.transpose().mmul(Vi).mmul(X);
  const logDetPerRun = Math.log(determinant(M.clone().div(n)));
  const sessions = [...new Set(fitted.map((run) => run.session!))].sort((a, b) => a - b);
  // Session indicators B; the intercept column of X is replaced by them.
  const B = new Matrix(n, sessions.length);
  fitted.forEach((run, i) => B.set(i, sessions.indexOf(run.session!), 1));
  const X1 = X.subMatrix(0, n - 1, 1, p - 1);
  const schur = (Z: Matrix) => {
    const A = X1.transpose().mmul(Vi).mmul(X1);
    const C = X1.transpose().mmul(Vi).mmul(Z);
    const D = Z.transpose().mmul(Vi).mmul(Z);
    return A.sub(C.mmul(inverse(D)).mmul(C.transpose()));
  };
  const one = Matrix.ones(n, 1);
  const kept = Math.pow(determinant(schur(B)) / determinant(schur(one)), 1 / (p - 1));
  return { logDetPerRun, kept, sessions: sessions.length };
}

describe('the sample plan laid out in whole plots and sessions', () => {
  let plan: PlanDocument;
  beforeAll(async () => {
    const study = await loadStudy('samples/spray-dryer/study.yaml');
    plan = buildPlan(study, options);
  }, 240_000);

  it('gives every run a 1-based whole plot, consecutive in run order, and a session', () => {
    const order = plan.schedule!.order.map((entry) => plan.runs.find((run) => run.point === entry.point)!);
    let last = 0;
    for (const run of order) {
      expect(run.wholePlot === last || run.wholePlot === last + 1).toBe(true);
      last = run.wholePlot!;
      expect(Number.isInteger(run.session) && run.session! >= 1).toBe(true);
    }
    expect(order[0].wholePlot).toBe(1);
    // Sessions never go back in run order, and hold at most sessions.maxRuns runs.
    const sessions = order.map((run) => run.session!);
    expect([...sessions].sort((a, b) => a - b)).toEqual(sessions);
    for (const s of new Set(sessions)) expect(sessions.filter((value) => value === s).length).toBeLessThanOrEqual(plan.study.sessions!.maxRuns);
  });

  it('keeps the hard-to-change setting constant inside every whole plot, and one whole plot inside one session', () => {
    const byPlot = new Map<number, PlanDocument['runs']>();
    for (const run of plan.runs) byPlot.set(run.wholePlot!, [...(byPlot.get(run.wholePlot!) ?? []), run]);
    for (const members of byPlot.values()) {
      expect(new Set(members.map((run) => run.settings.inlet_temp)).size).toBe(1);
      expect(new Set(members.map((run) => run.session)).size).toBe(1);
    }
    // A true split-plot plan: some whole plot holds more than one run.
    expect(Math.max(...[...byPlot.values()].map((members) => members.length))).toBeGreaterThan(1);
  });

  it('varies no factor in step with the days: every varied factor takes two or more settings in some session', () => {
    for (const level of plan.levels.filter((entry) => entry.varied)) {
      const perSession = new Map<number, Set<number>>();
      for (const run of plan.runs) perSession.set(run.session!, (perSession.get(run.session!) ?? new Set()).add(run.settings[level.id]));
      expect([...perSession.values()].some((values) => values.size > 1), level.id).toBe(true);
    }
  });

  it('records GLS figures that recompute from the runs, whole plots and sessions alone', () => {
    const reference = glsByDefinition(plan);
    expect(plan.metrics.gls!.varianceRatio).toBe(1);
    expect(plan.metrics.gls!.logDetPerRun!).toBeCloseTo(reference.logDetPerRun, 8);
    expect(plan.metrics.blocks!.sessions).toBe(reference.sessions);
    expect(plan.metrics.blocks!.informationKept!).toBeCloseTo(reference.kept, 8);
    // No model term is confounded with the days.
    expect(plan.metrics.blocks!.informationKept!).toBeGreaterThan(0.5);
  });

  it('echoes the whole plots and the variance ratio it used, and compares three ways of running it', () => {
    const fitPlots = new Set(plan.runs.filter((run) => run.purpose === 'fit').map((run) => run.wholePlot)).size;
    expect(plan.study.design.wholePlots).toBe(fitPlots);
    expect(plan.study.design.varianceRatio).toBe(1);
    const split = plan.splitPlot!;
    expect(split.choices.map((choice) => choice.plan)).toEqual(['randomised', 'splitPlot', 'groupedThenCut']);
    const [randomised, splitPlot, grouped] = split.choices;
    expect(splitPlot.resets).toBe(plan.schedule!.hardToChange!.levelChanges);
    expect(randomised.resets).toBe(plan.runs.length - 1);
    expect(splitPlot.resets).toBeLessThan(randomised.resets);
    // The split-plot plan meets the target; grouping after the fact leaves the hard factor nearly blind.
    expect(splitPlot.weakestPower!).toBeGreaterThanOrEqual(0.8);
    expect(grouped.hardFactorPower!).toBeLessThan(0.5);
    expect(split.analysis).toMatch(/random effect for each whole plot and fixed day effects/);
  });
});

describe('GLS figures of a plan with no whole plots', () => {
  it('with eta 0 and one session equal the ordinary ln det(X′X / n) over the fitted runs, nothing lost to blocks', () => {
    const plan = buildPlan(manyFactorStudy(3, 0.2, { runs: 12, varianceRatio: 0, starts: 4 }), options);
    const { fitted, X } = fittedOf(plan);
    const ordinary = Math.log(determinant(X.transpose().mmul(X).div(fitted.length)));
    expect(plan.metrics.gls!.logDetPerRun!).toBeCloseTo(ordinary, 9);
    expect(plan.metrics.blocks).toEqual({ sessions: 1, informationKept: 1 });
    expect(plan.splitPlot).toBeUndefined();
  });
});

/** A 3-setting study with the first setting hard to change, fixed run count. */
function hardStudy(design: Partial<Study['design']>, sessions?: Study['sessions']): Study {
  const study = manyFactorStudy(3, 0.2, { runs: 16, starts: 4, ...design });
  study.factors[0].hardToChange = true;
  if (sessions) study.sessions = sessions;
  return study;
}

describe('the whole-plot study keys', () => {
  it('lays a fixed count of whole plots out as asked, and tests the hard factor against the whole-plot error', () => {
    const plan = buildPlan(hardStudy({ wholePlots: 6 }), options);
    expect(new Set(plan.runs.filter((run) => run.purpose === 'fit').map((run) => run.wholePlot)).size).toBe(6);
    // Containment rule: 6 fitting whole plots + 3 centre whole plots − 1 (one session) − 2 terms in x1 alone.
    expect(plan.precision.wholePlotDf).toBe(6 + 3 - 1 - 2);
    expect(plan.splitPlot!.wholePlotsSetBy).toBe('set by the study (design.wholePlots)');
  });

  it('refuses more whole plots than fitting runs', () => {
    const error = expectInputError(() => buildPlan(hardStudy({ wholePlots: 17 }), options));
    expect(error.location.key).toBe('design.wholePlots');
    expect(error.message).toBe('17 whole plots cannot be made from 16 fitting runs; use at most 16 whole plots, or more runs');
  });

  it('refuses sessions too small to hold one whole plot', () => {
    const error = expectInputError(() => buildPlan(hardStudy({ wholePlots: 2 }, { maxRuns: 4, label: 'Day' }), options));
    expect(error.location.key).toBe('sessions.maxRuns');
    expect(error.message).toMatch(/^a session of at most 4 runs cannot hold a whole plot of 8 runs/);
  });

  it('warns, without refusing, when a hard-to-change factor ends up held fixed', () => {
    const study = hardStudy({});
    study.factors.push({ id: 'x9', name: 'Jacket temperature', unit: '°C', role: 'operating', low: 20, high: 40, nominal: 30, hardToChange: true });
    study.indices.push({ factor: 'x9', response: 'y', first: 0.001, total: 0.002 });
    const plan = buildPlan(study, options);
    expect(plan.warnings).toContain('Jacket temperature is hard to change but held fixed by the plan, so it needs no changes');
  });
});
