/**
 * The workbook is read back with exceljs itself (a general-purpose xlsx reader) and checked
 * cell by cell against the plan fixture.
 */
import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { scheduleRuns } from '../../../src/core/schedule/scheduleRuns.js';
import { planWorkbook, SHEET_NAMES } from '../../../src/io/workbook/planWorkbook.js';
import { CHECKSUM_CELL, FIRST_RUN_ROW, HEADER_ROW, KEY_ROW, PLAN_ID_CELL, RUN_ROW_HEIGHT } from '../../../src/io/workbook/runSheet.js';
import { FONT_NAME } from '../../../src/io/workbook/sheetLayout.js';
import { sprayDryerPlan } from '../../fixtures/plan/sprayDryerPlan.js';
import type { PlanDocument } from '../../../src/core/plan/planDocument.js';

async function readBack(edit?: (plan: PlanDocument) => void, seed = 20261201) {
  const plan = sprayDryerPlan();
  edit?.(plan);
  const schedule = scheduleRuns(plan, seed);
  const buffer = await planWorkbook(plan, schedule);
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(buffer as unknown as ArrayBuffer);
  return { plan, schedule, workbook, buffer };
}

/** Row number of the first row whose column A holds `text`. */
function rowWith(sheet: ExcelJS.Worksheet, text: string): number {
  for (let r = 1; r <= sheet.rowCount; r++) if (sheet.getCell(r, 1).value === text) return r;
  throw new Error(`no row starting with ${text}`);
}

