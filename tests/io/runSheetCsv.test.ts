import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { scheduleRuns } from '../../src/core/schedule/scheduleRuns.js';
import { runSheetCsv } from '../../src/io/runSheetCsv.js';
import { runSheetTable } from '../../src/io/runSheetTable.js';
import { csvCell, neutraliseFormula } from '../../src/io/csvCell.js';
import { InputError } from '../../src/core/inputError.js';
import { sprayDryerPlan } from '../fixtures/plan/sprayDryerPlan.js';

/** Raw fields of a CSV text, split at commas and CRLF outside quotes (quotes kept). */
function rawFields(text: string): string[] {
  const fields: string[] = [];
  let current = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    if (!quoted && (c === ',' || (c === '\r' && text[i + 1] === '\n'))) {
      fields.push(current);
      current = '';
      if (c === '\r') i++;
      continue;
    }
    current += c;
  }
  fields.push(current);
  return fields;
}

function sheet(seed = 20261201, edit?: (plan: ReturnType<typeof sprayDryerPlan>) => void) {
  const plan = sprayDryerPlan();
  edit?.(plan);
  const schedule = scheduleRuns(plan, seed);
  return { plan, schedule, csv: runSheetCsv(plan, schedule) };
}

/** Header block and table, split at the first empty line as the header of src/io/runSheetCsv.ts fixes. */
function split(csv: string) {
  expect(csv.startsWith('\uFEFF')).toBe(true);
  const body = csv.slice(1);
  const [head, table] = body.split('\r\n\r\n');
  // csv-parse is an independent RFC 4180 reader: the file must parse cleanly with it.
  return { head: parse(head, { relax_column_count: true }) as string[][], table: parse(table) as string[][] };
}

