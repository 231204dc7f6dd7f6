/**
 * The manager report: one self-contained HTML file (about one printed page plus an appendix)
 * that makes the case for the proposed plan.
 *
 * Content, in order: the decision (runs, cost and bench time saved against the conventional
 * plan, and what the smaller plan still estimates); the indices per factor with both tier
 * thresholds; the threshold sweep; the comparison table, where every efficiency names its
 * reference; the fraction-of-design-space curves (Zahran, Anderson-Cook & Myers 2003); the
 * model parameters to estimate versus fix; assumptions and caveats. The appendix holds the
 * tier table, levels, model terms, run order and plan metrics.
 *
 * Every figure shown is taken from the plan document (computed by the core stages); this
 * module only formats. User text goes through handlebars escaping; charts are vega SVG
 * (see src/io/charts/). Wording lives in templates/managerReport.hbs and in the sentences
 * built below.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import type { ComparatorRow, Comparison } from '../core/compare/comparisonTypes.js';
import type { SweepRow, TierResult } from '../core/sensitivity/tierTypes.js';
import { renderTemplate } from './templateRendering.js';
import { indexChartSvg } from './charts/indexChart.js';
import { sweepSlice, thresholdSweepChartSvg } from './charts/thresholdSweepChart.js';
import { COMPARATOR_SHORT_NAME, predictionVarianceChartSvg } from './charts/predictionVarianceChart.js';
import { settingText } from './numberText.js';
import { PURPOSE_WORDS } from './runSheetTable.js';

const DASH = '—';

function fixed(value: number | null | undefined, digits: number): string {
  return value === null || value === undefined || !Number.isFinite(value) ? DASH : value.toFixed(digits);
}

function grouped(value: number | null | undefined, digits = 0): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return DASH;
  return value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

function money(value: number | null | undefined, currency: string | null): string {
  if (value === null || value === undefined) return DASH;
  return currency ? `${currency} ${grouped(value)}` : grouped(value);
}

function plural(count: number, word: string): string {
  return `${grouped(count)} ${word}${count === 1 ? '' : 's'}`;
}

interface DecisionView {
  /** The decision in one or two sentences (bold), then the rest of the argument (plain). */
  headline: string;
  detail: string;
  /** Proposed against conventional, figure by figure; null when either row is missing or unbuilt. */
  figures: { measure: string; proposed: string; conventional: string; difference: string }[] | null;
  conventionalLabel: string;
}

function difference(proposed: number | null, conventional: number | null, format: (value: number) => string): string {
  if (proposed === null || conventional === null) return DASH;
  const saved = conventional - proposed;
  const percent = conventional === 0 ? '' : ` (${fixed((100 * saved) / conventional, 0)} %)`;
  return saved >= 0 ? `${format(saved)} saved${percent}` : `${format(-saved)} extra${percent.replace('(-', '(+')}`;
}

/**
 * Splits a paragraph into the decision proper (its first two sentences) and the rest. A
 * sentence ends at a full stop followed by a space and a capital; decimals such as "28.6 %"
 * never match.
 */
export function splitDecision(sentences: string[]): { headline: string; detail: string } {
  const all = sentences.flatMap((text) => text.split(/(?<=\.)\s+(?=[A-Z])/));
  return { headline: all.slice(0, 2).join(' '), detail: all.slice(2).join(' ') };
}

