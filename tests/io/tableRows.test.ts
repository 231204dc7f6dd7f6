/**
 * A table the user may not read: `stat` succeeds on it (so the size and folder checks pass)
 * but opening it fails with EACCES. That must be the same one-line message for CSV, JSON
 * and XLSX as for the study file, never a stack trace. Permissions cannot be tested for
 * real when the tests run as root, so `readFile` is made to fail for files named
 * `locked.*` and behaves normally for everything else.
 */
import { join } from 'node:path';
import { describe, it, vi } from 'vitest';
import { readIndexTable } from '../../src/io/indexTables.js';
import { loadStudy } from '../../src/io/studyFile.js';
import { BASE_INDICES_CSV, STUDY_IDS, expectInputError, writeFiles, writeStudy } from './studyScratch.js';

vi.mock('node:fs/promises', async (importOriginal) => {
  const original = await importOriginal<typeof import('node:fs/promises')>();
  const readFile = (async (path: Parameters<typeof original.readFile>[0], ...rest: unknown[]) => {
    if (/[\\/]locked\.[a-z]+$/.test(String(path))) {
      throw Object.assign(new Error(`EACCES: permission denied, open '${String(path)}'`), { code: 'EACCES' });
    }
    return (original.readFile as (...args: unknown[]) => unknown)(path, ...rest);
  }) as typeof original.readFile;
  return { ...original, readFile, default: { ...original, readFile } };
});

describe('a file that exists but cannot be read', () => {
  for (const name of ['locked.csv', 'locked.json', 'locked.xlsx']) {
    it(`index table ${name}`, async () => {
      const folder = writeFiles({ [name]: BASE_INDICES_CSV });
      await expectInputError(
        () => readIndexTable(join(folder, name), name, STUDY_IDS),
        `${name}: cannot be read (permission denied)`,
        folder,
      );
    });
  }
  it('through loadStudy, the message names the table as the study gives it', async () => {
    const { folder, studyPath } = writeStudy((study) => (study.indices = 'locked.csv'), { 'locked.csv': BASE_INDICES_CSV });
    await expectInputError(() => loadStudy(studyPath), `${join(folder, 'locked.csv')}: cannot be read (permission denied)`, folder);
  });
  it('the study file itself', async () => {
    const folder = writeFiles({ 'locked.yaml': 'title: x\n' });
    await expectInputError(() => loadStudy(join(folder, 'locked.yaml')), `${join(folder, 'locked.yaml')}: cannot be read (permission denied)`, folder);
  });
});
