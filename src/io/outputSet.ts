/**
 * Writes the files of one plan into an output folder all together or not at all.
 *
 * Method: every file is first written under a temporary name in the target folder (same file
 * system, so the final rename is atomic on POSIX and NTFS), then each is renamed into place.
 * A file it replaces is first moved aside to a backup name, so that a failure part-way through
 * the renames can put every earlier file back. The record file (plan.json, or analysis.json
 * for an analysis) is renamed last: a folder whose record names a plan holds that plan's
 * complete set.
 *
 * Conventions fixed here:
 * - The folder is created when missing (and removed again when nothing could be written).
 * - Refusals, before anything is touched: a plan.json of a DIFFERENT planId is there; or any
 *   of the target files is there but no readable plan.json says whose it is; or a target name
 *   is taken by a folder. `force` lifts the first two. The same planId may be overwritten.
 * - Errors the user can fix (permissions, disk full, bad folder) become InputError naming the
 *   path; names with path separators are our bug and throw a plain Error.
 */
import { randomBytes } from 'node:crypto';
import * as fs from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../core/inputError.js';
import { clearPendingFile, notePendingFile } from './pendingFiles.js';

export interface OutputFile {
  name: string;
  content: string | Buffer;
}

/** The file operations used, replaceable in tests to simulate a failure at a chosen step. */
export interface FileOperations {
  writeFile(path: string, content: string | Buffer): Promise<void>;
  rename(from: string, to: string): Promise<void>;
}

const realOperations: FileOperations = {
  writeFile: (path, content) => fs.writeFile(path, content, { flag: 'wx' }),
  rename: (from, to) => fs.rename(from, to),
};

const PLAN_FILE = 'plan.json';

export async function writeOutputSet(
  dir: string,
  files: OutputFile[],
  options: { planId: string; force: boolean; operations?: Partial<FileOperations>; recordFile?: string },
): Promise<string[]> {
  const ops: FileOperations = { ...realOperations, ...options.operations };
  const recordFile = options.recordFile ?? PLAN_FILE;
  checkNames(files);

  const created = await makeFolder(dir);
  try {
    await refuseForeignFolder(dir, files, options, recordFile);
  } catch (error) {
    await removeCreatedFolders(dir, created);
    throw error;
  }

  const tag = `${process.pid}-${randomBytes(4).toString('hex')}`;
  const temps: string[] = [];
  try {
    for (const file of files) {
      const temp = join(dir, `.${file.name}.${tag}.tmp`);
      temps.push(temp);
      notePendingFile(temp);
      await ops.writeFile(temp, file.content);
    }
  } catch (error) {
    await Promise.all(temps.map(removeQuietly));
    await removeCreatedFolders(dir, created);
    throw asInputError(error, 'cannot write into');
  }

  // The record file last, so it never names a plan whose other files are not all in place.
  const order = files.map((_, i) => i).sort((a, b) => Number(files[a].name === recordFile) - Number(files[b].name === recordFile));
  const done: { target: string; backup: string | null }[] = [];
  try {
    for (const i of order) {
      const target = join(dir, files[i].name);
      let backup: string | null = null;
      if (await exists(target)) {
        backup = join(dir, `.${files[i].name}.${tag}.bak`);
        await ops.rename(target, backup);
      }
      done.push({ target, backup });
      await ops.rename(temps[i], target);
    }
  } catch (error) {
    await rollBack(done, temps);
    await removeCreatedFolders(dir, created);
    throw asInputError(error, 'cannot put files in place in');
  }
  await Promise.all(done.map(({ backup }) => (backup ? removeQuietly(backup) : undefined)));
  for (const temp of temps) clearPendingFile(temp);
  return files.map((file) => join(dir, file.name));
}

