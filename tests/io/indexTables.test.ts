/**
 * Index and interaction tables: every accepted format gives the same rows, and each bad
 * input gives one line naming the file, the spreadsheet row (header = row 1, comment lines
 * counted) and the column.
 */
import { readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { readIndexTable, readInteractionTable, INDEX_COLUMN_ALIASES } from '../../src/io/indexTables.js';
import { loadStudy } from '../../src/io/studyFile.js';
import { InputError } from '../../src/core/inputError.js';
import {
  BASE_INDEX_ROWS,
  BASE_INDICES_CSV,
  BASE_INTERACTIONS_CSV,
  STUDY_IDS,
  expectInputError,
  writeFiles,
  writeStudy,
} from './studyScratch.js';

const fixtures = new URL('../fixtures/study/', import.meta.url).pathname;

/** Writes `text` as indices.csv (or `name`) in a new folder and reads it. */
async function readCsv(text: string | Uint8Array, name = 'indices.csv') {
  const folder = writeFiles({ [name]: text });
  return readIndexTable(join(folder, name), name, STUDY_IDS);
}

/** The base CSV with data row `row` (spreadsheet numbering, header is row 2) replaced. */
function withRow(row: number, line: string): string {
  const lines = BASE_INDICES_CSV.split('\n');
  lines[row - 1] = line;
  return lines.join('\n');
}

async function expectCsvError(text: string | Uint8Array, line: string, name = 'indices.csv'): Promise<void> {
  const folder = writeFiles({ [name]: text });
  await expectInputError(() => readIndexTable(join(folder, name), name, STUDY_IDS), line, folder);
}

describe('formats give the same rows', () => {
  it('comma-separated CSV with a leading comment line', async () => {
    const table = await readCsv(BASE_INDICES_CSV);
    expect(table.rows).toEqual(BASE_INDEX_ROWS);
    expect(table.warnings).toEqual([]);
  });

  it('semicolon-separated CSV with decimal commas (decimal-comma locale export)', async () => {
    const path = join(fixtures, 'indices-semicolon.csv');
    const table = await readIndexTable(path, 'indices-semicolon.csv', STUDY_IDS);
    expect(table.rows).toEqual(BASE_INDEX_ROWS);
    expect(table.warnings).toEqual([]);
  });

  it('semicolon-separated CSV with decimal points', async () => {
    const table = await readCsv(BASE_INDICES_CSV.replace(/,/g, ';'));
    expect(table.rows).toEqual(BASE_INDEX_ROWS);
  });

  it('CSV with a UTF-8 byte-order mark before the comment line', async () => {
    const bytes = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(BASE_INDICES_CSV, 'utf8')]);
    expect(bytes.subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
    const table = await readCsv(bytes);
    expect(table.rows).toEqual(BASE_INDEX_ROWS);
  });

  it('CSV with a byte-order mark directly before the header', async () => {
    const text = BASE_INDICES_CSV.split('\n').slice(1).join('\r\n');
    const table = await readCsv(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text, 'utf8')]));
    expect(table.rows).toEqual(BASE_INDEX_ROWS);
  });

  it('XLSX with numbers, numeric text and a comment row, from a sheet named "indices"', async () => {
    const workbook = new ExcelJS.Workbook();
    workbook.addWorksheet('notes').addRow(['this sheet is not read']);
    const sheet = workbook.addWorksheet('Indices');
    const lines = BASE_INDICES_CSV.trim().split('\n');
    sheet.addRow([lines[0]]);
    sheet.addRow(lines[1].split(','));
    lines.slice(2).forEach((line, i) => {
      const cells = line.split(',').map((cell, c) => (cell === '' ? null : c < 2 ? cell : i % 2 === 0 ? Number(cell) : cell));
      sheet.addRow(cells);
    });
    const folder = writeFiles({});
    await workbook.xlsx.writeFile(join(folder, 'indices.xlsx'));
    const table = await readIndexTable(join(folder, 'indices.xlsx'), 'indices.xlsx', STUDY_IDS);
    expect(table.rows).toEqual(BASE_INDEX_ROWS);
  });

  it('XLSX errors name the worksheet row', async () => {
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet('Sheet1');
    sheet.addRow(['factor', 'response', 'first', 'total']);
    sheet.addRow(['temp', 'titre', 0.42, 0.55]);
    sheet.addRow(['temp', 'purity', 'n/a', 0.18]);
    const folder = writeFiles({});
    await workbook.xlsx.writeFile(join(folder, 'indices.xlsx'));
    await expectInputError(
      () => readIndexTable(join(folder, 'indices.xlsx'), 'indices.xlsx', STUDY_IDS),
      'indices.xlsx, row 3, column first: must be a number, not "n/a"',
    );
    // Numeric text typed under a decimal-comma locale: the advice fits a workbook, not a CSV.
    sheet.getCell('C3').value = '0,10';
    sheet.addRow(['ph', 'titre', { formula: '1/0', result: { error: '#DIV/0!' } }, 0.31]);
    await workbook.xlsx.writeFile(join(folder, 'indices.xlsx'));
    await expectInputError(
      () => readIndexTable(join(folder, 'indices.xlsx'), 'indices.xlsx', STUDY_IDS),
      'indices.xlsx, row 3, column first: "0,10" has a decimal comma; enter it as a number with "." decimals',
    );
    sheet.getCell('C3').value = 0.1;
    await workbook.xlsx.writeFile(join(folder, 'indices.xlsx'));
    await expectInputError(
      () => readIndexTable(join(folder, 'indices.xlsx'), 'indices.xlsx', STUDY_IDS),
      'indices.xlsx, row 4, column first: "#DIV/0!" is not a usable index value (NaN, infinite or a spreadsheet error); re-estimate or fix it',
    );
  });

  it('JSON as an array of rows and as {rows: [...]}', async () => {
    const entries = BASE_INDEX_ROWS.map((row) => ({
      factor: row.factor,
      response: row.response,
      first: row.first,
      total: String(row.total),
      ...(row.firstLow !== undefined ? { first_low: row.firstLow, first_high: row.firstHigh, total_low: row.totalLow, total_high: row.totalHigh } : {}),
    }));
    expect((await readCsv(JSON.stringify(entries), 'indices.json')).rows).toEqual(BASE_INDEX_ROWS);
    expect((await readCsv(JSON.stringify({ rows: entries }), 'indices.json')).rows).toEqual(BASE_INDEX_ROWS);
  });

  it('a study whose tables are XLSX and JSON loads to the same Study as with CSV', async () => {
    const { folder, studyPath } = writeStudy();
    const fromCsv = await loadStudy(studyPath);
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet('data');
    for (const line of BASE_INDICES_CSV.trim().split('\n').slice(1)) {
      sheet.addRow(line.split(',').map((cell) => (cell === '' ? null : /^[\d.]+$/.test(cell) ? Number(cell) : cell)));
    }
    await workbook.xlsx.writeFile(join(folder, 'indices.xlsx'));
    const pairs = BASE_INTERACTIONS_CSV.trim().split('\n').slice(1).map((line) => {
      const [factor_a, factor_b, response, index] = line.split(',');
      return { factor_a, factor_b, response, index: Number(index) };
    });
    writeFileSync(join(folder, 'interactions.json'), JSON.stringify(pairs));
    const study = readFileSync(studyPath, 'utf8').replace('indices.csv', 'indices.xlsx').replace('interactions.csv', 'interactions.json');
    writeFileSync(join(folder, 'other.yaml'), study);
    const fromOthers = await loadStudy(join(folder, 'other.yaml'));
    expect(fromOthers).toEqual({
      ...fromCsv,
      source: { studyFile: join(folder, 'other.yaml'), indicesFile: 'indices.xlsx', interactionsFile: 'interactions.json' },
    });
  });

  it('accepts the documented header aliases, any case, with spaces', async () => {
    const text = BASE_INDICES_CSV.replace(
      'factor,response,first,total,first_low,first_high,total_low,total_high',
      ' Parameter ,Output,S1,ST,S1_low,S1 high,ST-low,st_high',
    );
    expect((await readCsv(text)).rows).toEqual(BASE_INDEX_ROWS);
    expect(INDEX_COLUMN_ALIASES.first).toEqual(['first', 's1', 'si', 'first_order']);
  });
});