/** The decision: the comparison summary plus the proposed-versus-conventional figures. */
function decisionView(plan: PlanDocument, comparison: Comparison | undefined): DecisionView {
  if (!comparison) {
    return {
      ...splitDecision([
        `The proposed plan has ${plural(plan.runs.length, 'run')} and estimates all ${plan.metrics.p} parameters of the target model.`,
        'No comparison with conventional plans is stored in this plan, so this report claims no savings. Run the comparison stage to add one.',
      ]),
      figures: null,
      conventionalLabel: '',
    };
  }
  const currency = comparison.currency;
  const proposed = comparison.comparators.find((row) => row.id === 'proposed');
  const conventional = comparison.comparators.find((row) => row.id === 'conventional');
  if (!proposed || !conventional || proposed.runs === null || conventional.runs === null) {
    return { ...splitDecision([comparison.summary, 'No conventional plan could be built for this study, so no savings are shown.']), figures: null, conventionalLabel: '' };
  }
  const estimates = (row: ComparatorRow) =>
    row.fitsModel ? `all ${comparison.p}` : `${comparison.p - row.missingTerms.length} of ${comparison.p}`;
  return {
    ...splitDecision([comparison.summary]),
    conventionalLabel: conventional.label,
    figures: [
      { measure: 'Runs', proposed: grouped(proposed.runs), conventional: grouped(conventional.runs), difference: difference(proposed.runs, conventional.runs, (v) => grouped(v)) },
      { measure: `Cost${currency ? ` (${currency})` : ''}`, proposed: grouped(proposed.cost), conventional: grouped(conventional.cost), difference: difference(proposed.cost, conventional.cost, (v) => grouped(v)) },
      { measure: 'Bench hours', proposed: grouped(proposed.hours), conventional: grouped(conventional.hours), difference: difference(proposed.hours, conventional.hours, (v) => grouped(v)) },
      { measure: 'Model parameters it can estimate', proposed: estimates(proposed), conventional: estimates(conventional), difference: '' },
    ],
  };
}

interface ComparatorView {
  id: string;
  name: string;
  label: string;
  proposed: boolean;
  runs: string;
  fits: string;
  /** Short form for the main table, e.g. "misses 2 terms". */
  missingShort: string;
  missing: string;
  dEfficiency: string;
  informationPerRun: string;
  informationTotal: string;
  predictionVariance: string;
  minPower: string;
  cost: string;
  hours: string;
  runsSaved: string;
  /** Runs that break the study's constraints or equipment limits, "8 of 27", "none" or a dash. */
  outsideLimits: string;
  verdict: string;
}

/**
 * Runs of a comparator that break the study's constraints or equipment limits. A manager must
 * see it in the table: a plan that estimates more but cannot be run as listed is no real
 * alternative.
 */
export function runsOutsideLimits(row: Pick<ComparatorRow, 'runs' | 'offLimitsRuns'>): string {
  if (row.runs === null) return DASH;
  return row.offLimitsRuns ? `${row.offLimitsRuns} of ${row.runs}` : 'none';
}

function comparatorView(row: ComparatorRow, currency: string | null): ComparatorView {
  const fits = row.runs === null ? 'not built' : row.fitsModel === null ? DASH : row.fitsModel ? 'yes' : 'no';
  const saved =
    row.id === 'proposed' || row.runsSaved === null
      ? DASH
      : `${grouped(row.runsSaved)}${row.percentRunsSaved === null ? '' : ` (${fixed(row.percentRunsSaved, 0)} %)`}`;
  let label = row.label;
  if (row.id === 'fractional' && row.resolution !== undefined) {
    label += ` · resolution ${row.resolution}${row.generators?.length ? `, generators ${row.generators.join(', ')}` : ''}`;
  }
  return {
    id: row.id,
    name: COMPARATOR_SHORT_NAME[row.id] ?? row.id,
    label,
    proposed: row.id === 'proposed',
    runs: row.runs === null ? DASH : grouped(row.runs),
    fits,
    missingShort: row.runs === null || row.missingTerms.length === 0 ? '' : `${row.missingTerms.length} missing`,
    missing: row.runs === null ? (row.reason ?? '') : row.missingTerms.length ? `cannot estimate ${row.missingTerms.join(', ')}` : '',
    dEfficiency: fixed(row.dEfficiency, 1),
    informationPerRun: fixed(row.relativeInformationPerRun, 2),
    informationTotal: fixed(row.relativeInformationTotal, 2),
    predictionVariance: fixed(row.averagePredictionVariance, 3),
    minPower: row.minPower === null ? DASH : `${fixed(row.minPower * 100, 0)} %${row.minPowerTerm ? ` (${row.minPowerTerm})` : ''}`,
    cost: money(row.cost, currency),
    hours: grouped(row.hours, 0),
    runsSaved: saved,
    outsideLimits: row.id === 'proposed' ? 'none' : runsOutsideLimits(row),
    verdict: row.verdict,
  };
}

