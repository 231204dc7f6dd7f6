import { describe, expect, it } from 'vitest';
import { decideTiers } from '../../../src/core/sensitivity/decideTiers.js';
import { InputError } from '../../../src/core/inputError.js';
import { factor, policy, response, row } from './studyFixture.js';

// A hand-made study: two responses (weights 3 and 1), four operating settings and two model
// parameters. Every expected value below is worked out by hand from the rules.
const responses = [response('r1', 3), response('r2', 1)];
const factors = [
  factor('temp'),
  factor('solids'),
  factor('rate'),
  factor('flow'),
  factor('k_rate', 'model'),
  factor('k_eq', 'model'),
];
const indices = [
  // temp: mean total 0.40, first 0.25, bounds [0.32, 0.48]
  row('temp', 'r1', 0.3, 0.5, [0.42, 0.58]),
  row('temp', 'r2', 0.2, 0.3, [0.22, 0.38]),
  // solids: mean total 0.27, bounds [0.22, 0.32] → moderate, borderline at 0.30
  row('solids', 'r1', 0.2, 0.24, [0.2, 0.28]),
  row('solids', 'r2', 0.25, 0.3, [0.24, 0.36]),
  // rate: mean total 0.10 (no bounds), first 0.12 > total → share clamped to 0
  row('rate', 'r1', 0.14, 0.12),
  row('rate', 'r2', 0.1, 0.08),
  // flow: mean total 0.04, bounds [0.02, 0.06] → negligible, borderline at 0.05
  row('flow', 'r1', 0.03, 0.05, [0.03, 0.07]),
  row('flow', 'r2', 0.01, 0.03, [0.01, 0.05]),
  // k_rate: total 0.2 in r1 only, 0 in r2 → mean 0.10, max 0.20, weighted 0.15
  row('k_rate', 'r1', 0.0, 0.2, [0.15, 0.25]),
  row('k_rate', 'r2', 0.0, 0.0, [0.0, 0.02]),
  // k_eq: mean total 0.01
  row('k_eq', 'r2', 0.0, 0.0),
  row('k_eq', 'r1', 0.01, 0.02),
];
const interactions = [
  { factorA: 'temp', factorB: 'solids', response: 'r1', index: 0.04 },
  { factorA: 'solids', factorB: 'temp', response: 'r2', index: 0.07 },
  { factorA: 'temp', factorB: 'k_rate', response: 'r1', index: 0.2 },
];
const study = { factors, responses, indices, interactions, policy: policy() };

describe('decideTiers with the default policy (mean, 0.30 / 0.05, point)', () => {
  const result = decideTiers(study);
  const byId = Object.fromEntries(result.factors.map((tier) => [tier.id, tier]));

  it('keeps the study order and tiers on the aggregated total', () => {
    expect(result.factors.map((tier) => [tier.id, tier.tier])).toEqual([
      ['temp', 'critical'],
      ['solids', 'moderate'],
      ['rate', 'moderate'],
      ['flow', 'negligible'],
      ['k_rate', 'moderate'],
      ['k_eq', 'negligible'],
    ]);
  });

  it('aggregates totals, first-order indices and bounds', () => {
    expect(byId.temp.aggregatedTotal).toBeCloseTo(0.4, 12);
    expect(byId.temp.aggregatedFirst).toBeCloseTo(0.25, 12);
    expect(byId.temp.aggregatedTotalLow).toBeCloseTo(0.32, 12);
    expect(byId.temp.aggregatedTotalHigh).toBeCloseTo(0.48, 12);
    expect(byId.temp.decidedOn).toBe(byId.temp.aggregatedTotal);
    expect(byId.temp.decisionBasis).toBe('estimate');
    expect(byId.rate.aggregatedTotalLow).toBeNull();
    expect(byId.k_eq.aggregatedTotal).toBeCloseTo(0.01, 12);
  });

  it('flags borderline factors whose interval crosses a cut-off', () => {
    expect(result.factors.filter((tier) => tier.borderline).map((tier) => tier.id)).toEqual(['solids', 'flow']);
  });

  it('interaction share is total − first, clamped at 0', () => {
    expect(byId.temp.interactionShare).toBeCloseTo(0.15, 12);
    expect(byId.k_rate.interactionShare).toBeCloseTo(0.1, 12);
    expect(byId.rate.interactionShare).toBe(0);
  });

  it('margin to the nearest cut-off', () => {
    expect(byId.temp.margin).toBeCloseTo(0.1, 12);
    expect(byId.solids.margin).toBeCloseTo(0.03, 12);
    expect(byId.flow.margin).toBeCloseTo(0.01, 12);
  });

  it('keeps per-response values in the study response order', () => {
    expect(byId.k_eq.perResponse).toEqual([
      { response: 'r1', first: 0.01, total: 0.02 },
      { response: 'r2', first: 0, total: 0 },
    ]);
    expect(byId.temp.perResponse[0]).toEqual({ response: 'r1', first: 0.3, total: 0.5, totalLow: 0.42, totalHigh: 0.58 });
  });

  it('lists interaction pairs by their largest index over responses', () => {
    expect(result.interactionPairs).toEqual([
      { factorA: 'temp', factorB: 'k_rate', index: 0.2, responses: ['r1'] },
      { factorA: 'temp', factorB: 'solids', index: 0.07, responses: ['r2'] },
    ]);
  });

  it('calibration list: k_rate estimated, k_eq from the literature', () => {
    expect(result.calibration.entries.map((entry) => [entry.id, entry.action])).toEqual([
      ['k_rate', 'estimate'],
      ['k_eq', 'literature'],
    ]);
    expect(result.calibration.estimate).toBe(1);
    expect(result.calibration.literature).toBe(1);
  });

  it('the policy row of the sweep reproduces the tier counts', () => {
    const policyRows = result.sweep.filter((sweepRow) => sweepRow.isPolicy);
    expect(policyRows).toHaveLength(2);
    for (const policyRow of policyRows) {
      expect(policyRow.counts).toEqual({ critical: 1, moderate: 3, negligible: 2 });
    }
    expect(result.notes).toEqual([]);
  });
});

