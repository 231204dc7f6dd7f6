/**
 * `tierplan analyze` end to end: plan the sample, fill its run sheet with the invented sample
 * results (samples/spray-dryer/makeResults.ts, INVENTED), analyse it to a verdict, recompute
 * the fit from the sheet with an outside library (ml-matrix's QR least squares), and refuse a
 * tampered sheet with its cell named, writing nothing.
 */
import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadPlan } from '../../src/io/planFile.js';
import { filledCsv, filledWorkbook } from '../../samples/spray-dryer/makeResults.js';
import { repoRoot, runCli } from '../support/runCli.js';
import { glsReferenceFit } from '../support/glsReferenceFit.js';

const work = mkdtempSync(join(tmpdir(), 'tierplan-analyze-'));
const planDir = join(work, 'plan');
const planPath = join(planDir, 'plan.json');
const xlsx = join(work, 'results.xlsx');
const csv = join(work, 'results.csv');

beforeAll(async () => {
  const planned = runCli(['plan', join(repoRoot, 'samples/spray-dryer/study.yaml'), '--out', planDir, '--starts', '4']);
  expect(planned.status).toBe(0);
  const plan = await loadPlan(planPath);
  writeFileSync(xlsx, await filledWorkbook(plan));
  writeFileSync(csv, filledCsv(plan));
});

interface AnalysisJson {
  plan: { id: string; checksum: string };
  responses: {
    id: string;
    n: number;
    terms: string[];
    coefficients: { term: string; estimate: number; standardError: number; t: number; p: number; lower: number; upper: number }[];
    engineering: { term: string; estimate: number }[];
    anova: Record<'model' | 'residual' | 'lackOfFit' | 'pureError', { df: number; ss: number; F: number | null; p: number | null } | null>;
    rSquared: number;
    adjustedRSquared: number;
    predictedRSquared: number;
    press: number;
    residualSd: number;
    runs: { run: number; point: string; observed: number; fitted: number; residual: number; leverage: number; studentised: number; cooksDistance: number }[];
    holdout: { run: number; point: string; observed: number; predicted: number; lower: number; upper: number; inside: boolean }[];
    verdict: string;
  }[];
}

