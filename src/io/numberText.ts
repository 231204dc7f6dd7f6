/**
 * Numbers as text: the one rule per quantity that every output (run sheets, worksheets, report,
 * workbook sheets) and every command-line summary prints with, so that one figure never shows
 * up as 0.36 in one place and 0.365 in another.
 *
 * One locale, British English (`en-GB`): `.` as decimal mark, `,` grouping thousands. Rounding of settings is not decided here but in core
 * (`settingStep` and `roundToPrecision` in src/core/design/levels.ts): plan.json already holds
 * the rounded settings, and this module prints them with the decimals of the factor's step.
 * Other quantities are rounded with the core's `roundToPrecision` (binary noise removed first,
 * halves up), so 0.365 prints 0.37, never 0.36.
 *
 * The rule per quantity (fixed here, relied on by tests):
 * | quantity                                   | function           | example         |
 * |--------------------------------------------|--------------------|-----------------|
 * | run, term, session and other counts        | `countText`        | 1,250           |
 * | a setting (engineering units)              | `settingText`      | 12.0, 20000     |
 * | money, whole units with the currency code  | `moneyText`        | EUR 22,210      |
 * | bench hours, 0.1 h, no trailing zero       | `hoursText`        | 25.8, 81        |
 * | a share or saving, whole per cent          | `percentText`      | 29 %            |
 * | power, whole per cent of a probability     | `powerText`        | 71 %            |
 * | efficiency, 0.1 per cent                   | `efficiencyText`   | 95.0 %          |
 * | Sobol' index or threshold, 2 decimals      | `indexText`        | 0.37            |
 * | ratio of information, 2 decimals           | `ratioText`        | 0.93            |
 * | prediction variance (σ²), 3 significant    | `varianceText`     | 0.767           |
 * | an effect in noise units, 0.1 σ            | `noiseUnitsText`   | 1.8σ            |
 * | anything else, `digits` significant        | `significantText`  | 0.0125          |
 *
 * An absent value (null, undefined, NaN) prints as an en dash, `ABSENT`.
 */
import { roundToPrecision, settingDecimals, settingStep, type SteppedFactor } from '../core/design/levels.js';

export const ABSENT = '–';
const LOCALE = 'en-GB';

type Maybe = number | null | undefined;

function present(value: Maybe): value is number {
  return value !== null && value !== undefined && Number.isFinite(value);
}

/** `value` with exactly `decimals` decimals, grouped; halves up; never `-0`. */
function fixedGrouped(value: number, decimals: number): string {
  const rounded = roundToPrecision(value, Number(`1e-${decimals}`));
  const text = (rounded === 0 ? 0 : rounded).toLocaleString(LOCALE, {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    useGrouping: true,
  });
  return text;
}

/**
 * `value` rounded to `decimals` decimals by the same rule as the texts, for cells that must
 * stay numbers (workbook sheets show it with a number format of the same decimals).
 */
export function rounded(value: number, decimals: number): number {
  const result = roundToPrecision(value, Number(`1e-${decimals}`));
  return result === 0 ? 0 : result;
}

/** `value` with exactly `decimals` decimals, ungrouped; halves up; never `-0`. */
export function fixedText(value: Maybe, decimals: number): string {
  if (!present(value)) return ABSENT;
  const rounded = roundToPrecision(value, Number(`1e-${decimals}`));
  return (rounded === 0 ? 0 : rounded).toFixed(decimals);
}

/** A count, grouped: 1,250. */
export function countText(value: Maybe): string {
  return present(value) ? fixedGrouped(Math.round(value), 0) : ABSENT;
}

/** "1 run", "25 runs"; `plural` when the word does not just take an s. */
export function countOf(count: number, singular: string, plural = `${singular}s`): string {
  return `${countText(count)} ${count === 1 ? singular : plural}`;
}

/** Money in whole units, grouped, after the currency code: "EUR 22,210"; no code → the number. */
export function moneyText(value: Maybe, currency: string | null | undefined): string {
  if (!present(value)) return ABSENT;
  const amount = fixedGrouped(Math.round(value), 0);
  return currency ? `${currency} ${amount}` : amount;
}

