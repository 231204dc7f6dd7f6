/**
 * Writes one output file (`tiers --out`, `compare --out`, `init --out`) whole or not at all,
 * and never over a file the command read.
 *
 * Method: the content goes to a temporary name in the target folder (same file system), then
 * is renamed over the target; rename is atomic on POSIX and NTFS, so a reader sees the old
 * file or the new one, never half of one, and a failure leaves nothing behind.
 *
 * Conventions fixed here:
 * - The folder must exist (a mistyped folder is refused, not created).
 * - A target that is one of the command's inputs (compared through symbolic links) is refused:
 *   `--out indices.csv` is a slip that would destroy what the output rests on.
 * - A folder in the target's place is refused.
 * - An existing target is kept unless `force`, by one of two rules, as the plan's output set
 *   does: `keep` (never replace it) or `owner` (replace a file of the same plan, recognised
 *   by the id it records). Without either rule an existing file is replaced.
 * - File-system refusals (permissions, a full or read-only disk) are InputErrors naming the
 *   path; anything without an error code is our bug.
 */
import { randomBytes } from 'node:crypto';
import { readFile, realpath, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../core/inputError.js';
import { clearPendingFile, notePendingFile } from './pendingFiles.js';

export interface SingleFileRules {
  /** Files the output may never replace, with what they are for the message. */
  inputs?: { files: readonly string[]; described: string };
  /** Refuse to replace an existing file (lifted by `force`). */
  keep?: boolean;
  /** Replace an existing file only when it records the same id (lifted by `force`). */
  owner?: { id: string; idOf(existingContent: string): string | null; what: string };
  force?: boolean;
  /** Extensions the message for a folder in the way suggests, e.g. ".csv or .json". */
  extensions: string;
}

export async function writeSingleFile(path: string, content: string, rules: SingleFileRules): Promise<void> {
  if (rules.inputs) {
    const target = await sameFileKey(path);
    for (const input of rules.inputs.files) {
      if ((await sameFileKey(input)) === target) {
        throw new InputError(`is an input of ${rules.inputs.described}; choose another --out file`, { file: path });
      }
    }
  }
  const folder = dirname(path);
  try {
    const info = await stat(folder);
    if (!info.isDirectory()) throw new InputError('is not a folder', { file: folder });
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError('folder does not exist; create it first', { file: folder });
  }
  const existing = await stat(path).catch(() => null);
  if (existing?.isDirectory()) throw new InputError(`is a folder; give a file name ending in ${rules.extensions}`, { file: path });
  if (existing && !rules.force) await refuseExisting(path, rules);

  const temporary = join(folder, `.${basename(path)}.${randomBytes(6).toString('hex')}.tmp`);
  notePendingFile(temporary);
  try {
    await writeFile(temporary, content, { encoding: 'utf8', flag: 'wx' });
    await rename(temporary, path);
    clearPendingFile(temporary);
  } catch (error) {
    await unlink(temporary).catch(() => {});
    clearPendingFile(temporary);
    const code = (error as NodeJS.ErrnoException).code;
    if (typeof code === 'string') throw new InputError(`cannot write here (${code}); nothing was written`, { file: path });
    throw error;
  }
}

async function refuseExisting(path: string, rules: SingleFileRules): Promise<void> {
  if (rules.keep) throw new InputError('already exists; use --force to overwrite it, or choose another --out file', { file: path });
  if (!rules.owner) return;
  const text = await readFile(path, 'utf8').catch(() => null);
  const id = text === null ? null : rules.owner.idOf(text);
  if (id === null) {
    throw new InputError(
      `already exists and does not say which plan it belongs to; use --force to overwrite it, or choose another --out file`,
      { file: path },
    );
  }
  if (id !== rules.owner.id) {
    throw new InputError(
      `holds the ${rules.owner.what} of plan ${id}, not of plan ${rules.owner.id}; use --force to overwrite it, or choose another --out file`,
      { file: path },
    );
  }
}

/** The resolved path, through symbolic links when the file exists, so two names of one file compare equal. */
async function sameFileKey(path: string): Promise<string> {
  return realpath(path).catch(() => resolve(path));
}
