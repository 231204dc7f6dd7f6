// `tierplan compare` on the invented spray-dryer sample, run as a user would (built CLI).
// Run counts follow the design definitions: 2^5 + 3 centre runs for the conventional plan
// over all five operating factors (common practice).
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../support/runCli.js';
import type { Comparison } from '../../src/core/compare/comparisonTypes.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';

const study = 'samples/spray-dryer/study.yaml';
let dir: string;
let planPath: string;
let plan: PlanDocument;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tierplan-compare-'));
  const result = runCli(['plan', study, '--json']);
  expect(result.status).toBe(0);
  plan = JSON.parse(result.stdout) as PlanDocument;
  planPath = join(dir, 'plan.json');
  writeFileSync(planPath, result.stdout);
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('tierplan compare', () => {
  it('plans a study and prints every comparator as JSON', () => {
    const result = runCli(['compare', study, '--json']);
    expect(result.status).toBe(0);
    const comparison = JSON.parse(result.stdout) as Comparison;
    expect(comparison.comparators.map((row) => row.id)).toEqual([
      'proposed', 'conventional', 'full-factorial', 'fractional', 'plackett-burman', 'full-grid', 'ccd-face', 'ccd-rotatable', 'box-behnken',
    ]);
    const conventional = comparison.comparators.find((row) => row.id === 'conventional')!;
    expect(conventional.runs).toBe(2 ** 5 + 3);
    expect(comparison.currency).toBe('EUR');
    expect(comparison.delta).toBe(2);
    expect(comparison.alpha).toBe(0.05);
    expect(comparison.comparators[0].fitsModel).toBe(true);
  });

  it('recomputes the same comparison from a saved plan.json as the plan embedded', () => {
    const result = runCli(['compare', planPath, '--json']);
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout)).toEqual(JSON.parse(JSON.stringify(plan.comparison)));
  });

  it('applies --delta and --alpha to the power column', () => {
    const base = plan.comparison!;
    const larger = JSON.parse(runCli(['compare', planPath, '--json', '--delta', '4', '--alpha', '0.1']).stdout) as Comparison;
    expect(larger.delta).toBe(4);
    expect(larger.alpha).toBe(0.1);
    expect(larger.comparators[0].minPower!).toBeGreaterThan(base.comparators[0].minPower!);
    expect(larger.comparators[0].runs).toBe(base.comparators[0].runs);
  });

  it('prints an aligned table, the verdicts and the summary', () => {
    const result = runCli(['compare', planPath]);
    expect(result.status).toBe(0);
    const lines = result.stdout.split('\n');
    const header = lines.find((line) => line.startsWith('Plan '))!;
    expect(header).toMatch(/Runs +Fits model +D-eff \[%\]/);
    expect(header).toContain('Cost [EUR]');
    const rule = lines[lines.indexOf(header) + 1];
    expect(rule).toMatch(/^-+( +-+)+$/);
    expect(result.stdout).toMatch(/^Proposed +25 +yes/m);
    expect(result.stdout).toMatch(/^Conventional 2\^5 +35 +no, /m);
    expect(result.stdout).toContain('What each plan means:');
    expect(lines.filter((line) => line.length > 0).at(-1)).toMatch(/^The proposed plan needs \d+ runs where the conventional full factorial needs 35/);
  });

  it('refuses a bad --delta with one line and exit code 2, printing nothing', () => {
    const result = runCli(['compare', planPath, '--delta', '-1']);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr).toMatch(/--delta must be a positive number/);
  });
});