/** Bench hours to 0.1 h, without a trailing zero: 81, 25.8. */
export function hoursText(value: Maybe): string {
  if (!present(value)) return ABSENT;
  const rounded = roundToPrecision(value, 0.1);
  return Number.isInteger(rounded) ? fixedGrouped(rounded, 0) : fixedGrouped(rounded, 1);
}

/** A share given in per cent (28.6 → "29 %"). */
export function percentText(percent: Maybe): string {
  return present(percent) ? `${fixedGrouped(percent, 0)} %` : ABSENT;
}

/** A probability as whole per cent (0.714 → "71 %"). */
export function powerText(probability: Maybe): string {
  return present(probability) ? `${fixedGrouped(100 * probability, 0)} %` : ABSENT;
}

/** An efficiency given in per cent, to 0.1 (94.97 → "95.0 %"). */
export function efficiencyText(percent: Maybe): string {
  return present(percent) ? `${fixedGrouped(percent, 1)} %` : ABSENT;
}

/** Decimals of a Sobol' index or tier threshold wherever one is printed. */
export const INDEX_DECIMALS = 2;

/** A Sobol' index or threshold, two decimals (0.365 → "0.37"). */
export function indexText(value: Maybe): string {
  return fixedText(value, INDEX_DECIMALS);
}

/** An information ratio, two decimals. */
export function ratioText(value: Maybe): string {
  return fixedText(value, 2);
}

/** A prediction variance in σ² units, three significant figures. */
export function varianceText(value: Maybe): string {
  return present(value) ? significantText(value, 3) : ABSENT;
}

/** An effect in noise units (σ), to 0.1: "1.8σ". */
export function noiseUnitsText(value: Maybe): string {
  return present(value) ? `${fixedText(value, 1)}σ` : ABSENT;
}

/**
 * A number with `digits` significant digits, in fixed notation for magnitudes a lab reader
 * meets every day (1e-4 ≤ |x| < 1e7) and exponent notation outside that range. Integers print
 * without decimals. Used for values with no quantity rule of their own (terminal tables).
 */
export function significantText(value: number, digits = 3): string {
  if (Number.isNaN(value)) return 'NaN';
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '-∞';
  if (value === 0) return '0';
  const significant = Math.min(Math.max(Math.round(digits), 1), 15);
  const magnitude = Math.abs(value);
  if (Number.isInteger(value) && magnitude < 1e15) return String(value);
  if (magnitude < 1e-4 || magnitude >= 1e7) {
    return value.toExponential(significant - 1).replace('e+', 'e');
  }
  // Round first, then count decimals on the rounded magnitude, so 0.99996 becomes 1.00, not 1.000.
  const rounded = Math.abs(Number(value.toPrecision(significant)));
  const decimals = Math.max(0, significant - 1 - Math.floor(Math.log10(rounded)));
  return value.toFixed(Math.min(decimals, 20));
}

/**
 * A setting as every output prints it: on the factor's settable step (core `settingStep`),
 * with the decimals that step implies (0.1 → 1, 0.25 → 2, 100 → 0), ungrouped so it reads as
 * the equipment's display does (20000, not 20,000).
 */
export function settingText(value: number, factor: SteppedFactor): string {
  return settingValue(value, factor).toFixed(settingDecimals(factor));
}

/** The number a setting cell holds: the value on the factor's settable step, never `-0`. */
export function settingValue(value: number, factor: SteppedFactor): number {
  const rounded = roundToPrecision(value, settingStep(factor));
  return rounded === 0 ? 0 : rounded;
}

/** "12.0 kg/h", or the number alone for no unit or `-`. */
export function withUnitText(text: string, unit: string | undefined): string {
  const trimmed = (unit ?? '').trim();
  return trimmed === '' || trimmed === '-' ? text : `${text} ${trimmed}`;
}