describe('file-level problems', () => {
  it('a missing file', async () => {
    const folder = writeFiles({});
    await expectInputError(() => readIndexTable(join(folder, 'indices.csv'), 'indices.csv', STUDY_IDS), 'indices.csv: file not found');
  });
  it('an empty file', () => expectCsvError('', 'indices.csv: is empty'));
  it('a file with only comments', () => expectCsvError('# nothing\n\n', 'indices.csv: has no header row (only blank or comment lines)'));
  it('a folder', async () => {
    const folder = writeFiles({});
    mkdirSync(join(folder, 'indices.csv'));
    await expectInputError(() => readIndexTable(join(folder, 'indices.csv'), 'indices.csv', STUDY_IDS), 'indices.csv: is a folder, not a file');
  });
  it('a header-only table', () =>
    expectCsvError(BASE_INDICES_CSV.split('\n').slice(0, 2).join('\n'), 'indices.csv: has a header but no data rows'));
  it('an empty JSON list', () => expectCsvError('[]', 'indices.json: holds no rows', 'indices.json'));
  it('an unsupported extension', () =>
    expectCsvError(BASE_INDICES_CSV, 'indices.xls: unsupported table type ".xls"; use .csv, .xlsx or .json; save the workbook as .xlsx', 'indices.xls'));
  it('UTF-16 text is refused with an explanation', () =>
    expectCsvError(
      Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(BASE_INDICES_CSV, 'utf16le')]),
      'indices.csv: is UTF-16 encoded (a "Unicode text" export); tierplan reads UTF-8 only — save it again as "CSV UTF-8" or plain comma-separated CSV',
    ));
  it('a legacy 8-bit encoding (Windows-1252 "°") is refused, not silently altered', () =>
    expectCsvError(
      Buffer.concat([Buffer.from('# units in '), Buffer.from([0xb0]), Buffer.from(`C\n${BASE_INDICES_CSV}`)]),
      'indices.csv: is not UTF-8 text (line 1 has bytes UTF-8 cannot read, probably a legacy encoding such as Windows-1252); save it again as "CSV UTF-8"',
    ));
  it('a workbook saved under a .csv name', async () => {
    const workbook = new ExcelJS.Workbook();
    workbook.addWorksheet('x').addRow(['factor']);
    const bytes = Buffer.from(await workbook.xlsx.writeBuffer());
    await expectCsvError(bytes, 'indices.csv: is a zipped workbook, not text; give it the .xlsx extension or export it as CSV');
  });
  it('invalid JSON, with line and column', () =>
    expectCsvError('[{"factor": "temp",}]', 'indices.json: is not valid JSON at line 1, column 20: Expected double-quoted property name', 'indices.json'));
  // Python's json module writes NaN unquoted; JSON.parse's own message quotes the text around
  // it, line breaks included, which used to split the error over two lines.
  it('NaN in pretty-printed JSON is one line with line and column', () =>
    expectCsvError(
      '[\n  {\n    "factor": "temp",\n    "total": NaN,\n    "first": 0.1\n  }\n]',
      'indices.json: is not valid JSON at line 4, column 14: NaN is not a JSON value; write a number (or null where a value may be empty)',
      'indices.json',
    ));
  it('a key repeated inside one JSON row (JSON.parse would keep the last silently)', () =>
    expectCsvError(
      '[{"factor": "temp", "response": "titre", "first": 0.42, "total": 0.55,\n  "total": 0.6}]',
      'indices.json: repeats the key "total" at line 2, column 3; give each key once',
      'indices.json',
    ));
  it('JSON that is not a list of rows', () =>
    expectCsvError('{"factor": "temp"}', 'indices.json: must hold an array of row objects, or an object with a "rows" array', 'indices.json'));
});

