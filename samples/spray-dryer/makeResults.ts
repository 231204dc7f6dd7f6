/**
 * INVENTED RESULTS for the spray-dryer sample: fills the sample plan's run sheet with results
 * from an invented smooth process function plus invented, seeded measurement noise, so that
 * `tierplan analyze` has something to read. Nothing here was measured or taken from a
 * publication; the function below describes no real dryer.
 *
 * Usage (one command, rerun whenever the planner changes the sample's plan id):
 *   npm run sample:results                      plans samples/spray-dryer/study.yaml as
 *                                               `tierplan plan` does by default, writes
 *                                               samples/spray-dryer/results.xlsx and .csv
 *   tsx samples/spray-dryer/makeResults.ts --plan <plan.json> --out <dir>
 *                                               fills the sheets of an existing plan
 *
 * The sheets are the writer's own (planWorkbook / runSheetCsv of the plan), filled in the
 * cells the technician would use, found through the writer's column definition. Each sheet
 * says it is invented: in its title and in the Operator column of every run.
 * Seed: RESULT_SEED; the same plan gives the same results.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import ExcelJS from 'exceljs';
import { parse } from 'csv-parse/sync';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';
import { createRandom } from '../../src/core/random.js';
import { toCoded } from '../../src/core/region/codedUnits.js';
import { csvCell } from '../../src/io/csvCell.js';
import { loadPlan, sealPlan } from '../../src/io/planFile.js';
import { locateRunTable, type CellValue } from '../../src/io/resultsSheet.js';
import { runSheetCsv } from '../../src/io/runSheetCsv.js';
import { runSheetTable, type RunSheetColumn } from '../../src/io/runSheetTable.js';
import { SHEET_NAMES, planWorkbook } from '../../src/io/workbook/planWorkbook.js';
import { loadStudy } from '../../src/io/studyFile.js';
import { toolVersion } from '../../src/io/toolVersion.js';

export const RESULT_SEED = 20261202;
export const INVENTED_MARK = 'invented (makeResults.ts)';
const sampleDir = fileURLToPath(new URL('.', import.meta.url));

/** Coded settings of the five operating factors (−1 … +1 over the study range). */
interface Coded {
  inlet_temp: number;
  feed_solids: number;
  feed_rate: number;
  atomiser_speed: number;
  air_flow: number;
}

/**
 * The invented process: smooth, mostly quadratic responses of the coded settings, each with
 * its invented repeatability SD. d50 carries a feed-rate × atomiser-speed interaction the
 * default model may not hold, so the lab can disagree with the model there.
 */
export const INVENTED_PROCESS: Record<string, { value: (x: Coded) => number; noise: number; decimals: number }> = {
  moisture: {
    value: (x) => 4.0 - 0.9 * x.inlet_temp + 0.45 * x.feed_solids + 0.55 * x.feed_rate - 0.05 * x.atomiser_speed - 0.15 * x.air_flow + 0.25 * x.inlet_temp ** 2 + 0.12 * x.inlet_temp * x.feed_rate,
    noise: 0.08,
    decimals: 2,
  },
  yield: {
    value: (x) => 82 + 3.0 * x.inlet_temp - 2.6 * x.feed_solids - 1.4 * x.feed_rate + 0.8 * x.atomiser_speed + 0.5 * x.air_flow - 1.5 * x.inlet_temp ** 2 - 0.8 * x.feed_solids ** 2 + 0.9 * x.inlet_temp * x.feed_solids,
    noise: 0.6,
    decimals: 1,
  },
  native_whey: {
    value: (x) => 88 - 4.5 * x.inlet_temp - 0.9 * x.feed_solids - 1.0 * x.feed_rate + 0.2 * x.atomiser_speed - 1.2 * x.inlet_temp ** 2 - 0.4 * x.inlet_temp ** 3,
    noise: 0.5,
    decimals: 1,
  },
  d50: {
    value: (x) => 52 - 2.0 * x.inlet_temp + 7.5 * x.feed_solids + 3.0 * x.feed_rate - 5.5 * x.atomiser_speed + 1.8 * x.feed_solids * x.atomiser_speed + 0.8 * x.feed_solids ** 2 + 1.5 * x.feed_rate * x.atomiser_speed,
    noise: 0.9,
    decimals: 1,
  },
};

