/**
 * The human view `tierplan compare` prints: the decision first, then what each plan
 * estimates, what it costs, the proposed plan term by term, what the columns mean, and one
 * verdict per plan. Prose is wrapped to TEXT_WIDTH columns; the tables are about as wide.
 *
 * Convention: when the study has no `costs` section the cost and time columns are left out
 * and one line says why, instead of columns of dashes.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { ComparatorRow, Comparison } from '../core/compare/comparisonTypes.js';
import { comparatorTableName, type ComparatorNaming } from '../core/compare/comparatorNames.js';
import { counted } from '../core/countedNoun.js';
import { displayWidth, renderTable, type TextColumn } from '../io/textTable.js';
import { fixedText, significantText } from '../io/numberText.js';

/** Width the prose is wrapped to (the tables are about as wide). */
const TEXT_WIDTH = 100;

/**
 * The human view: the decision first, then what each plan estimates, what it costs, the
 * proposed plan term by term, what the columns mean, and one verdict per plan.
 */
export function compareSummary(comparison: Comparison, plan: PlanDocument): string {
  const rows = comparison.comparators;
  const naming = namingFor(plan);
  const name = (row: ComparatorRow) => comparatorTableName(row, naming);
  const lines: string[] = [plan.study.title, ''];
  lines.push(...wrap(`Decision: ${comparison.summary}`, ''), '');

  const estimates = renderTable(
    [
      { header: 'Plan' },
      { header: 'Fit runs' },
      { header: 'Fits model' },
      { header: 'D-eff', unit: '%', align: 'right' },
      { header: 'Info/run', align: 'right' },
      { header: 'Info total', align: 'right' },
      { header: 'Avg var', unit: 'σ²', align: 'right' },
      { header: 'Min power', unit: '%', align: 'right' },
    ],
    rows.map((row) => [
      name(row),
      row.runs === null ? null : (row.fittingRuns ?? row.runs),
      row.runs === null ? 'not built' : row.fitsModel ? 'yes' : `no, ${counted(row.missingTerms.length, 'term')}`,
      fixed(row.dEfficiency, 1),
      fixed(row.relativeInformationPerRun, 2),
      fixed(row.relativeInformationTotal, 2),
      row.averagePredictionVariance,
      fixed(row.minPower === null ? null : 100 * row.minPower, 0),
    ]),
    { title: `What each plan can estimate: the same ${counted(comparison.modelTerms.length, 'model term')} + intercept (p = ${comparison.p}), coded units` },
  );
  lines.push(estimates.replace(/\n+$/, ''), '');

  // Without a `costs` section there is nothing to show in money or hours: leave the columns out.
  const currency = comparison.currency ?? undefined;
  const costed = comparison.currency !== null;
  const costColumns: { column: TextColumn; cell: (row: ComparatorRow) => string | number | null; costOnly: boolean }[] = [
    { column: { header: 'Plan' }, cell: name, costOnly: false },
    { column: { header: 'Runs' }, cell: (row) => row.runs, costOnly: false },
    { column: { header: 'Off limits', align: 'right' }, cell: (row) => (row.runs === null ? null : String(row.offLimitsRuns ?? 0)), costOnly: false },
    { column: { header: 'Level changes', align: 'right' }, cell: (row) => (row.levelChanges === null ? null : String(row.levelChanges)), costOnly: false },
    { column: { header: 'Cost', unit: currency, align: 'right' }, cell: (row) => (row.cost === null ? null : grouped(row.cost)), costOnly: true },
    { column: { header: 'Time', unit: 'h', align: 'right' }, cell: (row) => fixed(row.hours, 1), costOnly: true },
    {
      column: { header: 'Runs saved', align: 'right' },
      cell: (row) => (row.id === 'proposed' ? null : savedText(row.runsSaved, row.percentRunsSaved, (value) => String(value))),
      costOnly: false,
    },
    {
      column: { header: 'Cost saved', unit: currency, align: 'right' },
      cell: (row) => (row.id === 'proposed' ? null : savedText(row.costSaved, row.percentCostSaved, grouped)),
      costOnly: true,
    },
  ];
  const shownCostColumns = costColumns.filter((entry) => costed || !entry.costOnly);
  const costs = renderTable(
    shownCostColumns.map((entry) => entry.column),
    rows.map((row) => shownCostColumns.map((entry) => entry.cell(row))),
    {
      title: costed
        ? 'What each plan costs and whether it can be run as listed (all runs, holdout runs included)'
        : 'What each plan takes and whether it can be run as listed (all runs, holdout runs included)',
    },
  );
  lines.push(costs.replace(/\n+$/, ''), '');

  const proposed = rows.find((row) => row.id === 'proposed');
  if (proposed?.terms && proposed.terms.length > 0) {
    const termTable = renderTable(
      [{ header: 'Term' }, { header: 'Std error', unit: 'σ', align: 'right' }, { header: 'VIF', align: 'right' }, { header: 'Power', unit: '%', align: 'right' }],
      proposed.terms.map((term) => [term.term === '1' ? '1 (intercept)' : term.term, fixed(term.standardError, 3), fixed(term.vif, 1), fixed(term.power === null ? null : 100 * term.power, 0)]),
      { title: `The proposed plan term by term (power for an effect of ${comparison.delta}σ, α = ${comparison.alpha})` },
    );
    lines.push(termTable.replace(/\n+$/, ''));
    const detail = [
      residualText(proposed, comparison.p),
      proposed.aCriterion != null ? `A-criterion ${significantText(proposed.aCriterion)} σ² (average coefficient variance)` : null,
      proposed.gEfficiency != null
        ? `G-efficiency ${fixed(proposed.gEfficiency, 1)} % (the floor p/N of the scaled prediction variance against its worst value, ${proposed.gEfficiencyBasis ?? 'over the region'})`
        : null,
      proposed.maxVif != null ? `largest VIF ${fixed(proposed.maxVif, 1)}` : null,
    ].filter((text): text is string => text !== null);
    if (detail.length > 0) lines.push(...wrap(`${capitalise(detail.join('; '))}.`, ''));
    lines.push('');
  }

  lines.push('What the columns mean');
  const notes = [
    'Fit runs: the runs each plan\'s figures are computed on. For the proposed plan these are its model and centre runs ' +
      '(its holdout runs only check predictions, and count in runs, cost and time); for the other plans, all their runs. ' +
      'The centre runs are why the proposed plan\'s D-eff and Avg var here differ from those `tierplan plan` prints for its model runs alone.',
    'D-eff: textbook D-efficiency 100·|X\'X|^(1/p)/N, relative to an ideal orthogonal two-level plan of the same size. ' +
      'Models with squared or cubic terms never reach 100 %, so compare the rows with each other, not with 100.',
    'Info/run, Info total: information (det X\'X)^(1/p) relative to the proposed plan, per run and in total; ' +
      'above 1 means more information than the proposed plan.',
    `Avg var: average variance of a predicted response over the studied region, in units of σ² (lower is better): ` +
      `${comparison.predictionVarianceMethod}.`,
    `Min power: the smallest over the model terms. ${comparison.powerConvention ?? `Effect of ${comparison.delta}σ across the coded range, two-sided t-test at α = ${comparison.alpha}.`}`,
    'Off limits: runs that break the study\'s constraints or equipment limits; a plan with any cannot be run as listed, ' +
      'and its figures describe runs that cannot be made.',
    'Level changes: changes of a hard-to-change factor\'s setting (the proposed plan as scheduled, the others grouped, ' +
      `the fewest they could need)${costed ? '; their cost and time are included' : ''}.`,
    costed
      ? 'Runs saved, Cost saved: the other plan minus the proposed plan, and in % of the other plan; ' +
        'negative means the other plan is smaller or cheaper.'
      : 'Runs saved: the other plan minus the proposed plan, and in % of the other plan; negative means the other plan is smaller.',
  ];
  if (!costed) notes.push('No cost or time columns: the study has no `costs` section (currency, perRun, hoursPerRun).');
  for (const note of notes) lines.push(...wrap(note, '  ', '    '));
  lines.push('');

  lines.push('What each plan means');
  for (const row of rows) {
    lines.push(...wrap(`${name(row)} — ${row.label}.`, '  ', '    '));
    lines.push(...wrap(row.verdict, '    '));
    const confounded = aliasText(row);
    if (confounded) lines.push(...wrap(`Confounded: ${confounded}.`, '    '));
  }
  return `${lines.join('\n')}\n`;
}

