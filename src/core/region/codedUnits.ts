/**
 * Coded units: the linear map between a factor's engineering settings and the coded scale of
 * the design search, low → −1, high → +1, the middle of the range → 0 (Montgomery, 2017,
 * "Design and Analysis of Experiments", 9th ed., ch. 6, coded variables; chapter from
 * memory).
 *
 * Conventions fixed here: no rounding in either direction — settable values (multiples of a
 * factor's precision) are the business of ../design/levels.ts.
 */
import type { Factor } from '../study.js';

/** Coded value of an engineering setting: low → −1, high → +1. */
export function toCoded(factor: Pick<Factor, 'low' | 'high'>, value: number): number {
  const half = (factor.high - factor.low) / 2;
  const mid = (factor.high + factor.low) / 2;
  return (value - mid) / half;
}

/** Engineering setting of a coded value (no rounding). */
export function toEngineering(factor: Pick<Factor, 'low' | 'high'>, coded: number): number {
  const half = (factor.high - factor.low) / 2;
  const mid = (factor.high + factor.low) / 2;
  return mid + coded * half;
}
