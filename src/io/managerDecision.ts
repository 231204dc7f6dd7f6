/**
 * Page 1 for the manager, in words: the title, the decision in two sentences, the figures
 * against the conventional and the best classical plan, what the campaign will detect and how
 * surely, the single main risk, what a failed validation costs, and the approval block. One
 * wording for report.html and the workbook's decision sheet, so both say the same.
 *
 * Everything is worded here from the structured facts of core (`decisionFacts.ts`); numbers
 * follow numberText.ts. Method details (criteria, sampling, formulas) stay out of this page:
 * they belong in the report's appendix and the workbook's model sheet.
 *
 * Conventions fixed here: the title states the result and never calls a plan smaller than one
 * it is larger than; the decision is exactly two sentences (what to approve, then why against
 * the conventional plan); plans are named by their short names (comparatorNames.ts).
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import { decisionFacts, type DecisionFacts, type MainRisk, type PlanFigures } from '../core/plan/decisionFacts.js';
import type { FactorPrecision, InteractionPrecision } from '../core/precision/precisionTypes.js';
import { wordList } from '../core/wordList.js';
import { comparatorName, comparatorNameInSentence } from './comparatorNames.js';
import { ABSENT, countOf, countText, hoursText, moneyText, noiseUnitsText, powerText } from './numberText.js';
import { termPhrase, termsPhrase } from './termWording.js';

export interface DecisionColumn {
  key: 'proposed' | 'conventional' | 'alternative';
  /** Column heading: "Proposed plan", "Conventional plan", "Best classical alternative". */
  heading: string;
  /** The plan's short name and its full description, for the note under the table. */
  name: string;
  label: string;
}

export interface DecisionPage {
  title: string;
  /** The decision, exactly two sentences. */
  decision: [string, string];
  columns: DecisionColumn[];
  /** One row per measure; `cells` follow `columns`. */
  rows: { measure: string; cells: string[] }[];
  /** Notes under the table (what each column is, how sessions are counted). */
  tableNotes: string[];
  /** What the campaign will detect and how surely: a lead sentence and short items. */
  precision: { lead: string; items: string[] };
  /** The single main risk, one sentence. */
  risk: string;
  /** What happens, and costs, if validation fails: one sentence, then how it was sized. */
  fallback: string;
  fallbackRule: string;
  /** Rows of the approval block and the fields each row has. */
  approval: { roles: string[]; fields: string[] };
}

const APPROVAL_ROLES = ['Prepared by', 'Statistical review', 'Approved by'];
const APPROVAL_FIELDS = ['Name', 'Role', 'Date', 'Signature'];

export function decisionPage(plan: PlanDocument): DecisionPage {
  const facts = decisionFacts(plan);
  const nameOf = factorNamer(plan);
  const factorIds = plan.levels.filter((level) => level.varied).map((level) => level.id);
  const sessionWord = sessionWords(facts);

  const columns: DecisionColumn[] = [{ key: 'proposed', heading: 'Proposed plan', name: 'Proposed plan', label: facts.proposed.label }];
  if (facts.conventional) columns.push({ key: 'conventional', heading: 'Conventional plan', name: comparatorName('conventional'), label: facts.conventional.label });
  if (facts.alternative) {
    columns.push({ key: 'alternative', heading: 'Best classical alternative', name: comparatorName(facts.alternative.id), label: facts.alternative.label });
  }
  const plans = columns.map((column) => (column.key === 'proposed' ? facts.proposed : column.key === 'conventional' ? facts.conventional! : facts.alternative!));

  const rows: DecisionPage['rows'] = [
    { measure: 'Runs', cells: plans.map((figures) => countText(figures.runs)) },
    { measure: `Cost${facts.currency ? ` (${facts.currency})` : ''}`, cells: plans.map((figures) => (figures.cost === null ? ABSENT : moneyText(figures.cost, null))) },
    { measure: 'Bench hours', cells: plans.map((figures) => hoursText(figures.hours)) },
    { measure: sessionWord.row, cells: plans.map((figures) => countText(figures.sessions)) },
    { measure: 'Model parameters it can estimate', cells: plans.map((figures) => estimableText(figures, facts.p)) },
    { measure: 'Runs outside the limits', cells: plans.map((figures) => (figures.offLimitsRuns === 0 ? 'none' : countText(figures.offLimitsRuns))) },
  ];
  if (plans.some((figures) => figures.runsForPrecision !== undefined)) {
    rows.push({
      measure: 'Runs for the same precision',
      cells: plans.map((figures) => (figures.runsForPrecision === undefined ? ABSENT : figures.runsForPrecision === null ? 'cannot' : countText(figures.runsForPrecision))),
    });
  }
  const tableNotes = [
    ...columns.slice(1).map((column) => `${column.heading}: ${column.label}.`),
    sessionWord.note,
  ];
  if (facts.alternativeMissing && plan.comparison) {
    tableNotes.push(
      facts.alternativeMissing === 'noneFits'
        ? 'No classical plan in the comparison can estimate the whole model, so there is no classical alternative to show.'
        : 'Every classical plan that can estimate the whole model has runs outside the constraints or equipment limits, so none is shown as an alternative.',
    );
  }

  return {
    title: titleFor(facts),
    decision: [approveSentence(facts, sessionWord), againstSentence(facts, factorIds, nameOf, plan.comparison !== undefined)],
    columns,
    rows,
    tableNotes,
    precision: precisionView(plan, facts, nameOf),
    risk: riskSentence(facts.risk, factorIds, nameOf),
    fallback: fallbackSentence(facts, sessionWord),
    fallbackRule:
      `Sized as the run-count rule's allowance for checking the fit, the larger of 3 and a quarter of the ${facts.p} model parameters; ` +
      'each added run is costed with a reset of the hard-to-change settings, so the figure errs high.',
    approval: { roles: APPROVAL_ROLES, fields: APPROVAL_FIELDS },
  };
}

