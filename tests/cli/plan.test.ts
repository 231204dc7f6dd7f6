/**
 * `tierplan plan` end to end on the bundled sample, and its refusals.
 */
import { mkdtempSync, readFileSync, readdirSync, writeFileSync, copyFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { LuDecomposition, Matrix } from 'ml-matrix';
import { repoRoot, runCli } from '../support/runCli.js';

const sampleDir = join(repoRoot, 'samples/spray-dryer');
const sample = join(sampleDir, 'study.yaml');
const OUTPUTS = ['plan.json', 'report.html', 'runsheet.csv', 'runsheet.xlsx', 'worksheets.html'];

/** A copy of the sample study with `edit` applied to its text, in a fresh folder. */
function editedSample(edit: (text: string) => string): string {
  const dir = mkdtempSync(join(tmpdir(), 'tierplan-plan-'));
  for (const name of ['indices.csv', 'interactions.csv']) copyFileSync(join(sampleDir, name), join(dir, name));
  writeFileSync(join(dir, 'study.yaml'), edit(readFileSync(sample, 'utf8')));
  return join(dir, 'study.yaml');
}

interface PlanRun {
  point: string;
  purpose: 'fit' | 'centre' | 'holdout';
  coded: Record<string, number>;
  settings: Record<string, number>;
}

/** One model-matrix row from the term strings of plan.json (`a`, `a^2`, `a*b`), intercept first. */
function modelRow(terms: string[], coded: Record<string, number>): number[] {
  return [
    1,
    ...terms.map((term) =>
      term.split('*').reduce((product, factor) => {
        const [id, power] = factor.split('^');
        return product * coded[id] ** Number(power ?? 1);
      }, 1),
    ),
  ];
}

/** ln det(X'X/N) and 100·|X'X|^(1/p)/N recomputed from the runs alone, with ml-matrix's LU. */
function criteriaFromRuns(plan: { model: { terms: string[] }; runs: PlanRun[] }): { logDetPerRun: number; dEfficiency: number } {
  const fit = plan.runs.filter((run) => run.purpose === 'fit');
  const X = new Matrix(fit.map((run) => modelRow(plan.model.terms, run.coded)));
  const N = X.rows;
  const p = X.columns;
  const determinant = new LuDecomposition(X.transpose().mmul(X).div(N)).determinant;
  return { logDetPerRun: Math.log(determinant), dEfficiency: 100 * determinant ** (1 / p) };
}

/** Written once by the first describe block and read by later ones (files run their blocks in order). */
const sampleOut = mkdtempSync(join(tmpdir(), 'tierplan-out-'));

describe('tierplan plan on the sample', () => {
  const out = sampleOut;
  const result = runCli(['plan', sample, '--out', out, '--starts', '6']);

  it('writes the five files and lists them', () => {
    expect(result.stderr).not.toMatch(/Error|at .*\.js/);
    expect(result.status).toBe(0);
    expect(readdirSync(out).sort()).toEqual(OUTPUTS);
    for (const name of OUTPUTS) expect(result.stdout).toContain(name);
  });

  it('writes a plan.json that satisfies the documented contract', () => {
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect(plan.formatVersion).toBe(1);
    expect(plan.checksum).toMatch(/^[0-9a-f]{64}$/);
    expect(plan.planId).toBe(`TP-${plan.checksum.slice(0, 10)}`);
    const { p, N, logDetPerRun, dEfficiency, boundEfficiency, iCriterion, seed } = plan.metrics;
    expect(N).toBeGreaterThanOrEqual(p);
    expect(Number.isFinite(logDetPerRun)).toBe(true);
    expect(dEfficiency).toBeGreaterThan(0);
    expect(dEfficiency).toBeLessThanOrEqual(100 + 1e-9);
    expect(boundEfficiency === null || (boundEfficiency > 50 && boundEfficiency <= 100 + 1e-6)).toBe(true);
    expect(iCriterion).toBeGreaterThan(0);
    expect(seed).toBe(20261201);
    expect(plan.model.terms).toContain('inlet_temp');
    expect(plan.model.explained[0].term).toBe('1');

    const purposes = plan.runs.map((run: { purpose: string }) => run.purpose);
    expect(purposes.filter((purpose: string) => purpose === 'fit')).toHaveLength(N);
    expect(purposes.filter((purpose: string) => purpose === 'centre')).toHaveLength(3);
    expect(purposes.filter((purpose: string) => purpose === 'holdout').length).toBeGreaterThanOrEqual(2);
    // Fixed factors appear in every run's settings; the sample fixes air_flow at its nominal (invented sample).
    for (const run of plan.runs) {
      expect(Object.keys(run.settings).sort()).toEqual(['air_flow', 'atomiser_speed', 'feed_rate', 'feed_solids', 'inlet_temp']);
      expect(run.settings.air_flow).toBe(400);
      // The sample's constraint: wet product when feed is high and inlet air cool.
      expect(run.settings.feed_rate).toBeLessThanOrEqual(0.2 * run.settings.inlet_temp - 18 + 1e-9);
    }
    expect(plan.comparison.comparators.map((row: { id: string }) => row.id)).toContain('conventional');
  });

  it('reports logDetPerRun and dEfficiency that the fitting runs reproduce', () => {
    // Definitions from Montgomery, Design and Analysis of Experiments (9th ed., §11.4):
    // logDetPerRun = ln det(X'X/N), D-efficiency = 100·|X'X|^(1/p)/N; recomputed here with ml-matrix's LU
    // from the coded runs and term strings of plan.json, not with tierplan's own Cholesky code.
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    const expected = criteriaFromRuns(plan);
    expect(plan.metrics.p).toBe(plan.model.terms.length + 1);
    expect(plan.metrics.logDetPerRun).toBeCloseTo(expected.logDetPerRun, 9);
    expect(plan.metrics.dEfficiency).toBeCloseTo(expected.dEfficiency, 9);
  });

  it('codes every run from its settings (low → −1, high → +1) and keeps holdouts off the fitting points', () => {
    const plan = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    const factor = new Map(plan.study.factors.map((f: { id: string; low: number; high: number }) => [f.id, f]));
    for (const run of plan.runs as PlanRun[]) {
      for (const [id, coded] of Object.entries(run.coded)) {
        const { low, high } = factor.get(id) as { low: number; high: number };
        expect(coded).toBeCloseTo((run.settings[id] - (low + high) / 2) / ((high - low) / 2), 9);
      }
    }
    const runs = plan.runs as PlanRun[];
    const key = (run: PlanRun) => JSON.stringify(run.coded);
    const fitted = new Set(runs.filter((run) => run.purpose === 'fit').map(key));
    const holdouts = runs.filter((run) => run.purpose === 'holdout');
    // Default holdout count max(2, round(0.2·N)) (common practice); N = 18 for the sample → 4.
    expect(holdouts).toHaveLength(Math.max(2, Math.round(0.2 * plan.metrics.N)));
    for (const run of holdouts) {
      expect(fitted.has(key(run))).toBe(false);
      for (const value of Object.values(run.coded)) expect(Math.abs(value)).toBeLessThan(1);
    }
    // Centre replicates sit at coded 0 when the constraints allow it (they do in the sample).
    for (const run of runs.filter((r) => r.purpose === 'centre')) expect(Object.values(run.coded).every((v) => v === 0)).toBe(true);
  });

  it('gives the same plan for the same seed', () => {
    const again = runCli(['plan', sample, '--json', '--starts', '6']);
    expect(again.status).toBe(0);
    const first = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect(JSON.parse(again.stdout).checksum).toBe(first.checksum);
  });

  it('refuses to overwrite a different plan without --force', () => {
    const other = runCli(['plan', sample, '--out', out, '--starts', '6', '--seed', '7']);
    expect(other.status).toBe(2);
    expect(other.stderr.trim().split('\n')).toHaveLength(1);
    const forced = runCli(['plan', sample, '--out', out, '--starts', '6', '--seed', '7', '--force']);
    expect(forced.status).toBe(0);
  }, 180_000);
});

describe('tierplan plan --json without --out', () => {
  it('prints the document and writes nothing', () => {
    const cwd = mkdtempSync(join(tmpdir(), 'tierplan-cwd-'));
    const result = runCli(['plan', sample, '--json', '--starts', '4'], { cwd });
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout).formatVersion).toBe(1);
    expect(readdirSync(cwd)).toEqual([]);
  });
});

