/**
 * The invented spray-dryer sample (samples/spray-dryer/study.yaml) as in-memory data for the
 * design-core tests, with its TierResult worked out BY HAND from indices.csv and
 * interactions.csv under the sample policy (mean aggregate, critical 0.30, moderate 0.05,
 * interaction 0.05, point estimates):
 *
 *   factor          mean total                          mean first                               tier
 *   inlet_temp      (0.46+0.38+0.52+0.10)/4 = 0.365     (0.245+0.203+0.277+0.053)/4 = 0.1945     critical
 *   feed_solids     (0.20+0.30+0.08+0.70)/4 = 0.32      (0.12+0.181+0.048+0.421)/4  = 0.1925     critical
 *   feed_rate       (0.26+0.15+0.12+0.19)/4 = 0.18      (0.123+0.071+0.057+0.09)/4  = 0.08525    moderate
 *   atomiser_speed  (0.02+0.06+0.01+0.36)/4 = 0.1125    (0.014+0.041+0.007+0.248)/4 = 0.0775     moderate
 *   air_flow        (0.07+0.05+0.03+0.02)/4 = 0.0425    (0.048+0.034+0.021+0.014)/4 = 0.02925    negligible
 *
 * Pairs whose largest second-order index reaches 0.05: inlet_temp×feed_rate 0.08 (moisture),
 * feed_solids×atomiser_speed 0.07 (d50), inlet_temp×feed_solids 0.06 (native_whey),
 * e_denat×inlet_temp 0.05 (native_whey; e_denat is a model parameter).
 * All numbers are invented demo data.
 */
import type { Factor, TierPolicy } from '../../../src/core/study.js';
import { DEFAULT_POLICY } from '../../../src/core/study.js';
import type { FactorTier, Tier, TierResult } from '../../../src/core/sensitivity/tierTypes.js';

export const samplePolicy: TierPolicy = { ...DEFAULT_POLICY };

export function sampleFactors(): Factor[] {
  return [
    {
      id: 'inlet_temp', name: 'Inlet air temperature', unit: '°C', role: 'operating',
      low: 160, high: 200, nominal: 180, precision: 1, limits: { low: 140, high: 220 }, hardToChange: true,
    },
    {
      id: 'feed_solids', name: 'Feed total solids', unit: '% w/w', role: 'operating',
      low: 30, high: 45, nominal: 38, precision: 0.5, limits: { low: 20, high: 50 },
    },
    {
      id: 'feed_rate', name: 'Feed rate', unit: 'kg/h', role: 'operating',
      low: 8, high: 16, nominal: 12, precision: 0.1, limits: { low: 4, high: 20 },
    },
    {
      id: 'atomiser_speed', name: 'Atomiser wheel speed', unit: 'rpm', role: 'operating',
      low: 15000, high: 25000, nominal: 20000, precision: 100, limits: { low: 10000, high: 28000 },
    },
    {
      id: 'air_flow', name: 'Drying air flow', unit: 'm³/h', role: 'operating',
      low: 350, high: 450, nominal: 400, precision: 5, limits: { low: 300, high: 500 },
    },
    { id: 'd_eff', name: 'Effective moisture diffusivity', unit: '1e-11 m²/s', role: 'model', low: 1, high: 10, nominal: 4 },
    { id: 'e_denat', name: 'Activation energy of denaturation', unit: 'kJ/mol', role: 'model', low: 180, high: 280, nominal: 230 },
  ];
}

export const sampleConstraint = 'feed_rate <= 0.2 * inlet_temp - 18';

function tierRow(id: string, role: Factor['role'], total: number, first: number, tier: Tier): FactorTier {
  return {
    id, name: id, unit: '-', role,
    aggregatedTotal: total, aggregatedFirst: first,
    aggregatedTotalLow: null, aggregatedTotalHigh: null,
    decidedOn: total, tier, borderline: false,
    interactionShare: Math.max(0, total - first),
    perResponse: [],
  };
}

export function sampleTiers(): TierResult {
  return {
    policy: samplePolicy,
    factors: [
      tierRow('inlet_temp', 'operating', 0.365, 0.1945, 'critical'),
      tierRow('feed_solids', 'operating', 0.32, 0.1925, 'critical'),
      tierRow('feed_rate', 'operating', 0.18, 0.08525, 'moderate'),
      tierRow('atomiser_speed', 'operating', 0.1125, 0.0775, 'moderate'),
      tierRow('air_flow', 'operating', 0.0425, 0.02925, 'negligible'),
      tierRow('d_eff', 'model', 0.1175, 0.06075, 'moderate'),
      tierRow('e_denat', 'model', 0.1, 0.056, 'moderate'),
    ],
    interactionPairs: [
      { factorA: 'inlet_temp', factorB: 'feed_rate', index: 0.08, responses: ['moisture'] },
      { factorA: 'feed_solids', factorB: 'atomiser_speed', index: 0.07, responses: ['d50'] },
      { factorA: 'inlet_temp', factorB: 'feed_solids', index: 0.06, responses: ['native_whey'] },
      { factorA: 'e_denat', factorB: 'inlet_temp', index: 0.05, responses: ['native_whey'] },
    ],
    calibration: { entries: [], estimate: 0, literature: 0 },
    sweep: [],
  };
}