/** Standard normal deviate by Box–Muller from two uniforms of the seeded generator. */
function normal(random: ReturnType<typeof createRandom>): number {
  const u = (random.next() >>> 0) / 4294967296 + 1 / 8589934592;
  const v = (random.next() >>> 0) / 4294967296;
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

/** Per run number: the result cells (response id → value) and the operator mark. */
/** Invented whole-plot standard deviation over the run noise (a variance ratio η of 0.25). */
const WHOLE_PLOT_SHARE = 0.5;

export function inventedResults(plan: PlanDocument): Map<number, Record<string, number>> {
  const random = createRandom(RESULT_SEED);
  const factorOf = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const runOf = new Map(plan.runs.map((run) => [run.point, run]));
  const results = new Map<number, Record<string, number>>();
  // Invented split-plot error: a shift per whole plot (the reset of the hard-to-change setting
  // is never exactly the same) of WHOLE_PLOT_SHARE times the run noise, drawn once per whole
  // plot from its own stream so that the run noise stays as before.
  const plotRandom = createRandom(RESULT_SEED + 1);
  const plotShift = new Map<number, Record<string, number>>();
  const shiftOf = (wholePlot: number | undefined, responseId: string): number => {
    if (wholePlot === undefined) return 0;
    if (!plotShift.has(wholePlot)) {
      const shifts: Record<string, number> = {};
      for (const id of Object.keys(INVENTED_PROCESS)) shifts[id] = WHOLE_PLOT_SHARE * INVENTED_PROCESS[id].noise * normal(plotRandom);
      plotShift.set(wholePlot, shifts);
    }
    return plotShift.get(wholePlot)![responseId] ?? 0;
  };
  for (const scheduled of plan.schedule!.order) {
    const run = runOf.get(scheduled.point)!;
    const coded = (id: keyof Coded): number => {
      const factor = factorOf.get(id);
      return factor && run.settings[id] !== undefined ? toCoded(factor, run.settings[id]) : 0;
    };
    const x: Coded = {
      inlet_temp: coded('inlet_temp'),
      feed_solids: coded('feed_solids'),
      feed_rate: coded('feed_rate'),
      atomiser_speed: coded('atomiser_speed'),
      air_flow: coded('air_flow'),
    };
    const row: Record<string, number> = {};
    for (const response of plan.study.responses) {
      const process = INVENTED_PROCESS[response.id];
      const noise = normal(random);
      if (!process) continue;
      row[response.id] = Number((process.value(x) + shiftOf(run.wholePlot, response.id) + process.noise * noise).toFixed(process.decimals));
    }
    results.set(scheduled.sequence, row);
  }
  return results;
}

/** The value to write in a column of run `runNumber`, or undefined to leave the cell as written. */
function entryFor(column: RunSheetColumn, runNumber: number, results: Map<number, Record<string, number>>): CellValue | undefined {
  if (column.kind === 'response') return results.get(runNumber)?.[column.id!] ?? null;
  if (column.kind === 'operator') return INVENTED_MARK;
  return undefined;
}

export async function filledWorkbook(plan: PlanDocument): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load((await planWorkbook(plan, plan.schedule!)) as unknown as ArrayBuffer);
  const sheet = workbook.getWorksheet(SHEET_NAMES.runSheet)!;
  const columns = runSheetTable(plan, plan.schedule!).columns;
  const cells: CellValue[][] = [];
  for (let r = 1; r <= sheet.rowCount; r++) {
    const row: CellValue[] = [];
    for (let c = 1; c <= sheet.columnCount; c++) {
      const value = sheet.getCell(r, c).value;
      row.push(typeof value === 'string' || typeof value === 'number' ? value : null);
    }
    cells.push(row);
  }
  const table = locateRunTable(cells, columns);
  if (!table) throw new Error('makeResults: no run table in the workbook');
  const results = inventedResults(plan);
  const runIndex = columns.findIndex((column) => column.kind === 'sequence');
  for (let r = table.row + 1; r < cells.length; r++) {
    const runNumber = cells[r][table.indexes[runIndex]];
    if (typeof runNumber !== 'number') continue;
    columns.forEach((column, i) => {
      const value = entryFor(column, runNumber, results);
      if (value !== undefined) sheet.getCell(r + 1, table.indexes[i] + 1).value = value;
    });
  }
  const title = sheet.getCell('A1');
  title.value = `${String(title.value)} — RESULTS INVENTED for the demo (samples/spray-dryer/makeResults.ts)`;
  return Buffer.from(await workbook.xlsx.writeBuffer());
}