describe('tierplan analyze on the invented sample results', () => {
  it('analyses the workbook to a verdict per response and writes the three files', () => {
    const out = join(work, 'out');
    const result = runCli(['analyze', planPath, xlsx, '--out', out]);
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    expect(result.stdout).toMatch(/^Analysis of plan TP-[0-9a-f]{10}/);
    expect(result.stdout).toMatch(/Verdict: (calibrated|not yet)/);
    expect(readdirSync(out).sort()).toEqual(['analysis.html', 'analysis.json', 'analysis.xlsx']);
    const analysis = JSON.parse(readFileSync(join(out, 'analysis.json'), 'utf8')) as AnalysisJson;
    const plan = JSON.parse(readFileSync(planPath, 'utf8'));
    expect(analysis.plan).toEqual({ id: plan.planId, checksum: plan.checksum });
    expect(analysis.responses.map((r) => r.id)).toEqual(['moisture', 'yield', 'native_whey', 'd50']);
    for (const response of analysis.responses) {
      expect(['calibrated', 'not yet']).toContain(response.verdict);
      expect(response.terms).toEqual(['1', ...plan.model.terms]);
      expect(response.coefficients.map((c) => c.term)).toEqual(response.terms);
      expect(Object.keys(response.coefficients[0]).slice(0, 7)).toEqual(['term', 'estimate', 'standardError', 't', 'p', 'lower', 'upper']);
      expect(Object.keys(response.anova)).toEqual(['model', 'residual', 'lackOfFit', 'pureError']);
      for (const entry of Object.values(response.anova)) if (entry) expect(Object.keys(entry)).toEqual(['df', 'ss', 'F', 'p']);
      const holdouts = plan.runs.filter((run: { purpose: string }) => run.purpose === 'holdout').length;
      expect(response.holdout).toHaveLength(holdouts);
      expect(response.runs).toHaveLength(plan.runs.length - holdouts);
      expect(response.n).toBe(plan.runs.length - holdouts);
    }
  });

  it('gives the numbers an outside GLS fit of the CSV gives at the reported variance ratio (ml-matrix QR after whitening)', () => {
    const result = runCli(['analyze', planPath, csv, '--json']);
    expect(result.status).toBe(0);
    const analysis = JSON.parse(result.stdout) as AnalysisJson;
    const plan = JSON.parse(readFileSync(planPath, 'utf8'));
    // The sheet itself: the run table after the first empty line.
    const text = readFileSync(csv, 'utf8').slice(1);
    // After the empty line: the column keys, then the header row, then the runs (runSheetCsv.ts).
    const rows = (parse(text.slice(text.indexOf('\r\n\r\n') + 4)) as string[][]).slice(1);
    const header = rows[0];
    const runNo = header.indexOf('Run no.');
    const pointAt = header.indexOf('Point');
    const runOf = new Map(plan.runs.map((run: { point: string }) => [run.point, run]));
    const moistureAt = header.findIndex((h) => h.startsWith('Residual moisture'));
    const fitted = rows
      .slice(1)
      .filter((row) => (runOf.get(row[pointAt]) as { purpose: string }).purpose !== 'holdout')
      .sort((a, b) => Number(a[runNo]) - Number(b[runNo]));
    const moisture = analysis.responses[0] as AnalysisJson['responses'][number] & { varianceComponents: { ratio: number } | null };
    // The split-plot fit is GLS at the REML variance ratio, sessions as fixed blocks.
    const { beta, residuals } = glsReferenceFit(
      fitted.map((row) => ({ ...(runOf.get(row[pointAt]) as { coded: Record<string, number>; session: number; wholePlot: number }), y: Number(row[moistureAt]) })),
      plan.model.terms,
      moisture.varianceComponents?.ratio ?? 0,
    );
    moisture.coefficients.forEach((c, j) => expect(c.estimate).toBeCloseTo(beta[j], 7));
    expect(moisture.runs.map((r) => r.run)).toEqual(fitted.map((row) => Number(row[runNo])));
    expect(moisture.runs.map((r) => r.residual)).toEqual(residuals.map((r) => expect.closeTo(r, 7)));
  });

  it('refuses a tampered sheet with its cell named, exit 2, nothing written', () => {
    const text = readFileSync(csv, 'utf8');
    const lines = text.split('\r\n');
    const headerAt = lines.findIndex((line) => line.startsWith('"Run no."'));
    const fields = lines[headerAt + 1].split(',');
    const yieldAt = parse(lines[headerAt])[0].findIndex((h: string) => h.startsWith('Powder yield'));
    fields[yieldAt] = '"n/a"';
    lines[headerAt + 1] = fields.join(',');
    const bad = join(work, 'tampered.csv');
    writeFileSync(bad, lines.join('\r\n'));
    const out = join(work, 'refused');
    const result = runCli(['analyze', planPath, bad, '--out', out]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(new RegExp(`^tierplan: .*tampered\\.csv, row ${headerAt + 2}, column [A-Z]+ \\(Powder yield \\[%\\]\\): "n/a" is not a number`));
    expect(existsSync(out)).toBe(false);
  });

  it('refuses the results of another plan', () => {
    const other = join(work, 'other');
    expect(runCli(['plan', join(repoRoot, 'samples/spray-dryer/study.yaml'), '--out', other, '--starts', '4', '--seed', '7']).status).toBe(0);
    const result = runCli(['analyze', join(other, 'plan.json'), xlsx, '--json']);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(/results\.xlsx, sheet Run sheet, row 2, column C: plan id TP-\w+ is not the plan id of this plan\.json/);
  });
});

describe('the committed sample results (samples/spray-dryer/results.xlsx, INVENTED)', () => {
  it('belong to the plan the README flow makes and analyse to a verdict (rerun `npm run sample:results` when this fails)', () => {
    const out = join(work, 'readme-flow');
    expect(runCli(['plan', 'samples/spray-dryer/study.yaml', '--out', out]).status).toBe(0);
    const result = runCli(['analyze', join(out, 'plan.json'), 'samples/spray-dryer/results.xlsx', '--json']);
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    const analysis = JSON.parse(result.stdout) as AnalysisJson;
    for (const response of analysis.responses) expect(['calibrated', 'not yet']).toContain(response.verdict);
  });
});
