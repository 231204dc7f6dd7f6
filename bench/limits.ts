/**
 * Benchmark of the input limits (`npx tsx bench/limits.ts`, or `npm run bench -- --limits`):
 * the largest inputs the limits of src/core/inputLimits.ts allow, run through the built
 * command line as a user would, with wall time and peak memory against the budget every
 * command must keep (TIME_BUDGET_SECONDS, MEMORY_BUDGET_MIB); and inputs just past a limit,
 * which must be refused at once. A benchmark, not a test: timings depend on the machine and
 * its load (printed). Run `npm run build` first.
 *
 * Peak memory is the child's own `process.resourceUsage().maxRSS`, reported by the preload
 * bench/reportMemory.mjs, so no system tool is needed.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import ExcelJS from 'exceljs';
import { MEMORY_BUDGET_MIB, TIME_BUDGET_SECONDS } from '../src/core/inputLimits.js';

const root = fileURLToPath(new URL('..', import.meta.url));
const cli = join(root, 'dist/cli/main.js');
const preload = join(root, 'bench/reportMemory.mjs');
const work = mkdtempSync(join(tmpdir(), 'tierplan-limits-'));

interface StudyOptions {
  operating: number;
  /** Aggregated total index of every setting: 0.2 moderate (3 levels), 0.4 critical (4 levels, every pair interacting). */
  total: number;
  modelParameters?: number;
  responses?: number;
  design?: string[];
  constraints?: string[];
  levels?: number;
  table?: 'csv' | 'json' | 'xlsx';
}

/** An invented study in its own folder; returns the study path. */
async function writeStudy(name: string, options: StudyOptions): Promise<string> {
  const folder = join(work, name);
  mkdirSync(folder, { recursive: true });
  const responses = Array.from({ length: options.responses ?? 1 }, (_, r) => `y${r + 1}`);
  const factors: string[] = [];
  const rows: string[][] = [];
  for (let j = 0; j < options.operating; j++) {
    const levels = options.levels ? `, levels: ${options.levels}` : '';
    factors.push(`  - { id: x${j + 1}, name: Setting ${j + 1}, unit: "-", role: operating, low: 0, high: 100, nominal: 50, precision: 0.001${levels} }`);
    for (const response of responses) rows.push([`x${j + 1}`, response, String(options.total * 0.8), String(options.total)]);
  }
  for (let j = 0; j < (options.modelParameters ?? 1); j++) {
    factors.push(`  - { id: m${j + 1}, name: Parameter ${j + 1}, unit: "-", role: model, low: 0, high: 1, nominal: 0.5 }`);
    for (const response of responses) rows.push([`m${j + 1}`, response, '0.001', '0.002']);
  }
  const table = options.table ?? 'csv';
  const header = ['factor', 'response', 'first', 'total'];
  if (table === 'csv') writeFileSync(join(folder, 'indices.csv'), `${[header, ...rows].map((row) => row.join(',')).join('\n')}\n`);
  if (table === 'json') {
    writeFileSync(join(folder, 'indices.json'), JSON.stringify(rows.map(([factor, response, first, total]) => ({ factor, response, first: Number(first), total: Number(total) }))));
  }
  if (table === 'xlsx') {
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet('indices');
    sheet.addRow(header);
    for (const [factor, response, first, total] of rows) sheet.addRow([factor, response, Number(first), Number(total)]);
    await workbook.xlsx.writeFile(join(folder, 'indices.xlsx'));
  }
  const text = [
    `title: Invented limits benchmark (${name})`,
    'factors:',
    ...factors,
    'responses:',
    ...responses.map((id) => `  - { id: ${id}, name: Response ${id}, unit: "%" }`),
    `indices: indices.${table}`,
    'design:',
    '  seed: 1',
    ...(options.design ?? []).map((line) => `  ${line}`),
    ...(options.constraints ? ['constraints:', ...options.constraints.map((constraint) => `  - "${constraint}"`)] : []),
    '',
  ].join('\n');
  writeFileSync(join(folder, 'study.yaml'), text);
  return join(folder, 'study.yaml');
}

interface Measured {
  name: string;
  expect: 'answer' | 'refusal';
  seconds: number;
  megabytes: number;
  status: number | null;
  note: string;
}

function run(name: string, expect: Measured['expect'], args: string[]): Measured {
  const started = performance.now();
  const result = spawnSync(process.execPath, ['--import', preload, cli, ...args], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, maxBuffer: 1 << 30 });
  const seconds = (performance.now() - started) / 1000;
  const memory = /tierplan-bench-maxrss=(\d+)/.exec(result.stderr);
  const message = result.stderr.split('\n').find((line) => line.startsWith('tierplan:')) ?? '';
  return {
    name,
    expect,
    seconds,
    megabytes: memory ? Number(memory[1]) / 1024 : Number.NaN,
    status: result.status,
    note: result.status === 0 ? 'ok' : message.replace(/^tierplan: .*?: /, '').slice(0, 90),
  };
}

const results: Measured[] = [];
const out = (name: string) => join(work, `out-${name}`);

