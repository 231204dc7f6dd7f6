/**
 * Levels per factor: how many settings each operating factor gets in the lab plan, which
 * settings, and why.
 *
 * Method: the tier of a factor (critical / moderate / negligible, from its aggregated total
 * Sobol' index) sets its level count — critical 4, moderate 3, negligible fixed at nominal
 * by default. A polynomial in one variable of degree d needs at least d + 1 distinct levels
 * to be estimable (Montgomery, 2017, *Design and Analysis of Experiments*, 9th ed., ch. 6–11:
 * two levels fit a line, three a quadratic), so 4 levels allow a cubic trend and 3 a
 * quadratic. Fixing the factors whose total index is small is the factor-fixing use of
 * total indices (Saltelli et al., 2008, *Global Sensitivity Analysis: The Primer*, ch. 4).
 *
 * Conventions fixed here:
 * - coded units: low → −1, high → +1, linear in between (`toCoded` / `toEngineering` in
 *   ../region/codedUnits.ts);
 * - levels are equally spaced over [low, high] in engineering units, rounded to the factor's
 *   precision (exact halves towards the middle of the range, see `settableValue`), and coded from the ROUNDED values (so a coded level may sit slightly off the
 *   equally spaced coded value — the coded value is what the lab will actually set);
 * - every setting sits on the factor's settable step (`settingStep`): its `precision` when the
 *   study gives one, otherwise an implied step of IMPLIED_SIGNIFICANT_FIGURES (3) significant
 *   figures of the range's largest magnitude, made ten times finer while it leaves fewer than
 *   IMPLIED_MIN_STEPS (20) steps across [low, high] or while a value the study itself gives as a
 *   setting (the nominal, explicit levels) is not a multiple of it. 30–45 g/min gives 0.1
 *   (33.3, not 33.3333); 15 000–25 000 rpm gives 100; 1000–1010 gives 0.1. The plan warns once
 *   per factor that has no precision (`impliedStepNotes`). Every output prints the settings
 *   plan.json holds, with the decimals of this step, so no two of them can disagree;
 * - explicit levels from the study must already be settable (multiples of the step) and
 *   lie in [low, high];
 * - a level outside the equipment limits is refused.
 */
import { InputError } from '../inputError.js';
import type { DesignSettings, Factor } from '../study.js';
import type { FactorTier, TierResult } from '../sensitivity/tierTypes.js';
import type { FactorLevels } from './designTypes.js';
import { toCoded, toEngineering } from '../region/codedUnits.js';

/**
 * Rounds to the nearest multiple of `precision` (halves go up) and removes binary noise, so
 * 0.1-steps print as 12.3, not 12.299999999999999. Without a precision the value is only
 * cleaned to 12 significant digits.
 */
export function roundToPrecision(value: number, precision?: number): number {
  if (!Number.isFinite(value)) return value;
  if (precision === undefined || !(precision > 0)) return cleanNoise(value);
  // value / precision itself carries noise (12.35 / 0.1 = 123.49999999999999): clean it first.
  const steps = Math.round(cleanNoise(value / precision));
  const decimals = decimalsOf(precision);
  const rounded = steps * precision;
  return decimals <= 15 ? Number(rounded.toFixed(decimals)) : cleanNoise(rounded);
}

function cleanNoise(value: number): number {
  if (value === 0) return 0;
  return Number(value.toPrecision(12));
}

/** Decimal places needed to write the precision exactly (0.1 → 1, 0.25 → 2, 100 → 0, 1e-7 → 7). */
function decimalsOf(precision: number): number {
  const text = String(precision);
  const exp = /e-(\d+)$/.exec(text);
  if (exp) {
    const mantissa = text.slice(0, text.indexOf('e'));
    const dot = mantissa.indexOf('.');
    return Number(exp[1]) + (dot < 0 ? 0 : mantissa.length - dot - 1);
  }
  const dot = text.indexOf('.');
  return dot < 0 ? 0 : text.length - dot - 1;
}

/** Significant figures of the range's largest magnitude a setting keeps when no `precision` is given. */
export const IMPLIED_SIGNIFICANT_FIGURES = 3;
/** Fewest settable steps across [low, high] an implied step must leave. */
export const IMPLIED_MIN_STEPS = 20;
/** An implied step is never finer than this fraction of the range's largest magnitude. */
const FINEST_IMPLIED = 1e-12;

/** What `settingStep` needs: the range, and the values the study gives as settings. */
export type SteppedFactor = Pick<Factor, 'low' | 'high' | 'precision'> & Partial<Pick<Factor, 'nominal' | 'levels'>>;

/**
 * The settable step of a factor: its `precision`, or the implied step described in the module
 * header when the study gives none. A power of ten written exactly (`1e-1`, not 0.1000…01).
 */