describe('tierplan plan --criterion I', () => {
  it('finds a plan with a smaller average prediction variance than the D-optimal one', () => {
    // The sample without whole plots or sessions (the I-criterion applies to completely
    // randomised plans), both criteria at the same number of fitting runs so that only the
    // criterion differs.
    const study = editedSample((text) => text.replace('    hardToChange: true\n', '').replace(/\nsessions:\n(  .*\n)+/, '\n'));
    const dPlan = runCli(['plan', study, '--json', '--starts', '4', '--criterion', 'D', '--runs', '20']);
    const iPlan = runCli(['plan', study, '--json', '--starts', '4', '--criterion', 'I', '--runs', '20']);
    expect(dPlan.status).toBe(0);
    expect(iPlan.status).toBe(0);
    const d = JSON.parse(dPlan.stdout).metrics;
    const i = JSON.parse(iPlan.stdout).metrics;
    expect(d.criterion).toBe('D');
    expect(i.criterion).toBe('I');
    // I-optimality minimises trace((X'X)⁻¹W) (Atkinson, Donev & Tobias 2007, §10.6): the I-optimal
    // search must beat the D-optimal plan on that criterion, which in turn has the larger det.
    expect(i.iCriterion).toBeLessThan(d.iCriterion);
    expect(d.logDetPerRun).toBeGreaterThan(i.logDetPerRun);
    expect(i.N).toBe(d.N);
  });

  it('says so when the plan is laid out in whole plots and sessions, where it searches D', () => {
    const laid = JSON.parse(runCli(['plan', sample, '--json', '--starts', '2', '--criterion', 'I', '--runs', '21']).stdout);
    expect(laid.warnings).toContain('the I-criterion is not available for a plan laid out in whole plots or sessions: this plan is D-optimal for the structured model');
  });
});

