/**
 * plan.json: sealing a plan with its checksum and id, writing it, and checking one read back.
 *
 * The checksum is SHA-256 over the document serialised with sorted keys, leaving out the
 * fields that describe the file rather than the plan (`checksum`, `planId`, `createdAt`).
 * The same study, seed and tool version therefore give the same checksum and plan id on any
 * machine and on any day; `createdAt` is metadata only.
 */
import { createHash } from 'node:crypto';
import { readFile, stat } from 'node:fs/promises';
import { InputError } from '../core/inputError.js';
import { z } from 'zod';
import { aboveLimit, limitOf } from '../core/inputLimits.js';
import { parseJsonText } from './documentText.js';
import { megabytes } from './tableRows.js';
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

/**
 * The parsed content of a plan file (any JSON, not yet checked), read within the plan-file
 * size limit and with the JSON safety of documentText.ts (depth, repeated and reserved keys).
 */
export async function readPlanJson(path: string): Promise<unknown> {
  let text: string;
  try {
    const info = await stat(path);
    if (info.size > limitOf('planFileBytes')) throw new InputError(`is ${megabytes(info.size)}, ${aboveLimit('planFileBytes')}`, { file: path });
    text = await readFile(path, 'utf8');
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError(`cannot read the plan file (${(error as NodeJS.ErrnoException).code ?? 'unreadable'})`, { file: path });
  }
  return parseJsonText(text.replace(/^\uFEFF/, ''), path);
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
  // A matching checksum proves only that the content was hashed as we hash it, not that we
  // wrote it: check the parts the comparison reads before it reads them.
  const shape = planShape.safeParse(plan);
  if (!shape.success) {
    const issue = shape.error.issues[0];
    const key = issue.path.map((part) => (typeof part === 'number' ? `[${part}]` : `.${String(part)}`)).join('').replace(/^\./, '');
    throw new InputError(`is not what tierplan writes here (${issue.message}); plan again from the study`, { file: path, key: key || '(top level)' });
  }
  return plan;
}

const finite = z.number().finite();
const planFactor = z.looseObject({
  id: z.string().max(limitOf('idLength')),
  role: z.enum(['operating', 'model']),
  low: finite,
  high: finite,
  nominal: finite,
  precision: finite.positive().optional(),
  limits: z.looseObject({ low: finite, high: finite }).optional(),
  hardToChange: z.boolean().optional(),
});
/** The parts of a plan document that `compare` reads, with the study's limits. */
const planShape = z.looseObject({
  study: z.looseObject({
    title: z.string().max(limitOf('textLength')),
    factors: z.array(planFactor).max(limitOf('factors')),
    constraints: z.array(z.string().max(limitOf('expressionLength'))).max(limitOf('constraints')),
    design: z.looseObject({ seed: z.number().int().min(0).max(4294967295) }),
    costs: z.looseObject({ currency: z.string().max(limitOf('textLength')), perRun: finite, hoursPerRun: finite }).optional(),
  }),
  levels: z
    .array(
      z.looseObject({
        id: z.string(),
        varied: z.boolean(),
        values: z.array(finite).max(limitOf('levelsPerFactor')),
        coded: z.array(finite).max(limitOf('levelsPerFactor')),
        fixedAt: finite.nullable(),
      }),
    )
    .max(limitOf('operatingFactors')),
  model: z.looseObject({ terms: z.array(z.string().max(limitOf('expressionLength'))).max(limitOf('modelTerms')) }),
  runs: z
    .array(z.looseObject({ purpose: z.enum(['fit', 'centre', 'holdout']), coded: z.record(z.string(), finite), settings: z.record(z.string(), finite) }))
    .max(limitOf('fittingRuns') + limitOf('centreRuns') + limitOf('holdoutRuns')),
  schedule: z.looseObject({ hardToChange: z.looseObject({ levelChanges: z.number().int().min(0) }).nullish() }).optional(),
  warnings: z.array(z.string()),
});

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

/** plan.json read from disk with the JSON safety and size limit of `readPlanJson`, then checked (`checkedPlan`). */
export async function loadPlan(path: string): Promise<PlanDocument> {
  return checkedPlan(await readPlanJson(path), path);
}
