/**
 * One plain sentence or two per comparison row, and the decision summary, in words a
 * manager reads without the table. Wording is ours; figures come from the row itself.
 *
 * Conventions fixed here: money is printed to whole units with the study's currency code
 * before it, hours to one decimal, percentages to one decimal; missing terms are grouped by
 * kind (squared, cubic, interaction) so that a long list stays readable; a plan with runs
 * that break the study's constraints or equipment limits says so first, because its figures
 * describe runs that cannot be made as listed; power is reported as how many terms reach
 * `GOOD_POWER`, then the weakest term with its variance inflation factor when that is what
 * makes it weak (VIF ≥ `OVERLAP_VIF`, Montgomery, Peck & Vining 2012 §9.4 treat VIF above 5–10
 * as a sign of serious overlap).
 */
import type { ComparatorRow, Comparison } from './comparisonTypes.js';
import { wordList } from '../wordList.js';
import { counted } from '../countedNoun.js';

/** Power at which a term counts as reliably detected (common practice: 80 %). */
export const GOOD_POWER = 0.8;
/** VIF from which a weak term is said to overlap other terms. */
export const OVERLAP_VIF = 5;

export interface VerdictContext {
  currency: string | null;
  /** Model terms, intercept excluded. */
  termCount: number;
  delta: number;
}

/** The verdict for the proposed plan's own row. */
export function proposedVerdict(row: ComparatorRow, fittingRuns: number, holdoutRuns: number, context: VerdictContext): string {
  if (!row.fitsModel) return `Cannot estimate ${describeTerms(row.missingTerms)}: the plan does not fit its own model.`;
  const holdout = holdoutRuns > 0 ? `, plus ${counted(holdoutRuns, 'holdout run')} to check predictions` : '';
  const power =
    row.minPower === null ? ' No residual degrees of freedom are left to test the terms.' : ` ${powerSentence(row, context.delta)}`;
  return `Estimates ${allTerms(context.termCount)} from ${counted(fittingRuns, 'fitting run')}${holdout}.${power}`;
}

/** The verdict for a comparator row, measured against the proposed row. */
export function comparatorVerdict(row: ComparatorRow, proposed: ComparatorRow, notes: readonly string[], context: VerdictContext): string {
  if (row.runs === null) return `Not built: ${row.reason ?? 'no plan of this kind exists here'}.`;
  const sentences: string[] = [];
  // A plan that fits but cannot be run says so first: its good figures describe runs nobody can make.
  const offLimits = row.offLimitsRuns ? `Cannot be run as listed: ${offLimitsText(row)}.` : null;
  if (offLimits && row.fitsModel) sentences.push(offLimits);
  let fit: string;
  if (row.fitsModel === false) {
    fit = `Cannot estimate ${describeTerms(row.missingTerms)}`;
  } else if (row.averagePredictionVariance !== null && proposed.averagePredictionVariance !== null) {
    const ratio = row.averagePredictionVariance / proposed.averagePredictionVariance;
    fit = `Fits the model; average prediction variance ${ratioText(ratio)} that of the proposed plan`;
  } else {
    fit = 'Fits the model';
  }
  sentences.push(`${fit}; ${runsText(row.runs - (proposed.runs ?? 0))}${costText(row, proposed, context.currency)}.`);
  if (offLimits && !row.fitsModel) sentences.push(offLimits);
  for (const note of notes) sentences.push(`${capitalise(note)}.`);
  return sentences.join(' ');
}

/** The decision in one or two sentences, against the conventional plan (or the first that was built). */
export function comparisonSummary(comparison: Omit<Comparison, 'summary'>): string {
  const proposed = comparison.comparators.find((row) => row.id === 'proposed');
  if (!proposed || proposed.runs === null) return 'The proposed plan could not be evaluated.';
  const reference =
    comparison.comparators.find((row) => row.id === 'conventional' && row.runs !== null) ??
    comparison.comparators.find((row) => row.id !== 'proposed' && row.runs !== null);
  const termCount = comparison.modelTerms.length;
  const still = proposed.fitsModel ? `It still estimates ${allTerms(termCount)}` : `It cannot estimate ${describeTerms(proposed.missingTerms)}`;
  const power = proposed.fitsModel && proposed.minPower !== null ? ` ${powerSentence(proposed, comparison.delta)}${gridPower(comparison, proposed)}` : '';
  if (!reference || reference.runs === null) return `The proposed plan needs ${counted(proposed.runs, 'run')}. ${still}.${power}`;
  const name = reference.id === 'conventional' ? 'the conventional full factorial' : `the ${reference.label.charAt(0).toLowerCase()}${reference.label.slice(1)}`;
  const saved = reference.runs - proposed.runs;
  const savedText =
    saved > 0
      ? `${counted(saved, 'fewer run', 'fewer runs')} (${percent(reference.percentRunsSaved ?? 0)} %)`
      : saved < 0
        ? counted(-saved, 'more run', 'more runs')
        : 'as many runs';
  let money = '';
  if (reference.cost !== null && proposed.cost !== null && comparison.currency) {
    const costSaved = reference.cost - proposed.cost;
    const hoursSaved = (reference.hours ?? 0) - (proposed.hours ?? 0);
    money =
      costSaved >= 0
        ? `, saving ${money_(costSaved, comparison.currency)} and ${hours(hoursSaved)} h of bench time`
        : `, costing ${money_(-costSaved, comparison.currency)} more`;
  }
  const referenceFit =
    reference.fitsModel === false ? `, while ${name} cannot estimate ${describeTerms(reference.missingTerms)}` : '';
  const offLimits = reference.offLimitsRuns ?? 0;
  const referenceRunnable =
    offLimits > 0
      ? ` Besides, ${offLimits} of the ${counted(reference.runs, 'run')} of ${name} ${offLimits === 1 ? 'breaks' : 'break'} the study's constraints or equipment limits.`
      : '';
  return `The proposed plan needs ${counted(proposed.runs, 'run')} where ${name} needs ${reference.runs}: ${savedText}${money}. ${still}${referenceFit}.${referenceRunnable}${power}`;
}