function factorNamer(plan: PlanDocument): (id: string) => string {
  const names = new Map(plan.study.factors.map((factor) => [factor.id, factor.name]));
  const responses = new Map(plan.study.responses.map((response) => [response.id, response.name]));
  return (id) => names.get(id) ?? responses.get(id) ?? id;
}

interface SessionWords {
  /** "Days", "Working days (8 h)". */
  row: string;
  /** "day", "days" for sentences. */
  singular: string;
  plural: string;
  note: string;
}

function sessionWords(facts: DecisionFacts): SessionWords {
  const basis = facts.sessionBasis;
  if (basis.kind === 'sessions') {
    const singular = basis.label.toLowerCase();
    const plural = singular.endsWith('s') ? singular : `${singular}s`;
    return {
      row: `${basis.label.endsWith('s') ? basis.label : `${basis.label}s`} at the bench`,
      singular,
      plural,
      note: `${basis.label}s: at most ${countOf(basis.maxRuns, 'run')} per ${singular} (sessions.maxRuns), the rule the run order uses.`,
    };
  }
  if (basis.kind === 'workingDays') {
    return {
      row: `Working days (${hoursText(basis.hours)} h)`,
      singular: 'working day',
      plural: 'working days',
      note: `Working days: bench hours ÷ ${hoursText(basis.hours)} h, rounded up (the study sets no sessions).`,
    };
  }
  return { row: 'Sessions', singular: 'session', plural: 'sessions', note: 'Sessions: not counted (the study sets neither sessions nor costs).' };
}

function titleFor(facts: DecisionFacts): string {
  const n = facts.proposed.runs;
  const conventional = facts.conventional;
  if (!conventional) return `Lab campaign plan: ${countOf(n, 'run')}`;
  const difference = conventional.runs - n;
  if (difference > 0) return `Lab campaign plan: ${countText(n)} runs where the conventional plan needs ${countText(conventional.runs)}`;
  if (difference === 0) return `Lab campaign plan: ${countOf(n, 'run')}, as many as the conventional plan`;
  const why = conventional.estimable < facts.p ? ', to estimate what it cannot' : '';
  return `Lab campaign plan: ${countOf(n, 'run')}, ${countText(-difference)} more than the conventional plan${why}`;
}

function approveSentence(facts: DecisionFacts, words: SessionWords): string {
  const { proposed } = facts;
  const parts = [
    `${countText(proposed.fitRuns)} to fit the model`,
    ...(proposed.centreRuns > 0 ? [`${countOf(proposed.centreRuns, 'centre repeat')}`] : []),
    ...(proposed.holdoutRuns > 0 ? [`${countOf(proposed.holdoutRuns, 'validation run')}`] : []),
  ];
  const over = proposed.sessions !== null ? ` over ${countOf(proposed.sessions, words.singular, words.plural)}` : '';
  const cost = proposed.cost !== null ? ` at ${moneyText(proposed.cost, facts.currency)}` : '';
  const hours = proposed.hours !== null ? ` and ${hoursText(proposed.hours)} h of bench work` : '';
  return `Approve ${countOf(proposed.runs, 'lab run')}${over} (${wordList(parts)})${cost}${hours}.`;
}

