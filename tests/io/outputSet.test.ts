import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { mkdtemp, mkdir, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeOutputSet, type OutputFile } from '../../src/io/outputSet.js';
import { InputError } from '../../src/core/inputError.js';

let root: string;
beforeEach(async () => {
  root = await mkdtemp(join(tmpdir(), 'tierplan-output-'));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

function planSet(planId: string, marker = 'new'): OutputFile[] {
  return [
    { name: 'plan.json', content: JSON.stringify({ planId, marker }) },
    { name: 'runsheet.csv', content: `\uFEFFcsv ${marker}\r\n` },
    { name: 'runsheet.xlsx', content: Buffer.from([0x50, 0x4b, 3, 4, marker.length]) },
  ];
}

/** Every entry of a folder with its content, to compare before and after a failed write. */
async function snapshot(dir: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const name of (await readdir(dir)).sort()) out[name] = (await readFile(join(dir, name))).toString('base64');
  return out;
}

describe('writeOutputSet', () => {
  it('creates the folder, writes every file and leaves no temporary files', async () => {
    const dir = join(root, 'out', 'spray');
    const paths = await writeOutputSet(dir, planSet('TP-a'), { planId: 'TP-a', force: false });
    expect(paths).toEqual(['plan.json', 'runsheet.csv', 'runsheet.xlsx'].map((n) => join(dir, n)));
    expect((await readdir(dir)).sort()).toEqual(['plan.json', 'runsheet.csv', 'runsheet.xlsx']);
    expect(await readFile(join(dir, 'runsheet.csv'), 'utf8')).toBe('\uFEFFcsv new\r\n');
    expect([...(await readFile(join(dir, 'runsheet.xlsx')))]).toEqual([0x50, 0x4b, 3, 4, 3]);
  });

  it('overwrites the same plan without --force', async () => {
    await writeOutputSet(root, planSet('TP-a', 'first'), { planId: 'TP-a', force: false });
    await writeOutputSet(root, planSet('TP-a', 'second'), { planId: 'TP-a', force: false });
    expect(JSON.parse(await readFile(join(root, 'plan.json'), 'utf8')).marker).toBe('second');
    expect((await readdir(root)).sort()).toEqual(['plan.json', 'runsheet.csv', 'runsheet.xlsx']);
  });

  it('refuses a folder holding a different plan, naming both ids and --force; force overwrites', async () => {
    await writeOutputSet(root, planSet('TP-old', 'old'), { planId: 'TP-old', force: false });
    const before = await snapshot(root);
    const attempt = writeOutputSet(root, planSet('TP-new'), { planId: 'TP-new', force: false });
    await expect(attempt).rejects.toBeInstanceOf(InputError);
    await expect(writeOutputSet(root, planSet('TP-new'), { planId: 'TP-new', force: false })).rejects.toThrow(
      new RegExp(`${root}.*holds plan TP-old.*--force`),
    );
    expect(await snapshot(root)).toEqual(before);

    await writeOutputSet(root, planSet('TP-new'), { planId: 'TP-new', force: true });
    expect(JSON.parse(await readFile(join(root, 'plan.json'), 'utf8')).planId).toBe('TP-new');
  });

  it('refuses target files with no readable plan.json, unless forced', async () => {
    await writeFile(join(root, 'runsheet.csv'), 'somebody else');
    await expect(writeOutputSet(root, planSet('TP-a'), { planId: 'TP-a', force: false })).rejects.toThrow(/no readable plan\.json.*--force/);
    await writeFile(join(root, 'plan.json'), '{ not json');
    await expect(writeOutputSet(root, planSet('TP-a'), { planId: 'TP-a', force: false })).rejects.toThrow(/no readable plan\.json/);
    expect(await readFile(join(root, 'runsheet.csv'), 'utf8')).toBe('somebody else');
    await writeOutputSet(root, planSet('TP-a'), { planId: 'TP-a', force: true });
    expect(await readFile(join(root, 'runsheet.csv'), 'utf8')).toBe('\uFEFFcsv new\r\n');
  });

  it('writes into a folder holding only unrelated files', async () => {
    await writeFile(join(root, 'notes.txt'), 'keep me');
    await writeOutputSet(root, planSet('TP-a'), { planId: 'TP-a', force: false });
    expect(await readFile(join(root, 'notes.txt'), 'utf8')).toBe('keep me');
  });

  it('leaves the folder as it was when a file cannot be written (name too long)', async () => {
    await writeOutputSet(root, planSet('TP-a', 'old'), { planId: 'TP-a', force: false });
    const before = await snapshot(root);
    const files = [...planSet('TP-a', 'new'), { name: `${'x'.repeat(300)}.csv`, content: 'unwritable' }];
    await expect(writeOutputSet(root, files, { planId: 'TP-a', force: false })).rejects.toBeInstanceOf(InputError);
    expect(await snapshot(root)).toEqual(before);
  });

  it('removes a folder it created when nothing could be written', async () => {
    const dir = join(root, 'fresh', 'nested');
    const files = [{ name: `${'x'.repeat(300)}.csv`, content: 'unwritable' }];
    await expect(writeOutputSet(dir, files, { planId: 'TP-a', force: false })).rejects.toThrow(/nothing was written/);
    expect(existsSync(join(root, 'fresh'))).toBe(false);
  });

  it('puts every earlier file back when a rename fails part-way', async () => {
    await writeOutputSet(root, planSet('TP-a', 'old'), { planId: 'TP-a', force: false });
    const before = await snapshot(root);
    const { rename } = await import('node:fs/promises');
    let renames = 0;
    const failing = async (from: string, to: string) => {
      // Renames run: csv aside, csv in, xlsx aside, xlsx in, … — fail on the 4th.
      if (++renames === 4) throw Object.assign(new Error('simulated failure'), { code: 'EIO', path: from });
      await rename(from, to);
    };
    await expect(
      writeOutputSet(root, planSet('TP-a', 'new'), { planId: 'TP-a', force: false, operations: { rename: failing } }),
    ).rejects.toThrow(/EIO/);
    expect(renames).toBe(4);
    expect(await snapshot(root)).toEqual(before);
  });

  it('refuses when a target name is taken by a folder, touching nothing', async () => {
    await mkdir(join(root, 'runsheet.csv'));
    await writeFile(join(root, 'runsheet.csv', 'inside'), 'x');
    await expect(writeOutputSet(root, planSet('TP-a'), { planId: 'TP-a', force: true })).rejects.toThrow(/is a folder/);
    expect((await readdir(root)).sort()).toEqual(['runsheet.csv']);
  });

  it('treats a path in a file name as our bug, not the user\'s', async () => {
    await expect(writeOutputSet(root, [{ name: '../escape.csv', content: '' }], { planId: 'TP-a', force: false })).rejects.not.toBeInstanceOf(InputError);
  });
});
