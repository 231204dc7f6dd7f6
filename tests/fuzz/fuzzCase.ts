/**
 * One fuzz case: write the files to a fresh folder, run the target's pipeline, and say what
 * happened. The property every case must meet: a valid result, or an InputError with a
 * location (file, row, column or key) on one line of reasonable length — and within the time
 * bound. Anything else is a crash (our bug) or a hang.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import ExcelJS from 'exceljs';
import { InputError } from '../../src/core/inputError.js';
import type { FuzzFiles } from './fuzzInputs.js';
import type { FuzzTarget } from './fuzzTargets.js';

export type OutcomeKind = 'valid' | 'inputError' | 'crash' | 'hang';

export interface Outcome {
  kind: OutcomeKind;
  milliseconds: number;
  /** The summary, the one-line message, or what went wrong. */
  detail: string;
}

/** Longest one-line message accepted: a message quoting a whole file is a bug too. */
export const MAX_MESSAGE_LENGTH = 600;

export async function writeCaseFiles(files: FuzzFiles['files'], folder = mkdtempSync(join(tmpdir(), 'tierplan-fuzz-'))): Promise<string> {
  for (const [name, content] of Object.entries(files)) {
    const path = join(folder, name);
    mkdirSync(dirname(path), { recursive: true });
    if (typeof content === 'string' || content instanceof Uint8Array) {
      writeFileSync(path, content);
      continue;
    }
    const workbook = new ExcelJS.Workbook();
    const sheet = workbook.addWorksheet('indices');
    for (const row of content.xlsx) sheet.addRow(row);
    writeFileSync(path, Buffer.from(await workbook.xlsx.writeBuffer()));
  }
  return folder;
}

/** Classifies an error: a proper InputError, or a crash with the reason. */
export function classifyError(error: unknown): { kind: 'inputError' | 'crash'; detail: string } {
  if (!(error instanceof InputError)) {
    const what = error instanceof Error ? `${error.name}: ${error.message}\n${error.stack ?? ''}` : String(error);
    return { kind: 'crash', detail: what };
  }
  const line = error.describe();
  const { file, row, column, key } = error.location;
  if (file === undefined && row === undefined && column === undefined && key === undefined) return { kind: 'crash', detail: `InputError without a location: ${line}` };
  if (line.includes('\n')) return { kind: 'crash', detail: `InputError on more than one line: ${JSON.stringify(line)}` };
  if (line.length > MAX_MESSAGE_LENGTH) return { kind: 'crash', detail: `InputError of ${line.length} characters: ${line.slice(0, 200)}…` };
  return { kind: 'inputError', detail: line };
}

/** Runs one case in this process; a case over `boundMilliseconds` counts as a hang. */
export async function runFuzzCase(target: FuzzTarget, input: FuzzFiles, boundMilliseconds: number): Promise<Outcome> {
  const folder = await writeCaseFiles(input.files);
  const started = performance.now();
  let outcome: Omit<Outcome, 'milliseconds'>;
  try {
    outcome = { kind: 'valid', detail: await target.run(folder, input.entry, input) };
  } catch (error) {
    outcome = classifyError(error);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
  const milliseconds = performance.now() - started;
  if (milliseconds > boundMilliseconds && outcome.kind !== 'crash') {
    return { kind: 'hang', milliseconds, detail: `took ${Math.round(milliseconds)} ms (bound ${boundMilliseconds} ms): ${outcome.detail}` };
  }
  return { ...outcome, milliseconds };
}
