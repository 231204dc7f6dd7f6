/**
 * The workbook is read back with exceljs itself (a general-purpose xlsx reader) and checked
 * cell by cell against the plan fixture.
 */
import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { scheduleRuns } from '../../src/core/schedule/scheduleRuns.js';
import { runSheetWorkbook, SHEET_NAMES } from '../../src/io/runSheetWorkbook.js';
import { sprayDryerPlan } from '../fixtures/plan/sprayDryerPlan.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';

async function readBack(edit?: (plan: PlanDocument) => void, seed = 20261201) {
  const plan = sprayDryerPlan();
  edit?.(plan);
  const schedule = scheduleRuns(plan, seed);
  const buffer = await runSheetWorkbook(plan, schedule);
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(buffer as unknown as ArrayBuffer);
  return { plan, schedule, workbook, buffer };
}

/** Row number of the first row whose column A holds `text`. */
function rowWith(sheet: ExcelJS.Worksheet, text: string): number {
  for (let r = 1; r <= sheet.rowCount; r++) if (sheet.getCell(r, 1).value === text) return r;
  throw new Error(`no row starting with ${text}`);
}

describe('run sheet workbook', () => {
  it('has our sheets in order and reproducible metadata', async () => {
    const { workbook, plan } = await readBack();
    expect(workbook.worksheets.map((s) => s.name)).toEqual([
      SHEET_NAMES.runSheet, SHEET_NAMES.tiers, SHEET_NAMES.model, SHEET_NAMES.comparison, SHEET_NAMES.record,
    ]);
    expect(workbook.creator).toBe('tierplan');
    expect(workbook.created.toISOString()).toBe(plan.createdAt);
    expect(workbook.modified.toISOString()).toBe(plan.createdAt);
  });

  it('gives the same workbook content for the same plan and seed (only zip entry dates may differ)', async () => {
    const unzip = async (buffer: Buffer) => {
      const zip = await JSZip.loadAsync(buffer);
      const out: Record<string, string> = {};
      for (const name of Object.keys(zip.files).sort()) if (!zip.files[name].dir) out[name] = await zip.files[name].async('string');
      return out;
    };
    const first = await unzip((await readBack()).buffer);
    const second = await unzip((await readBack()).buffer);
    expect(Object.keys(first)).toContain('docProps/core.xml');
    expect(second).toEqual(first);
    const other = await unzip((await readBack(undefined, 7)).buffer);
    expect(other['xl/worksheets/sheet1.xml']).not.toBe(first['xl/worksheets/sheet1.xml']);
  });

  it('makes every merged note row tall enough for its text, the caution included', async () => {
    const { workbook } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    const merged = sheet.columns.slice(1).reduce((sum, column) => sum + (column.width ?? 0), 0);
    for (const label of ['Run order', 'Hard to change', 'Caution', 'Fill in']) {
      const row = sheet.getRow(rowWith(sheet, label));
      const text = String(row.getCell(2).value);
      const lines = (row.height ?? 15) / 15;
      // At most 0.9 characters per column-width unit, so bold text is not cut off (see the module).
      expect(lines * 0.9 * merged, label).toBeGreaterThanOrEqual(text.length);
    }
  });

  it('writes the header block with plan id, seed, caution and the fixed factors', async () => {
    const { workbook, plan, schedule } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    expect(sheet.getCell('A1').value).toBe(`Run sheet — ${plan.study.title}`);
    expect(sheet.getCell('A2').value).toBe('Plan id');
    expect(sheet.getCell('B2').value).toBe(plan.planId);
    expect(sheet.getCell('C2').value).toBe('Seed');
    expect(sheet.getCell('D2').value).toBe(20261201);
    expect(sheet.getCell('F2').value).toBe('tierplan 0.1.0');
    expect(sheet.getCell(rowWith(sheet, 'Run order'), 2).value).toBe(schedule.note);
    expect(sheet.getCell(rowWith(sheet, 'Hard to change'), 2).value).toBe(schedule.hardToChange!.note);
    expect(String(sheet.getCell(rowWith(sheet, 'Caution'), 2).value)).toMatch(
      /rated limits and the site's safety procedures.*does not replace a hazard review; local codes and licensed practice prevail/,
    );
    const fixedRow = rowWith(sheet, 'Held fixed');
    expect(sheet.getCell(fixedRow, 2).value).toBe('Feed total solids [% w/w]');
    expect(sheet.getCell(fixedRow, 5).value).toBe(38);
    expect(sheet.getCell(fixedRow, 5).numFmt).toBe('0.0'); // precision 0.5
    expect(sheet.getCell(fixedRow + 1, 2).value).toBe('Drying air flow [m³/h]');
    expect(sheet.getCell(fixedRow + 1, 5).value).toBe(400);
    expect(sheet.getCell(fixedRow + 1, 5).numFmt).toBe('0'); // precision 5
  });

  it('writes the table in execution order with numbers, number formats and entry validation', async () => {
    const { workbook, plan, schedule } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    const headerRow = rowWith(sheet, 'Run no.');
    const headers = (sheet.getRow(headerRow).values as unknown[]).slice(1);
    expect(headers).toEqual([
      'Run no.', 'Day', 'Point', 'Kind of run', 'Inlet air temperature [°C]', 'Feed rate [kg/h]', 'Atomiser wheel speed [rpm]',
      'Residual moisture [% w/w]', 'Powder yield [%]', 'Median particle size [µm]', 'Operator', 'Date', 'Remarks',
    ]);
    const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
    schedule.order.forEach((scheduled, i) => {
      const row = sheet.getRow(headerRow + 1 + i);
      const run = byPoint.get(scheduled.point)!;
      expect(row.getCell(1).value).toBe(scheduled.sequence);
      expect(row.getCell(2).value).toBe(scheduled.session);
      expect(row.getCell(3).value).toBe(scheduled.point);
      expect(row.getCell(5).value).toBe(run.settings.inlet_temp);
      expect(row.getCell(5).numFmt).toBe('0');
      expect(row.getCell(6).value).toBeCloseTo(run.settings.feed_rate, 10);
      expect(row.getCell(6).numFmt).toBe('0.0');
      expect(row.getCell(7).value).toBe(run.settings.atomiser_speed);
      expect(row.getCell(7).numFmt).toBe('0');
      for (const col of [8, 9, 10]) {
        expect(row.getCell(col).value).toBeNull();
        const validation = row.getCell(col).dataValidation;
        expect(validation.type).toBe('decimal');
        expect(validation.operator).toBe('between');
        expect(validation.allowBlank).toBe(true);
        expect(validation.showInputMessage).toBe(true);
        expect(validation.showErrorMessage).toBe(true);
        expect(validation.prompt).toMatch(/Numbers only/);
        expect(validation.error).toMatch(/as a number/);
      }
      expect(row.getCell(12).numFmt).toBe('yyyy-mm-dd');
    });
    expect(sheet.getCell(headerRow + 1, 8).dataValidation.prompt).toBe('Measured Residual moisture in % w/w. Numbers only.');
    expect(sheet.getCell(headerRow + 1, 4).dataValidation).toBeUndefined();
    expect(sheet.getRow(headerRow + schedule.order.length + 1).getCell(1).value).toBeNull();
  });

  it('freezes the table header, prints landscape one page wide and repeats the header row', async () => {
    const { workbook } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    const headerRow = rowWith(sheet, 'Run no.');
    expect(sheet.views[0]).toMatchObject({ state: 'frozen', ySplit: headerRow });
    expect(sheet.pageSetup.orientation).toBe('landscape');
    expect(sheet.pageSetup.fitToPage).toBe(true);
    expect(sheet.pageSetup.fitToWidth).toBe(1);
    expect(sheet.pageSetup.fitToHeight).toBe(0);
    expect(sheet.pageSetup.printTitlesRow).toBe(`${headerRow}:${headerRow}`);
    expect(sheet.headerFooter.oddFooter).toMatch(/Plan tp-3f9a1c, seed 20261201/);
  });

  it('starts each session on a new printed page and marks hard-to-change resets in bold', async () => {
    const { workbook, schedule, plan, buffer } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    const headerRow = rowWith(sheet, 'Run no.');
    // A break after the last run of each session but the last: sessions of 6, 6, 6 → after runs 6 and 12.
    const lastOfSession = schedule.order.filter((r, i, all) => i + 1 < all.length && all[i + 1].session !== r.session);
    expect(lastOfSession.map((r) => r.sequence)).toEqual([6, 12]);
    // exceljs does not read page breaks back, so the sheet XML is read directly (jszip comes with
    // exceljs); OOXML <brk id="n"> puts a break below row n (ECMA-376 Part 1, §18.3.1.14).
    const xml = await (await JSZip.loadAsync(buffer)).file('xl/worksheets/sheet1.xml')!.async('string');
    const breaks = [...xml.matchAll(/<brk id="(\d+)"/g)].map((m) => Number(m[1]));
    expect(breaks).toEqual(lastOfSession.map((r) => headerRow + r.sequence));
    const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
    let boldCount = 0;
    schedule.order.forEach((scheduled, i) => {
      const cell = sheet.getCell(headerRow + 1 + i, 5);
      const changed = i > 0 && byPoint.get(schedule.order[i - 1].point)!.settings.inlet_temp !== byPoint.get(scheduled.point)!.settings.inlet_temp;
      expect(Boolean(cell.font?.bold)).toBe(changed);
      if (changed) boldCount++;
      expect(Boolean(sheet.getCell(headerRow + 1 + i, 6).font?.bold)).toBe(false);
    });
    expect(boldCount).toBe(schedule.hardToChange!.levelChanges);
  });

  it('fills the plan record, model and tier sheets', async () => {
    const { workbook, plan } = await readBack();
    const record = workbook.getWorksheet(SHEET_NAMES.record)!;
    const value = (label: string) => record.getCell(rowWith(record, label), 2).value;
    expect(value('Plan id')).toBe(plan.planId);
    expect(value('Checksum (SHA-256)')).toBe(plan.checksum);
    expect(value('Run order seed')).toBe(20261201);
    expect(value('Tool version')).toBe('0.1.0');
    expect(value('Created (UTC)')).toBe(plan.createdAt);
    expect(value('Study title')).toBe(plan.study.title);
    expect(value('Study file')).toBe('samples/spray-dryer/study.yaml');
    expect(value('Index table')).toBe('samples/spray-dryer/indices.csv');

    const model = workbook.getWorksheet(SHEET_NAMES.model)!;
    expect(model.getCell(rowWith(model, 'inlet_temp*feed_rate'), 2).value).toBe('second-order index 0.07 ≥ 0.05');
    const dRow = rowWith(model, 'D-efficiency (%)');
    expect(model.getCell(dRow, 2).value).toBe(41.2);
    expect(String(model.getCell(dRow, 3).value)).toMatch(/relative to a hypothetical orthogonal design/);
    expect(String(model.getCell(rowWith(model, 'D-efficiency against the continuous optimum (%)'), 3).value)).toMatch(/relative to the best continuous/);
    expect(model.getCell(rowWith(model, 'D-efficiency against the continuous optimum (%)'), 2).value).toBe(93.5);

    const tiers = workbook.getWorksheet(SHEET_NAMES.tiers)!;
    const inlet = rowWith(tiers, 'Inlet air temperature');
    expect(tiers.getCell(inlet, 5).value).toBe('critical');
    expect(tiers.getCell(inlet, 6).value).toBe(0.52);
    expect(tiers.getCell(inlet, 12).value).toBe('varied: 160, 180, 200');
    expect(tiers.getCell(rowWith(tiers, 'GAB energy constant C'), 13).value).toBe('model parameter: estimate precisely from the lab data');
  });

  it('says so when the comparison was not computed, and fills it when present', async () => {
    const without = await readBack();
    expect(String(without.workbook.getWorksheet(SHEET_NAMES.comparison)!.getCell('A3').value)).toMatch(/not computed/);

    const withComparison = await readBack((plan) => {
      plan.comparison = {
        modelTerms: plan.model.terms, p: 7, delta: 2, alpha: 0.05, predictionVarianceMethod: 'exact region moments', currency: 'EUR',
        comparators: [
          {
            id: 'full-grid', label: '3×3×2 full grid + 3 centre runs', runs: 21, fitsModel: true, missingTerms: [], dEfficiency: 38.5,
            relativeInformationPerRun: 0.93, relativeInformationTotal: 1.08, averagePredictionVariance: 0.55, minPower: 0.91,
            cost: 17850, hours: 63, levelChanges: 2, runsSaved: 3, percentRunsSaved: 14.3, costSaved: 2550, percentCostSaved: 14.3,
            verdict: 'more runs for little more information',
          },
        ],
        fdsCurves: [], summary: 'The proposed plan needs 3 runs fewer than the full grid.',
      };
    });
    const sheet = withComparison.workbook.getWorksheet(SHEET_NAMES.comparison)!;
    expect(sheet.getCell('A2').value).toBe('The proposed plan needs 3 runs fewer than the full grid.');
    expect(sheet.getCell('A6').value).toBe('3×3×2 full grid + 3 centre runs');
    expect(sheet.getCell('B6').value).toBe(21);
    expect(sheet.getCell('F5').value).toBe('Information per run, relative to proposed');
    expect(sheet.getCell('F6').value).toBe(0.93);
  });

  it('writes formula-like study text as plain strings, never formulas', async () => {
    const { workbook } = await readBack((plan) => {
      plan.study.title = '=SUM(A1)';
      plan.study.responses[0].name = '+1';
      plan.levels[0].name = '@x';
      plan.levels[1].name = '-cmd';
    });
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    expect(sheet.getCell('A1').type).toBe(ExcelJS.ValueType.String);
    expect(sheet.getCell('A1').value).toBe('Run sheet — =SUM(A1)');
    const record = workbook.getWorksheet(SHEET_NAMES.record)!;
    const title = record.getCell(rowWith(record, 'Study title'), 2);
    expect(title.type).toBe(ExcelJS.ValueType.String);
    expect(title.value).toBe('=SUM(A1)');
    expect(title.formula).toBeUndefined();
    const headerRow = rowWith(sheet, 'Run no.');
    expect(sheet.getCell(headerRow, 5).value).toBe('@x [°C]');
    expect(sheet.getCell(headerRow, 8).type).toBe(ExcelJS.ValueType.String);
    expect(sheet.getCell(headerRow, 8).value).toBe('+1 [% w/w]');
    expect(sheet.getCell(rowWith(sheet, 'Held fixed'), 2).value).toBe('-cmd [% w/w]');
  });
});