function againstSentence(facts: DecisionFacts, factorIds: string[], nameOf: (id: string) => string, compared: boolean): string {
  const { proposed, conventional, alternative } = facts;
  const estimates = proposed.estimable === facts.p ? `It estimates all ${facts.p} model parameters` : `It estimates ${proposed.estimable} of the ${facts.p} model parameters`;
  if (!compared) return `${estimates}; no comparison with conventional plans is stored in this plan (run tierplan compare).`;
  if (!conventional) return `${estimates}; no conventional plan could be built for this study to compare it with.`;
  const difference = conventional.runs - proposed.runs;
  const money =
    conventional.cost !== null && proposed.cost !== null && Math.round(conventional.cost - proposed.cost) !== 0
      ? ` and ${moneyText(Math.abs(conventional.cost - proposed.cost), facts.currency)} ${conventional.cost > proposed.cost ? 'less' : 'more'}`
      : '';
  const runs = difference > 0 ? `${countOf(difference, 'run')} fewer` : difference < 0 ? `${countOf(-difference, 'run')} more` : 'as many runs';
  const comparative = difference === 0 ? `as many runs${money}` : `${runs}${money}`;
  const conventionalCan =
    conventional.missingTerms.length > 0
      ? `, which cannot estimate ${termsPhrase(conventional.missingTerms, factorIds, nameOf)}`
      : conventional.offLimitsRuns > 0
        ? `, ${countOf(conventional.offLimitsRuns, 'run')} of which break the constraints or equipment limits`
        : '';
  const alternativeText = alternative ? `; the best classical alternative that can, the ${comparatorNameInSentence(alternative.id)} plan, needs ${countOf(alternative.runs, 'run')}` : '';
  return `${estimates} with ${comparative} than the conventional plan${conventionalCan}${alternativeText}.`;
}

function estimableText(figures: PlanFigures, p: number): string {
  return figures.estimable >= p ? `all ${p}` : `${figures.estimable} of ${p}`;
}

function effectName(entry: FactorPrecision | InteractionPrecision, nameOf: (id: string) => string): string {
  return 'factors' in entry ? `${nameOf(entry.factors[0])} × ${nameOf(entry.factors[1])}` : nameOf(entry.factor);
}

function precisionView(plan: PlanDocument, facts: DecisionFacts, nameOf: (id: string) => string): DecisionPage['precision'] {
  const calibration = plan.tiers.calibration;
  const toEstimate = calibration.entries.filter((entry) => entry.action === 'estimate').map((entry) => entry.name);
  const calibrationItem =
    calibration.entries.length === 0
      ? []
      : [
          `Model parameters to estimate precisely from these runs: ${toEstimate.length === 0 ? 'none' : wordList(toEstimate)}; ` +
            `${countOf(calibration.entries.length - toEstimate.length, 'other')} can be taken from the literature.`,
        ];
  const precision = facts.precision;
  if (precision && precision.basis !== 'none') {
    const entries: (FactorPrecision | InteractionPrecision)[] = [...precision.factors, ...precision.interactions];
    const short = entries.filter((entry) => (entry.power ?? 0) < precision.power);
    const lead = precision.met
      ? `Every effect the sensitivity analysis predicts is detected with at least ${powerText(precision.power)} power (α = ${precision.alpha}).`
      : `${countOf(short.length, 'predicted effect')} of ${entries.length} ${short.length === 1 ? 'falls' : 'fall'} short of the ${powerText(precision.power)} power target (α = ${precision.alpha}).`;
    // The weakest effect per factor, weakest first: what a reader needs to trust the plan.
    const byFactor = new Map<string, FactorPrecision | InteractionPrecision>();
    for (const entry of entries) {
      const key = effectName(entry, nameOf);
      const kept = byFactor.get(key);
      if (!kept || (entry.power ?? 0) < (kept.power ?? 0)) byFactor.set(key, entry);
    }
    const items = [...byFactor.values()]
      .sort((a, b) => (a.power ?? 0) - (b.power ?? 0))
      .slice(0, 5)
      .map((entry) => `${effectName(entry, nameOf)}: weakest on ${nameOf(entry.response)}, an effect of ${noiseUnitsText(entry.effectInNoise)}, power ${powerText(entry.power)}.`);
    const fixed = [...precision.fixed].sort((a, b) => b.largestEffectInNoise - a.largestEffectInNoise)[0];
    if (fixed) items.push(`Holding the negligible factors fixed leaves at most ${noiseUnitsText(fixed.largestEffectInNoise)} unexplained (${nameOf(fixed.factor)} on ${nameOf(fixed.response)}).`);
    return { lead, items: [...items, ...calibrationItem] };
  }
  const noNoise = precision?.basis === 'none' || !precision;
  const lead = noNoise
    ? 'Precision not judged (no noise given): the study gives no lab noise figure (responses[].noise), so how surely each effect will be detected cannot be said; the run count follows the default rule.'
    : '';
  const items: string[] = [];
  if (facts.termPower) {
    const { termPower } = facts;
    const weakest = termPower.term ? `, the weakest (${termPhrase(termPower.term, plan.levels.filter((level) => level.varied).map((level) => level.id), nameOf)}) with ${powerText(termPower.power)}` : '';
    items.push(
      termPower.terms > 0
        ? `A term that alone moves a response by ${termPower.delta}σ across the range is detected with at least 80 % power for ${termPower.reaching} of the ${termPower.terms} model terms${weakest}.`
        : `A term that alone moves a response by ${termPower.delta}σ across the range is detected with at least ${powerText(termPower.power)} power by every model term's test${weakest}.`,
    );
  }
  return { lead, items: [...items, ...calibrationItem] };
}

