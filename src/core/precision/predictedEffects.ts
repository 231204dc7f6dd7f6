/**
 * Effects predicted from the sensitivity analysis: the coded regression coefficient each
 * factor's main effect and each pair's interaction should have in the lab, in the response's
 * units, and the largest effect a fixed factor can leave unexplained.
 *
 * Identities (x uniform on [−1, 1], so Var(x) = 1/3 and Var(x_i x_j) = 1/9):
 * - A first-order index S_i means the main-effect function of factor i has variance
 *   S_i·spread². Carried by a linear trend βx, Var = β²/3, so β = √(3·S_i)·spread.
 * - A second-order index S_ij carried by a bilinear term β_ij·x_i·x_j: Var = β_ij²/9, so
 *   β_ij = 3·√(S_ij)·spread.
 * - A total index T_i bounds all the variance factor i drives, alone or with others: if it
 *   were one linear trend, its coefficient would be √(3·T_i)·spread — the largest effect that
 *   fixing the factor can leave unexplained, on the same footing as the main effects.
 * Sources: for a linear model the indices are the squared standardised coefficients (Saltelli
 * et al., 2008, "Global Sensitivity Analysis: The Primer", ch. 1); for orthonormal polynomial
 * expansions the indices are sums of squared coefficients (Sudret, 2008, "Global sensitivity
 * analysis using polynomial chaos expansions", Reliability Engineering & System Safety 93).
 *
 * Conventions fixed here:
 * - Assumption stated in every output: the analysis sampled each factor uniformly over the
 *   range it analysed. That range is the factor's [low, high] unless the study gives
 *   `analysedRange`; then the coefficient is scaled by (high − low)/(analysed high − low),
 *   which is exact for a linear trend (a coded unit of the plan is that fraction of a coded
 *   unit of the analysis).
 * - Basis per response: `predicted` (needs `spread` and `noise`), else `smallestEffect`
 *   (needs `smallestEffect` and `noise`: β = smallestEffect / 2, since a linear trend or a
 *   bilinear term changes by 2β across the coded range), else the response is not judged.
 * - Required pairs: varied factor × judged response where the first-order index reaches
 *   `policy.moderate` (the effects that made the factor matter). Interactions: pairs of
 *   varied factors × judged responses whose second-order index reaches `policy.interaction`.
 */
import type { Factor, IndexRow, InteractionRow, Response, TierPolicy } from '../study.js';
import type { FactorLevels } from '../design/designTypes.js';

export type EffectBasis = 'predicted' | 'smallestEffect';

export interface PredictedFactorEffect {
  factor: string;
  response: string;
  /** First-order index of the pair (on the smallestEffect basis it only selects the pair). */
  index: number;
  /** Coded coefficient β, response units. */
  effect: number;
  noise: number;
  basis: EffectBasis;
}

export interface PredictedInteractionEffect {
  factors: [string, string];
  response: string;
  /** Second-order index. */
  index: number;
  effect: number;
  noise: number;
  basis: EffectBasis;
}

export interface FixedFactorEffect {
  factor: string;
  response: string;
  /** √(3·T)·spread, response units. */
  largestEffect: number;
  largestEffectInNoise: number;
}

export interface PredictedEffects {
  /** `predicted` when some response is judged on its spread, else `smallestEffect` when some is judged, else `none`. */
  basis: EffectBasis | 'none';
  factors: PredictedFactorEffect[];
  interactions: PredictedInteractionEffect[];
  fixed: FixedFactorEffect[];
  /** Responses that can be judged (they give `noise` and `spread` or `smallestEffect`). */
  judged: string[];
  /** The assumptions and scalings, one sentence each. */
  notes: string[];
}

export interface EffectInputs {
  factors: readonly Factor[];
  responses: readonly Response[];
  indices: readonly IndexRow[];
  interactions: readonly InteractionRow[];
  policy: Pick<TierPolicy, 'moderate' | 'interaction'>;
  levels: readonly FactorLevels[];
}

/** Index values are sums of decimals from a table: a value equal to a threshold must reach it. */
const TOLERANCE = 1e-12;

/** β of a linear trend carrying the variance share S of a response with standard deviation `spread`. */
export function linearCoefficient(firstIndex: number, spread: number): number {
  return Math.sqrt(3 * Math.max(0, firstIndex)) * spread;
}

/** β_ij of a bilinear term carrying the variance share S_ij. */
export function bilinearCoefficient(secondIndex: number, spread: number): number {
  return 3 * Math.sqrt(Math.max(0, secondIndex)) * spread;
}

/** Plan range over analysed range: the factor that converts a coefficient per analysed coded unit to one per plan coded unit. */
export function rangeScale(factor: Pick<Factor, 'low' | 'high' | 'analysedRange'>): number {
  if (!factor.analysedRange) return 1;
  return (factor.high - factor.low) / (factor.analysedRange.high - factor.analysedRange.low);
}