describe('separators and decimal marks', () => {
  it('a header mixing commas and semicolons is ambiguous', () =>
    expectCsvError(
      withRow(2, 'factor,response;first,total'),
      'indices.csv, row 2: the header mixes commas and semicolons, so the column separator is ambiguous; export the table as comma-separated CSV with "." decimals',
    ));
  it('a semicolon file mixing decimal commas and points is refused, naming both rows', () => {
    const text = readFileSync(join(fixtures, 'indices-semicolon.csv'), 'utf8').replace('ph;purity;0,51;0,66', 'ph;purity;0.51;0,66');
    return expectCsvError(
      text,
      'indices.csv, row 6, column first: mixed decimal marks: "0,42" (row 3) uses a decimal comma but "0.51" (row 6) a decimal point; export the whole table with one convention — commas between columns and "." decimals is safest',
    );
  });
  it('decimal commas in a comma-separated file', () =>
    expectCsvError(
      withRow(4, 'temp,purity,0,10,0,18,,,,'),
      'indices.csv, row 4: has 10 cells but the header has 8 columns; if the numbers use decimal commas, separate the columns with semicolons (or export with "." decimals)',
    ));
  it('too many cells in a comma-separated row', () =>
    expectCsvError(
      withRow(3, 'temp,titre,0,42,0,55,0,38,0,46,0,5,0,6'),
      'indices.csv, row 3: has 14 cells but the header has 8 columns; if the numbers use decimal commas, separate the columns with semicolons (or export with "." decimals)',
    ));
  it('a quoted decimal comma in a comma-separated file', () =>
    expectCsvError(
      withRow(4, 'temp,purity,"0,10",0.18,,,,'),
      'indices.csv, row 4, column first: "0,10" has a decimal comma; use "." decimals, or separate the columns with semicolons',
    ));
  it('a single-column header', () =>
    expectCsvError(
      'factor\tresponse\tfirst\ttotal\ntemp\ttitre\t0.1\t0.2\n',
      'indices.csv, row 1: the header has a single column (it looks tab-separated); expected comma-separated columns such as factor,response,first,total',
    ));
});