/** "21 fitting runs − 14 coefficients = 7 residual degrees of freedom": what the t-tests have to work with. */
function residualText(row: ComparatorRow, p: number): string | null {
  if (row.fittingRuns === undefined) return null;
  const residual = counted(row.fittingRuns - p, 'residual degree of freedom', 'residual degrees of freedom');
  return `${counted(row.fittingRuns, 'fitting run')} − ${counted(p, 'coefficient')} = ${residual} for the tests`;
}

/** "inlet_temp^3 with inlet_temp; feed_solids^2 with inlet_temp^2", partners with their alias coefficients. */
function aliasText(row: ComparatorRow): string {
  if (!row.aliases || row.aliases.length === 0) return '';
  const MAX_PARTNERS = 3;
  return row.aliases
    .map((alias) => {
      if (alias.aliasedWith.length === 0) return `${alias.term} (constant over the plan)`;
      const partners = alias.aliasedWith
        .slice(0, MAX_PARTNERS)
        .map((partner) => (Math.abs(partner.coefficient - 1) < 1e-9 ? partner.term : `${significantText(partner.coefficient)}·${partner.term}`));
      const more = alias.aliasedWith.length > MAX_PARTNERS ? ` and ${alias.aliasedWith.length - MAX_PARTNERS} more` : '';
      return `${alias.term} with ${partners.join(', ')}${more}`;
    })
    .join('; ');
}

