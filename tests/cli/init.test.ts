/**
 * `tierplan init` on the bundled sample's index table: the skeleton names every factor and
 * response of the table, `plan` and `tiers` refuse it until each placeholder is filled (one
 * line naming the key), and once filled — here with the sample study's own values — it plans.
 * Plus the refusals: an existing file, a non-YAML name, a table that cannot make a study.
 */
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parse, parseDocument } from 'yaml';
import { describe, expect, it } from 'vitest';
import { repoRoot, runCli } from '../support/runCli.js';

const sampleDir = join(repoRoot, 'samples/spray-dryer');
const sampleStudy = parse(readFileSync(join(sampleDir, 'study.yaml'), 'utf8')) as Record<string, any>;

/** A scratch folder with a copy of the sample's index tables. */
function scratch(): string {
  const dir = mkdtempSync(join(tmpdir(), 'tierplan-init-'));
  for (const name of ['indices.csv', 'interactions.csv']) copyFileSync(join(sampleDir, name), join(dir, name));
  return dir;
}

/** The skeleton with every placeholder replaced by the sample study's value, comments kept. */
function filled(text: string): string {
  const document = parseDocument(text);
  document.set('title', 'Spray dryer filled from a skeleton (invented demo)');
  sampleStudy.factors.forEach((factor: Record<string, any>, i: number) => {
    expect(document.getIn(['factors', i, 'id'])).toBe(factor.id);
    for (const key of ['name', 'unit', 'role', 'low', 'high', 'nominal']) document.setIn(['factors', i, key], factor[key]);
  });
  sampleStudy.responses.forEach((response: Record<string, any>, i: number) => {
    expect(document.getIn(['responses', i, 'id'])).toBe(response.id);
    document.setIn(['responses', i, 'unit'], response.unit);
  });
  return document.toString();
}

