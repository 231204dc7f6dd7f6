/**
 * Aggregation of a factor's Sobol' indices over several responses into one number per
 * factor, so that one tier (and one lab plan) serves every response.
 *
 * Rules:
 * - `mean`: arithmetic mean over the factor's rows.
 * - `max`: largest value over the rows: a factor that matters for any response matters.
 * - `weighted`: Σ wᵣ·xᵣ / Σ wᵣ with wᵣ = `Response.weight` (1 for a response the study
 *   does not list).
 * Convention: a factor is aggregated over the rows it has; a response without a row for
 * the factor does not count as zero. Confidence bounds are aggregated by the same rule,
 * bound by bound (the low bound from the lows, the high bound from the highs), which is the
 * interval of the aggregate when the per-response errors move together — the cautious
 * reading, since it never makes an interval narrower than its parts suggest. If any row
 * lacks a bound, the aggregated bound is null.
 * Aggregates are rounded to 12 significant digits, which drops floating-point summation
 * noise (0.36500000000000005 → 0.365) and nothing else: no Sobol' estimate is known to
 * more than a few digits.
 */
import type { AggregateRule, IndexRow, Response } from '../study.js';
import { InputError } from '../inputError.js';
import { max, mean } from 'simple-statistics';

export interface AggregatedIndices {
  total: number;
  first: number;
  totalLow: number | null;
  totalHigh: number | null;
}

const SIGNIFICANT_DIGITS = 12;

export function dropRoundingNoise(value: number): number {
  return value === 0 ? 0 : Number(value.toPrecision(SIGNIFICANT_DIGITS));
}

/** Aggregates `values` (with matching `weights`) by `rule`; an empty list gives 0. */
export function aggregateValues(values: readonly number[], weights: readonly number[], rule: AggregateRule): number {
  return dropRoundingNoise(aggregateExactly(values, weights, rule));
}

function aggregateExactly(values: readonly number[], weights: readonly number[], rule: AggregateRule): number {
  if (values.length === 0) return 0;
  if (rule === 'max') return max(values as number[]);
  if (rule === 'mean') return mean(values as number[]);
  let weightSum = 0;
  let weighted = 0;
  values.forEach((value, i) => {
    weightSum += weights[i];
    weighted += weights[i] * value;
  });
  if (!(weightSum > 0)) {
    throw new InputError('the weighted aggregate needs at least one response with a positive weight', {
      key: 'responses[].weight',
    });
  }
  return weighted / weightSum;
}

/** Aggregates one factor's index rows. */
export function aggregateIndices(
  rows: readonly IndexRow[],
  responses: readonly Response[],
  rule: AggregateRule,
): AggregatedIndices {
  const weightOf = new Map(responses.map((response) => [response.id, response.weight]));
  const weights = rows.map((row) => weightOf.get(row.response) ?? 1);
  const bounded = rows.length > 0 && rows.every((row) => row.totalLow !== undefined && row.totalHigh !== undefined);
  return {
    total: aggregateValues(rows.map((row) => row.total), weights, rule),
    first: aggregateValues(rows.map((row) => row.first), weights, rule),
    totalLow: bounded ? aggregateValues(rows.map((row) => row.totalLow as number), weights, rule) : null,
    totalHigh: bounded ? aggregateValues(rows.map((row) => row.totalHigh as number), weights, rule) : null,
  };
}
