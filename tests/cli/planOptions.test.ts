/**
 * The options `tierplan plan` shares with the study's `policy` and `design` keys: the tier
 * overrides (one definition with `tierplan tiers`), the centre and holdout run counts, and
 * their refusals, each one line naming the option.
 *
 * Expected tiers worked out by hand from samples/spray-dryer/indices.csv (see tiers.test.ts):
 * mean total indices inlet_temp 0.365, feed_solids 0.32, feed_rate 0.18, atomiser_speed
 * 0.1125, air_flow 0.0425; the largest total of air_flow over the responses is 0.07.
 */
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repoRoot, runCli } from '../support/runCli.js';

const sample = join(repoRoot, 'samples/spray-dryer/study.yaml');

interface PlanJson {
  tiers: { policy: { critical: number; aggregate: string }; factors: { id: string; tier: string }[] };
  metrics: { p: number; N: number };
  runs: { purpose: string }[];
}

function planJson(args: string[]): PlanJson {
  const result = runCli(['plan', sample, '--json', '--starts', '2', ...args]);
  expect(result.stderr).not.toMatch(/Error|at .*\.js/);
  expect(result.status).toBe(0);
  return JSON.parse(result.stdout) as PlanJson;
}

const tierOf = (plan: PlanJson, id: string) => plan.tiers.factors.find((factor) => factor.id === id)?.tier;
const count = (plan: PlanJson, purpose: string) => plan.runs.filter((run) => run.purpose === purpose).length;

describe('tierplan plan: centre and holdout runs from the command line', () => {
  it('adds them on top of the fitting runs (18 here, set by --runs)', () => {
    const plan = planJson(['--runs', '18', '--centre-runs', '5', '--holdout-runs', '2']);
    expect(plan.metrics.p).toBe(12);
    expect(plan.metrics.N).toBe(18);
    expect(count(plan, 'fit')).toBe(18);
    expect(count(plan, 'centre')).toBe(5);
    expect(count(plan, 'holdout')).toBe(2);
  });

  it('says "1 centre replicate" and notes that one replicate gives no pure error', () => {
    const result = runCli(['plan', sample, '--starts', '2', '--runs', '18', '--centre-runs', '1', '--holdout-runs', '0']);
    expect(result.status).toBe(0);
    expect(result.stdout).toContain('Runs: 18 fitting + 1 centre replicate + 0 holdout (validation only, not used for fitting) = 19 ');
    expect(result.stdout).toMatch(/0 for pure error \(no replicated point\), so lack of fit cannot be tested/);
  });
});

describe('tierplan plan: tier overrides, as tierplan tiers has them', () => {
  it('--critical 0.37 makes inlet_temp (0.365) and feed_solids (0.32) moderate', () => {
    const plan = planJson(['--critical', '0.37']);
    expect(plan.tiers.policy.critical).toBe(0.37);
    expect(tierOf(plan, 'inlet_temp')).toBe('moderate');
    expect(tierOf(plan, 'feed_solids')).toBe('moderate');
    // No critical factor is left, so no cubic term: intercept, 4 main effects, 4 squares and the
    // 3 pairs at or above 0.05 in interactions.csv = 12 (14 with the two cubic terms of the default).
    expect(plan.metrics.p).toBe(12);
  });

  it('--aggregate max makes air_flow moderate (largest total 0.07 ≥ 0.05; its mean 0.0425 is not)', () => {
    const plan = planJson(['--aggregate', 'max']);
    expect(plan.tiers.policy.aggregate).toBe('max');
    expect(tierOf(plan, 'air_flow')).toBe('moderate');
  });
});

describe('tierplan plan refuses option values in one line naming the option', () => {
  // A study path that does not exist: option values are checked before any file is read.
  const missing = join(tmpdir(), 'no-such-folder', 'study.yaml');
  it.each([
    [['--critical', '1.5'], /^tierplan: --critical must be a number strictly between 0 and 1 \(such as 0\.3\), not "1\.5"$/],
    [['--moderate', 'abc'], /^tierplan: --moderate must be a number strictly between 0 and 1/],
    [['--aggregate', 'median'], /^tierplan: --aggregate must be mean, max or weighted, not "median"$/],
    [['--confidence', 'lower'], /^tierplan: --confidence must be point or upper, not "lower"$/],
    [['--centre-runs', '-1'], /^tierplan: --centre-runs must be a whole number from 0 to 100, not -1$/],
    [['--holdout-runs', '1.5'], /^tierplan: --holdout-runs must be a whole number from 0 to 200, not 1\.5$/],
  ])('%j', (args, pattern) => {
    const result = runCli(['plan', missing, ...args]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr.trim()).toMatch(pattern);
  });

  it('blames a cut-off order broken by an option on the option', () => {
    const result = runCli(['plan', sample, '--moderate', '0.4']);
    expect(result.status).toBe(2);
    expect(result.stderr.trim()).toBe(
      'tierplan: the moderate cut-off must be below the critical one: --moderate 0.4 is not below critical 0.3 (from the study)',
    );
  });

  it('refuses --holdout-runs past its limit on the option, and writes nothing', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'tierplan-holdout-')), 'out');
    const result = runCli(['plan', sample, '--starts', '2', '--holdout-runs', '500', '--out', out]);
    expect(result.status).toBe(2);
    expect(result.stderr.trim()).toBe('tierplan: --holdout-runs 500: 500 runs is above the limit of 200 runs (see "Limits" in the README)');
    expect(existsSync(out)).toBe(false);
  });
});