export function filledCsv(plan: PlanDocument): string {
  const text = runSheetCsv(plan, plan.schedule!);
  const records = parse(text, { bom: true, relax_column_count: true, skip_empty_lines: false }) as string[][];
  const columns = runSheetTable(plan, plan.schedule!).columns;
  const table = locateRunTable(records.map((row) => row.map((cell) => (cell === '' ? null : cell))), columns);
  if (!table) throw new Error('makeResults: no run table in the CSV');
  const results = inventedResults(plan);
  const runIndex = columns.findIndex((column) => column.kind === 'sequence');
  records[0][1] = `${records[0][1]} — RESULTS INVENTED for the demo (samples/spray-dryer/makeResults.ts)`;
  for (let r = table.row + 1; r < records.length; r++) {
    const runNumber = Number(records[r][table.indexes[runIndex]]);
    if (!Number.isInteger(runNumber) || records[r][table.indexes[runIndex]] === '') continue;
    columns.forEach((column, i) => {
      const value = entryFor(column, runNumber, results);
      if (value !== undefined) records[r][table.indexes[i]] = value === null ? '' : String(value);
    });
  }
  // Numbers stay numbers; text passes the writer's formula guard again.
  const cell = (text: string) => (text !== '' && /^[+-]?\d+(\.\d+)?$/.test(text) ? text : csvCell(text === '' ? null : text));
  return `\uFEFF${records.map((row) => (row.length === 1 && row[0] === '' ? '' : row.map(cell).join(','))).join('\r\n')}\r\n`;
}

/**
 * The sample's plan exactly as `tierplan plan samples/spray-dryer/study.yaml` makes it from the
 * repository root: the study path as typed is part of the plan (and so of its id).
 */
async function samplePlan(): Promise<PlanDocument> {
  process.chdir(resolve(sampleDir, '../..'));
  const study = await loadStudy('samples/spray-dryer/study.yaml');
  const { buildPlan } = await import('../../src/core/plan/buildPlan.js');
  return sealPlan(buildPlan(study, { toolVersion: toolVersion() }));
}

async function main(argv: string[]): Promise<void> {
  const option = (name: string): string | undefined => {
    const at = argv.indexOf(name);
    return at >= 0 ? argv[at + 1] : undefined;
  };
  const planPath = option('--plan');
  const out = resolve(option('--out') ?? sampleDir);
  const plan = planPath ? await loadPlan(planPath) : await samplePlan();
  await mkdir(out, { recursive: true });
  await writeFile(join(out, 'results.xlsx'), await filledWorkbook(plan));
  await writeFile(join(out, 'results.csv'), filledCsv(plan));
  process.stdout.write(`invented results for plan ${plan.planId} written to ${join(out, 'results.xlsx')} and results.csv\n`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main(process.argv.slice(2)).catch((error: unknown) => {
    process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    process.exitCode = 1;
  });
}