describe('tierplan init on the sample index table', () => {
  const dir = scratch();
  const result = runCli(['init', 'indices.csv'], { cwd: dir });
  const text = existsSync(join(dir, 'study.yaml')) ? readFileSync(join(dir, 'study.yaml'), 'utf8') : '';

  it('writes study.yaml with every factor and response of the table, in its order', () => {
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    const skeleton = parse(text) as Record<string, any>;
    expect(skeleton.factors.map((factor: { id: string }) => factor.id)).toEqual(sampleStudy.factors.map((factor: { id: string }) => factor.id));
    expect(skeleton.responses.map((response: { id: string }) => response.id)).toEqual(['moisture', 'yield', 'native_whey', 'd50']);
    expect(skeleton.indices).toBe('indices.csv');
    // title + 5 per factor (unit, role, low, high, nominal) + 1 per response = 1 + 75 + 4.
    expect(result.stdout).toContain('Wrote study.yaml: 15 factors and 4 responses from indices.csv.');
    expect(result.stdout).toContain('Fill in the 80 placeholders marked TODO');
    expect(readdirSync(dir).sort()).toEqual(['indices.csv', 'interactions.csv', 'study.yaml']);
  });

  it('points the YAML language server at the shipped schema, and explains the keys', () => {
    const first = text.split('\n')[0];
    const reference = /^# yaml-language-server: \$schema=(.+)$/.exec(first)?.[1] ?? '';
    const schemaFile = reference.startsWith('file://') ? new URL(reference) : resolve(dir, reference);
    expect(readFileSync(schemaFile, 'utf8')).toBe(readFileSync(join(repoRoot, 'schema/study.schema.json'), 'utf8'));
    expect(text).toContain('#   unit         engineering unit of low, high and nominal');
    expect(text).toContain('# policy:');
    expect(text).toMatch(/^# {3}critical: 0\.30 +# aggregated total index at or above which a factor is critical/m);
  });

  it.each([['plan'], ['tiers']])('%s refuses the unfilled skeleton in one line naming the first placeholder', (command) => {
    const refused = runCli([command, 'study.yaml'], { cwd: dir });
    expect(refused.status).toBe(2);
    expect(refused.stdout).toBe('');
    expect(refused.stderr).toBe('tierplan: study.yaml, key title: fill in the text (in place of TODO)\n');
  });

  it('names the next placeholder once the title is filled', () => {
    const other = join(dir, 'title-only.yaml');
    writeFileSync(other, text.replace(/^title: TODO$/m, 'title: A study'));
    const refused = runCli(['tiers', other]);
    expect(refused.stderr).toBe(`tierplan: ${other}, key factors[0].unit: fill in the text (in place of TODO)\n`);
  });

  it('plans once filled: the same tiers and model as the sample study itself', () => {
    const study = join(dir, 'filled.yaml');
    writeFileSync(study, filled(text));
    const planned = runCli(['plan', study, '--json', '--starts', '2']);
    expect(planned.stderr).not.toMatch(/Error|tierplan:/);
    expect(planned.status).toBe(0);
    const plan = JSON.parse(planned.stdout);
    // Worked out by hand in tiers.test.ts; default policy and design, as the skeleton leaves them.
    expect(plan.tiers.factors.filter((factor: { tier: string }) => factor.tier === 'critical').map((factor: { id: string }) => factor.id)).toEqual([
      'inlet_temp',
      'feed_solids',
    ]);
    // The skeleton gives no noise, so the run count falls back to p + max(3, ⌈p/4⌉) = 12 + 3.
    expect(plan.metrics.p).toBe(12);
    expect(plan.metrics.N).toBe(15);
  });
});

describe('tierplan init refuses', () => {
  it('to overwrite an existing file without --force, and overwrites it with --force', () => {
    const dir = scratch();
    writeFileSync(join(dir, 'study.yaml'), 'my study\n');
    const refused = runCli(['init', 'indices.csv'], { cwd: dir });
    expect(refused.status).toBe(2);
    expect(refused.stderr).toBe('tierplan: study.yaml: already exists; use --force to overwrite it, or choose another --out file\n');
    expect(readFileSync(join(dir, 'study.yaml'), 'utf8')).toBe('my study\n');
    expect(runCli(['init', 'indices.csv', '--force'], { cwd: dir }).status).toBe(0);
    expect(readFileSync(join(dir, 'study.yaml'), 'utf8')).toMatch(/^# yaml-language-server/);
    expect(readdirSync(dir).sort()).toEqual(['indices.csv', 'interactions.csv', 'study.yaml']);
  });

  it('a folder that does not exist; in one that does, the table path is relative to the study file', () => {
    const dir = scratch();
    const out = join(dir, 'studies', 'first.yaml');
    const refused = runCli(['init', join(dir, 'indices.csv'), '--out', out]);
    expect(refused.stderr.trim()).toBe(`tierplan: ${join(dir, 'studies')}: folder does not exist; create it first`);
    mkdirSync(join(dir, 'studies'));
    expect(runCli(['init', join(dir, 'indices.csv'), '--out', out]).status).toBe(0);
    expect(parse(readFileSync(out, 'utf8')).indices).toBe('../indices.csv');
  });

  it.each([
    ['a study name that is not YAML', ['init', 'indices.csv', '--out', 'study.json'], 'tierplan: study.json: the skeleton is YAML (its comments explain each key); name the file .yaml or .yml'],
    ['a missing table', ['init', 'missing.csv'], 'tierplan: missing.csv: file not found'],
  ])('%s', (_name, args, line) => {
    const dir = scratch();
    const result = runCli(args, { cwd: dir });
    expect(result.status).toBe(2);
    expect(result.stderr.trim()).toBe(line);
    expect(readdirSync(dir).sort()).toEqual(['indices.csv', 'interactions.csv']);
  });

  it('a table whose ids cannot be study ids, naming the cell', () => {
    const dir = scratch();
    writeFileSync(join(dir, 'spaced.csv'), 'factor,response,first,total\nInlet temp,moisture,0.2,0.3\n');
    const result = runCli(['init', 'spaced.csv'], { cwd: dir });
    expect(result.status).toBe(2);
    expect(result.stderr.trim()).toBe(
      'tierplan: spaced.csv, row 2, column factor: "Inlet temp" is not a usable id: start with a letter, then letters, digits or "_" (ids are written in constraints and model terms); rename it in the table',
    );
  });

  it('a table the study could not use (a factor without a row for every response)', () => {
    const dir = scratch();
    writeFileSync(join(dir, 'gap.csv'), 'factor,response,first,total\na,y,0.2,0.3\na,z,0.1,0.2\nb,y,0.1,0.1\n');
    const result = runCli(['init', 'gap.csv'], { cwd: dir });
    expect(result.status).toBe(2);
    expect(result.stderr.trim()).toMatch(/^tierplan: gap\.csv: no row for factor × response b × z/);
  });
});
