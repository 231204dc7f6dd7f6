/**
 * The polynomial model the lab plan must be able to fit, derived from the tiers (or taken
 * from a preset or an explicit term list), each term with the reason it is there.
 *
 * Method: a factor's total Sobol' index bounds how much of the output variance it can
 * explain, alone or with others; its first-order index is the part it explains alone, and a
 * second-order index is the part a pair explains together beyond their main effects
 * (Sobol', 2001, "Global sensitivity indices for nonlinear mathematical models and their
 * Monte Carlo estimates"; Saltelli et al., 2008, *Global Sensitivity Analysis: The Primer*,
 * ch. 4). So:
 * - every varied factor gets a main effect;
 * - powers up to (levels − 1), capped at quadratic for critical and moderate factors (a
 *   factor varied only on request, though negligible, keeps its main effect); a critical
 *   factor's cubic trend is a potential term instead (potentialTerms.ts), because as a
 *   primary term its raw cubic column overlaps the linear one so much (VIF above 20 on
 *   4 levels) that the main effect itself is seen with little power;
 * - a two-factor interaction for each pair of varied factors whose second-order index reaches
 *   the interaction threshold for some response, when a second-order table was given; without
 *   one, for each pair whose interaction shares (aggregated total − first order) both reach it.
 *   The share rule is a screen, not a measurement: a large share says a factor interacts with
 *   something, not with whom (common practice).
 *
 * Whether a second-order table was given cannot be read from `TierResult` alone (an empty
 * `interactionPairs` also arises when a table exists but no pair reaches the threshold), so
 * callers pass `{ interactionTable: study.interactions.length > 0 }`; without it, a
 * non-empty `interactionPairs` is taken as proof of a table and an empty one as its absence.
 *
 * Term order (a contract with the plan document): intercept, main effects, pure powers,
 * interactions; within each group, factor order of `levels`, then power.
 */
import { InputError } from '../inputError.js';
import type { ModelPreset, TierPolicy } from '../study.js';
import type { ModelTerm } from '../model/modelTerm.js';
import { termLabel } from '../model/modelTerm.js';
import type { FactorTier, TierResult } from '../sensitivity/tierTypes.js';
import type { FactorLevels } from './designTypes.js';
import { roundToPrecision } from './levels.js';
import { parseTerm } from '../model/termSyntax.js';

export interface DerivedModel {
  terms: ModelTerm[];
  source: 'tiers' | 'linear' | 'interactions' | 'quadratic' | 'explicit';
  notes: string[];
}

export interface DeriveModelOptions {
  /** True when the study gave a second-order index table (even if no pair reaches the threshold). */
  interactionTable?: boolean;
}

/** Index values are sums of decimals from a table: a value equal to a threshold must reach it. */
const TOLERANCE = 1e-12;

/** Highest power a tier earns by default (before the level count caps it). */
const POWER_CAP: Record<FactorTier['tier'], number> = { critical: 2, moderate: 2, negligible: 1 };

export function deriveModel(
  levels: FactorLevels[],
  tiers: TierResult,
  policy: TierPolicy,
  spec?: ModelPreset | string[],
  options: DeriveModelOptions = {},
): DerivedModel {
  const varied = levels.filter((l) => l.varied);
  const order = levels.map((l) => l.id);
  const notes: string[] = [];
  if (varied.length === 0) notes.push('no factor is varied: the model is the intercept alone');

  const intercept: ModelTerm = { powers: {}, reason: 'intercept: the mean response at the centre of the region (coded 0)' };
  let body: ModelTerm[];
  let source: DerivedModel['source'];
  if (spec === undefined) {
    body = fromTiers(varied, levels, tiers, policy, options, notes);
    source = 'tiers';
  } else if (Array.isArray(spec)) {
    body = fromList(spec, levels, notes);
    source = 'explicit';
  } else {
    body = fromPreset(spec, varied, notes);
    source = spec;
  }
  return { terms: [intercept, ...sortTerms(body, order)], source, notes };
}

function mainEffect(level: FactorLevels, reason: string): ModelTerm {
  return { powers: { [level.id]: 1 }, reason };
}

