/**
 * analysis.html and analysis.xlsx from the hand-made fixture plan (INVENTED) filled with the
 * invented sample results: the verdict comes first, the four charts are vega SVG, and text
 * from the study is escaped as in report.html (common practice: HTML-escape user text).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { analyzeCampaign } from '../../src/core/results/campaignAnalysis.js';
import { scheduleRuns } from '../../src/core/schedule/scheduleRuns.js';
import { analysisReportHtml } from '../../src/io/analysisReport.js';
import { analysisWorkbook } from '../../src/io/analysisWorkbook.js';
import { readResultsSheet } from '../../src/io/resultsSheet.js';
import { filledCsv } from '../../samples/spray-dryer/makeResults.js';
import { HOSTILE_NAME, sprayDryerPlan } from '../fixtures/plan/sprayDryerPlan.js';

async function fixtureAnalysis() {
  const plan = sprayDryerPlan();
  plan.schedule = scheduleRuns(plan, 20261201);
  const path = join(mkdtempSync(join(tmpdir(), 'tierplan-report-')), 'results.csv');
  writeFileSync(path, filledCsv(plan));
  const sheet = await readResultsSheet(path, plan);
  plan.study.responses[0].name = HOSTILE_NAME;
  return analyzeCampaign(plan, sheet, { file: path, sheet: sheet.sheet, toolVersion: '0.1.0' });
}

describe('analysis reports', () => {
  it('puts the verdict first, draws the charts as SVG and escapes study text', async () => {
    const analysis = await fixtureAnalysis();
    const html = await analysisReportHtml(analysis, HOSTILE_NAME);
    expect(html).not.toContain('<script>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    const decision = html.indexOf('class="decision');
    expect(decision).toBeGreaterThan(0);
    expect(decision).toBeLessThan(html.indexOf('<svg'));
    expect(html.match(/<svg /g)!.length).toBeGreaterThanOrEqual(3 * analysis.responses.length);
    expect(html).toContain('@media print');
  });

  it('writes the coefficient, ANOVA, diagnostics and validation sheets with the analysis numbers', async () => {
    const analysis = await fixtureAnalysis();
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load((await analysisWorkbook(analysis)) as unknown as ArrayBuffer);
    expect(workbook.worksheets.map((sheet) => sheet.name)).toEqual(['Verdict', 'Coefficients', 'ANOVA', 'Run diagnostics', 'Validation', 'Lab vs model']);
    const coefficients = workbook.getWorksheet('Coefficients')!;
    expect(coefficients.getCell('A3').value).toBe('1');
    expect(coefficients.getCell('B3').value).toBe(analysis.responses[0].coefficients[0].estimate);
    expect(workbook.getWorksheet('Verdict')!.getCell('C6').value).toBe(analysis.responses[0].verdict);
  });
});