export function settingStep(factor: SteppedFactor): number {
  if (factor.precision !== undefined && factor.precision > 0) return factor.precision;
  const magnitude = Math.max(Math.abs(factor.low), Math.abs(factor.high));
  if (!(magnitude > 0) || !Number.isFinite(magnitude)) return 1;
  let exponent = Math.floor(Math.log10(magnitude)) - (IMPLIED_SIGNIFICANT_FIGURES - 1);
  const finest = Math.floor(Math.log10(magnitude * FINEST_IMPLIED));
  const given = [...(factor.nominal !== undefined ? [factor.nominal] : []), ...(Array.isArray(factor.levels) ? factor.levels : [])];
  const step = () => Number(`1e${exponent}`);
  const onStep = (value: number) => Math.abs(roundToPrecision(value, step()) - value) <= 1e-9 * Math.max(1, Math.abs(value));
  while (exponent > finest && ((factor.high - factor.low) / step() < IMPLIED_MIN_STEPS - 1e-9 || !given.every(onStep))) exponent -= 1;
  return step();
}

/** Decimals a setting of this factor is printed with: those of its settable step (0.5 → 1, 100 → 0). */
export function settingDecimals(factor: SteppedFactor): number {
  return decimalsOf(settingStep(factor));
}

/**
 * One warning per operating factor whose settings are rounded to an implied step because the
 * study gives no `precision`; `factors` is the study's full list (its indices name the keys).
 */
export function impliedStepNotes(factors: Factor[]): string[] {
  return factors.flatMap((factor, index) => {
    if (factor.role !== 'operating' || (factor.precision !== undefined && factor.precision > 0)) return [];
    const step = settingStep(factor);
    const unit = factor.unit && factor.unit !== '-' ? ` ${factor.unit}` : '';
    return [
      `factors[${index}] (${factor.id}) has no precision: its settings are rounded to steps of ${step}${unit} ` +
        `(${IMPLIED_SIGNIFICANT_FIGURES} significant figures); give precision the step the equipment can be set to`,
    ];
  });
}

/**
 * The settable value nearest to an engineering setting: a multiple of the settable step, with
 * exact halves rounded towards the middle of [low, high] so that settings mirrored about the
 * middle stay mirrored (30–45 in 0.5 steps: 33.75 → 34 and 41.25 → 41).
 */
export function settableValue(factor: SteppedFactor, value: number): number {
  const mid = (factor.low + factor.high) / 2;
  const step = settingStep(factor);
  return value > mid ? -roundToPrecision(-value, step) : roundToPrecision(value, step);
}

/**
 * A coded value rounded to the nearest settable engineering value (`settableValue`) and coded
 * back. Used for centre and holdout points that fall between levels.
 */
export function settableCoded(factor: SteppedFactor, coded: number): number {
  return roundToPrecision(toCoded(factor, settableValue(factor, toEngineering(factor, coded))));
}

/**
 * Levels of every operating factor, in study order. Model-role factors are not settings and
 * get no entry. `factors` is the study's full factor list (indices in error keys refer to it).
 */
export function planLevels(factors: Factor[], tiers: TierResult, defaults: DesignSettings['levels']): FactorLevels[] {
  const result: FactorLevels[] = [];
  factors.forEach((factor, index) => {
    if (factor.role !== 'operating') return;
    const tier = tiers.factors.find((t) => t.id === factor.id);
    if (!tier) {
      throw new InputError(`factor ${factor.id} has no sensitivity indices, so it cannot be tiered`, {
        key: `factors[${index}]`,
      });
    }
    result.push(levelsOf(factor, index, tier, tiers, defaults));
  });
  return result;
}

function levelsOf(
  factor: Factor,
  index: number,
  tier: FactorTier,
  tiers: TierResult,
  defaults: DesignSettings['levels'],
): FactorLevels {
  const why = tierReason(tier, tiers);
  const base = { id: factor.id, name: factor.name, unit: factor.unit, tier: tier.tier };
  const override = factor.levels;

  if (tier.tier === 'negligible' && override === undefined) {
    const fixedAt = roundToPrecision(factor.nominal, settingStep(factor));
    checkLimits(factor, index, [fixedAt], 'nominal');
    return {
      ...base,
      varied: false,
      values: [],
      coded: [],
      fixedAt,
      reason: `${why}: fixed at its nominal ${formatValue(fixedAt, factor.unit)}`,
    };
  }

  if (!(factor.high > factor.low)) {
    throw new InputError(`a varied factor needs high above low (got ${factor.low}–${factor.high})`, {
      key: `factors[${index}].high`,
    });
  }
  let values: number[];
  let how: string;
  if (Array.isArray(override)) {
    values = explicitLevels(factor, index, override);
    how = `${values.length} levels listed in the study file`;
  } else {
    const count = override ?? (tier.tier === 'critical' ? defaults.critical : defaults.moderate);
    const key = override === undefined ? `design.levels.${tier.tier}` : `factors[${index}].levels`;
    if (!Number.isInteger(count) || count < 2) {
      throw new InputError(`a varied factor needs a whole number of at least 2 levels (got ${count})`, { key });
    }
    values = spacedLevels(factor, index, count);
    how = override === undefined ? `${count} levels` : `${count} levels set in the study file`;
  }
  checkLimits(factor, index, values, 'level');

  const onRequest = tier.tier === 'negligible' ? ', varied on request' : '';
  return {
    ...base,
    varied: true,
    values,
    coded: values.map((v) => roundToPrecision(toCoded(factor, v))),
    fixedAt: null,
    reason: `${why}${onRequest}: ${how} ${trendPhrase(values.length)}`,
  };
}