describe('tierplan plan follows the study', () => {
  it('takes level counts and explicit levels per factor, and a preset model', () => {
    const study = editedSample((text) =>
      text
        .replace('    precision: 0.1\n', '    precision: 0.1\n    levels: [8, 9.5, 16]\n')
        .replace('    precision: 100\n', '    precision: 100\n    levels: 5\n')
        .replace('runs: auto', 'runs: auto\n  model: quadratic'),
    );
    const result = runCli(['plan', study, '--json', '--starts', '2']);
    expect(result.status).toBe(0);
    const plan = JSON.parse(result.stdout);
    const levels = new Map(plan.levels.map((level: { id: string }) => [level.id, level]));
    expect((levels.get('feed_rate') as { values: number[] }).values).toEqual([8, 9.5, 16]);
    expect((levels.get('feed_rate') as { coded: number[] }).coded).toEqual([-1, -0.625, 1]);
    expect((levels.get('atomiser_speed') as { values: number[] }).values).toEqual([15000, 17500, 20000, 22500, 25000]);
    // Full quadratic in the 4 varied factors: 1 + 4 + 4 + 6 terms.
    expect(plan.model.source).toBe('quadratic');
    expect(plan.metrics.p).toBe(15);
  });

  it('moves the centre runs to the nearest feasible point when the constraints exclude the centre, and says so', () => {
    const study = editedSample((text) =>
      text.replace(
        '- feed_rate <= 0.2 * inlet_temp - 18',
        '- feed_rate <= 0.2 * inlet_temp - 18\n  - not (abs(feed_rate - 12) < 1 and abs(inlet_temp - 180) < 5)',
      ),
    );
    const result = runCli(['plan', study, '--json', '--starts', '2']);
    expect(result.status).toBe(0);
    const plan = JSON.parse(result.stdout);
    const centres = (plan.runs as PlanRun[]).filter((run) => run.purpose === 'centre');
    expect(centres).toHaveLength(3);
    // Nearest by coded distance among levels and midpoints: inlet_temp 173 °C (coded −0.35), the rest at the centre.
    for (const run of centres) expect(run.settings).toEqual({ inlet_temp: 173, feed_solids: 37.5, feed_rate: 12, atomiser_speed: 20000, air_flow: 400 });
    expect(plan.warnings.join('\n')).toMatch(/nearest feasible point/);
  });

  it('explains the run count without a lack-of-fit test when there are no centre replicates, and credits --runs', () => {
    const study = editedSample((text) => text.replace('centreRuns: 3', 'centreRuns: 0'));
    const auto = JSON.parse(runCli(['plan', study, '--json', '--starts', '2']).stdout);
    expect(auto.metrics.runsNote).toMatch(/0 for pure error \(no replicated point\), so lack of fit cannot be tested/);
    expect(auto.runs.filter((run: PlanRun) => run.purpose === 'centre')).toHaveLength(0);
    const fixed = JSON.parse(runCli(['plan', study, '--json', '--starts', '2', '--runs', '20']).stdout);
    expect(fixed.metrics.N).toBe(20);
    expect(fixed.metrics.runsNote).toMatch(/--runs/);
  });
});

