/**
 * The manager report: one self-contained HTML file. Page 1 is the decision (managerDecision.ts,
 * the same words as the workbook's decision sheet): title, the decision in two sentences, runs,
 * cost, bench hours and sessions against the conventional and the best classical plan, the
 * sessions with their hours, what the campaign will detect and how surely, the main risk, what
 * a failed validation costs, and the approval block. Page 2 holds the evidence in plain words:
 * the indices per factor with both tier thresholds, the threshold sweep, the comparison table,
 * the fraction-of-design-space curves (Zahran, Anderson-Cook & Myers 2003) and the assumptions.
 * The appendix, on pages of its own, holds the method details once: the tier table, levels and
 * model terms, the plan figures with their formulas and the notes from planning, the run order
 * (with sessions and whole plots) and a verdict per plan.
 *
 * Every figure shown is taken from the plan document (computed by the core stages); this
 * module only words and formats, with numberText.ts. User text goes through handlebars
 * escaping; charts are vega SVG (see src/io/charts/). Wording lives in
 * templates/managerReport.hbs, managerDecision.ts and the sentences built below.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { Schedule } from '../core/schedule/scheduleTypes.js';
import type { ComparatorRow } from '../core/compare/comparisonTypes.js';
import type { SweepRow, TierResult } from '../core/sensitivity/tierTypes.js';
import { sessionHours } from '../core/schedule/sessionHours.js';
import { renderTemplate } from './templateRendering.js';
import { indexChartSvg } from './charts/indexChart.js';
import { sweepSlice, thresholdSweepChartSvg } from './charts/thresholdSweepChart.js';
import { predictionVarianceChartSvg } from './charts/predictionVarianceChart.js';
import { comparatorName } from './comparatorNames.js';
import { decisionPage } from './managerDecision.js';
import { overLimitSummary, sessionsSentence } from './sessionWording.js';
import { PURPOSE_WORDS } from './runSheetTable.js';
import { splitPlotView } from './splitPlotView.js';
import {
  ABSENT,
  countOf,
  countText,
  fixedText,
  efficiencyText,
  hoursText,
  indexText,
  moneyText,
  percentText,
  powerText,
  ratioText,
  settingText,
  varianceText,
} from './numberText.js';

interface ComparatorView {
  id: string;
  name: string;
  label: string;
  proposed: boolean;
  runs: string;
  fits: string;
  /** Short form for the main table, e.g. "2 missing". */
  missingShort: string;
  missing: string;
  dEfficiency: string;
  informationPerRun: string;
  informationTotal: string;
  predictionVariance: string;
  minPower: string;
  minPowerTerm: string;
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
  if (row.runs === null) return ABSENT;
  return row.offLimitsRuns ? `${countText(row.offLimitsRuns)} of ${countText(row.runs)}` : 'none';
}

/** "10 (29 %)", "6 more (32 %)". */
function savedText(row: ComparatorRow): string {
  if (row.id === 'proposed' || row.runsSaved === null) return ABSENT;
  const share = row.percentRunsSaved === null ? '' : ` (${percentText(Math.abs(row.percentRunsSaved))})`;
  return row.runsSaved >= 0 ? `${countText(row.runsSaved)}${share}` : `${countText(-row.runsSaved)} more${share}`;
}

function comparatorView(row: ComparatorRow): ComparatorView {
  const fits = row.runs === null ? 'not built' : row.fitsModel === null ? ABSENT : row.fitsModel ? 'yes' : 'no';
  let label = row.label;
  if (row.id === 'fractional' && row.resolution !== undefined) {
    label += ` · resolution ${row.resolution}${row.generators?.length ? `, generators ${row.generators.join(', ')}` : ''}`;
  }
  return {
    id: row.id,
    name: comparatorName(row.id),
    label,
    proposed: row.id === 'proposed',
    runs: row.runs === null ? ABSENT : countText(row.runs),
    fits,
    missingShort: row.runs === null || row.missingTerms.length === 0 ? '' : `${countText(row.missingTerms.length)} missing`,
    missing: row.runs === null ? (row.reason ?? '') : row.missingTerms.length ? `cannot estimate ${row.missingTerms.join(', ')}` : '',
    dEfficiency: efficiencyText(row.dEfficiency),
    informationPerRun: ratioText(row.relativeInformationPerRun),
    informationTotal: ratioText(row.relativeInformationTotal),
    predictionVariance: varianceText(row.averagePredictionVariance),
    minPower: powerText(row.minPower),
    minPowerTerm: row.minPower === null ? '' : (row.minPowerTerm ?? ''),
    cost: moneyText(row.cost, null),
    hours: hoursText(row.hours),
    runsSaved: savedText(row),
    outsideLimits: row.id === 'proposed' ? 'none' : runsOutsideLimits(row),
    verdict: row.verdict,
  };
}

function sweepRows(tiers: TierResult, rows: SweepRow[] | null, axis: 'critical' | 'moderate') {
  return (rows ?? []).map((row) => ({
    threshold: indexText(row[axis]),
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
      total: indexText(factor.aggregatedTotal),
      first: indexText(factor.aggregatedFirst),
      interval:
        factor.aggregatedTotalLow !== null && factor.aggregatedTotalHigh !== null
          ? `${indexText(factor.aggregatedTotalLow)} to ${indexText(factor.aggregatedTotalHigh)}`
          : ABSENT,
      interactionShare: indexText(factor.interactionShare),
      borderline: factor.borderline,
    }));
}

