/**
 * Reading the filled run sheet back: the sheets `tierplan plan` writes, filled by the invented
 * sample generator (samples/spray-dryer/makeResults.ts), then tampered cell by cell. Checks
 * that every refusal names the file, sheet, row and column, and that warnings do not refuse.
 * The plan is the hand-made fixture of tests/fixtures/plan (INVENTED).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { scheduleRuns } from '../../src/core/schedule/scheduleRuns.js';
import { InputError } from '../../src/core/inputError.js';
import { columnLetters, readResultsSheet } from '../../src/io/resultsSheet.js';
import { limitOf } from '../../src/core/inputLimits.js';
import { runSheetTable } from '../../src/io/runSheetTable.js';
import { filledCsv, filledWorkbook, inventedResults } from '../../samples/spray-dryer/makeResults.js';
import { sprayDryerPlan } from '../fixtures/plan/sprayDryerPlan.js';

const dir = mkdtempSync(join(tmpdir(), 'tierplan-results-'));

function fixturePlan() {
  const plan = sprayDryerPlan();
  plan.schedule = scheduleRuns(plan, 20261201);
  return plan;
}

async function refusal(promise: Promise<unknown>): Promise<InputError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  throw new Error('expected an InputError');
}

/** The CSV's lines as fields (the generator writes no quoted line breaks). */
function csvLines(text: string): string[] {
  return text.slice(1).split('\r\n');
}

describe('results read back from the CSV run sheet', () => {
  const plan = fixturePlan();
  const table = runSheetTable(plan, plan.schedule!);
  const csv = filledCsv(plan);
  const lines = csvLines(csv);
  const headerLine = lines.findIndex((line) => line.startsWith('"Run no."'));
  const column = (kind: string, id?: string) => table.columns.findIndex((c) => c.kind === kind && (id === undefined || c.id === id));

  /** The CSV with field `c` of table row `r` (0-based, after the header) replaced. */
  function tampered(r: number, c: number, value: string): string {
    const copy = [...lines];
    const fields = copy[headerLine + 1 + r].split(',');
    fields[c] = value;
    copy[headerLine + 1 + r] = fields.join(',');
    return `\uFEFF${copy.join('\r\n')}`;
  }
  function write(name: string, text: string): string {
    const path = join(dir, name);
    writeFileSync(path, text);
    return path;
  }

  it('reads every run and result the generator wrote', async () => {
    const read = await readResultsSheet(write('ok.csv', csv), plan);
    const invented = inventedResults(plan);
    expect(read.runs).toHaveLength(plan.runs.length);
    expect(read.warnings).toEqual([]);
    for (const run of read.runs) expect(run.results).toEqual(invented.get(run.run));
    expect(read.format).toBe('csv');
  });

  it('refuses a changed set-point, naming its row and column', async () => {
    const c = column('setPoint', 'inlet_temp');
    const error = await refusal(readResultsSheet(write('setpoint.csv', tampered(2, c, '182')), plan));
    // Line of the third run: header block, empty line, header row, two runs before it.
    expect(error.location.row).toBe(headerLine + 1 + 2 + 1);
    expect(error.location.column).toBe(`${columnLetters(c)} (Inlet air temperature [°C])`);
    expect(error.describe()).toMatch(/setpoint\.csv, row \d+, column [A-Z] \(Inlet air temperature \[°C\]\): the set-point of run 3 was \d+, the sheet says 182: never change a set-point/);
  });

  it('refuses a result that is not a number', async () => {
    const c = column('response', 'yield');
    const error = await refusal(readResultsSheet(write('text.csv', tampered(0, c, '"about 80"')), plan));
    expect(error.location.column).toBe(`${columnLetters(c)} (Powder yield [%])`);
    expect(error.message).toMatch(/"about 80" is not a number/);
    const comma = await refusal(readResultsSheet(write('comma.csv', tampered(0, c, '"81,5"')), plan));
    expect(comma.message).toMatch(/"81,5" is not a number.*decimal point/);
  });

  it("refuses another plan's sheet by its plan id", async () => {
    const other = csv.replace(`"Plan id","${plan.planId}"`, '"Plan id","TP-0000000000"');
    const error = await refusal(readResultsSheet(write('other.csv', other), plan));
    expect(error.describe()).toMatch(/other\.csv, row 2, column B: plan id TP-0000000000 is not the plan id of this plan\.json/);
  });

  it("refuses another plan's sheet by its checksum", async () => {
    const other = csv.replace(plan.checksum, 'f'.repeat(64));
    const error = await refusal(readResultsSheet(write('checksum.csv', other), plan));
    expect(error.describe()).toMatch(/row 3, column B: checksum f+ is not the checksum of this plan\.json/);
  });

  it('refuses a missing run and a run listed twice', async () => {
    const copy = [...lines];
    copy.splice(headerLine + 2, 1);
    const missing = await refusal(readResultsSheet(write('missing.csv', `\uFEFF${copy.join('\r\n')}`), plan));
    expect(missing.message).toMatch(/run 2 of plan .* is missing from the table/);
    const twice = [...lines];
    twice[headerLine + 2] = twice[headerLine + 3];
    const error = await refusal(readResultsSheet(write('twice.csv', `\uFEFF${twice.join('\r\n')}`), plan));
    expect(error.message).toMatch(/run 3 is listed twice \(also on row \d+\)/);
  });

  it('warns about a blank result and a run marked not done, and leaves their results out', async () => {
    const blank = tampered(0, column('response', 'moisture'), '');
    const blankLines = csvLines(blank);
    const fields = blankLines[headerLine + 2].split(',');
    fields[column('remarks')] = '"Not done: nozzle blocked"';
    blankLines[headerLine + 2] = fields.join(',');
    const read = await readResultsSheet(write('warn.csv', `\uFEFF${blankLines.join('\r\n')}`), plan);
    expect(read.warnings).toEqual([
      expect.stringMatching(/^run 2 \(point \w+\) is marked "not done" in Remarks: its results are left out$/),
      'Residual moisture: no result for run 1; fitted on the runs that have one',
    ]);
    expect(read.runs[0].results.moisture).toBeNull();
    expect(read.runs[1].notDone).toBe(true);
    expect(Object.values(read.runs[1].results).every((value) => value === null)).toBe(true);
  });

  it('reads a remark at the cell-length limit and refuses one character more, naming the cell', async () => {
    const c = column('remarks');
    const limit = limitOf('sheetCellLength');
    const read = await readResultsSheet(write('long-ok.csv', tampered(0, c, `"${'r'.repeat(limit)}"`)), plan);
    expect(read.runs).toHaveLength(plan.runs.length);
    const error = await refusal(readResultsSheet(write('long.csv', tampered(0, c, `"${'r'.repeat(limit + 1)}"`)), plan));
    expect(error.describe()).toBe(
      `${join(dir, 'long.csv')}, row ${headerLine + 2}, column ${columnLetters(c)}: ${limit + 1} characters in one cell is above the limit of ${limit} characters (see "Limits" in the README)`,
    );
  });

  it('quotes a long wrong value as an excerpt, so the message stays one short line', async () => {
    const c = column('response', 'yield');
    const error = await refusal(readResultsSheet(write('wordy.csv', tampered(0, c, `"${'about eighty '.repeat(300)}"`)), plan));
    expect(error.message).toMatch(/^"about eighty about eighty .{20,60}…" is not a number/);
    expect(error.describe().length).toBeLessThan(400);
  });

  it('refuses a CSV beyond the table file-size limit before parsing it', async () => {
    const path = write('huge.csv', `${csv}${' '.repeat(limitOf('tableFileBytes'))}`);
    const error = await refusal(readResultsSheet(path, plan));
    expect(error.message).toMatch(/^is 33\.6 MB, above the limit of 32 MiB \(see "Limits" in the README\)$/);
  });

  const asRun = table.columns.find((c) => (c.kind as string) === 'asRun');
  it.skipIf(asRun === undefined)('refuses an as-run value outside the equipment limits (sheets with "as run" columns)', async () => {
    const c = table.columns.indexOf(asRun!);
    const factor = plan.study.factors.find((f) => f.id === asRun!.id)!;
    const error = await refusal(readResultsSheet(write('limits.csv', tampered(0, c, String(factor.limits!.high + 1))), plan));
    expect(error.location.column).toMatch(new RegExp(`^${columnLetters(c)} `));
    expect(error.message).toMatch(/outside the equipment limits/);
  });
});

