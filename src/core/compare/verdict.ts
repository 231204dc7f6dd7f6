/**
 * One plain sentence or two per comparison row, and the decision summary, in words a
 * manager reads without the table. Wording is ours; figures come from the row itself.
 *
 * Conventions fixed here: money is printed to whole units with the study's currency code
 * before it, hours to one decimal, percentages to one decimal; missing terms are grouped by
 * kind (squared, cubic, interaction) so that a long list stays readable.
 */
import type { ComparatorRow, Comparison } from './comparisonTypes.js';

export interface VerdictContext {
  currency: string | null;
  /** Model terms, intercept excluded. */
  termCount: number;
  delta: number;
}

/** The verdict for the proposed plan's own row. */
export function proposedVerdict(row: ComparatorRow, fittingRuns: number, holdoutRuns: number, context: VerdictContext): string {
  if (!row.fitsModel) return `Cannot estimate ${describeTerms(row.missingTerms)}: the plan does not fit its own model.`;
  const holdout = holdoutRuns > 0 ? `, plus ${holdoutRuns} holdout run${holdoutRuns === 1 ? '' : 's'} to check predictions` : '';
  const power =
    row.minPower === null
      ? ' No residual degrees of freedom are left to test the terms.'
      : ` Every term is detected with power ≥ ${percent(row.minPower * 100)} % when it moves the response by ${context.delta}σ${weakest(row)}.`;
  return `Estimates all ${context.termCount} model terms from ${fittingRuns} fitting runs${holdout}.${power}`;
}

/** The verdict for a comparator row, measured against the proposed row. */
export function comparatorVerdict(row: ComparatorRow, proposed: ComparatorRow, notes: readonly string[], context: VerdictContext): string {
  if (row.runs === null) return `Not built: ${row.reason ?? 'no plan of this kind exists here'}.`;
  const sentences: string[] = [];
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
  const still = proposed.fitsModel
    ? `It still estimates all ${termCount} model terms${
        proposed.minPower === null
          ? ''
          : `, each with power ≥ ${percent(proposed.minPower * 100)} % for an effect of ${comparison.delta}σ${weakest(proposed)}`
      }`
    : `It cannot estimate ${describeTerms(proposed.missingTerms)}`;
  if (!reference || reference.runs === null) return `The proposed plan needs ${proposed.runs} runs. ${still}.`;
  const name = reference.id === 'conventional' ? 'the conventional full factorial' : `the ${reference.label.charAt(0).toLowerCase()}${reference.label.slice(1)}`;
  const saved = reference.runs - proposed.runs;
  const savedText =
    saved > 0
      ? `${saved} fewer runs (${percent(reference.percentRunsSaved ?? 0)} %)`
      : saved < 0
        ? `${-saved} more runs`
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
  return `The proposed plan needs ${proposed.runs} runs where ${name} needs ${reference.runs}: ${savedText}${money}. ${still}${referenceFit}.`;
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
  if (squared.length) parts.push(`the squared term${squared.length > 1 ? 's' : ''} of ${list(squared)}`);
  if (cubic.length) parts.push(`the cubic term${cubic.length > 1 ? 's' : ''} of ${list(cubic)}`);
  if (interactions.length) parts.push(`the interaction${interactions.length > 1 ? 's' : ''} ${list(interactions)}`);
  if (others.length) parts.push(`the term${others.length > 1 ? 's' : ''} ${list(others)}`);
  return list(parts);
}

function weakest(row: ComparatorRow): string {
  return row.minPowerTerm ? ` (lowest: ${row.minPowerTerm})` : '';
}

function list(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function runsText(difference: number): string {
  if (difference === 0) return 'as many runs as the proposed plan';
  const count = Math.abs(difference);
  return `${count} ${difference > 0 ? 'more' : 'fewer'} run${count === 1 ? '' : 's'} than the proposed plan`;
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