describe('CSV run sheet layout', () => {
  it('has a BOM, CRLF lines, a header block, then one row per run in execution order', () => {
    const { plan, schedule, csv } = sheet();
    expect(csv.replace(/\r\n/g, '')).not.toMatch(/\n/);
    const { head, table } = split(csv);
    expect(head[0]).toEqual(['Run sheet', plan.study.title]);
    expect(head).toContainEqual(['Plan id', plan.planId]);
    expect(head).toContainEqual(['Seed', '20261201']);
    expect(head).toContainEqual(['Made with', 'tierplan 0.1.0']);
    expect(head).toContainEqual(['Held fixed', 'Feed total solids [% w/w]', '38.0']);
    expect(head).toContainEqual(['Held fixed', 'Drying air flow [m³/h]', '400']);
    expect(head.find((row) => row[0] === 'Caution')![1]).toMatch(/rated limits.*hazard review.*licensed practice prevail/);
    expect(csv).not.toMatch(/#/);

    expect(head).toContainEqual(['Checksum', plan.checksum]);
    // One Session row per session: label, runs, bench hours (6 runs × 3 h = 18 h plus level changes).
    const sessionRows = head.filter((row) => row[0] === 'Session');
    expect(sessionRows.map((row) => row[1])).toEqual(['Day 1', 'Day 2', 'Day 3', 'Day 4', 'Day 5'].slice(0, sessionRows.length));
    expect(sessionRows.reduce((sum, row) => sum + Number(row[2]), 0)).toBe(plan.runs.length);
    for (const row of sessionRows) expect(Number(row[3])).toBeGreaterThanOrEqual(3 * Number(row[2]));

    // First the machine keys, then the human headers: a reader finds columns by key.
    expect(table[0]).toEqual([
      'run', 'session', 'point', 'kind',
      'set:inlet_temp', 'as_run:inlet_temp', 'set:feed_rate', 'as_run:feed_rate', 'set:atomiser_speed', 'as_run:atomiser_speed',
      'result:moisture', 'result:yield', 'result:d50',
      'start', 'end', 'lot', 'operator', 'checked_by', 'date', 'remarks',
    ]);
    expect(table[1]).toEqual([
      'Run no.', 'Day', 'Point', 'Kind of run',
      'Inlet air temperature [°C]', 'as run [°C]', 'Feed rate [kg/h]', 'as run [kg/h]', 'Atomiser wheel speed [rpm]', 'as run [rpm]',
      'Residual moisture [% w/w]', 'Powder yield [%]', 'Median particle size [µm]',
      'Start time', 'End time', 'Material lot', 'Operator', 'Checked by', 'Date', 'Remarks',
    ]);
    expect(table).toHaveLength(2 + plan.runs.length);
    const rows = table.slice(2);
    expect(rows.map((r) => r[0])).toEqual(schedule.order.map((r) => String(r.sequence)));
    expect(rows.map((r) => r[2])).toEqual(schedule.order.map((r) => r.point));
    const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
    for (const row of rows) {
      const run = byPoint.get(row[2])!;
      expect(row[4]).toBe(String(run.settings.inlet_temp)); // precision 1 → no decimals
      expect(row[6]).toBe(run.settings.feed_rate.toFixed(1)); // precision 0.1 → 1 decimal
      expect(row[8]).toBe(String(run.settings.atomiser_speed));
      // As-run, result and record fields are blank for the bench to fill.
      expect([row[5], row[7], row[9]]).toEqual(['', '', '']);
      expect(row.slice(10)).toEqual(['', '', '', '', '', '', '', '', '', '']);
      expect(['Model run', 'Centre repeat', 'Validation run']).toContain(row[3]);
    }
  });

  it('exports one column definition with a group per column, in the order the files write', () => {
    const { plan, schedule, csv } = sheet();
    const { columns } = runSheetTable(plan, schedule);
    const { table } = split(csv);
    expect(columns.map((column) => column.key)).toEqual(table[0]);
    expect(columns.map((column) => column.header)).toEqual(table[1]);
    const groups = columns.map((column) => `${column.group}:${column.id ?? column.kind}`);
    expect(groups.slice(4, 8)).toEqual(['setPoint:inlet_temp', 'asRun:inlet_temp', 'setPoint:feed_rate', 'asRun:feed_rate']);
    expect(columns.filter((column) => column.group === 'response').map((column) => column.id)).toEqual(['moisture', 'yield', 'd50']);
    expect(columns.filter((column) => column.group === 'record').map((column) => column.key)).toEqual(['start', 'end', 'lot', 'operator', 'checked_by', 'date', 'remarks']);
  });

  it('is byte-identical for the same plan and seed and differs for another seed', () => {
    expect(sheet(5).csv).toBe(sheet(5).csv);
    expect(sheet(5).csv).not.toBe(sheet(6).csv);
  });

  it('refuses a setting outside the equipment limits', () => {
    expect(() =>
      sheet(1, (plan) => {
        plan.runs[0].settings.inlet_temp = 230;
      }),
    ).toThrow(InputError);
  });
});

describe('CSV formula-injection guard', () => {
  // OWASP, "CSV Injection" (https://owasp.org/www-community/attacks/CSV_Injection): cells
  // beginning with =, +, -, @, tab (0x09) or carriage return (0x0D) are prefixed with a single
  // quote and the field is wrapped in double quotes, with inner double quotes escaped.
  it.each([
    ['=SUM(A1)', "'=SUM(A1)"],
    ['+1', "'+1"],
    ['-cmd', "'-cmd"],
    ['@x', "'@x"],
    ['\tx', "'\tx"],
    ['\rx', "'\rx"],
    ['plain', 'plain'],
    ['a=b', 'a=b'],
    // A lone minus (a dimensionless unit) cannot start a formula; '-- ' still can.
    ['-', '-'],
    ['--1', "'--1"],
  ])('neutralises %j', (input, shown) => {
    expect(neutraliseFormula(input)).toBe(shown);
    expect(csvCell(input)).toBe(`"${shown}"`);
  });

  it('escapes inner quotes and keeps numbers, negative ones included, as bare numbers', () => {
    expect(csvCell('=HYPERLINK("http://x","y")')).toBe('"\'=HYPERLINK(""http://x"",""y"")"');
    expect(csvCell(-1.5)).toBe('-1.5');
    expect(csvCell(-1.5, 2)).toBe('-1.50');
    expect(csvCell(-0.04, 1)).toBe('0.0');
    expect(csvCell(null)).toBe('');
  });

  it('guards study title, factor and response names and the session label in the file', () => {
    const { csv } = sheet(3, (plan) => {
      plan.study.title = '=SUM(A1)';
      plan.levels[0].name = '+1';
      plan.levels[2].name = '-cmd';
      plan.study.responses[0].name = '@x';
      plan.study.responses[1].name = '\tx';
      plan.study.responses[2].name = '\rx';
      plan.levels[1].name = '=cmd|"/C calc"!A0';
      plan.study.sessions!.label = '-Day';
      // A factor whose settings are negative numbers (coded feed offset, invented).
      for (const run of plan.runs) run.settings.feed_rate = Number((run.settings.feed_rate - 12.5).toFixed(1));
      const factor = plan.study.factors.find((f) => f.id === 'feed_rate')!;
      factor.limits = { low: -10, high: 10 };
    });
    const { head, table } = split(csv);
    expect(head[0][1]).toBe("'=SUM(A1)");
    expect(head).toContainEqual(['Held fixed', '\'=cmd|"/C calc"!A0 [% w/w]', '38.0']);
    expect([1, 2, 3, 4, 6, 8, 10, 11, 12].map((i) => table[1][i])).toEqual([
      "'-Day", 'Point', 'Kind of run', "'+1 [°C]", "'-cmd [kg/h]", 'Atomiser wheel speed [rpm]', "'@x [% w/w]", "'\tx [%]", "'\rx [µm]",
    ]);
    // Every field that starts with a trigger character in the raw file is a quoted, guarded text
    // field or a bare number.
    for (const field of rawFields(csv.slice(1))) {
      if (field.startsWith('"')) {
        expect(field.endsWith('"')).toBe(true);
        expect(field.charAt(1)).not.toMatch(/[=+\-@\t\r]/);
      } else {
        // Unquoted fields are empty or bare numbers.
        expect(field).toMatch(/^(-?\d+(\.\d+)?)?$/);
      }
    }
    expect(table.slice(2).some((row) => row[6] === '-1.5')).toBe(true);
    expect(csv).toMatch(/,-1\.5,/);
  });
});