function runRows(plan: PlanDocument, schedule: Schedule | undefined) {
  const factorById = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  const varied = plan.levels.filter((level) => level.varied);
  const runByPoint = new Map(plan.runs.map((run) => [run.point, run]));
  const wholePlots = plan.runs.some((run) => run.wholePlot !== undefined);
  const order = schedule
    ? schedule.order.map((entry) => ({ sequence: String(entry.sequence), session: entry.session, point: entry.point }))
    : plan.runs.map((run) => ({ sequence: ABSENT, session: run.session ?? null, point: run.point }));
  return {
    sessionLabel: schedule?.sessionLabel ?? 'Session',
    wholePlots,
    headers: varied.map((level) => ({ name: level.name, unit: level.unit })),
    rows: order.map((entry) => {
      const run = runByPoint.get(entry.point);
      const session = run?.session ?? entry.session;
      return {
        sequence: entry.sequence,
        session: session === null ? ABSENT : String(session),
        wholePlot: run?.wholePlot === undefined ? ABSENT : String(run.wholePlot),
        point: entry.point,
        // The run sheet's own words, so manager and technician read the same kind of run.
        purpose: run ? PURPOSE_WORDS[run.purpose] : ABSENT,
        settings: varied.map((level) => {
          const value = run?.settings[level.id];
          const factor = factorById.get(level.id);
          return value === undefined || !factor ? ABSENT : settingText(value, factor);
        }),
      };
    }),
  };
}

const ASSUMPTIONS = [
  'The sensitivity indices come from a process model and carry its assumptions, input ranges and input distributions; a factor the model leaves out cannot appear here.',
  'The tier thresholds are common-practice starting points, not physical constants; the threshold sweep shows how the tiers move with them.',
  'The plan assumes the model form in the appendix (the terms chosen from the tiers). Effects outside that form are not estimable from this plan; the validation runs exist to catch them.',
  'Negligible factors are held fixed at their nominal settings; conclusions hold at those settings only.',
  'Every efficiency is relative to a stated reference: textbook D-efficiency to an ideal orthogonal plan of the same size, information to the proposed plan (appendix D).',
  'Costs and bench hours are the study file’s per-run figures multiplied out, with the hard-to-change resets; they include no set-up, analysis or failed runs.',
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
  const centreRuns = plan.runs.filter((run) => run.purpose === 'centre').length;
  const page = decisionPage(plan);

  let sessions: { text: string; warnings: string[] } | null = null;
  if (schedule) {
    const hours = sessionHours(plan, schedule);
    sessions = {
      text: sessionsSentence(hours, schedule.sessionLabel),
      warnings: [overLimitSummary(hours, schedule.sessionLabel)].filter((text): text is string => text !== null),
    };
  }

  return renderTemplate('managerReport', {
    title: plan.study.title,
    heading: page.title,
    planId: plan.planId,
    createdDate: plan.createdAt.slice(0, 10),
    toolVersion: plan.tool.version,
    page,
    sessions,
    policy: {
      aggregate: plan.tiers.policy.aggregate,
      critical: indexText(plan.tiers.policy.critical),
      moderate: indexText(plan.tiers.policy.moderate),
      confidence: plan.tiers.policy.confidence === 'upper' ? 'the upper confidence bound' : 'the estimate',
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
          rows: comparison.comparators.map(comparatorView),
          p: comparison.p,
          delta: String(comparison.delta),
          alpha: String(comparison.alpha),
          varianceMethod: comparison.predictionVarianceMethod,
          costHeading: currency ? `Cost, ${currency}` : 'Cost',
          hasCosts: comparison.comparators.some((row) => row.cost !== null),
        }
      : null,
    fdsChart,
    assumptions: ASSUMPTIONS,
    warnings: plan.warnings,
    tierRows: tierRows(plan.tiers),
    levels: plan.levels.map((level) => {
      const factor = plan.study.factors.find((candidate) => candidate.id === level.id);
      const setting = (value: number) => (factor ? settingText(value, factor) : String(value));
      return {
        name: level.name,
        unit: level.unit,
        tier: level.tier,
        settings: level.varied ? level.values.map(setting).join(', ') : `fixed at ${level.fixedAt === null ? ABSENT : setting(level.fixedAt)}`,
        reason: level.reason,
      };
    }),
    modelTerms: plan.model.explained,
    interactionPairs: plan.tiers.interactionPairs.map((pair) => ({
      pair: `${pair.factorA} × ${pair.factorB}`,
      index: indexText(pair.index),
      responses: pair.responses.join(', '),
    })),
    runTable: runRows(plan, schedule),
    splitPlot: splitPlotView(plan),
    scheduleNote: schedule ? schedule.note : 'No run schedule is stored: runs are listed in plan order and are not randomised.',
    metrics: {
      dEfficiency: efficiencyText(plan.metrics.dEfficiency),
      boundEfficiency: efficiencyText(plan.metrics.boundEfficiency),
      boundNote: plan.metrics.boundNote,
      iCriterion: varianceText(plan.metrics.iCriterion),
      criterion: plan.metrics.criterion === 'D' ? 'D-optimal' : 'I-optimal',
      seed: String(plan.metrics.seed),
      starts: String(plan.metrics.starts),
      runsNote: plan.metrics.runsNote,
      fitRuns: String(plan.metrics.N),
      centreRuns: countOf(centreRuns, 'centre repeat'),
      gls: plan.metrics.gls?.logDetPerRun != null ? `${fixedText(plan.metrics.gls.logDetPerRun, 3)} (η = ${plan.metrics.gls.varianceRatio})` : null,
      blocks: plan.metrics.blocks && plan.metrics.blocks.sessions > 1 ? `${ratioText(plan.metrics.blocks.informationKept)} over ${plan.metrics.blocks.sessions} sessions (1 = nothing lost)` : null,
    },
  });
}
