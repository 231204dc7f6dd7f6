/**
 * The precision block as the outputs show it — the terminal summary, the workbook and the
 * report all take their rows and sentences from here, so the wording has one home.
 *
 * What is shown, in this order: the verdict sentence (from the plan), the weakest effect, one
 * row per (factor, response) pair with its predicted effect in response units and in noise
 * units and its power, one row per interaction, the fixed factors' largest unexplained
 * effects, the run curve, and the assumptions. Powers are printed in per cent to one decimal,
 * so a power just below the target never reads as the target.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { FactorPrecision, InteractionPrecision } from '../core/precision/precisionTypes.js';
import { significantText as formatNumber } from './numberText.js';

export interface PrecisionRow {
  /** Factor name (factor id in brackets), or the two factors of an interaction. */
  what: string;
  response: string;
  unit: string;
  /** Coded coefficient β in response units. */
  effect: string;
  effectInNoise: string;
  power: string;
  /** The power reaches the target. */
  meets: boolean;
  /** The model terms tested jointly. */
  tested: string;
}

export interface PrecisionView {
  headline: string;
  weakest: string | null;
  target: string;
  factors: PrecisionRow[];
  interactions: PrecisionRow[];
  fixed: { factor: string; response: string; largestEffectInNoise: string }[];
  runCurve: string | null;
  notes: string[];
}

export function powerText(power: number | null): string {
  return power === null ? 'cannot be tested' : `${(Math.floor(power * 1000) / 10).toFixed(1)} %`;
}

export function precisionView(plan: Pick<PlanDocument, 'precision' | 'study' | 'levels'>): PrecisionView {
  const precision = plan.precision;
  const responseOf = new Map(plan.study.responses.map((response) => [response.id, response]));
  const nameOf = new Map(plan.study.factors.map((factor) => [factor.id, factor.name]));
  const target = `power ≥ ${Math.round(precision.power * 100)} % at α = ${precision.alpha}`;
  const row = (what: string, entry: FactorPrecision | InteractionPrecision, tested: string): PrecisionRow => {
    const response = responseOf.get(entry.response);
    return {
      what,
      response: response?.name ?? entry.response,
      unit: response?.unit ?? '',
      effect: formatNumber(entry.effect, 3),
      effectInNoise: formatNumber(entry.effectInNoise, 3),
      power: powerText(entry.power),
      meets: entry.power !== null && entry.power >= precision.power - 1e-12,
      tested,
    };
  };
  const factors = precision.factors.map((entry) => row(`${nameOf.get(entry.factor) ?? entry.factor} (${entry.factor})`, entry, (entry.terms ?? []).join(', ')));
  const interactions = precision.interactions.map((entry) => row(`${entry.factors[0]} × ${entry.factors[1]}`, entry, entry.factors.join('*')));
  const weakest = precision.weakest ? describeEntry(precision.weakest, responseOf) : null;
  const runCurve =
    precision.runCurve.length > 1
      ? precision.runCurve.map((point) => `${point.runs} runs ${point.weakestPower === null ? '–' : powerText(point.weakestPower)}`).join(', ')
      : null;
  return {
    headline: precision.statement ?? '',
    weakest,
    target,
    factors,
    interactions,
    fixed: precision.fixed.map((entry) => ({
      factor: `${nameOf.get(entry.factor) ?? entry.factor} (${entry.factor})`,
      response: responseOf.get(entry.response)?.name ?? entry.response,
      largestEffectInNoise: formatNumber(entry.largestEffectInNoise, 2),
    })),
    runCurve,
    notes: precision.notes ?? [],
  };
}

function describeEntry(entry: FactorPrecision | InteractionPrecision, responseOf: Map<string, { name: string; unit: string }>): string {
  const response = responseOf.get(entry.response);
  const what = 'factor' in entry ? entry.factor : `${entry.factors[0]} × ${entry.factors[1]}`;
  const unit = response?.unit && response.unit !== '-' ? ` ${response.unit}` : '';
  return (
    `${what} on ${response?.name ?? entry.response}: predicted effect ${formatNumber(entry.effect, 3)}${unit} ` +
    `(${formatNumber(entry.effectInNoise, 3)} × noise), power ${powerText(entry.power)}`
  );
}