function fromTiers(
  varied: FactorLevels[],
  levels: FactorLevels[],
  tiers: TierResult,
  policy: TierPolicy,
  options: DeriveModelOptions,
  notes: string[],
): ModelTerm[] {
  const terms: ModelTerm[] = [];
  const tierOf = new Map(tiers.factors.map((t) => [t.id, t]));
  for (const level of varied) {
    const count = level.values.length;
    const what = level.tier === 'negligible' ? 'negligible factor varied on request' : `${level.tier} factor`;
    terms.push(mainEffect(level, `main effect of ${level.id}: ${what} at ${count} levels`));
    const top = Math.min(count - 1, POWER_CAP[level.tier]);
    for (let power = 2; power <= top; power++) {
      const shape = power === 2 ? 'curvature' : power === 3 ? 'cubic trend' : `degree-${power} trend`;
      terms.push({
        powers: { [level.id]: power },
        reason: `${shape} of ${level.id}: ${level.tier} factor at ${count} levels (powers up to ${capWord(level.tier)})`,
      });
    }
  }

  const variedIds = new Set(varied.map((l) => l.id));
  const levelOf = new Map(levels.map((l) => [l.id, l]));
  const tableGiven = options.interactionTable ?? tiers.interactionPairs.length > 0;
  if (tableGiven) {
    const pairsSeen = new Set<string>();
    for (const pair of tiers.interactionPairs) {
      if (pair.index < policy.interaction - TOLERANCE) continue;
      const missing = [pair.factorA, pair.factorB].filter((id) => !variedIds.has(id));
      if (missing.length > 0) {
        const why = missing.map((id) => {
          const level = levelOf.get(id);
          return level ? `${id} is fixed at ${level.fixedAt}` : `${id} is a model parameter, not a setting`;
        });
        notes.push(
          `pair ${pair.factorA}×${pair.factorB} reaches the interaction threshold (second-order index ${fmt(pair.index)}) ` +
            `but ${why.join(' and ')}, so the plan has no term for it`,
        );
        continue;
      }
      const pairLabel = [pair.factorA, pair.factorB].sort().join('*');
      if (pairsSeen.has(pairLabel) || pair.factorA === pair.factorB) continue;
      pairsSeen.add(pairLabel);
      const responses = pair.responses.length > 0 ? ` for ${pair.responses.join(', ')}` : '';
      terms.push({
        powers: { [pair.factorA]: 1, [pair.factorB]: 1 },
        reason:
          `interaction ${pair.factorA}×${pair.factorB}: second-order index ${fmt(pair.index)} ≥ ${fmt(policy.interaction)}` +
          responses,
      });
    }
  } else {
    notes.push(
      'no second-order index table: interaction terms were chosen where both factors\' interaction shares ' +
        `(aggregated total − first order) reach ${fmt(policy.interaction)}`,
    );
    for (let a = 0; a < varied.length; a++) {
      for (let b = a + 1; b < varied.length; b++) {
        const ta = tierOf.get(varied[a].id);
        const tb = tierOf.get(varied[b].id);
        if (!ta || !tb) continue;
        if (ta.interactionShare >= policy.interaction - TOLERANCE && tb.interactionShare >= policy.interaction - TOLERANCE) {
          terms.push({
            powers: { [ta.id]: 1, [tb.id]: 1 },
            reason:
              `interaction ${ta.id}×${tb.id}: no second-order table; both interaction shares reach ${fmt(policy.interaction)} ` +
              `(${ta.id} ${fmt(ta.interactionShare)}, ${tb.id} ${fmt(tb.interactionShare)})`,
          });
        }
      }
    }
  }
  return terms;
}

function capWord(tier: FactorTier['tier']): string {
  return tier === 'negligible' ? 'linear' : 'quadratic';
}

function fromPreset(preset: ModelPreset, varied: FactorLevels[], notes: string[]): ModelTerm[] {
  const why = `model preset "${preset}"`;
  const terms: ModelTerm[] = varied.map((l) => mainEffect(l, `main effect of ${l.id}: ${why}`));
  if (preset === 'interactions' || preset === 'quadratic') {
    for (let a = 0; a < varied.length; a++) {
      for (let b = a + 1; b < varied.length; b++) {
        terms.push({
          powers: { [varied[a].id]: 1, [varied[b].id]: 1 },
          reason: `interaction ${varied[a].id}×${varied[b].id}: ${why}`,
        });
      }
    }
  }
  if (preset === 'quadratic') {
    for (const l of varied) {
      if (l.values.length < 3) {
        notes.push(`${l.id} has only ${l.values.length} levels, so its square cannot be estimated and was left out`);
        continue;
      }
      terms.push({ powers: { [l.id]: 2 }, reason: `curvature of ${l.id}: ${why}` });
    }
  }
  return terms;
}

