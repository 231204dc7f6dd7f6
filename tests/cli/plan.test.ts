/**
 * `tierplan plan` end to end on the bundled sample, and its refusals.
 */
import { mkdtempSync, readFileSync, readdirSync, writeFileSync, copyFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
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

describe('tierplan plan on the sample', () => {
  const out = mkdtempSync(join(tmpdir(), 'tierplan-out-'));
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
  });
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