describe('plan workbook', () => {
  it('has our sheets in order and reproducible metadata', async () => {
    const { workbook, plan } = await readBack();
    expect(workbook.worksheets.map((s) => s.name)).toEqual([
      SHEET_NAMES.runSheet, SHEET_NAMES.decision, SHEET_NAMES.tiers, SHEET_NAMES.model, SHEET_NAMES.comparison, SHEET_NAMES.record,
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

  it('keeps plan id and checksum in fixed cells and the column keys in a hidden row', async () => {
    const { workbook, plan } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    expect(sheet.getCell('A1').value).toBe(`Run sheet — ${plan.study.title}`);
    expect(sheet.getCell(PLAN_ID_CELL).value).toBe(plan.planId);
    expect(sheet.getCell(CHECKSUM_CELL).value).toBe(plan.checksum);
    expect(String(sheet.getCell('C3').value)).toMatch(/rated limits and the site's safety procedures.*hazard review; local codes and licensed practice prevail/);
    expect(sheet.getCell('C4').value).toBe('Feed total solids 38.0 % w/w; Drying air flow 400 m³/h (every run).');
    // The marks are explained on the sheet.
    expect(String(sheet.getCell('C5').value)).toMatch(/^Bold set-point on a yellow cell: Inlet air temperature changes before this run/);
    expect(String(sheet.getCell('C5').value)).toContain('Grey "as run" columns');
    expect(sheet.getRow(KEY_ROW).hidden).toBe(true);
    expect((sheet.getRow(KEY_ROW).values as unknown[]).slice(1)).toEqual([
      'run', 'session', 'point', 'kind',
      'set:inlet_temp', 'as_run:inlet_temp', 'set:feed_rate', 'as_run:feed_rate', 'set:atomiser_speed', 'as_run:atomiser_speed',
      'result:moisture', 'result:yield', 'result:d50', 'start', 'end', 'lot', 'operator', 'checked_by', 'date', 'remarks',
    ]);
    expect((sheet.getRow(HEADER_ROW).values as unknown[]).slice(1, 7)).toEqual([
      'Run no.', 'Day', 'Point', 'Kind of run', 'Inlet air temperature [°C]', 'as run [°C]',
    ]);
  });

  it('writes the runs in execution order with set-point formats and numeric entry cells', async () => {
    const { workbook, plan, schedule } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
    schedule.order.forEach((scheduled, i) => {
      const row = sheet.getRow(FIRST_RUN_ROW + i);
      const run = byPoint.get(scheduled.point)!;
      expect(row.getCell(1).value).toBe(scheduled.sequence);
      expect(row.getCell(3).value).toBe(scheduled.point);
      expect(row.getCell(5).value).toBe(run.settings.inlet_temp);
      expect(row.getCell(5).numFmt).toBe('0');
      expect(row.getCell(7).value).toBeCloseTo(run.settings.feed_rate, 10);
      for (const col of [6, 8, 10, 11, 12, 13]) {
        expect(row.getCell(col).value).toBeNull();
        expect(row.getCell(col).dataValidation.type).toBe('decimal');
        expect(row.getCell(col).dataValidation.allowBlank).toBe(true);
      }
      expect(row.getCell(19).numFmt).toBe('yyyy-mm-dd');
    });
    expect(sheet.getCell(FIRST_RUN_ROW, 6).dataValidation.prompt).toMatch(/^Only if the Inlet air temperature actually set differs from \d+ in °C/);
    expect(sheet.getCell(FIRST_RUN_ROW + schedule.order.length, 1).value).toBeNull();
  });

  it('prints the run sheet with the header block on every page, rows to write in and headers that fit', async () => {
    const { workbook } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    expect(sheet.pageSetup.printTitlesRow).toBe(`1:${HEADER_ROW}`);
    expect(sheet.pageSetup.orientation).toBe('landscape');
    expect(sheet.pageSetup.fitToPage).toBe(true);
    expect(sheet.pageSetup.fitToWidth).toBe(1);
    expect(sheet.pageSetup.fitToHeight).toBe(0);
    expect(sheet.headerFooter.oddFooter).toContain('Plan tp-3f9a1c · run order seed 20261201');
    expect(sheet.views[0]).toMatchObject({ state: 'frozen', ySplit: HEADER_ROW });
    for (let r = FIRST_RUN_ROW; r < FIRST_RUN_ROW + 18; r++) expect(sheet.getRow(r).height).toBeGreaterThanOrEqual(RUN_ROW_HEIGHT);
    // The longest header, "Atomiser wheel speed [rpm]", needs three 9-pt lines: 3 × 12 pt at least.
    expect(sheet.getRow(HEADER_ROW).height).toBeGreaterThanOrEqual(36);
    expect(sheet.getCell(HEADER_ROW, 9).alignment?.wrapText).toBe(true);
    // No header word is wider than its column (0.8 width units per character at 10 pt, common practice for Arial; 9 pt bold).
    sheet.getRow(HEADER_ROW).eachCell((cell, col) => {
      const longest = Math.max(...String(cell.value).split(/\s+/).map((word) => word.length));
      expect(longest * 0.8 * 0.9 * 1.08, String(cell.value)).toBeLessThanOrEqual(sheet.getColumn(col).width ?? sheet.properties.defaultColWidth ?? 0);
    });
  });

  it('fits every sheet to the page width, with the plan id in every footer', async () => {
    const { workbook, plan } = await readBack((p) => p);
    for (const sheet of workbook.worksheets) {
      expect(sheet.pageSetup.fitToPage, sheet.name).toBe(true);
      expect(sheet.pageSetup.fitToWidth, sheet.name).toBe(1);
      expect(sheet.pageSetup.paperSize, sheet.name).toBe(9);
      expect(sheet.headerFooter.oddFooter, sheet.name).toContain(`Plan ${plan.planId}`);
      // A sheet either fits one page tall or repeats its header rows on every page.
      expect(sheet.pageSetup.fitToHeight === 1 || sheet.pageSetup.printTitlesRow !== undefined, sheet.name).toBe(true);
    }
  });

  it('uses one explicit font on every written cell of every sheet', async () => {
    const { workbook } = await readBack();
    const families = new Set<string>();
    let cells = 0;
    for (const sheet of workbook.worksheets) {
      sheet.eachRow((row) => row.eachCell((cell) => {
        if (cell.value === null || cell.value === '') return;
        cells++;
        families.add(String(cell.font?.name));
      }));
    }
    expect(cells).toBeGreaterThan(200);
    expect([...families]).toEqual([FONT_NAME]);
  });

  it('starts each session on a new printed page and marks hard-to-change resets in bold', async () => {
    const { workbook, schedule, plan, buffer } = await readBack();
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    const headerRow = HEADER_ROW;
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
      const cell = sheet.getCell(headerRow + 1 + i, 5); // set:inlet_temp
      const changed = i > 0 && byPoint.get(schedule.order[i - 1].point)!.settings.inlet_temp !== byPoint.get(scheduled.point)!.settings.inlet_temp;
      expect(Boolean(cell.font?.bold)).toBe(changed);
      if (changed) boldCount++;
      expect(Boolean(sheet.getCell(headerRow + 1 + i, 7).font?.bold)).toBe(false); // set:feed_rate
    });
    expect(boldCount).toBe(schedule.hardToChange!.levelChanges);
  });

  it('fills the plan record and says so when the comparison was not computed', async () => {
    const { workbook, plan } = await readBack();
    const record = workbook.getWorksheet(SHEET_NAMES.record)!;
    const value = (label: string) => record.getCell(rowWith(record, label), 2).value;
    expect(value('Plan id')).toBe(plan.planId);
    expect(value('Checksum (SHA-256)')).toBe(plan.checksum);
    expect(value('Run order seed')).toBe(20261201);
    expect(String(workbook.getWorksheet(SHEET_NAMES.comparison)!.getCell('A3').value)).toMatch(/not computed/);
    const tiers = workbook.getWorksheet(SHEET_NAMES.tiers)!;
    const inlet = rowWith(tiers, 'Inlet air temperature [°C]');
    expect(tiers.getCell(inlet, 3).value).toBe('critical');
    expect(tiers.getCell(inlet, 4).value).toBe(0.52);
  });

  it('writes formula-like study text as plain strings, never formulas', async () => {
    const { workbook } = await readBack((plan) => {
      plan.study.title = '=SUM(A1)';
      plan.study.responses[0].name = '+1';
      plan.levels[0].name = '@x';
    });
    const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
    expect(sheet.getCell('A1').type).toBe(ExcelJS.ValueType.String);
    expect(sheet.getCell('A1').value).toBe('Run sheet — =SUM(A1)');
    expect(sheet.getCell(HEADER_ROW, 5).value).toBe('@x [°C]');
    expect(sheet.getCell(HEADER_ROW, 11).type).toBe(ExcelJS.ValueType.String);
    expect(sheet.getCell(HEADER_ROW, 11).value).toBe('+1 [% w/w]');
    for (const ws of workbook.worksheets) ws.eachRow((row) => row.eachCell((cell) => expect(cell.formula).toBeUndefined()));
  });
});