function riskSentence(risk: MainRisk, factorIds: string[], nameOf: (id: string) => string): string {
  switch (risk.kind) {
    case 'precisionShort':
      return (
        `The weakest predicted effect, ${effectName(risk.weakest, nameOf)} on ${nameOf(risk.weakest.response)} (${noiseUnitsText(risk.weakest.effectInNoise)}), ` +
        `is detected with only ${powerText(risk.weakest.power)} power against the ${powerText(risk.target)} target, so a real effect there could be missed.`
      );
    case 'weakTerm': {
      const overlap = risk.vif !== null && risk.vif >= 5 ? ', because it overlaps other terms,' : '';
      return (
        `${capitalised(termPhrase(risk.term, factorIds, nameOf))} is detected with only ${powerText(risk.power)} power for a ${risk.delta}σ effect${overlap} ` +
        'so the model may fit the runs without that term being pinned down.'
      );
    }
    case 'borderlineFixed':
      return `${wordList(risk.factors)} ${risk.factors.length === 1 ? 'is' : 'are'} held fixed although the sensitivity index lies near the threshold; if it matters more than the analysis says, the validation runs will show it.`;
    case 'groupedHardToChange':
      return (
        `Runs sharing a setting of ${wordList(risk.factors)} are done together over ${risk.sessions} sessions, so a change from one session to the next ` +
        'would look like an effect of that setting unless the results are analysed with the groups as whole plots.'
      );
    case 'modelForm':
      return `An effect outside the assumed model form; the ${countOf(risk.holdoutRuns, 'validation run')} ${risk.holdoutRuns === 1 ? 'is' : 'are'} there to catch it.`;
  }
}

/** First letter upper case: a term phrase may open the sentence. */
function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

function fallbackSentence(facts: DecisionFacts, words: SessionWords): string {
  const { fallback, proposed } = facts;
  const validation = proposed.holdoutRuns > 0 ? proposed.holdoutRuns === 1 ? 'the validation run misses its prediction' : `the ${countOf(proposed.holdoutRuns, 'validation run')} miss their predictions` : 'the fit shows lack of fit';
  const costs = [
    ...(fallback.cost !== null ? [moneyText(fallback.cost, facts.currency)] : []),
    ...(fallback.hours !== null ? [`${hoursText(fallback.hours)} h`] : []),
    ...(fallback.sessions !== null ? [`${fallback.sessions} more ${fallback.sessions === 1 ? words.singular : words.plural}`] : []),
  ];
  return (
    `If ${validation}, the model is extended by the terms the misfit points to and about ${countOf(fallback.runs, 'run')} ` +
    `are added to the runs already made${costs.length ? ` (about ${wordList(costs)})` : ''}.`
  );
}