function savedText(value: number | null, percent: number | null, format: (value: number) => string): string | null {
  if (value === null) return null;
  const sign = value < 0 ? '−' : '';
  const amount = `${sign}${format(Math.abs(value))}`;
  return percent === null ? amount : `${amount} (${percent < 0 ? '−' : ''}${fixedText(Math.abs(percent), 0)} %)`;
}

function fixed(value: number | null | undefined, decimals: number): string | null {
  return value === null || value === undefined ? null : value.toFixed(decimals);
}

function grouped(value: number): string {
  return Math.round(value).toLocaleString('en-US');
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Greedy word wrap to TEXT_WIDTH with a first-line and a continuation indent. */
function wrap(text: string, indent: string, continuation: string = indent): string[] {
  const out: string[] = [];
  let line = indent;
  let empty = true;
  for (const word of text.split(/\s+/).filter((w) => w.length > 0)) {
    if (!empty && displayWidth(line) + 1 + displayWidth(word) > TEXT_WIDTH) {
      out.push(line);
      line = continuation + word;
    } else {
      line += (empty ? '' : ' ') + word;
    }
    empty = false;
  }
  out.push(line);
  return out;
}

/** What the compact plan names need from the plan the rows are set against. */
function namingFor(plan: PlanDocument): ComparatorNaming {
  const varied = plan.levels.filter((level) => level.varied);
  return {
    variedFactors: varied.length,
    operatingFactors: plan.study.factors.filter((factor) => factor.role === 'operating').length,
    centreRuns: plan.runs.filter((run) => run.purpose === 'centre').length,
    levelCounts: varied.map((level) => level.coded.length),
  };
}
