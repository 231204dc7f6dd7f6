/**
 * `tierplan compare --out`: the comparison as a CSV or JSON file that records whose plan it
 * is, written whole, never over an input, and over an earlier file only when it is the same
 * plan's or with --force — the rules of `tierplan plan --out`. Also the comparison without a
 * `costs` section, which leaves the cost columns out instead of filling them with dashes.
 */
import { copyFileSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';
import { repoRoot, runCli } from '../support/runCli.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';

const sampleDir = join(repoRoot, 'samples/spray-dryer');
const study = join(sampleDir, 'study.yaml');
let dir: string;
let planPath: string;
let plan: PlanDocument;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tierplan-compare-out-'));
  const result = runCli(['plan', study, '--json']);
  expect(result.status).toBe(0);
  plan = JSON.parse(result.stdout) as PlanDocument;
  planPath = join(dir, 'plan.json');
  writeFileSync(planPath, result.stdout);
});

describe('tierplan compare --out', () => {
  it('writes one CSV row per plan, each with the plan id, and nothing else in the folder', () => {
    const out = join(dir, 'comparison.csv');
    const result = runCli(['compare', planPath, '--out', out]);
    expect(result.status).toBe(0);
    expect(result.stderr).toBe(`wrote ${out}\n`);
    const rows = parseCsv(readFileSync(out, 'utf8'), { columns: true }) as Record<string, string>[];
    expect(rows.map((row) => row.id)).toEqual(plan.comparison!.comparators.map((row) => row.id));
    expect(new Set(rows.map((row) => row.plan_id))).toEqual(new Set([plan.planId]));
    const conventional = rows.find((row) => row.id === 'conventional')!;
    // 2^5 corners + 3 centre runs (common practice), at EUR 850 per run plus level changes.
    expect(conventional.runs).toBe('35');
    expect(conventional.currency).toBe('EUR');
    expect(Number(conventional.cost)).toBe(plan.comparison!.comparators.find((row) => row.id === 'conventional')!.cost);
    expect(conventional.name).toBe('Conventional plan');
    expect(readdirSync(dir).sort()).toEqual(['comparison.csv', 'plan.json']);
  });

  it('writes the --json document with the plan id, and a study gives the id tierplan plan gives it', () => {
    const fromPlan = join(dir, 'from-plan.json');
    const fromStudy = join(dir, 'from-study.json');
    expect(runCli(['compare', planPath, '--out', fromPlan]).status).toBe(0);
    expect(runCli(['compare', study, '--out', fromStudy]).status).toBe(0);
    const a = JSON.parse(readFileSync(fromPlan, 'utf8'));
    const b = JSON.parse(readFileSync(fromStudy, 'utf8'));
    expect(a.planId).toBe(plan.planId);
    expect(b.planId).toBe(plan.planId);
    expect(a.comparators).toEqual(plan.comparison!.comparators);
  });

  it('replaces the same plan\'s file, refuses another plan\'s or an unmarked one without --force', () => {
    const out = join(dir, 'again.csv');
    expect(runCli(['compare', planPath, '--out', out]).status).toBe(0);
    expect(runCli(['compare', planPath, '--out', out, '--delta', '3']).status).toBe(0);

    const other = runCli(['compare', study, '--out', out, '--delta', '3']);
    expect(other.status).toBe(0); // the same study and seed: the same plan

    writeFileSync(out, '"plan_id","id"\r\n"TP-0000000000","proposed"\r\n');
    const foreign = runCli(['compare', planPath, '--out', out]);
    expect(foreign.status).toBe(2);
    expect(foreign.stderr.trim()).toBe(
      `tierplan: ${out}: holds the comparison of plan TP-0000000000, not of plan ${plan.planId}; use --force to overwrite it, or choose another --out file`,
    );
    writeFileSync(out, 'my own notes\n');
    const unmarked = runCli(['compare', planPath, '--out', out]);
    expect(unmarked.status).toBe(2);
    expect(unmarked.stderr).toMatch(/already exists and does not say which plan it belongs to; use --force/);
    expect(readFileSync(out, 'utf8')).toBe('my own notes\n');
    expect(runCli(['compare', planPath, '--out', out, '--force']).status).toBe(0);
    expect(readFileSync(out, 'utf8')).toMatch(/^"plan_id"/);
  });

  it.each([
    ['an input: the plan file itself', () => planPath, /is an input of the comparison \(the study file, one of its index tables or the plan file\)/],
    ['a wrong extension', () => join(dir, 'comparison.xlsx'), /cannot write "\.xlsx" files; name the file \.csv or \.json/],
    ['a folder that does not exist', () => join(dir, 'missing', 'c.csv'), /folder does not exist; create it first/],
  ])('refuses %s in one line, writing nothing', (_name, target, pattern) => {
    const before = readFileSync(planPath, 'utf8');
    const result = runCli(['compare', planPath, '--out', target()]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr).toMatch(pattern);
    expect(readFileSync(planPath, 'utf8')).toBe(before);
  });

  it('refuses an index table of the study as the target', () => {
    const copy = mkdtempSync(join(tmpdir(), 'tierplan-compare-input-'));
    for (const name of ['study.yaml', 'indices.csv', 'interactions.csv']) copyFileSync(join(sampleDir, name), join(copy, name));
    const result = runCli(['compare', join(copy, 'study.yaml'), '--out', join(copy, 'indices.csv')]);
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/indices\.csv: is an input of the comparison/);
    expect(readFileSync(join(copy, 'indices.csv'), 'utf8')).toBe(readFileSync(join(sampleDir, 'indices.csv'), 'utf8'));
  });
});

describe('tierplan compare without costs', () => {
  it('leaves the cost and time columns out and says why, instead of printing dashes', () => {
    const copy = mkdtempSync(join(tmpdir(), 'tierplan-compare-nocost-'));
    for (const name of ['indices.csv', 'interactions.csv']) copyFileSync(join(sampleDir, name), join(copy, name));
    const text = readFileSync(study, 'utf8').replace(/\ncosts:\n(?:  .*\n)+/, '\n');
    expect(text).not.toContain('costs:');
    writeFileSync(join(copy, 'study.yaml'), text);
    const result = runCli(['compare', join(copy, 'study.yaml')]);
    expect(result.status).toBe(0);
    const header = result.stdout.split('\n').find((line) => line.startsWith('Plan ') && line.includes('Off limits'))!;
    expect(header).toMatch(/^Plan\s+Runs\s+Off limits\s+Level changes\s+Runs saved$/);
    expect(result.stdout).toContain('What each plan takes and whether it can be run as listed');
    expect(result.stdout).toContain('No cost or time columns: the study has no `costs` section');
    expect(result.stdout).not.toMatch(/Cost saved|cost units/);
  });
});
