/**
 * plan.json sealing: the checksum ignores file metadata, covers the content, and a damaged
 * file is refused on reading.
 */
import { describe, expect, it } from 'vitest';
import { checkedPlan, planChecksum, planJson, sealPlan } from '../../src/io/planFile.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';

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
    const sealed = sealPlan(unsealed);
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
});
