/**
 * The whole-plot comparison of a plan with hard-to-change factors (plan.json `splitPlot`), as
 * text rows for the plan summary and the report: one row per way of running the campaign,
 * the same columns in both, numbers by the one rule per quantity (numberText.ts).
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { GroupingName } from '../core/plan/groupingChoices.js';
import { countText, efficiencyText, hoursText, moneyText, powerText, ratioText } from './numberText.js';

/** Our names for the three ways of running the campaign. */
export const GROUPING_NAMES: Record<GroupingName, string> = {
  randomised: 'Completely randomised',
  splitPlot: 'Split-plot (this plan)',
  groupedThenCut: 'Grouped by setting, then cut',
};

export interface SplitPlotView {
  headers: string[];
  rows: { name: string; proposed: boolean; cells: string[] }[];
  statement: string;
  analysis: string;
  wholePlotsLine: string;
  hasCosts: boolean;
}

export function splitPlotView(plan: PlanDocument): SplitPlotView | null {
  const summary = plan.splitPlot;
  if (!summary) return null;
  const currency = plan.study.costs?.currency ?? null;
  const hasCosts = summary.choices.some((choice) => choice.cost !== null);
  const label = plan.schedule?.sessionLabel ?? 'Session';
  const headers = [
    'Runs',
    'Whole plots',
    'Resets',
    `${label}s`,
    ...(hasCosts ? [`Cost (${currency ?? 'cost units'})`, 'Hours'] : []),
    'Weakest power',
    'Hard-to-change power',
    'Whole-plot df',
    'Info kept',
    'D-eff. vs randomised',
  ];
  const rows = summary.choices.map((choice) => ({
    name: GROUPING_NAMES[choice.plan],
    proposed: choice.plan === 'splitPlot',
    cells: [
      countText(choice.runs),
      countText(choice.wholePlots),
      countText(choice.resets),
      countText(choice.sessions),
      ...(hasCosts ? [moneyText(choice.cost, null), hoursText(choice.hours)] : []),
      powerText(choice.weakestPower),
      powerText(choice.hardFactorPower),
      countText(choice.wholePlotDf),
      ratioText(choice.informationKept),
      efficiencyText(choice.efficiency === null ? null : 100 * choice.efficiency),
    ],
  }));
  const wholePlotsLine =
    `Whole plots: the ${plan.metrics.N} fitting runs form ${summary.wholePlots} whole plot${summary.wholePlots === 1 ? '' : 's'} (${summary.wholePlotsSetBy}); ` +
    `η = ${summary.varianceRatio} (whole-plot over run variance, design.varianceRatio).`;
  return { headers, rows, statement: summary.statement, analysis: summary.analysis, wholePlotsLine, hasCosts };
}
