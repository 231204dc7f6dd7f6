/**
 * The run sheet as an Excel workbook: the sheet the technician prints and fills in, plus the
 * plan behind it on further sheets.
 *
 * Sheets (our own naming): "Run sheet", "Factor tiers", "Model and metrics", "Comparison",
 * "Plan record".
 *
 * Conventions fixed here:
 * - The run sheet opens with a header block (study title, plan id, seed, tool, checksum, how the order
 *   was made, the safety caution, the factors held fixed with their values), one empty row,
 *   then the table. The panes are frozen below the table's header row; that header row is
 *   repeated on every printed page; pages are landscape and fit to one page wide; the footer
 *   carries the plan id, seed and page number. Each session after the first starts on a new
 *   printed page, and a hard-to-change setting that differs from the run before is bold.
 * - Settings are numbers with a number format showing the factor's precision (`0`, `0.0`, …),
 *   the same rounding as the CSV (`runSheetTable.ts`).
 * - Response entry cells accept decimals only (data validation with an input prompt and an
 *   error message); the date column is formatted as a date.
 * - Every text from the study is written as a plain string value, never as a formula.
 * - Creator "tierplan", created and modified = the plan's `createdAt`, so two workbooks of the
 *   same plan differ only in the zip container's own metadata.
 */
import ExcelJS from 'exceljs';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import { FILL_IN_HINT, IDENTITY_LABELS, SAFETY_CAUTION, runSheetTable, type RunSheetTable } from './runSheetTable.js';
import { withUnit } from './textTable.js';

export const SHEET_NAMES = {
  runSheet: 'Run sheet',
  tiers: 'Factor tiers',
  model: 'Model and metrics',
  comparison: 'Comparison',
  record: 'Plan record',
} as const;

/** Response entries outside ±1e12 are typing slips, not measurements. */
const ENTRY_LIMIT = 1e12;
const BOLD = { bold: true } as const;
const CAUTION_FILL: ExcelJS.Fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFFFF2CC' } };
const HEADER_FILL: ExcelJS.Fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFE7E6E6' } };
const THIN: Partial<ExcelJS.Borders> = {
  top: { style: 'thin' },
  bottom: { style: 'thin' },
  left: { style: 'thin' },
  right: { style: 'thin' },
};

function numberFormat(decimals: number): string {
  return decimals <= 0 ? '0' : `0.${'0'.repeat(decimals)}`;
}

export async function runSheetWorkbook(plan: PlanDocument, schedule: Schedule): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  const created = new Date(plan.createdAt);
  workbook.creator = 'tierplan';
  workbook.lastModifiedBy = 'tierplan';
  workbook.created = created;
  workbook.modified = created;
  workbook.title = `Run sheet — ${plan.study.title}`;

  const table = runSheetTable(plan, schedule);
  addRunSheet(workbook, plan, schedule, table);
  addTierSheet(workbook, plan);
  addModelSheet(workbook, plan, schedule);
  addComparisonSheet(workbook, plan);
  addRecordSheet(workbook, plan, schedule);

  return Buffer.from(await workbook.xlsx.writeBuffer());
}

/** A label in column A and a long text merged across the rest of the table's width. */
function noteRow(sheet: ExcelJS.Worksheet, row: number, label: string, text: string, width: number, charsPerLine: number): ExcelJS.Row {
  const r = sheet.getRow(row);
  r.getCell(1).value = label;
  r.getCell(1).font = BOLD;
  r.getCell(1).alignment = { vertical: 'top' };
  r.getCell(2).value = text;
  r.getCell(2).alignment = { wrapText: true, vertical: 'top' };
  if (width > 2) sheet.mergeCells(row, 2, row, width);
  r.height = 15 * Math.max(1, Math.ceil(text.length / charsPerLine));
  return r;
}