function sweepRows(tiers: TierResult, rows: SweepRow[] | null, axis: 'critical' | 'moderate') {
  return (rows ?? []).map((row) => ({
    threshold: row[axis].toFixed(2),
    critical: row.counts.critical,
    moderate: row.counts.moderate,
    negligible: row.counts.negligible,
    inUse: Math.abs(row[axis] - tiers.policy[axis]) < 1e-9,
  }));
}

function tierRows(tiers: TierResult) {
  return [...tiers.factors]
    .sort((a, b) => b.aggregatedTotal - a.aggregatedTotal)
    .map((factor) => ({
      name: factor.name,
      unit: factor.unit,
      role: factor.role === 'model' ? 'model parameter' : 'operating setting',
      tier: factor.tier,
      total: factor.aggregatedTotal.toFixed(3),
      first: factor.aggregatedFirst.toFixed(3),
      interval:
        factor.aggregatedTotalLow !== null && factor.aggregatedTotalHigh !== null
          ? `${factor.aggregatedTotalLow.toFixed(3)} to ${factor.aggregatedTotalHigh.toFixed(3)}`
          : DASH,
      interactionShare: factor.interactionShare.toFixed(3),
      borderline: factor.borderline,
    }));
}

function runRows(plan: PlanDocument, schedule: Schedule | undefined) {
  const factorById = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const varied = plan.levels.filter((level) => level.varied);
  const runByPoint = new Map(plan.runs.map((run) => [run.point, run]));
  const order = schedule
    ? schedule.order.map((entry) => ({ sequence: String(entry.sequence), session: String(entry.session), point: entry.point }))
    : plan.runs.map((run) => ({ sequence: DASH, session: DASH, point: run.point }));
  return {
    sessionLabel: schedule?.sessionLabel ?? 'Session',
    headers: varied.map((level) => ({ name: level.name, unit: level.unit })),
    rows: order.map((entry) => {
      const run = runByPoint.get(entry.point);
      return {
        ...entry,
        // The run sheet's own words, so manager and technician read the same kind of run.
        purpose: run ? PURPOSE_WORDS[run.purpose] : DASH,
        settings: varied.map((level) => {
          const value = run?.settings[level.id];
          const factor = factorById.get(level.id);
          return value === undefined || !factor ? DASH : settingText(value, factor);
        }),
      };
    }),
  };
}

const ASSUMPTIONS = [
  'The sensitivity indices come from a process model and carry its assumptions, input ranges and input distributions; a factor the model leaves out cannot appear here.',
  'The tier thresholds are common-practice starting points, not physical constants; the threshold sweep shows how the tiers move with them.',
  'The plan assumes the model form in the appendix (the terms chosen from the tiers). Effects outside that form are not estimable from this plan; the holdout runs exist to catch them.',
  'Negligible factors are held fixed at their nominal settings; conclusions hold at those settings only.',
  'Every efficiency is relative to a stated reference: textbook D-efficiency to an ideal orthogonal plan of the same size, the bound efficiency to the best approximate plan on the same candidate points, information ratios to the proposed plan.',
  'Costs and bench hours are the study file’s per-run figures multiplied out; they include no set-up, analysis or failed runs.',
  'Power figures assume independent, normally distributed run-to-run error of constant size.',
  'Every setting must be checked against the equipment’s rated limits and site procedures; the plan does not replace a hazard review.',
];

/**
 * Renders the manager report. `schedule` defaults to `plan.schedule`; without one the appendix
 * lists runs in plan order. Without `plan.comparison` the report says that no comparison was
 * made and claims no savings.
 */