function fromList(list: string[], levels: FactorLevels[], notes: string[]): ModelTerm[] {
  if (list.length === 0) {
    throw new InputError('the model term list is empty; list terms or leave design.model out to derive them from the tiers', {
      key: 'design.model',
    });
  }
  const ids = levels.map((l) => l.id);
  const byId = new Map(levels.map((l) => [l.id, l]));
  const seen = new Map<string, number>();
  const terms: ModelTerm[] = [];
  list.forEach((text, i) => {
    const key = `design.model[${i}]`;
    const powers = parseTerm(text, ids, key);
    const label = termLabel({ powers }, ids);
    if (Object.keys(powers).length === 0) {
      notes.push(`design.model[${i}]: the intercept is always in the model; "1" need not be listed`);
      return;
    }
    for (const [id, power] of Object.entries(powers)) {
      const level = byId.get(id)!;
      if (!level.varied) {
        throw new InputError(
          `model term "${label}" uses ${id}, which is fixed at ${level.fixedAt} in this plan; ` +
            `give ${id} levels in the study file to vary it, or drop the term`,
          { key },
        );
      }
      if (power >= level.values.length) {
        throw new InputError(
          `model term "${label}" needs at least ${power + 1} levels of ${id}, which has ${level.values.length}`,
          { key },
        );
      }
    }
    const earlier = seen.get(label);
    if (earlier !== undefined) {
      throw new InputError(`model term "${label}" is listed twice (also design.model[${earlier}])`, { key });
    }
    seen.set(label, i);
    terms.push({ powers, reason: `listed in the study file (design.model[${i}])` });
  });

  // A term without its lower-order parents makes the fit depend on where zero is in coded units.
  const labels = new Set(seen.keys());
  for (const term of terms) {
    for (const parent of parentsOf(term.powers)) {
      const parentLabel = termLabel({ powers: parent }, ids);
      if (!labels.has(parentLabel)) {
        notes.push(`the model is not hierarchical: ${termLabel(term, ids)} is listed without ${parentLabel}`);
        break;
      }
    }
  }
  return terms;
}

/** Terms obtained by lowering one power by one (the immediate parents in the hierarchy). */
function parentsOf(powers: Record<string, number>): Record<string, number>[] {
  const parents: Record<string, number>[] = [];
  for (const id of Object.keys(powers)) {
    const parent = { ...powers };
    if (parent[id] === 1) delete parent[id];
    else parent[id] -= 1;
    if (Object.keys(parent).length > 0) parents.push(parent);
  }
  return parents;
}

function sortTerms(terms: ModelTerm[], order: readonly string[]): ModelTerm[] {
  const rank = (id: string) => {
    const at = order.indexOf(id);
    return at < 0 ? order.length : at;
  };
  const key = (term: ModelTerm) => {
    const ids = Object.keys(term.powers).sort((a, b) => rank(a) - rank(b));
    const group = ids.length >= 2 ? 2 : term.powers[ids[0]] === 1 ? 0 : 1;
    const seq: number[] = [group];
    for (const id of ids) seq.push(rank(id), term.powers[id]);
    return seq;
  };
  return terms
    .map((term, at) => ({ term, at, k: key(term) }))
    .sort((x, y) => {
      const n = Math.min(x.k.length, y.k.length);
      for (let i = 0; i < n; i++) if (x.k[i] !== y.k[i]) return x.k[i] - y.k[i];
      return x.k.length - y.k.length || x.at - y.at;
    })
    .map((entry) => entry.term);
}

/** Two decimals, halves up after cleaning binary noise (0.365 prints 0.37, not 0.36). */
function fmt(x: number): string {
  return roundToPrecision(x, 0.01).toFixed(2);
}