function addRunSheet(workbook: ExcelJS.Workbook, plan: PlanDocument, schedule: Schedule, table: RunSheetTable): void {
  const sheet = workbook.addWorksheet(SHEET_NAMES.runSheet);
  const width = table.columns.length;
  const widths = table.columns.map((column) => {
    switch (column.kind) {
      case 'sequence':
      case 'session':
        return 8;
      case 'point':
        return 8;
      case 'purpose':
        return 15;
      case 'remarks':
        return 30;
      case 'operator':
      case 'date':
        return 12;
      default:
        return Math.min(22, Math.max(12, Math.ceil(column.header.length / 2) + 2));
    }
  });
  widths.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
  // Merged note cells span columns B..last, and spreadsheets do not grow a merged row to fit its
  // text, so the row height is set here. A column width unit is one '0' of the default font;
  // prose runs close to one character per unit and bold text wider, so 0.9 characters per unit
  // leaves a spare line rather than clipping the end of the caution (common practice, measured
  // by eye in a spreadsheet program, not from a specification).
  const charsPerLine = Math.max(40, widths.slice(1).reduce((a, b) => a + b, 0) * 0.9);

  let row = 1;
  const title = sheet.getRow(row++);
  title.getCell(1).value = `Run sheet — ${plan.study.title}`;
  title.getCell(1).font = { bold: true, size: 14 };

  const ids = sheet.getRow(row++);
  const idCells: [string, string | number][] = [
    [IDENTITY_LABELS.planId, plan.planId],
    ['Seed', schedule.seed],
    ['Made with', `${plan.tool.name} ${plan.tool.version}`],
    [IDENTITY_LABELS.checksum, plan.checksum],
  ];
  idCells.forEach(([label, value], i) => {
    ids.getCell(1 + 2 * i).value = label;
    ids.getCell(1 + 2 * i).font = BOLD;
    ids.getCell(2 + 2 * i).value = value;
    ids.getCell(2 + 2 * i).alignment = { horizontal: 'left' };
  });

  noteRow(sheet, row++, 'Run order', schedule.note, width, charsPerLine);
  if (schedule.hardToChange) noteRow(sheet, row++, 'Hard to change', schedule.hardToChange.note, width, charsPerLine);
  const caution = noteRow(sheet, row++, 'Caution', SAFETY_CAUTION, width, charsPerLine);
  caution.getCell(2).font = BOLD;
  caution.getCell(1).fill = CAUTION_FILL;
  caution.getCell(2).fill = CAUTION_FILL;
  noteRow(sheet, row++, 'Fill in', FILL_IN_HINT, width, charsPerLine);

  table.fixed.forEach((setting, i) => {
    const r = sheet.getRow(row++);
    if (i === 0) {
      r.getCell(1).value = 'Held fixed';
      r.getCell(1).font = BOLD;
    }
    r.getCell(2).value = setting.label;
    if (width > 4) sheet.mergeCells(r.number, 2, r.number, 4);
    r.getCell(5).value = setting.value;
    r.getCell(5).numFmt = numberFormat(setting.decimals);
    r.getCell(5).alignment = { horizontal: 'left' };
  });
  row++; // one empty row between the header block and the table

  const headerRow = row;
  const header = sheet.getRow(headerRow);
  table.columns.forEach((column, i) => {
    const cell = header.getCell(i + 1);
    cell.value = column.header;
    cell.font = BOLD;
    cell.fill = HEADER_FILL;
    cell.border = THIN;
    cell.alignment = { wrapText: true, vertical: 'middle', horizontal: 'center' };
  });
  header.height = 32;

  const hardIds = new Set(schedule.hardToChange?.factors ?? []);
  const sessionColumn = table.columns.findIndex((column) => column.kind === 'session');
  table.rows.forEach((values, r) => {
    const excelRow = sheet.getRow(headerRow + 1 + r);
    const previous = r > 0 ? table.rows[r - 1] : null;
    table.columns.forEach((column, i) => {
      const cell = excelRow.getCell(i + 1);
      cell.value = values[i];
      cell.border = THIN;
      if (column.kind === 'factor') cell.numFmt = numberFormat(column.decimals ?? 0);
      // A changed hard-to-change setting is printed bold so the technician sees the reset coming.
      if (column.kind === 'factor' && hardIds.has(column.id!) && previous && previous[i] !== values[i]) cell.font = BOLD;
      if (column.kind === 'date') cell.numFmt = 'yyyy-mm-dd';
      if (column.kind === 'response') {
        cell.dataValidation = {
          type: 'decimal',
          operator: 'between',
          allowBlank: true,
          formulae: [-ENTRY_LIMIT, ENTRY_LIMIT],
          showInputMessage: true,
          promptTitle: column.name!.slice(0, 32),
          prompt: `Measured ${column.name}${column.unit && column.unit !== '-' ? ` in ${column.unit}` : ''}. Numbers only.`.slice(0, 255),
          showErrorMessage: true,
          errorStyle: 'stop',
          errorTitle: 'Number expected',
          error: `Enter ${column.name} as a number${column.unit && column.unit !== '-' ? ` in ${column.unit}` : ''}, or leave it empty. Put comments under Remarks.`.slice(0, 255),
        };
      }
    });
    excelRow.height = 20;
    // Each session after the first starts on a new printed page: one page per day or shift.
    if (previous && previous[sessionColumn] !== values[sessionColumn]) sheet.getRow(excelRow.number - 1).addPageBreak();
  });

  sheet.views = [{ state: 'frozen', xSplit: 0, ySplit: headerRow, topLeftCell: `A${headerRow + 1}`, activeCell: `A${headerRow + 1}` }];
  sheet.pageSetup = {
    ...sheet.pageSetup,
    orientation: 'landscape',
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: 0,
    paperSize: 9,
    printTitlesRow: `${headerRow}:${headerRow}`,
    margins: { left: 0.5, right: 0.5, top: 0.6, bottom: 0.6, header: 0.3, footer: 0.3 },
  };
  sheet.headerFooter = {
    oddFooter: `&LPlan ${plan.planId.replace(/&/g, '&&')}, seed ${schedule.seed}&RPage &P of &N`,
  };
}