function checkNames(files: OutputFile[]): void {
  const seen = new Set<string>();
  for (const { name } of files) {
    if (name === '' || name === '.' || name === '..' || basename(name) !== name || name.includes('\\')) {
      throw new Error(`output file name must be a plain file name, got ${JSON.stringify(name)}`);
    }
    if (seen.has(name)) throw new Error(`output file ${name} is listed twice`);
    seen.add(name);
  }
}

/** Creates `dir` when missing; returns the first folder it created (or undefined). */
async function makeFolder(dir: string): Promise<string | undefined> {
  try {
    return await fs.mkdir(dir, { recursive: true });
  } catch (error) {
    throw asInputError(error, 'cannot create the output folder');
  }
}

async function removeCreatedFolders(dir: string, created: string | undefined): Promise<void> {
  if (created === undefined) return;
  // Only the empty folders this call made, deepest first; rmdir never removes content.
  for (let at = dir; ; at = dirname(at)) {
    try {
      await fs.rmdir(at);
    } catch {
      return;
    }
    if (at === created || dirname(at) === at) return;
  }
}

async function refuseForeignFolder(dir: string, files: OutputFile[], options: { planId: string; force: boolean }, recordFile: string): Promise<void> {
  const present: string[] = [];
  for (const { name } of files) {
    const path = join(dir, name);
    const stat = await fs.stat(path).catch(() => null);
    if (stat === null) continue;
    if (!stat.isFile()) throw new InputError(`${path} is a folder or device, not a file; move it away or choose another --out folder`, { file: path });
    present.push(name);
  }
  if (options.force || present.length === 0) return;

  const existingId = (await readPlanId(join(dir, recordFile))) ?? (recordFile === PLAN_FILE ? null : await readPlanId(join(dir, PLAN_FILE)));
  if (existingId === null) {
    throw new InputError(
      `${dir} already holds ${present.join(', ')} but no readable ${recordFile} saying which plan they belong to; use --force to overwrite them, or choose another --out folder`,
      { file: dir },
    );
  }
  if (existingId !== options.planId) {
    throw new InputError(
      `${dir} holds plan ${existingId}, not plan ${options.planId}; use --force to overwrite it, or choose another --out folder`,
      { file: dir },
    );
  }
}

/** The plan id an existing record file names (`planId`, or `plan.id` of analysis.json), or null when missing or unreadable. */
async function readPlanId(path: string): Promise<string | null> {
  try {
    const parsed = JSON.parse(await fs.readFile(path, 'utf8')) as { planId?: unknown; plan?: { id?: unknown } } | null;
    const id = parsed?.planId ?? parsed?.plan?.id;
    return typeof id === 'string' && id !== '' ? id : null;
  } catch {
    return null;
  }
}

async function rollBack(done: { target: string; backup: string | null }[], temps: string[]): Promise<void> {
  for (const { target, backup } of done.reverse()) {
    try {
      if (backup) {
        // rename over the new file (if it got there) restores the old one in one step.
        await fs.rename(backup, target);
      } else {
        await removeQuietly(target);
      }
    } catch {
      // Keep going: restore as much as possible; the original error is what the user sees.
    }
  }
  await Promise.all(temps.map(removeQuietly));
}

/** Clean-up must not hide the error that caused it (a too-long name fails even to be removed). */
async function removeQuietly(path: string): Promise<void> {
  await fs.rm(path, { force: true }).catch(() => undefined);
  clearPendingFile(path);
}

async function exists(path: string): Promise<boolean> {
  return fs.stat(path).then(
    () => true,
    () => false,
  );
}

function asInputError(error: unknown, doing: string): Error {
  const errno = error as NodeJS.ErrnoException;
  if (error instanceof InputError || typeof errno?.code !== 'string') return error as Error;
  const path = errno.path ?? (error as { dest?: string }).dest ?? '';
  return new InputError(`${doing} ${path ? dirname(path) : 'the output folder'}: ${errno.code} (${errno.message}); nothing was written`, {
    file: path || undefined,
  });
}
