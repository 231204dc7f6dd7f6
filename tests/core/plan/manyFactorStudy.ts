/**
 * An invented study of k operating settings, all with the same indices, built in memory for
 * the many-factor and design-invariant tests. Not a test file itself.
 *
 * total 0.2 (first 0.16) makes every factor moderate (3 levels, squares, no pair reaches the
 * interaction share 0.05); total 0.4 (first 0.32) makes them critical (4 levels, cubes) and,
 * without a second-order table, every pair interacting (shares 0.08 ≥ 0.05).
 */
import { DEFAULT_DESIGN, DEFAULT_POLICY, type DesignSettings, type Factor, type Study } from '../../../src/core/study.js';

export function manyFactorStudy(k: number, total: number, design: Partial<DesignSettings> = {}, constraints: string[] = []): Study {
  const factors: Factor[] = Array.from({ length: k }, (_, j) => ({
    id: `x${j + 1}`,
    name: `Setting ${j + 1}`,
    unit: '-',
    role: 'operating',
    low: 0,
    high: 10,
    nominal: 5,
    precision: 0.001,
  }));
  factors.push({ id: 'm1', name: 'Rate parameter', unit: '-', role: 'model', low: 0, high: 1, nominal: 0.5 });
  return {
    title: `Invented ${k}-setting study`,
    factors,
    responses: [{ id: 'y', name: 'Yield', unit: '%', weight: 1 }],
    indices: [
      ...factors.slice(0, k).map((factor) => ({ factor: factor.id, response: 'y', first: total * 0.8, total })),
      { factor: 'm1', response: 'y', first: 0.01, total: 0.02 },
    ],
    interactions: [],
    policy: { ...DEFAULT_POLICY },
    design: { ...DEFAULT_DESIGN, ...design },
    constraints,
    source: { studyFile: 'study.yaml', indicesFile: 'indices.csv' },
    warnings: [],
  };
}
