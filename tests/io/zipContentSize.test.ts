/**
 * The unpacked size of a workbook read from its ZIP central directory, checked against JSZip
 * (a general-purpose ZIP library, here only as the reference) inflating every entry; and the
 * workbook refusal it drives.
 */
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { describe, expect, it } from 'vitest';
import { zipContentSize } from '../../src/io/zipContentSize.js';
import { readIndexTable } from '../../src/io/indexTables.js';
import { STUDY_IDS, expectInputError, writeFiles } from './studyScratch.js';

async function workbook(rows: (string | number)[][]): Promise<Uint8Array> {
  const book = new ExcelJS.Workbook();
  const sheet = book.addWorksheet('indices');
  for (const row of rows) sheet.addRow(row);
  return new Uint8Array(await book.xlsx.writeBuffer());
}

async function inflatedSize(bytes: Uint8Array): Promise<number> {
  const archive = await JSZip.loadAsync(bytes);
  let total = 0;
  for (const entry of Object.values(archive.files)) if (!entry.dir) total += (await entry.async('uint8array')).length;
  return total;
}

describe('zipContentSize', () => {
  it('equals the sum of the inflated entries', async () => {
    const bytes = await workbook([['factor', 'response', 'first', 'total'], ['temp', 'titre', 0.42, 0.55]]);
    expect(zipContentSize(bytes)).toBe(await inflatedSize(bytes));
  });

  it('is null for bytes that are not a ZIP archive', () => {
    expect(zipContentSize(new TextEncoder().encode('factor,response\n'))).toBeNull();
    expect(zipContentSize(new Uint8Array(0))).toBeNull();
  });
});

describe('a workbook that unpacks past the limit', () => {
  it('is refused before it is read, though its file is small', async () => {
    // 70 MiB of sheet XML of one repeated character compresses to well under 1 MB.
    const archive = new JSZip();
    archive.file('xl/worksheets/sheet1.xml', '0'.repeat(70 * 1024 * 1024));
    const bytes = await archive.generateAsync({ type: 'uint8array', compression: 'DEFLATE' });
    expect(bytes.length).toBeLessThan(1024 * 1024);
    const folder = writeFiles({ 'indices.xlsx': bytes });
    await expectInputError(
      () => readIndexTable(join(folder, 'indices.xlsx'), 'indices.xlsx', STUDY_IDS),
      'indices.xlsx: unpacks to 73.4 MB, above the limit of 64 MiB (see "Limits" in the README); export the table as CSV',
    );
  });
});