export async function managerReportHtml(plan: PlanDocument, schedule: Schedule | undefined = plan.schedule): Promise<string> {
  const comparison = plan.comparison;
  const currency = comparison?.currency ?? plan.study.costs?.currency ?? null;
  const [indexChart, criticalSweepChart, moderateSweepChart, fdsChart] = await Promise.all([
    indexChartSvg(plan.tiers),
    thresholdSweepChartSvg(plan.tiers, 'critical'),
    thresholdSweepChartSvg(plan.tiers, 'moderate'),
    comparison ? predictionVarianceChartSvg(comparison) : Promise.resolve(null),
  ]);
  const counts = { critical: 0, moderate: 0, negligible: 0 };
  for (const factor of plan.tiers.factors) counts[factor.tier] += 1;
  const calibration = plan.tiers.calibration;
  const fitRuns = plan.runs.filter((run) => run.purpose === 'fit').length;
  const centreRuns = plan.runs.filter((run) => run.purpose === 'centre').length;
  const holdoutRuns = plan.runs.filter((run) => run.purpose === 'holdout').length;
  const settingOf = (id: string, value: number): string => {
    const factor = plan.study.factors.find((candidate) => candidate.id === id);
    return factor ? settingText(value, factor) : DASH;
  };

  return renderTemplate('managerReport', {
    title: plan.study.title,
    planId: plan.planId,
    createdDate: plan.createdAt.slice(0, 10),
    toolVersion: plan.tool.version,
    decision: decisionView(plan, comparison),
    planShape: `${plural(plan.runs.length, 'run')}: ${fitRuns} for fitting, ${centreRuns} replicate centre ${centreRuns === 1 ? 'point' : 'points'}, ${holdoutRuns} holdout check ${holdoutRuns === 1 ? 'run' : 'runs'}; ${plan.metrics.p} model parameters.`,
    policy: {
      aggregate: plan.tiers.policy.aggregate,
      critical: plan.tiers.policy.critical.toFixed(2),
      moderate: plan.tiers.policy.moderate.toFixed(2),
      confidence: plan.tiers.policy.confidence === 'upper' ? 'the upper confidence bound' : 'the point estimate',
    },
    tierCounts: counts,
    indexChart,
    criticalSweepChart,
    moderateSweepChart,
    criticalSweep: sweepRows(plan.tiers, sweepSlice(plan.tiers, 'critical'), 'critical'),
    moderateSweep: sweepRows(plan.tiers, sweepSlice(plan.tiers, 'moderate'), 'moderate'),
    hasComparison: comparison !== undefined,
    comparison: comparison
      ? {
          rows: comparison.comparators.map((row) => comparatorView(row, currency)),
          p: comparison.p,
          delta: grouped(comparison.delta, 1),
          alpha: grouped(comparison.alpha, 2),
          varianceMethod: comparison.predictionVarianceMethod,
          currency: currency ?? 'cost units',
        }
      : null,
    fdsChart,
    calibration: {
      estimate: calibration.entries.filter((entry) => entry.action === 'estimate').map((entry) => ({ name: entry.name, tier: entry.tier, total: entry.aggregatedTotal.toFixed(2) })),
      literature: calibration.entries.filter((entry) => entry.action === 'literature').map((entry) => ({ name: entry.name, tier: entry.tier, total: entry.aggregatedTotal.toFixed(2) })),
    },
    assumptions: ASSUMPTIONS,
    warnings: plan.warnings,
    tierRows: tierRows(plan.tiers),
    levels: plan.levels.map((level) => ({
      name: level.name,
      unit: level.unit,
      tier: level.tier,
      settings: level.varied
        ? level.values.map((value) => settingOf(level.id, value)).join(', ')
        : `fixed at ${level.fixedAt === null ? DASH : settingOf(level.id, level.fixedAt)}`,
      reason: level.reason,
    })),
    modelTerms: plan.model.explained,
    interactionPairs: plan.tiers.interactionPairs.map((pair) => ({
      pair: `${pair.factorA} × ${pair.factorB}`,
      index: pair.index.toFixed(3),
      responses: pair.responses.join(', '),
    })),
    runTable: runRows(plan, schedule),
    scheduleNote: schedule ? schedule.note : 'No run schedule is stored: runs are listed in plan order and are not randomised.',
    metrics: {
      dEfficiency: fixed(plan.metrics.dEfficiency, 1),
      boundEfficiency: fixed(plan.metrics.boundEfficiency, 1),
      boundNote: plan.metrics.boundNote,
      iCriterion: fixed(plan.metrics.iCriterion, 3),
      criterion: plan.metrics.criterion === 'D' ? 'D-optimal' : 'I-optimal',
      seed: String(plan.metrics.seed),
      starts: String(plan.metrics.starts),
      runsNote: plan.metrics.runsNote,
      fitRuns: String(plan.metrics.N),
      centreRuns: String(centreRuns),
    },
  });
}
