/**
 * Hand-made plan documents for the comparison tests: small invented studies with known
 * fitting, centre and holdout runs, so that every comparator can be counted by hand.
 */
import { DEFAULT_DESIGN, DEFAULT_POLICY, type Factor, type Study } from '../../../src/core/study.js';
import type { FactorLevels, PlannedRun, RunPurpose } from '../../../src/core/design/designTypes.js';
import type { PlanDocument } from '../../../src/core/plan/planDocument.js';
import type { TierResult } from '../../../src/core/sensitivity/tierTypes.js';

export interface FixtureOptions {
  factors: Factor[];
  /** Ids of the varied factors with their coded levels; every other factor is fixed at nominal. */
  varied: Record<string, number[]>;
  terms: string[];
  fit: number[][];
  centre: number;
  holdout: number[][];
  constraints?: string[];
  costs?: Study['costs'];
}

export function planFixture(options: FixtureOptions): PlanDocument {
  const variedIds = Object.keys(options.varied);
  const levels: FactorLevels[] = options.factors
    .filter((f) => f.role === 'operating')
    .map((f) => {
      const coded = options.varied[f.id];
      const half = (f.high - f.low) / 2;
      const mid = (f.high + f.low) / 2;
      return {
        id: f.id,
        name: f.name,
        unit: f.unit,
        tier: coded ? 'critical' : 'negligible',
        varied: Boolean(coded),
        values: coded ? coded.map((x) => mid + x * half) : [],
        coded: coded ?? [],
        fixedAt: coded ? null : f.nominal,
        reason: 'hand-made test fixture',
      };
    });
  const toRun = (prefix: string, purpose: RunPurpose) => (x: number[], i: number): PlannedRun => {
    const coded: Record<string, number> = {};
    const settings: Record<string, number> = {};
    variedIds.forEach((id, j) => (coded[id] = x[j]));
    for (const f of options.factors.filter((g) => g.role === 'operating')) {
      settings[f.id] = f.id in coded ? (f.high + f.low) / 2 + (coded[f.id] * (f.high - f.low)) / 2 : f.nominal;
    }
    return { point: `${prefix}${i + 1}`, purpose, coded, settings };
  };
  const centrePoint = variedIds.map(() => 0);
  const runs: PlannedRun[] = [
    ...options.fit.map(toRun('F', 'fit')),
    ...Array.from({ length: options.centre }, () => centrePoint).map(toRun('C', 'centre')),
    ...options.holdout.map(toRun('H', 'holdout')),
  ];
  const tiers: TierResult = {
    policy: DEFAULT_POLICY,
    factors: [],
    interactionPairs: [],
    calibration: { entries: [], estimate: 0, literature: 0 },
    sweep: [],
  };
  const study: Omit<Study, 'warnings'> = {
    title: 'Comparison test fixture (invented)',
    factors: options.factors,
    responses: [{ id: 'y', name: 'Response', unit: '-', weight: 1 }],
    indices: [],
    interactions: [],
    policy: DEFAULT_POLICY,
    design: { ...DEFAULT_DESIGN, centreRuns: options.centre },
    constraints: options.constraints ?? [],
    costs: options.costs,
    source: { studyFile: 'fixture.yaml', indicesFile: 'fixture.csv' },
  };
  return {
    formatVersion: 1,
    tool: { name: 'tierplan', version: 'test' },
    planId: 'fixture',
    checksum: '',
    createdAt: '',
    study,
    tiers,
    levels,
    model: { intercept: true, terms: options.terms, explained: [], source: 'explicit', potential: [] },
    runs,
    metrics: {
      p: options.terms.length + 1,
      N: options.fit.length,
      logDetPerRun: 0,
      dEfficiency: 0,
      boundEfficiency: null,
      boundNote: '',
      iCriterion: 0,
      criterion: 'D',
      seed: 1,
      starts: 1,
      runsNote: '',
    },
    precision: { power: 0.8, alpha: 0.05, met: false, basis: 'none', factors: [], interactions: [], weakest: null, runCurve: [], fixed: [] },
    warnings: [],
  };
}

export function operatingFactor(id: string, low: number, high: number, extra: Partial<Factor> = {}): Factor {
  return { id, name: id, unit: 'u', role: 'operating', low, high, nominal: (low + high) / 2, ...extra };
}
