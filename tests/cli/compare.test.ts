// `tierplan compare` on the invented spray-dryer sample, run as a user would (built CLI).
// Run counts follow the design definitions: 2^5 + 3 centre runs for the conventional plan
// over all five operating factors (common practice).
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
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

  it('prints the decision first, then aligned tables, the term-by-term powers, the column notes and the verdicts', () => {
    const result = runCli(['compare', planPath]);
    expect(result.status).toBe(0);
    const lines = result.stdout.split('\n');
    expect(lines[2]).toMatch(/^Decision: The proposed plan needs 28 runs where the conventional full factorial needs 35: 7 fewer/);
    const header = lines.find((line) => line.startsWith('Plan ') && line.includes('Fit runs'))!;
    expect(header).toMatch(/Fit runs +Fits model +D-eff \[%\] +Info\/run +Info total +Avg var \[σ²\] +Min power \[%\]/);
    const rule = lines[lines.indexOf(header) + 1];
    expect(rule).toMatch(/^-+( +-+)+$/);
    // Every row of a table is as wide as its rule or narrower (aligned columns, no wrapped cells).
    for (const line of lines.slice(lines.indexOf(header), lines.indexOf(header) + 11)) expect(line.length).toBeLessThanOrEqual(rule.length);
    expect(result.stdout).toMatch(/^Proposed +24 +yes +\d+\.\d +1\.00 +1\.00 /m); // 21 model + 3 centre runs are fitted
    expect(result.stdout).toMatch(/^Conventional 2\^5 +35 +no, 3 terms/m);
    const costHeader = lines.find((line) => line.startsWith('Plan ') && line.includes('Cost [EUR]'))!;
    expect(costHeader).toMatch(/Runs +Off limits +Level changes +Cost \[EUR\] +Time \[h\] +Runs saved +Cost saved \[EUR\]/);
    // 35 − 23 = 12 runs, 34.3 % of 35, printed as a whole per cent (common practice).
    expect(result.stdout).toMatch(/^Conventional 2\^5 +35 +\d+ +\d+ +29,990 +106\.4 +7 \(20 %\) +[\d,]+ \(\d+ %\)$/m);
    expect(result.stdout).toMatch(/^feed_solids\^2 +\d\.\d{3} +\d+\.\d +\d+$/m); // power: whole per cent (numberText.ts)
    expect(result.stdout).toContain('D-eff: textbook D-efficiency 100·|X\'X|^(1/p)/N, relative to an ideal orthogonal');
    expect(result.stdout).toContain('What each plan means');
    expect(result.stdout).toMatch(/Confounded: feed_solids\^2 with inlet_temp\^2;/);
    // Prose is wrapped at 100 columns; tables (title line to the next empty line) are as wide as their rule.
    let inTable = false;
    lines.forEach((line, i) => {
      if (/^-+( +-+)+$/.test(lines[i + 2] ?? '')) inTable = true;
      if (line === '') inTable = false;
      if (!inTable) expect(line.length, line).toBeLessThanOrEqual(100);
    });
  });

  it('lists the response-surface plans with a reason for a linear model (edited copy of the sample)', () => {
    const linearDir = join(dir, 'linear');
    mkdirSync(linearDir);
    for (const name of ['indices.csv', 'interactions.csv']) copyFileSync(join('samples/spray-dryer', name), join(linearDir, name));
    const text = readFileSync(study, 'utf8').replace('  criterion: D\n', '  criterion: D\n  model: linear\n');
    writeFileSync(join(linearDir, 'study.yaml'), text);
    const result = runCli(['compare', join(linearDir, 'study.yaml'), '--json']);
    expect(result.status).toBe(0);
    const comparison = JSON.parse(result.stdout) as Comparison;
    for (const id of ['ccd-face', 'ccd-rotatable', 'box-behnken']) {
      const row = comparison.comparators.find((r) => r.id === id)!;
      expect(row.runs).toBeNull();
      expect(row.reason).toMatch(/no squared terms/);
    }
    // 4 varied factors, main effects only: resolution IV is enough, 2^(4−1) with D = ±ABC
    // (NIST/SEMATECH e-Handbook §5.3.3.4.7), + 3 centre runs.
    const fractional = comparison.comparators.find((r) => r.id === 'fractional')!;
    expect(fractional.runs).toBe(11);
    expect(fractional.generators).toEqual([expect.stringMatching(/^D=-?ABC$/)]);
    expect(fractional.resolution).toBe(4);
    expect(fractional.wordLengthPattern).toEqual([0, 1]);
  });

  it('refuses a bad --delta with one line and exit code 2, printing nothing', () => {
    const result = runCli(['compare', planPath, '--delta', '-1']);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr).toMatch(/--delta must be a positive number/);
  });
});
