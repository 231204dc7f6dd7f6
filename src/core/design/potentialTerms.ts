/**
 * The potential terms of the model: terms the plan guards against without paying a run for
 * each, by Bayesian D-optimality (DuMouchel & Jones, 1994, "A simple Bayesian modification
 * of D-optimal designs to reduce dependence on an assumed model", Technometrics 36; the
 * prior itself is potentialPrior.ts).
 *
 * `design.potential: auto` (the default) takes:
 * - the cubic trend of every varied critical factor with four or more levels (its primary
 *   terms stop at the quadratic, modelFromTiers.ts);
 * - each interaction of two varied factors that is not primary and either has a second-order
 *   index in the band [INTERACTION_BAND·threshold, threshold) for some response, or involves
 *   a borderline factor (one whose index interval straddles a tier threshold) and has a
 *   second-order index above zero. Without a second-order table, the band applies to the
 *   interaction shares (aggregated total − first order) of both factors, as the primary rule
 *   does. The band (half the threshold) is our choice: close enough to the threshold that the
 *   analysis cannot rule the interaction out, far enough to keep the list short.
 * A term list names the potential terms explicitly (study syntax, key `design.potential[i]`);
 * `[]` means none.
 */
import { InputError } from '../inputError.js';
import type { TierPolicy } from '../study.js';
import type { ModelTerm } from '../model/modelTerm.js';
import { termLabel } from '../model/modelTerm.js';
import type { TierResult } from '../sensitivity/tierTypes.js';
import type { InteractionRow } from '../study.js';
import type { FactorLevels } from './designTypes.js';
import { parseTerm } from '../model/termSyntax.js';

/** Lower edge of the interaction band, as a fraction of `policy.interaction`. */
export const INTERACTION_BAND = 0.5;
const TOLERANCE = 1e-12;

export interface PotentialTermsInput {
  levels: readonly FactorLevels[];
  tiers: TierResult;
  policy: Pick<TierPolicy, 'interaction'>;
  interactions: readonly InteractionRow[];
  /** The primary terms (study syntax labels are derived from them). */
  primary: readonly ModelTerm[];
  spec: 'auto' | string[];
}

export function potentialTerms(input: PotentialTermsInput): { terms: ModelTerm[]; notes: string[] } {
  const order = input.levels.map((level) => level.id);
  const primaryLabels = new Set(input.primary.map((term) => termLabel(term, order)));
  return input.spec === 'auto' ? automatic(input, primaryLabels) : listed(input.spec, input.levels, primaryLabels);
}

function automatic(input: PotentialTermsInput, primaryLabels: Set<string>): { terms: ModelTerm[]; notes: string[] } {
  const varied = input.levels.filter((level) => level.varied);
  const order = input.levels.map((level) => level.id);
  const terms: ModelTerm[] = [];
  const add = (term: ModelTerm) => {
    const label = termLabel(term, order);
    if (primaryLabels.has(label) || terms.some((t) => termLabel(t, order) === label)) return;
    terms.push(term);
  };
  for (const level of varied) {
    if (level.tier === 'critical' && level.values.length >= 4) {
      add({
        powers: { [level.id]: 3 },
        reason: `cubic trend of ${level.id}: critical factor at ${level.values.length} levels, guarded against as a potential term`,
      });
    }
  }

  const tierOf = new Map(input.tiers.factors.map((factor) => [factor.id, factor]));
  const threshold = input.policy.interaction;
  const low = INTERACTION_BAND * threshold;
  const largest = new Map<string, number>();
  for (const row of input.interactions) {
    const key = [row.factorA, row.factorB].sort().join('\u0000');
    largest.set(key, Math.max(largest.get(key) ?? 0, row.index));
  }
  const tableGiven = input.interactions.length > 0;
  for (let a = 0; a < varied.length; a++) {
    for (let b = a + 1; b < varied.length; b++) {
      const [ida, idb] = [varied[a].id, varied[b].id];
      const borderline = [ida, idb].filter((id) => tierOf.get(id)?.borderline);
      let why: string | null = null;
      if (tableGiven) {
        const index = largest.get([ida, idb].sort().join('\u0000')) ?? 0;
        if (index >= low - TOLERANCE && index < threshold - TOLERANCE) {
          why = `second-order index ${fmt(index)} lies just below the interaction threshold ${fmt(threshold)} (band from ${fmt(low)})`;
        } else if (borderline.length > 0 && index > 0) {
          why = `${borderline.join(' and ')} ${borderline.length === 1 ? 'is' : 'are'} borderline (second-order index ${fmt(index)})`;
        }
      } else {
        const shares = [tierOf.get(ida)?.interactionShare ?? 0, tierOf.get(idb)?.interactionShare ?? 0];
        if (shares.every((share) => share >= low - TOLERANCE)) {
          why = `no second-order table; both interaction shares reach ${fmt(low)} (${ida} ${fmt(shares[0])}, ${idb} ${fmt(shares[1])})`;
        } else if (borderline.length > 0) {
          why = `no second-order table; ${borderline.join(' and ')} ${borderline.length === 1 ? 'is' : 'are'} borderline`;
        }
      }
      if (why) add({ powers: { [ida]: 1, [idb]: 1 }, reason: `interaction ${ida}×${idb}: ${why}; guarded against as a potential term` });
    }
  }
  return { terms, notes: [] };
}

function listed(list: string[], levels: readonly FactorLevels[], primaryLabels: Set<string>): { terms: ModelTerm[]; notes: string[] } {
  const ids = levels.map((level) => level.id);
  const byId = new Map(levels.map((level) => [level.id, level]));
  const seen = new Map<string, number>();
  const terms: ModelTerm[] = [];
  list.forEach((text, i) => {
    const key = `design.potential[${i}]`;
    const powers = parseTerm(text, ids, key);
    const label = termLabel({ powers }, ids);
    if (Object.keys(powers).length === 0) throw new InputError('the intercept cannot be a potential term', { key });
    for (const [id, power] of Object.entries(powers)) {
      const level = byId.get(id)!;
      if (!level.varied) throw new InputError(`potential term "${label}" uses ${id}, which is fixed at ${level.fixedAt} in this plan`, { key });
      if (power >= level.values.length) {
        throw new InputError(`potential term "${label}" needs at least ${power + 1} levels of ${id}, which has ${level.values.length}`, { key });
      }
    }
    if (primaryLabels.has(label)) throw new InputError(`"${label}" is already a primary model term; a term is primary or potential, not both`, { key });
    const earlier = seen.get(label);
    if (earlier !== undefined) throw new InputError(`potential term "${label}" is listed twice (also design.potential[${earlier}])`, { key });
    seen.set(label, i);
    terms.push({ powers, reason: `potential term listed in the study file (design.potential[${i}])` });
  });
  return { terms, notes: [] };
}

function fmt(x: number): string {
  return (Math.round(x * 1000) / 1000).toString();
}