/** "all 13 model terms", or "the one model term" when there is only one. */
function allTerms(count: number): string {
  return count === 1 ? 'the one model term' : `all ${count} model terms`;
}

/** "the squared terms of a and b, the cubic term of c and the interaction a*b". */
export function describeTerms(terms: readonly string[]): string {
  const squared: string[] = [];
  const cubic: string[] = [];
  const interactions: string[] = [];
  const others: string[] = [];
  for (const term of terms) {
    const single = /^([A-Za-z_][A-Za-z0-9_.]*)\^(\d+)$/.exec(term);
    if (single && single[2] === '2') squared.push(single[1]);
    else if (single && single[2] === '3') cubic.push(single[1]);
    else if (/^[A-Za-z_][A-Za-z0-9_.]*(\*[A-Za-z_][A-Za-z0-9_.]*)+$/.test(term)) interactions.push(term);
    else others.push(term);
  }
  const parts: string[] = [];
  if (squared.length) parts.push(`the squared term${squared.length > 1 ? 's' : ''} of ${wordList(squared)}`);
  if (cubic.length) parts.push(`the cubic term${cubic.length > 1 ? 's' : ''} of ${wordList(cubic)}`);
  if (interactions.length) parts.push(`the interaction${interactions.length > 1 ? 's' : ''} ${wordList(interactions)}`);
  if (others.length) parts.push(`the term${others.length > 1 ? 's' : ''} ${wordList(others)}`);
  return wordList(parts);
}

/**
 * "A term that moves the response by 2σ is detected with at least 80 % power for 9 of the 13
 * terms; the weakest, feed_solids^3 (8.9 %), overlaps other terms (VIF 27)."
 */
export function powerSentence(row: ComparatorRow, delta: number): string {
  if (row.minPower === null) return '';
  const powers = (row.terms ?? []).filter((term) => term.power !== null);
  const good = powers.filter((term) => (term.power as number) >= GOOD_POWER).length;
  const effect = `A term that moves the response by ${delta}σ across the studied range`;
  if (powers.length > 0 && good === powers.length) {
    return `${effect} is detected with at least ${Math.round(GOOD_POWER * 100)} % power for every term (lowest ${percent(row.minPower * 100)} %).`;
  }
  const share =
    powers.length === 0
      ? ':'
      : good === 0
        ? ` is detected with less than ${Math.round(GOOD_POWER * 100)} % power for every term;`
        : ` is detected with at least ${Math.round(GOOD_POWER * 100)} % power for ${good} of the ${counted(powers.length, 'term')};`;
  const weakestTerm = powers.find((term) => term.term === row.minPowerTerm);
  const overlap =
    weakestTerm?.vif != null && weakestTerm.vif >= OVERLAP_VIF
      ? `, because it overlaps other terms (VIF ${Math.round(weakestTerm.vif)}) and is estimated imprecisely on its own`
      : '';
  const name = row.minPowerTerm ? `${row.minPowerTerm} at ` : '';
  return `${effect}${share} the weakest is ${name}${percent(row.minPower * 100)} %${overlap}.`;
}

/**
 * A yardstick for a weak figure: what running every combination of the planned levels would
 * reach, so that a reader can tell a small plan's weakness from one the model itself brings.
 */
function gridPower(comparison: Omit<Comparison, 'summary'>, proposed: ComparatorRow): string {
  const grid = comparison.comparators.find((row) => row.id === 'full-grid');
  if (proposed.minPower === null || proposed.minPower >= GOOD_POWER || !grid?.fitsModel || grid.minPower === null) return '';
  const term = grid.minPowerTerm ? `, weakest ${grid.minPowerTerm}` : '';
  return ` Running every combination of the planned levels (${counted(grid.runs ?? 0, 'run')}) would reach ${percent(grid.minPower * 100)} %${term}.`;
}

function offLimitsText(row: ComparatorRow): string {
  const count = row.offLimitsRuns ?? 0;
  return `${count} of its ${counted(row.runs ?? 0, 'run')} ${count === 1 ? 'breaks' : 'break'} the study's constraints or equipment limits`;
}


function runsText(difference: number): string {
  if (difference === 0) return 'as many runs as the proposed plan';
  const count = Math.abs(difference);
  return `${counted(count, `${difference > 0 ? 'more' : 'fewer'} run`)} than the proposed plan`;
}

function costText(row: ComparatorRow, proposed: ComparatorRow, currency: string | null): string {
  if (row.cost === null || proposed.cost === null || !currency) return '';
  const difference = row.cost - proposed.cost;
  if (Math.abs(difference) < 0.5) return '';
  return ` (${money_(Math.abs(difference), currency)} ${difference > 0 ? 'more' : 'less'})`;
}

function ratioText(ratio: number): string {
  if (Math.abs(ratio - 1) < 0.005) return 'about equal to';
  return `${ratio.toFixed(2)}×`;
}

function money_(value: number, currency: string): string {
  return `${currency} ${Math.round(value).toLocaleString('en-US')}`;
}

function hours(value: number): string {
  return (Math.round(value * 10) / 10).toLocaleString('en-US');
}

function percent(value: number): string {
  return (Math.round(value * 10) / 10).toFixed(1);
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