// Inside the limits: every command must answer within the budget.
{
  const study = await writeStudy('tiers-200k', { operating: 10, total: 0.2, modelParameters: 1990, responses: 100 });
  results.push(run('tiers: 2 000 factors × 100 responses (200 000 CSV rows)', 'answer', ['tiers', study, '--json']));
}
{
  const study = await writeStudy('tiers-json', { operating: 10, total: 0.2, modelParameters: 1990, responses: 100, table: 'json' });
  results.push(run('tiers: the same as a JSON table', 'answer', ['tiers', study, '--json']));
}
{
  const study = await writeStudy('tiers-xlsx', { operating: 10, total: 0.2, modelParameters: 1990, responses: 100, table: 'xlsx' });
  results.push(run('tiers: the same as an XLSX workbook', 'answer', ['tiers', study, '--json']));
}
{
  const study = await writeStudy('varied-30', { operating: 30, total: 0.2, design: ['model: linear'] });
  results.push(run('plan --out: 30 varied factors, linear, 20 starts', 'answer', ['plan', study, '--out', out('varied-30')]));
  const quadratic = await writeStudy('varied-30-quadratic', { operating: 30, total: 0.2, design: ['model: quadratic', 'starts: 1'] });
  results.push(run('plan: 30 varied factors, full quadratic (p = 496): refused', 'refusal', ['plan', quadratic, '--json']));
}
{
  const study = await writeStudy('critical-12', { operating: 12, total: 0.4 });
  results.push(run('plan --out: 12 critical factors, cubic + all 2FI (p = 103), 20 starts', 'answer', ['plan', study, '--out', out('critical-12')]));
  results.push(run('compare: that plan.json', 'answer', ['compare', join(out('critical-12'), 'plan.json')]));
}
{
  const study = await writeStudy('interactions-20', { operating: 20, total: 0.2, design: ['model: interactions', 'starts: 4'] });
  results.push(run('plan: 20 factors, all 2FI (p = 211), 4 starts (the most allowed)', 'answer', ['plan', study, '--json']));
}
{
  const study = await writeStudy('grid-250k', { operating: 5, total: 0.2, levels: 12, design: ['model: quadratic'], constraints: ['x1 + x2 <= 150'] });
  results.push(run('plan: 12^5 = 248 832-point grid (enumerated), a constraint', 'answer', ['plan', study, '--json']));
}
{
  const study = await writeStudy('runs-1000', {
    operating: 6,
    total: 0.2,
    design: ['model: quadratic', 'runs: 1000', 'centreRuns: 100', 'holdoutRuns: 200', 'starts: 10'],
    constraints: ['x1 + x2 <= 180'],
  });
  results.push(run('plan --out: 1000 fitting + 100 centre + 200 holdout runs, 10 starts', 'answer', ['plan', study, '--out', out('runs-1000')]));
}
{
  const study = await writeStudy('levels-50', { operating: 4, total: 0.2, levels: 50, design: ['model: quadratic'] });
  results.push(run('plan: 4 factors with 50 levels each', 'answer', ['plan', study, '--json']));
}
{
  const study = await writeStudy('starts-1000', { operating: 3, total: 0.2, design: ['model: quadratic', 'starts: 1000'] });
  results.push(run('plan: 1000 starts on a 3-factor quadratic', 'answer', ['plan', study, '--json']));
}

// Past a limit: refused at once.
{
  const folder = join(work, 'bomb');
  mkdirSync(folder, { recursive: true });
  const lines = ['a: &a [x, x, x, x, x, x, x, x, x]'];
  for (const [i, name] of [...'bcdefghi'].entries()) lines.push(`${name}: &${name} [${Array(9).fill(`*${'abcdefghi'[i]}`).join(', ')}]`);
  writeFileSync(join(folder, 'study.yaml'), `${lines.join('\n')}\n`);
  results.push(run('tiers: YAML alias bomb (9^9 strings)', 'refusal', ['tiers', join(folder, 'study.yaml')]));
  writeFileSync(join(folder, 'deep.json'), `${'['.repeat(500_000)}${']'.repeat(500_000)}`);
  results.push(run('tiers: JSON nested 500 000 deep', 'refusal', ['tiers', join(folder, 'deep.json')]));
}
{
  const study = await writeStudy('runs-too-many', { operating: 3, total: 0.2, design: ['runs: 10000000'] });
  results.push(run('plan: design.runs 10 000 000', 'refusal', ['plan', study, '--json']));
  const levels = await writeStudy('levels-too-many', { operating: 3, total: 0.2, levels: 1_000_000 });
  results.push(run('plan: a million levels', 'refusal', ['plan', levels, '--json']));
  const search = await writeStudy('search-too-big', { operating: 20, total: 0.2, design: ['model: interactions'] });
  results.push(run('plan: 20 factors, all 2FI, 20 starts: search refused', 'refusal', ['plan', search, '--json']));
  const varied = await writeStudy('varied-40', { operating: 40, total: 0.2, design: ['model: linear'] });
  results.push(run('plan: 40 varied factors', 'refusal', ['plan', varied, '--json']));
}

rmSync(work, { recursive: true, force: true });

const pass = (row: Measured) =>
  row.expect === 'answer'
    ? row.status === 0 && row.seconds <= TIME_BUDGET_SECONDS && row.megabytes <= MEMORY_BUDGET_MIB
    : row.status === 2 && row.seconds <= 5 && row.megabytes <= MEMORY_BUDGET_MIB;
process.stdout.write(`Limits benchmark — budget ${TIME_BUDGET_SECONDS} s and ${MEMORY_BUDGET_MIB} MiB per command (refusals: 5 s); load ${loadavg().map((value) => value.toFixed(1)).join(' ')}\n\n`);
process.stdout.write(`${'case'.padEnd(70)}${'time s'.padStart(8)}${'peak MiB'.padStart(10)}  result\n`);
for (const row of results) {
  process.stdout.write(`${row.name.padEnd(70)}${row.seconds.toFixed(1).padStart(8)}${row.megabytes.toFixed(0).padStart(10)}  ${pass(row) ? 'PASS' : 'FAIL'} ${row.note}\n`);
}
if (results.some((row) => !pass(row))) process.exitCode = 1;