describe('tierplan plan refuses bad input with one line, exit 2 and nothing written', () => {
  const cases: [string, (text: string) => string, RegExp][] = [
    ['fewer runs than parameters', (text) => text.replace('runs: auto', 'runs: 5'), /design\.runs/],
    [
      'constraints that exclude every point',
      (text) => text.replace('- feed_rate <= 0.2 * inlet_temp - 18', '- feed_rate <= 0.01 * inlet_temp'),
      /constraint/i,
    ],
    ['an unknown id in a constraint', (text) => text.replace('- feed_rate <= 0.2', '- feed_rat <= 0.2'), /feed_rat/],
    ['a syntax error in a constraint', (text) => text.replace('- feed_rate <= 0.2 * inlet_temp - 18', '- feed_rate <= * inlet_temp'), /constraints\[0\]/],
    ['an unknown id in a model term', (text) => text.replace('runs: auto', 'runs: auto\n  model: [inlet_temp, feed_rte]'), /feed_rte/],
    ['a term on a fixed factor', (text) => text.replace('runs: auto', 'runs: auto\n  model: [inlet_temp, air_flow]'), /air_flow/],
    ['a power at or above the level count', (text) => text.replace('runs: auto', 'runs: auto\n  model: [inlet_temp, feed_rate, feed_rate^3]'), /feed_rate/],
    ['a syntax error in a model term', (text) => text.replace('runs: auto', 'runs: auto\n  model: [inlet_temp, "inlet_temp*"]'), /design\.model\[1\]/],
    ['an unknown function in a constraint', (text) => text.replace('- feed_rate <= 0.2', '- root(feed_rate) <= 0.2'), /unknown function root/],
    [
      'constraints that leave a factor too few settings for its terms',
      (text) => text.replace('- feed_rate <= 0.2 * inlet_temp - 18', '- feed_rate <= 12'),
      /cannot support the model: feed_rate has only 2 feasible settings of its 3 levels.*feed_rate\^2/,
    ],
    [
      'a precision that leaves fewer settings than levels',
      (text) => text.replace('    precision: 0.1\n', '    precision: 4\n    levels: 4\n'),
      /factors\[2\]\.precision.*only 3 distinct settings/,
    ],
  ];
  for (const [name, edit, pattern] of cases) {
    it(name, () => {
      const study = editedSample(edit);
      const out = join(mkdtempSync(join(tmpdir(), 'tierplan-bad-')), 'out');
      const result = runCli(['plan', study, '--out', out, '--starts', '2']);
      expect(result.status).toBe(2);
      const lines = result.stderr.trim().split('\n').filter((line) => !line.startsWith('warning:'));
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(pattern);
      expect(existsSync(out)).toBe(false);
    });
  }
});

describe('tierplan plan refuses bad options with one line naming the option', () => {
  const cases: [string, string[], RegExp][] = [
    ['fewer runs than parameters', ['--runs', '11'], /^tierplan: --runs 11: 11 fitting runs cannot estimate 12 model parameters/],
    ['a criterion other than D or I', ['--criterion', 'A'], /--criterion must be D or I/],
    ['a fractional run count', ['--runs', '1.5'], /--runs must be a whole number/],
  ];
  for (const [name, args, pattern] of cases) {
    it(name, () => {
      const out = join(mkdtempSync(join(tmpdir(), 'tierplan-bad-')), 'out');
      const result = runCli(['plan', sample, '--out', out, '--starts', '2', ...args]);
      expect(result.status).toBe(2);
      expect(result.stderr.trim().split('\n')).toHaveLength(1);
      expect(result.stderr).toMatch(pattern);
      expect(existsSync(out)).toBe(false);
    });
  }
});