describe('results read back from the workbook run sheet', () => {
  const plan = fixturePlan();
  const table = runSheetTable(plan, plan.schedule!);

  it('refuses a number under a date format that is no date as "not a number", not as a crash', async () => {
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load((await filledWorkbook(plan)) as unknown as ArrayBuffer);
    const sheet = workbook.getWorksheet('Run sheet')!;
    const c = table.columns.findIndex((column) => column.kind === 'response' && column.id === 'yield');
    let firstRun = 0;
    sheet.eachRow((row, number) => {
      if (firstRun === 0 && row.getCell(1).value === 1) firstRun = number;
    });
    const cell = sheet.getCell(firstRun, c + 1);
    cell.value = 1e308;
    cell.style = { ...cell.style, numFmt: 'yyyy-mm-dd' };
    const path = join(dir, 'date.xlsx');
    writeFileSync(path, Buffer.from(await workbook.xlsx.writeBuffer()));
    const error = await refusal(readResultsSheet(path, plan));
    expect(error.describe()).toMatch(new RegExp(`date\\.xlsx, sheet Run sheet, row ${firstRun}, column ${columnLetters(c)} \\(Powder yield \\[%\\]\\): "an invalid date" is not a number`));
  });

  it('reads the filled workbook and refuses a changed set-point cell by sheet, row and column', async () => {
    const buffer = await filledWorkbook(plan);
    const good = join(dir, 'ok.xlsx');
    writeFileSync(good, buffer);
    const read = await readResultsSheet(good, plan);
    expect(read.sheet).toBe('Run sheet');
    expect(read.runs.map((run) => run.results)).toEqual(read.runs.map((run) => inventedResults(plan).get(run.run)));

    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(buffer as unknown as ArrayBuffer);
    const sheet = workbook.getWorksheet('Run sheet')!;
    const c = table.columns.findIndex((column) => column.kind === 'setPoint' && column.id === 'feed_rate');
    let firstRun = 0;
    sheet.eachRow((row, number) => {
      if (firstRun === 0 && row.getCell(1).value === 1) firstRun = number;
    });
    sheet.getCell(firstRun + 4, c + 1).value = 15.5;
    const bad = join(dir, 'tampered.xlsx');
    writeFileSync(bad, Buffer.from(await workbook.xlsx.writeBuffer()));
    const error = await refusal(readResultsSheet(bad, plan));
    expect(error.describe()).toMatch(
      new RegExp(`tampered\\.xlsx, sheet Run sheet, row ${firstRun + 4}, column ${columnLetters(c)} \\(Feed rate \\[kg/h\\]\\): the set-point of run 5 was [\\d.]+, the sheet says 15\\.5`),
    );
  });
});