function tableHeader(sheet: ExcelJS.Worksheet, rowNumber: number, headers: string[]): void {
  const row = sheet.getRow(rowNumber);
  headers.forEach((text, i) => {
    const cell = row.getCell(i + 1);
    cell.value = text;
    cell.font = BOLD;
    cell.fill = HEADER_FILL;
    cell.alignment = { wrapText: true, vertical: 'middle' };
  });
}

function addTierSheet(workbook: ExcelJS.Workbook, plan: PlanDocument): void {
  const sheet = workbook.addWorksheet(SHEET_NAMES.tiers);
  const levels = new Map(plan.levels.map((level) => [level.id, level]));
  sheet.getCell('A1').value = 'Factor tiers from the aggregated total Sobol\' indices';
  sheet.getCell('A1').font = { bold: true, size: 13 };
  const p = plan.tiers.policy;
  sheet.getCell('A2').value =
    `Aggregated over responses by the ${p.aggregate} rule, decided on the ${p.confidence === 'upper' ? 'upper confidence bound' : 'point estimate'}; ` +
    `critical at or above ${p.critical}, moderate at or above ${p.moderate}.`;
  tableHeader(sheet, 4, [
    'Factor', 'Id', 'Unit', 'Role', 'Tier', 'Total index (aggregated)', 'First-order index (aggregated)',
    'Total index, lower bound', 'Total index, upper bound', 'Near a threshold', 'Share through interactions', 'In the plan', 'Why',
  ]);
  plan.tiers.factors.forEach((factor, i) => {
    const level = levels.get(factor.id);
    const inPlan = !level
      ? factor.role === 'model' ? 'model parameter' : '–'
      : level.varied
        ? `varied: ${level.values.join(', ')}`
        : `held at ${level.fixedAt}`;
    const row = sheet.getRow(5 + i);
    row.values = [
      factor.name, factor.id, factor.unit, factor.role, factor.tier, factor.aggregatedTotal, factor.aggregatedFirst,
      factor.aggregatedTotalLow, factor.aggregatedTotalHigh, factor.borderline ? 'yes' : 'no', factor.interactionShare, inPlan,
      level?.reason ?? calibrationWords(plan, factor.id),
    ];
    for (const c of [6, 7, 8, 9, 11]) row.getCell(c).numFmt = '0.000';
  });
  let row = 6 + plan.tiers.factors.length;
  if (plan.tiers.interactionPairs.length > 0) {
    tableHeader(sheet, row++, ['Interacting pair', 'Second-order index (largest over responses)', 'Responses where it matters']);
    for (const pair of plan.tiers.interactionPairs) {
      const r = sheet.getRow(row++);
      r.values = [`${pair.factorA} × ${pair.factorB}`, pair.index, pair.responses.join(', ')];
      r.getCell(2).numFmt = '0.000';
    }
    row++;
  }
  if (plan.tiers.calibration.entries.length > 0) {
    tableHeader(sheet, row++, ['Model parameter', 'Id', 'Tier', 'Total index (aggregated)', 'Action']);
    for (const entry of plan.tiers.calibration.entries) {
      const r = sheet.getRow(row++);
      r.values = [entry.name, entry.id, entry.tier, entry.aggregatedTotal, entry.action === 'estimate' ? 'estimate precisely from the lab data' : 'take a literature or nominal value'];
      r.getCell(4).numFmt = '0.000';
    }
  }
  [30, 16, 10, 10, 11, 12, 12, 12, 12, 10, 12, 26, 40].forEach((w, i) => (sheet.getColumn(i + 1).width = w));
}