/** "critical (aggregated total 0.37 ≥ 0.30)" — the comparison the tier rule made. */
function tierReason(tier: FactorTier, tiers: TierResult): string {
  const { critical, moderate, confidence } = tiers.policy;
  const what = confidence === 'upper' ? 'upper bound of aggregated total' : 'aggregated total';
  const v = fmt(tier.decidedOn);
  let text: string;
  if (tier.tier === 'critical') text = `critical (${what} ${v} ≥ ${fmt(critical)})`;
  else if (tier.tier === 'moderate') text = `moderate (${what} ${v}, between ${fmt(moderate)} and ${fmt(critical)})`;
  else text = `negligible (${what} ${v} < ${fmt(moderate)})`;
  if (tier.borderline) {
    text += ', borderline: its interval straddles a threshold';
    if (tier.tier === 'negligible') text += ' (give it levels in the study file to vary it anyway)';
  }
  return text;
}

function trendPhrase(count: number): string {
  if (count === 2) return 'so a straight-line trend can be fitted';
  if (count === 3) return 'so curvature (a quadratic) can be fitted';
  if (count === 4) return 'so a cubic trend can be fitted';
  return `so a trend up to degree ${count - 1} can be fitted`;
}

/** Two decimals, halves up after cleaning binary noise (0.365 prints 0.37, not 0.36). */
function fmt(x: number): string {
  return roundToPrecision(x, 0.01).toFixed(2);
}

function formatValue(value: number, unit: string): string {
  return unit && unit !== '-' ? `${value} ${unit}` : String(value);
}

/** Number of settable values (multiples of the settable step) inside [low, high]. */
function settableCount(factor: Factor): number {
  const p = settingStep(factor);
  const first = Math.ceil(roundNoise(factor.low / p));
  const last = Math.floor(roundNoise(factor.high / p));
  return Math.max(0, last - first + 1);
}

function roundNoise(x: number): number {
  return Number(x.toPrecision(12));
}

function spacedLevels(factor: Factor, index: number, count: number): number[] {
  const available = settableCount(factor);
  if (available < count) {
    throw new InputError(
      `precision ${settingStep(factor)} leaves only ${available} distinct settings between ${factor.low} and ${factor.high}, ` +
        `fewer than the ${count} levels planned; use a finer precision or fewer levels`,
      { key: `factors[${index}].precision` },
    );
  }
  const p = settingStep(factor);
  const values: number[] = [];
  for (let i = 0; i < count; i++) {
    const exact = factor.low + (i * (factor.high - factor.low)) / (count - 1);
    let v = settableValue(factor, exact);
    // Keep ends inside the studied range when low/high are not multiples of the step.
    if (v < factor.low) v = roundToPrecision(v + p, p);
    if (v > factor.high) v = roundToPrecision(v - p, p);
    values.push(v);
  }
  for (let i = 1; i < values.length; i++) {
    if (values[i] <= values[i - 1]) {
      throw new InputError(
        `rounding to precision ${settingStep(factor)} merges levels ${values[i - 1]} and ${values[i]}; ` +
          'use a finer precision or fewer levels',
        { key: `factors[${index}].precision` },
      );
    }
  }
  return values;
}

function explicitLevels(factor: Factor, index: number, listed: number[]): number[] {
  const key = `factors[${index}].levels`;
  const values = [...listed].sort((a, b) => a - b);
  if (values.length < 2) throw new InputError('a varied factor needs at least 2 levels', { key });
  for (const v of values) {
    if (!Number.isFinite(v)) throw new InputError(`level ${v} is not a number`, { key });
  }
  checkLimits(factor, index, values, 'level');
  for (const v of values) {
    if (v < factor.low || v > factor.high) {
      throw new InputError(
        `level ${v} lies outside the studied range ${factor.low}–${factor.high} ${factor.unit}`.trimEnd(),
        { key },
      );
    }
    const r = roundToPrecision(v, settingStep(factor));
    if (Math.abs(r - v) > 1e-9 * Math.max(1, Math.abs(v))) {
      throw new InputError(`level ${v} is not a multiple of the precision ${settingStep(factor)}`, { key });
    }
  }
  const rounded = values.map((v) => roundToPrecision(v, settingStep(factor)));
  for (let i = 1; i < rounded.length; i++) {
    if (rounded[i] === rounded[i - 1]) {
      throw new InputError(`level ${rounded[i]} is listed twice`, { key });
    }
  }
  return rounded;
}

function checkLimits(factor: Factor, index: number, values: number[], what: 'level' | 'nominal'): void {
  const limits = factor.limits;
  if (!limits) return;
  for (const v of values) {
    if (v < limits.low || v > limits.high) {
      throw new InputError(
        `${what} ${v} ${factor.unit} of ${factor.id} refused: outside the rated range ${limits.low}–${limits.high} ${factor.unit}`,
        { key: what === 'nominal' ? `factors[${index}].nominal` : `factors[${index}].levels` },
      );
    }
  }
}