describe('columns', () => {
  it('an unknown column, with a suggestion', () =>
    expectCsvError(withRow(2, 'factor,response,first,totl,first_low,first_high,total_low,total_high'), 'indices.csv, row 2, column totl: unknown column "totl"; did you mean `total`?'));
  it('a confidence half-width column, with advice', () =>
    expectCsvError(
      withRow(2, 'factor,response,S1,ST,S1_conf,first_high,total_low,total_high'),
      'indices.csv, row 2, column S1_conf: unknown column "S1_conf"; a "_conf" column is usually a confidence half-width — give the bounds instead (estimate − half-width and estimate + half-width) as *_low and *_high',
    ));
  it('a missing required column, listing its aliases', () =>
    expectCsvError(
      'factor,response,first\ntemp,titre,0.4\n',
      'indices.csv, row 1: missing column total (also accepted: st, sti, total_order)',
    ));
  it('an unknown JSON key names the first entry that has it (a JSON table has no header row)', () =>
    expectCsvError(
      JSON.stringify([
        { factor: 'temp', response: 'titre', first: 0.42, total: 0.55 },
        { factor: 'temp', response: 'purity', first: 0.1, totl: 0.18 },
      ]),
      'indices.json, key [1].totl: unknown column "totl"; did you mean `total`?',
      'indices.json',
    ));
  it('two columns meaning the same thing', () =>
    expectCsvError(
      withRow(2, 'factor,response,first,total,S1,first_high,total_low,total_high'),
      'indices.csv, row 2, column S1: column "S1" repeats column "first" (both mean first)',
    ));
});