function calibrationWords(plan: PlanDocument, id: string): string {
  const entry = plan.tiers.calibration.entries.find((e) => e.id === id);
  if (!entry) return '';
  return entry.action === 'estimate' ? 'model parameter: estimate precisely from the lab data' : 'model parameter: take a literature or nominal value';
}

function addModelSheet(workbook: ExcelJS.Workbook, plan: PlanDocument, schedule: Schedule): void {
  const sheet = workbook.addWorksheet(SHEET_NAMES.model);
  sheet.getCell('A1').value = 'Model terms and design metrics (coded units: low → −1, high → +1)';
  sheet.getCell('A1').font = { bold: true, size: 13 };
  tableHeader(sheet, 3, ['Model term', 'Why it is in the model']);
  let row = 4;
  for (const { term, reason } of plan.model.explained) sheet.getRow(row++).values = [term === '1' ? '1 (intercept)' : term, reason];
  row++;
  const m = plan.metrics;
  const countBy = (purpose: string) => plan.runs.filter((run) => run.purpose === purpose).length;
  tableHeader(sheet, row++, ['Quantity', 'Value', 'What it means / relative to what']);
  const metrics: [string, number | string | null, string, string?][] = [
    ['Model parameters p', m.p, 'Intercept included.', '0'],
    ['Fitting runs N', m.N, m.runsNote, '0'],
    ['Centre repeats', countBy('centre'), 'Replicates at the centre, for pure error and drift.', '0'],
    ['Validation runs', countBy('holdout'), 'Kept out of the fit; used to check predictions.', '0'],
    ['Runs on the sheet', plan.runs.length, 'Fitting, centre and validation runs together.', '0'],
    ['D-efficiency (%)', m.dEfficiency, "Textbook 100·|X'X|^(1/p)/N for the fitting runs: relative to a hypothetical orthogonal design of N runs with every setting at ±1, which a model with square terms or constraints cannot reach.", '0.0'],
    [
      'D-efficiency against the continuous optimum (%)',
      m.boundEfficiency,
      m.boundEfficiency === null
        ? `Not computed: ${m.boundNote}`
        : `100·(det M(exact)/det M(bound))^(1/p), relative to the best continuous (approximate) D-optimal design, which no exact design can beat: ${m.boundNote}`,
      '0.0',
    ],
    ['Average prediction variance (σ² units)', m.iCriterion, "trace((X'X)⁻¹·W) over the region, W the region moment matrix; lower is better. Not an efficiency.", '0.000'],
    ["log det(X'X/N)", m.logDetPerRun, 'Information per fitting run on a log scale; higher is better.', '0.000'],
    ['Search criterion', m.criterion === 'D' ? 'D-optimal' : 'I-optimal', 'What the exact design search maximised or minimised.'],
    ['Design search seed', m.seed, `Run order seed: ${schedule.seed}.`, '0'],
    ['Random starts', m.starts, 'Independent starts of the exchange search.', '0'],
  ];
  for (const [label, value, meaning, format] of metrics) {
    const r = sheet.getRow(row++);
    r.values = [label, value ?? '–', meaning];
    if (format && typeof value === 'number') r.getCell(2).numFmt = format;
    r.getCell(3).alignment = { wrapText: true, vertical: 'top' };
  }
  if (plan.warnings.length > 0) {
    row++;
    tableHeader(sheet, row++, ['Notes from planning']);
    for (const warning of plan.warnings) sheet.getRow(row++).values = [warning];
  }
  [34, 14, 90].forEach((w, i) => (sheet.getColumn(i + 1).width = w));
}