export function predictEffects(input: EffectInputs): PredictedEffects {
  const factorOf = new Map(input.factors.map((factor) => [factor.id, factor]));
  const varied = input.levels.filter((level) => level.varied);
  const fixed = input.levels.filter((level) => !level.varied);
  const notes: string[] = [];

  const judged = input.responses.filter((response) => response.noise !== undefined && (response.spread !== undefined || response.smallestEffect !== undefined));
  const basisOf = (response: Response): EffectBasis => (response.spread !== undefined ? 'predicted' : 'smallestEffect');
  const predictedResponses = judged.filter((response) => basisOf(response) === 'predicted');
  const basis: PredictedEffects['basis'] =
    predictedResponses.length > 0 ? 'predicted' : judged.length > 0 ? 'smallestEffect' : 'none';

  const unjudged = input.responses.filter((response) => !judged.includes(response));
  for (const response of unjudged) {
    notes.push(
      response.noise === undefined
        ? `${response.id} gives no noise (the standard deviation of one lab result), so its precision is not judged`
        : `${response.id} gives neither spread nor smallestEffect, so no effect size is known and its precision is not judged`,
    );
  }
  if (predictedResponses.length > 0) {
    notes.push(
      'effects are predicted from the Sobol\' indices assuming the analysis sampled each factor uniformly over its range and that ' +
        'each main effect is a linear trend (β = √(3·S)·spread) and each interaction a bilinear term (β = 3·√S·spread)',
    );
  }
  for (const response of judged.filter((r) => basisOf(r) === 'smallestEffect')) {
    notes.push(`${response.id} gives no spread: every required effect is taken as its smallestEffect ${response.smallestEffect} ${response.unit} across the range (β = ${response.smallestEffect! / 2})`);
  }
  for (const level of [...varied, ...fixed]) {
    const factor = factorOf.get(level.id);
    if (!factor?.analysedRange || predictedResponses.length === 0) continue;
    const scale = rangeScale(factor);
    notes.push(
      `${factor.id}: the analysis sampled ${factor.analysedRange.low}–${factor.analysedRange.high} ${factor.unit}, the plan spans ` +
        `${factor.low}–${factor.high}; its predicted effects are scaled by ${round(scale)} (exact for a linear trend)`,
    );
  }
  for (const level of varied) {
    const lowest = Math.min(...level.coded);
    const highest = Math.max(...level.coded);
    if (lowest > -1 + 1e-9 || highest < 1 - 1e-9) {
      notes.push(`${level.id}: its levels span coded ${round(lowest)} to ${round(highest)}, not the whole range; the powers include that loss`);
    }
  }

  const first = new Map(input.indices.map((row) => [`${row.factor}\u0000${row.response}`, row]));
  const factors: PredictedFactorEffect[] = [];
  for (const level of varied) {
    const factor = factorOf.get(level.id);
    if (!factor) continue;
    for (const response of judged) {
      const row = first.get(`${level.id}\u0000${response.id}`);
      if (!row || row.first < input.policy.moderate - TOLERANCE) continue;
      const effect =
        basisOf(response) === 'predicted'
          ? linearCoefficient(row.first, response.spread!) * rangeScale(factor)
          : response.smallestEffect! / 2;
      factors.push({ factor: level.id, response: response.id, index: row.first, effect, noise: response.noise!, basis: basisOf(response) });
    }
  }

  const variedIds = varied.map((level) => level.id);
  const interactions: PredictedInteractionEffect[] = [];
  for (const row of input.interactions) {
    const a = variedIds.indexOf(row.factorA);
    const b = variedIds.indexOf(row.factorB);
    if (a < 0 || b < 0 || a === b || row.index < input.policy.interaction - TOLERANCE) continue;
    const response = judged.find((r) => r.id === row.response);
    if (!response) continue;
    const pair: [string, string] = a < b ? [row.factorA, row.factorB] : [row.factorB, row.factorA];
    const scale = rangeScale(factorOf.get(pair[0])!) * rangeScale(factorOf.get(pair[1])!);
    const effect = basisOf(response) === 'predicted' ? bilinearCoefficient(row.index, response.spread!) * scale : response.smallestEffect! / 2;
    interactions.push({ factors: pair, response: response.id, index: row.index, effect, noise: response.noise!, basis: basisOf(response) });
  }
  interactions.sort((x, y) => variedIds.indexOf(x.factors[0]) - variedIds.indexOf(y.factors[0]) || variedIds.indexOf(x.factors[1]) - variedIds.indexOf(y.factors[1]));

  const fixedEffects: FixedFactorEffect[] = [];
  for (const level of fixed) {
    const factor = factorOf.get(level.id);
    if (!factor) continue;
    for (const response of predictedResponses) {
      const row = first.get(`${level.id}\u0000${response.id}`);
      if (!row) continue;
      const largestEffect = linearCoefficient(row.total, response.spread!) * rangeScale(factor);
      fixedEffects.push({ factor: level.id, response: response.id, largestEffect, largestEffectInNoise: largestEffect / response.noise! });
    }
  }
  return { basis, factors, interactions, fixed: fixedEffects, judged: judged.map((r) => r.id), notes };
}

function round(value: number): string {
  return String(Number(value.toPrecision(3)));
}
