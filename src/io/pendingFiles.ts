/**
 * The temporary files being written right now, so that a crash between writing a file and
 * renaming it into place leaves nothing behind.
 *
 * Every writer writes under a temporary name in the target folder and renames the file into
 * place (outputSet.ts, singleFileOutput.ts): a target is never half-written. What an unexpected
 * failure could still leave is a hidden temporary file; the command line's last-resort
 * handler calls `removePendingFiles` before it exits.
 */
import { rmSync } from 'node:fs';

const pending = new Set<string>();

/** Records a temporary file before it is created. */
export function notePendingFile(path: string): void {
  pending.add(path);
}

/** Forgets a temporary file once it was renamed into place or removed. */
export function clearPendingFile(path: string): void {
  pending.delete(path);
}

/** Removes every temporary file still recorded (synchronously: the process is about to exit). */
export function removePendingFiles(): void {
  for (const path of pending) {
    try {
      rmSync(path, { force: true });
    } catch {
      // Nothing more can be done on the way out; the original error is what the user sees.
    }
  }
  pending.clear();
}