function addComparisonSheet(workbook: ExcelJS.Workbook, plan: PlanDocument): void {
  const sheet = workbook.addWorksheet(SHEET_NAMES.comparison);
  sheet.getCell('A1').value = 'The proposed plan beside classical plans';
  sheet.getCell('A1').font = { bold: true, size: 13 };
  const comparison = plan.comparison;
  if (!comparison) {
    sheet.getCell('A3').value = 'The comparison with classical plans was not computed for this plan; run `tierplan compare` on plan.json to add it.';
    sheet.getColumn(1).width = 100;
    return;
  }
  sheet.getCell('A2').value = comparison.summary;
  sheet.getCell('A3').value =
    `Every figure is for the proposed plan's model (${comparison.p} parameters), coded units. Ratios are relative to the proposed plan (1 = the same). ` +
    `Power for an effect of ${comparison.delta} σ at α = ${comparison.alpha}. Prediction variance: ${comparison.predictionVarianceMethod}.`;
  const money = comparison.currency ? ` [${comparison.currency}]` : '';
  tableHeader(sheet, 5, [
    'Plan', 'Runs', 'Fits the model', 'Terms it cannot estimate', 'D-efficiency (%), textbook: relative to an orthogonal ±1 design of the same size',
    'Information per run, relative to proposed', 'Total information, relative to proposed', 'Average prediction variance (σ²)',
    'Lowest power over terms', `Cost${money}`, 'Bench hours', 'Hard-to-change level changes', 'Runs saved by the proposed plan',
    "Runs saved (% of this plan's runs)", `Cost saved${money}`, "Cost saved (% of this plan's cost)", 'Verdict',
  ]);
  sheet.getRow(5).height = 75;
  comparison.comparators.forEach((c, i) => {
    const r = sheet.getRow(6 + i);
    r.values = [
      c.label, c.runs ?? (c.reason ? `cannot be built: ${c.reason}` : '–'), c.fitsModel === null ? '–' : c.fitsModel ? 'yes' : 'no',
      c.missingTerms.join(', '), c.dEfficiency, c.relativeInformationPerRun, c.relativeInformationTotal, c.averagePredictionVariance,
      c.minPower, c.cost, c.hours, c.levelChanges, c.runsSaved, c.percentRunsSaved, c.costSaved, c.percentCostSaved, c.verdict,
    ];
    const formats: Record<number, string> = { 5: '0.0', 6: '0.000', 7: '0.000', 8: '0.000', 9: '0.00', 10: '#,##0', 11: '0.0', 14: '0.0', 15: '#,##0', 16: '0.0' };
    for (const [col, fmt] of Object.entries(formats)) r.getCell(Number(col)).numFmt = fmt;
  });
  sheet.getColumn(1).width = 48;
  for (let c = 2; c <= 16; c++) sheet.getColumn(c).width = 13;
  sheet.getColumn(17).width = 60;
}

function addRecordSheet(workbook: ExcelJS.Workbook, plan: PlanDocument, schedule: Schedule): void {
  const sheet = workbook.addWorksheet(SHEET_NAMES.record);
  sheet.getCell('A1').value = 'Plan record';
  sheet.getCell('A1').font = { bold: true, size: 13 };
  const source = plan.study.source;
  const entries: [string, string | number][] = [
    ['Plan id', plan.planId],
    ['Checksum (SHA-256)', plan.checksum],
    ['Run order seed', schedule.seed],
    ['Design search seed', plan.metrics.seed],
    ['Tool', plan.tool.name],
    ['Tool version', plan.tool.version],
    ['Plan format version', plan.formatVersion],
    ['Created (UTC)', plan.createdAt],
    ['Study title', plan.study.title],
    ['Study file', source.studyFile],
    ['Index table', source.indicesFile],
    ['Second-order index table', source.interactionsFile ?? 'none'],
    ['Sessions', plan.study.sessions ? `${schedule.sessionCount} × ${plan.study.sessions.label} (at most ${plan.study.sessions.maxRuns} runs each)` : 'not split'],
    ['Fixed factors', plan.levels.filter((l) => !l.varied).map((l) => `${withUnit(l.name, l.unit)} = ${l.fixedAt}`).join('; ') || 'none'],
  ];
  entries.forEach(([label, value], i) => {
    const r = sheet.getRow(3 + i);
    r.getCell(1).value = label;
    r.getCell(1).font = BOLD;
    r.getCell(2).value = value;
    r.getCell(2).alignment = { horizontal: 'left' };
  });
  sheet.getColumn(1).width = 28;
  sheet.getColumn(2).width = 80;
}
