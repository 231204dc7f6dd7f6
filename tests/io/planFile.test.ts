/**
 * plan.json sealing: the checksum ignores file metadata, covers the content, and a damaged
 * file is refused on reading.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkedPlan, planChecksum, planJson, readPlanJson, sealPlan } from '../../src/io/planFile.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';
import { InputError } from '../../src/core/inputError.js';
import { makePlanFixture } from '../fixtures/plan/sprayDryerPlan.js';

const unsealed = {
  formatVersion: 1,
  tool: { name: 'tierplan', version: '0.0.0' },
  planId: '',
  checksum: '',
  createdAt: '',
  runs: [{ point: 'F01', purpose: 'fit', coded: { a: -1 }, settings: { a: 10 } }],
  metrics: { p: 1, N: 1 },
} as unknown as PlanDocument;

describe('sealPlan', () => {
  it('does not depend on the creation time or on key order', () => {
    const a = sealPlan(unsealed, new Date('2026-01-01T00:00:00Z'));
    const reordered = Object.fromEntries(Object.entries(unsealed).reverse()) as unknown as PlanDocument;
    const b = sealPlan(reordered, new Date('2027-06-01T00:00:00Z'));
    expect(a.checksum).toBe(b.checksum);
    expect(a.planId).toBe(`TP-${a.checksum.slice(0, 10)}`);
    expect(a.createdAt).toBe('2026-01-01T00:00:00.000Z');
  });

  it('changes when a setting changes', () => {
    const changed = { ...unsealed, runs: [{ ...unsealed.runs[0], settings: { a: 11 } }] } as PlanDocument;
    expect(planChecksum(changed)).not.toBe(planChecksum(unsealed));
  });
});

describe('checkedPlan', () => {
  it('reads back what was written', () => {
    const sealed = sealPlan(makePlanFixture());
    expect(checkedPlan(JSON.parse(planJson(sealed)), 'plan.json').checksum).toBe(sealed.checksum);
  });

  it('refuses a plan edited by hand, naming the file and the key', () => {
    const sealed = sealPlan(unsealed);
    const edited = JSON.parse(planJson({ ...sealed, runs: [{ ...sealed.runs[0], settings: { a: 99 } }] }));
    expect(() => checkedPlan(edited, 'edited.json')).toThrow(/checksum/);
    expect(() => checkedPlan(edited, 'edited.json')).toThrow(expect.objectContaining({ location: { file: 'edited.json', key: 'checksum' } }));
  });

  it('refuses a file that is not a plan', () => {
    expect(() => checkedPlan({ title: 'x' }, 'other.json')).toThrow(/formatVersion/);
  });

  it('refuses a plan whose checksum matches but whose content is not what tierplan writes', () => {
    // Anyone can compute the checksum: the comparison must not trust the shape because of it.
    const forged = makePlanFixture();
    (forged.levels[0] as unknown as { coded: unknown }).coded = 'not a list';
    const path = 'forged.json';
    let error: unknown = null;
    try {
      checkedPlan(JSON.parse(planJson(sealPlan(forged))), path);
    } catch (caught) {
      error = caught;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).describe()).toBe(
      `${path}, key levels[0].coded: is not what tierplan writes here (Invalid input: expected array, received string); plan again from the study`,
    );
  });

  it('refuses a plan file above 64 MiB by its size', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'tierplan-planfile-')), 'huge.json');
    writeFileSync(path, `{"formatVersion": 1, "pad": "${'x'.repeat(64 * 1024 * 1024)}"}`);
    await expect(readPlanJson(path)).rejects.toThrow(/is 67\.1 MB, above the limit of 64 MiB/);
  });
});