describe('decideTiers under other policies', () => {
  it('max aggregate: k_rate takes its largest total, 0.20', () => {
    const result = decideTiers({ ...study, policy: policy({ aggregate: 'max' }) });
    const kRate = result.factors.find((tier) => tier.id === 'k_rate');
    expect(kRate?.aggregatedTotal).toBeCloseTo(0.2, 12);
    expect(kRate?.aggregatedTotalHigh).toBeCloseTo(0.25, 12);
    // solids max total 0.30 reaches the critical cut-off
    expect(result.factors.find((tier) => tier.id === 'solids')?.tier).toBe('critical');
    // flow max total 0.05 reaches the moderate cut-off
    expect(result.factors.find((tier) => tier.id === 'flow')?.tier).toBe('moderate');
  });

  it('weighted aggregate uses the response weights 3 and 1', () => {
    const result = decideTiers({ ...study, policy: policy({ aggregate: 'weighted' }) });
    const byId = Object.fromEntries(result.factors.map((tier) => [tier.id, tier]));
    // temp (3·0.5 + 0.3)/4 = 0.45; solids (3·0.24 + 0.3)/4 = 0.255; k_rate 3·0.2/4 = 0.15
    expect(byId.temp.aggregatedTotal).toBeCloseTo(0.45, 12);
    expect(byId.solids.aggregatedTotal).toBeCloseTo(0.255, 12);
    expect(byId.k_rate.aggregatedTotal).toBeCloseTo(0.15, 12);
    // flow (3·0.05 + 0.03)/4 = 0.045, bounds (0.09 + 0.01)/4 = 0.025, (0.21 + 0.05)/4 = 0.065
    expect(byId.flow.aggregatedTotal).toBeCloseTo(0.045, 12);
    expect(byId.flow.aggregatedTotalLow).toBeCloseTo(0.025, 12);
    expect(byId.flow.aggregatedTotalHigh).toBeCloseTo(0.065, 12);
    expect(byId.flow.tier).toBe('negligible');
  });

  it('upper confidence: tiers on the upper bound, falls back to the estimate and says so', () => {
    const result = decideTiers({ ...study, policy: policy({ confidence: 'upper' }) });
    const byId = Object.fromEntries(result.factors.map((tier) => [tier.id, tier]));
    // solids upper bound 0.32 → critical; flow upper bound 0.06 → moderate
    expect(byId.solids.decidedOn).toBeCloseTo(0.32, 12);
    expect(byId.solids.decisionBasis).toBe('upperBound');
    expect(byId.solids.tier).toBe('critical');
    expect(byId.flow.tier).toBe('moderate');
    expect(byId.flow.aggregatedTotal).toBeCloseTo(0.04, 12);
    // rate and k_eq have no bounds
    expect(byId.rate.decidedOn).toBeCloseTo(0.1, 12);
    expect(byId.rate.decisionBasis).toBe('estimateWithoutBounds');
    expect(result.notes).toEqual([
      'no confidence bounds for rate, k_eq: tiered on the estimate, not the upper bound',
    ]);
  });

  it('stricter cut-offs change the tiers as the rule says', () => {
    const result = decideTiers({ ...study, policy: policy({ critical: 0.5, moderate: 0.15 }) });
    expect(result.factors.map((tier) => tier.tier)).toEqual([
      'moderate',
      'moderate',
      'negligible',
      'negligible',
      'negligible',
      'negligible',
    ]);
    expect(result.calibration.literature).toBe(2);
  });

  it('the interaction threshold filters pairs', () => {
    const result = decideTiers({ ...study, policy: policy({ interaction: 0.1 }) });
    expect(result.interactionPairs.map((pair) => pair.factorB)).toEqual(['k_rate']);
  });

  it('refuses a policy with moderate above critical', () => {
    expect(() => decideTiers({ ...study, policy: policy({ critical: 0.1, moderate: 0.2 }) })).toThrow(InputError);
  });

  it('a factor without index rows is negligible and noted', () => {
    const result = decideTiers({ ...study, factors: [...factors, factor('spare')] });
    const spare = result.factors.find((tier) => tier.id === 'spare');
    expect(spare?.tier).toBe('negligible');
    expect(spare?.aggregatedTotal).toBe(0);
    expect(result.notes).toContain('no index rows for spare: treated as zero (negligible)');
  });
});