describe('rows', () => {
  it('an unknown factor, with a suggestion', () =>
    expectCsvError(withRow(5, 'pH,titre,0.2,0.31,,,,'), 'indices.csv, row 5, column factor: unknown factor "pH"; did you mean `ph`?'));
  it('a factor the study does not define', () =>
    expectCsvError(
      withRow(5, 'stirrer_speed,titre,0.2,0.31,,,,'),
      'indices.csv, row 5, column factor: unknown factor "stirrer_speed"; every factor in the table must be defined under `factors` in the study file',
    ));
  it('an unknown response, with a suggestion', () =>
    expectCsvError(withRow(6, 'ph,purty,0.51,0.66,,,,'), 'indices.csv, row 6, column response: unknown response "purty"; did you mean `purity`?'));
  it('an empty factor cell', () =>
    expectCsvError(withRow(6, ',purity,0.51,0.66,,,,'), 'indices.csv, row 6, column factor: is empty; a factor id is required'));
  it('a defined factor × response pair without a row', () =>
    expectCsvError(
      withRow(6, ''),
      'indices.csv: no row for factor × response ph × purity; every factor in the study, operating or model, needs one row per response',
    ));
  it('a factor with no rows at all', () =>
    expectCsvError(
      withRow(8, '').replace('k_ref,titre,0.05,0.09,,,,', ''),
      'indices.csv: factor k_ref is defined in the study file but has no rows; every factor in the study, operating or model, needs one row per response',
    ));
  it('a duplicate row names both rows', () =>
    expectCsvError(
      withRow(8, 'temp,titre,0.42,0.55,,,,'),
      'indices.csv, row 8: duplicate row for factor temp × response titre; row 3 already gives it',
    ));
  it('a non-numeric value', () =>
    expectCsvError(withRow(4, 'temp,purity,0.10,high,,,,'), 'indices.csv, row 4, column total: must be a number, not "high"'));
  it('an empty required value', () =>
    expectCsvError(withRow(4, 'temp,purity,,0.18,,,,'), 'indices.csv, row 4, column first: is empty; a number is required'));
  it('NaN', () =>
    expectCsvError(
      withRow(4, 'temp,purity,NaN,0.18,,,,'),
      'indices.csv, row 4, column first: "NaN" is not a usable index value (NaN, infinite or a spreadsheet error); re-estimate or fix it',
    ));
  it('Infinity', () =>
    expectCsvError(
      withRow(4, 'temp,purity,0.1,Infinity,,,,'),
      'indices.csv, row 4, column total: "Infinity" is not a usable index value (NaN, infinite or a spreadsheet error); re-estimate or fix it',
    ));
  it('a percentage', () =>
    expectCsvError(withRow(4, 'temp,purity,10%,0.18,,,,'), 'indices.csv, row 4, column first: "10%" is a percentage; give indices as fractions (0.25, not 25%)'));
  it('an index below −0.05', () =>
    expectCsvError(
      withRow(7, 'k_ref,titre,-0.06,0.09,,,,'),
      "indices.csv, row 7, column first: -0.06 is outside [0, 1] by more than 0.05; Sobol' indices are fractions of the output variance",
    ));
  it('an index above 1.05 (percent given as a number)', () =>
    expectCsvError(
      withRow(6, 'ph,purity,51,66,,,,'),
      "indices.csv, row 6, column first: 51 is outside [0, 1] by more than 0.05; Sobol' indices are fractions of the output variance",
    ));
  it('a JSON row error names the entry', () =>
    expectCsvError(
      JSON.stringify([{ factor: 'temp', response: 'titre', first: 0.4, total: 'x' }]),
      'indices.json, key [0].total: must be a number, not "x"',
      'indices.json',
    ));
});

