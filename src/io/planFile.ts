/**
 * plan.json: sealing a plan with its checksum and id, writing it, and checking one read back.
 *
 * The checksum is SHA-256 over the document serialised with sorted keys, leaving out the
 * fields that describe the file rather than the plan (`checksum`, `planId`, `createdAt`).
 * The same study, seed and tool version therefore give the same checksum and plan id on any
 * machine and on any day; `createdAt` is metadata only.
 */
import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { InputError } from '../core/inputError.js';
import type { PlanDocument } from '../core/plan/planDocument.js';

const UNSEALED_KEYS = new Set(['checksum', 'planId', 'createdAt']);

export function planChecksum(plan: PlanDocument): string {
  return createHash('sha256').update(canonicalJson(plan, true)).digest('hex');
}

/** The plan with checksum, plan id (first 10 hex digits of the checksum) and creation time filled in. */
export function sealPlan(plan: PlanDocument, createdAt: Date = new Date()): PlanDocument {
  const checksum = planChecksum(plan);
  return { ...plan, checksum, planId: `TP-${checksum.slice(0, 10)}`, createdAt: createdAt.toISOString() };
}

export function planJson(plan: PlanDocument): string {
  return `${JSON.stringify(plan, null, 2)}\n`;
}

/** An already parsed plan.json, refused unless it is format version 1 with a matching checksum. */
export function checkedPlan(parsed: unknown, path: string): PlanDocument {
  if (typeof parsed !== 'object' || parsed === null || (parsed as { formatVersion?: unknown }).formatVersion !== 1) {
    throw new InputError('not a tierplan plan file (no formatVersion 1)', { file: path, key: 'formatVersion' });
  }
  const plan = parsed as PlanDocument;
  if (plan.checksum !== planChecksum(plan)) {
    throw new InputError('checksum does not match the content: the plan was edited by hand or damaged; plan again from the study', {
      file: path,
      key: 'checksum',
    });
  }
  return plan;
}

/** plan.json read from disk and checked (`checkedPlan`); unreadable or unparsable files are InputErrors. */
export async function loadPlan(path: string): Promise<PlanDocument> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (error) {
    throw new InputError(`cannot read the plan (${(error as NodeJS.ErrnoException).code ?? 'error'})`, { file: path });
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (error) {
    throw new InputError(`is not valid JSON (${(error as Error).message})`, { file: path });
  }
  return checkedPlan(parsed, path);
}

/** JSON with object keys sorted, so the checksum does not depend on construction order. */
function canonicalJson(value: unknown, top = false): string {
  if (Array.isArray(value)) return `[${value.map((item) => canonicalJson(item)).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([key, item]) => item !== undefined && !(top && UNSEALED_KEYS.has(key)))
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonicalJson(item)}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}