describe('warnings and clipping', () => {
  it('a slightly negative index is set to 0 with a warning naming row and column', async () => {
    const table = await readCsv(withRow(8, 'k_ref,purity,-0.03,0.03,,,,'));
    expect(table.rows[5]).toEqual({ factor: 'k_ref', response: 'purity', first: 0, total: 0.03 });
    expect(table.warnings).toEqual(['indices.csv, row 8, column first: -0.03 clipped to 0 (estimator noise around the [0, 1] range)']);
  });
  it('a total slightly above 1 is set to 1 with a warning', async () => {
    const table = await readCsv(withRow(6, 'ph,purity,0.51,1.04,,,,'));
    expect(table.rows[3].total).toBe(1);
    expect(table.warnings).toEqual(['indices.csv, row 6, column total: 1.04 clipped to 1 (estimator noise around the [0, 1] range)']);
  });
  it('first-order above total by more than 0.02 is a warning, not an error', async () => {
    const table = await readCsv(withRow(7, 'k_ref,titre,0.12,0.09,,,,'));
    expect(table.rows[4]).toEqual({ factor: 'k_ref', response: 'titre', first: 0.12, total: 0.09 });
    expect(table.warnings).toEqual([
      'indices.csv, row 7: first-order index 0.12 exceeds total index 0.09 by more than 0.02 (S1 ≤ ST in theory; check the estimates or the sample size)',
    ]);
  });
  it('first-order above total within 0.02 passes silently', async () => {
    const table = await readCsv(withRow(7, 'k_ref,titre,0.10,0.09,,,,'));
    expect(table.warnings).toEqual([]);
  });
  it('a bound on the wrong side of its estimate is an error', () =>
    expectCsvError(
      withRow(3, 'temp,titre,0.42,0.55,0.46,0.38,0.50,0.60'),
      'indices.csv, row 3, column first_low: low bound 0.46 is above its estimate 0.42 (tolerance 0.02); are the bound columns swapped?',
    ));
  it('an upper bound below its estimate is an error', () =>
    expectCsvError(
      withRow(5, 'ph,titre,0.20,0.31,0.17,0.23,0.27,0.28'),
      'indices.csv, row 5, column total_high: high bound 0.28 is below its estimate 0.31 (tolerance 0.02); are the bound columns swapped?',
    ));
  // A one-sided interval used to be kept silently and then dropped from the factor's
  // aggregated interval, hiding a possible borderline; it is refused now.
  it('a low bound without its high bound is an error at the empty cell', () =>
    expectCsvError(
      withRow(3, 'temp,titre,0.42,0.55,0.38,0.46,0.50,'),
      'indices.csv, row 3, column total_high: is empty but total_low is given; a confidence interval needs both bounds (or leave both empty)',
    ));
  it('a high bound without its low bound is an error at the empty cell', () =>
    expectCsvError(
      withRow(5, 'ph,titre,0.20,0.31,,0.23,0.27,0.35'),
      'indices.csv, row 5, column first_low: is empty but first_high is given; a confidence interval needs both bounds (or leave both empty)',
    ));
  it('a low bound above the high bound (each within tolerance of the estimate) is an error', () =>
    expectCsvError(
      withRow(5, 'ph,titre,0.20,0.31,0.17,0.23,0.32,0.30'),
      'indices.csv, row 5, column total_low: low bound 0.32 is above high bound 0.3; are the bound columns swapped?',
    ));
  it('a bound column without its partner column is an error at the header', () =>
    expectCsvError(
      ['factor,response,first,total,ST_low', 'temp,titre,0.42,0.55,0.5', 'temp,purity,0.1,0.18,0.1'].join('\n'),
      'indices.csv, row 1, column ST_low: column "ST_low" has no partner column total_high; a confidence interval needs both bounds (or leave both columns out)',
    ));
  it('negative lower bounds are clipped to 0 with one summary warning', async () => {
    const text = withRow(3, 'temp,titre,0.42,0.55,0.38,0.46,0.50,0.60')
      .replace('k_ref,titre,0.05,0.09,,,,', 'k_ref,titre,0.05,0.09,-0.02,0.12,-0.01,0.2');
    const table = await readCsv(text);
    expect(table.rows[4]).toEqual({ factor: 'k_ref', response: 'titre', first: 0.05, total: 0.09, firstLow: 0, firstHigh: 0.12, totalLow: 0, totalHigh: 0.2 });
    expect(table.warnings).toEqual(['indices.csv, row 7, column first_low: 2 confidence bounds lie outside [0, 1] and were clipped to it (first here)']);
  });
  it('first-order indices of one response adding up to more than 1 are reported', async () => {
    const text = withRow(3, 'temp,titre,0.60,0.70,,,,').replace('ph,titre,0.20,0.31,0.17,0.23,0.27,0.35', 'ph,titre,0.45,0.5,,,,');
    const table = await readCsv(text);
    expect(table.warnings).toEqual([
      'indices.csv: first-order indices of response titre add up to 1.1, more than 1 (they are shares of one variance; check the estimates)',
    ]);
  });
  it('warnings reach Study.warnings', async () => {
    const { studyPath, folder } = writeStudy(undefined, { 'indices.csv': withRow(8, 'k_ref,purity,-0.03,0.03,,,,') });
    const study = await loadStudy(studyPath);
    expect(study.warnings).toEqual([`${folder}/indices.csv, row 8, column first: -0.03 clipped to 0 (estimator noise around the [0, 1] range)`]);
  });
});

describe('second-order table', () => {
  const indexRows = BASE_INDEX_ROWS;
  async function readPairs(text: string) {
    const folder = writeFiles({ 'interactions.csv': text });
    return readInteractionTable(join(folder, 'interactions.csv'), 'interactions.csv', STUDY_IDS, indexRows);
  }
  async function expectPairsError(text: string, line: string) {
    const folder = writeFiles({ 'interactions.csv': text });
    await expectInputError(() => readInteractionTable(join(folder, 'interactions.csv'), 'interactions.csv', STUDY_IDS, indexRows), line, folder);
  }

  it('reads pairs, with S2 and output as aliases', async () => {
    const table = await readPairs('factor_a,factor_b,Output,S2\ntemp,ph,titre,0.08\nph,k_ref,purity,0.01\n');
    expect(table.rows).toEqual([
      { factorA: 'temp', factorB: 'ph', response: 'titre', index: 0.08 },
      { factorA: 'ph', factorB: 'k_ref', response: 'purity', index: 0.01 },
    ]);
    expect(table.warnings).toEqual([]);
  });
  it('an unknown factor id', () =>
    expectPairsError('factor_a,factor_b,response,index\ntemp,phh,titre,0.08\n', 'interactions.csv, row 2, column factor_b: unknown factor "phh"; did you mean `ph`?'));
  it('an unknown response id', () =>
    expectPairsError(
      'factor_a,factor_b,response,index\ntemp,ph,titer,0.08\n',
      'interactions.csv, row 2, column response: unknown response "titer"; did you mean `titre`?',
    ));
  it('a factor paired with itself', () =>
    expectPairsError(
      'factor_a,factor_b,response,index\ntemp,temp,titre,0.08\n',
      'interactions.csv, row 2, column factor_b: factor_a and factor_b are both temp; a second-order index needs two different factors',
    ));
  it('a pair repeated in the other order for the same response', () =>
    expectPairsError(
      '# pairs\nfactor_a,factor_b,response,index\ntemp,ph,titre,0.08\nph,temp,purity,0.02\nph,temp,titre,0.07\n',
      'interactions.csv, row 5: duplicate pair ph × temp for response titre (order does not matter); row 3 already gives it',
    ));
  it('an out-of-range value', () =>
    expectPairsError(
      'factor_a,factor_b,response,index\ntemp,ph,titre,8\n',
      "interactions.csv, row 2, column index: 8 is outside [0, 1] by more than 0.05; Sobol' indices are fractions of the output variance",
    ));
  it('a header-only table', () =>
    expectPairsError(
      'factor_a,factor_b,response,index\n',
      'interactions.csv: has a header but no data rows; remove the `interactions` key from the study file if there are none',
    ));
  it('an unknown column', () =>
    expectPairsError('factor_a,factor_b,response,indx\n', 'interactions.csv, row 1, column indx: unknown column "indx"; did you mean `index`?'));
  it('a second-order index above a total index is a warning (S_ij ≤ S_Ti)', async () => {
    const table = await readPairs('factor_a,factor_b,response,index\nk_ref,ph,purity,0.08\n');
    expect(table.warnings).toEqual([
      'interactions.csv, row 2: second-order index 0.08 exceeds the smaller total index of k_ref and ph for purity (0.03) by more than 0.02; S_ij ≤ S_Ti in theory',
    ]);
  });
});
