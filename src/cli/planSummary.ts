/**
 * The short readable summary `tierplan plan` prints: first whether the campaign sees every
 * predicted effect (the precision block), then what is varied, the model and why (potential
 * terms included), how many runs, how good the plan is and relative to what, and what it saves.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import { counted } from '../core/countedNoun.js';
import { renderTable } from '../io/textTable.js';
import { efficiencyText, indexText, settingText, varianceText } from '../io/numberText.js';
import { precisionSummaryLines } from './precisionSummary.js';
import { splitPlotView } from '../io/splitPlotView.js';

export function planSummary(plan: PlanDocument): string {
  const lines: string[] = [];
  const { metrics } = plan;
  lines.push(plan.study.title);
  lines.push(`Plan ${plan.planId || '(unsealed)'} · seed ${metrics.seed} · tierplan ${plan.tool.version}`);
  lines.push('');
  lines.push(...precisionSummaryLines(plan));
  lines.push('');

  const tierOf = new Map(plan.tiers.factors.map((factor) => [factor.id, factor]));
  const factorOf = new Map(plan.study.factors.map((factor) => [factor.id, factor]));
  lines.push(
    renderTable(
      [{ header: 'Factor' }, { header: 'Tier' }, { header: 'Total index', align: 'right' }, { header: 'Settings' }, { header: 'Unit' }],
      plan.levels.map((level) => {
        const tier = tierOf.get(level.id);
        const factor = factorOf.get(level.id) ?? { low: 0, high: 1 };
        const setting = (value: number) => settingText(value, factor);
        const settings = level.varied ? level.values.map(setting).join(', ') : `fixed at ${level.fixedAt === null ? '–' : setting(level.fixedAt)}`;
        return [level.id, `${level.tier}${tier?.borderline ? ' (borderline)' : ''}`, tier ? indexText(tier.decidedOn) : null, settings, level.unit];
      }),
      { title: 'Operating factors' },
    ),
  );
  lines.push('');

  lines.push(
    renderTable(
      [{ header: 'Term' }, { header: 'Why it is in the model' }],
      plan.model.explained.map((entry) => [entry.term, entry.reason]),
      { title: `Model: p = ${metrics.p} parameters (${plan.model.source === 'tiers' ? 'derived from the tiers' : `${plan.model.source} model`})` },
    ),
  );
  const potential = plan.model.potentialExplained ?? plan.model.potential.map((term) => ({ term, reason: '' }));
  if (potential.length > 0) {
    lines.push('');
    lines.push(
      renderTable(
        [{ header: 'Potential term' }, { header: 'Why the plan guards against it (not fitted)' }],
        potential.map((entry) => [entry.term, entry.reason]),
        { title: 'Potential terms (Bayesian D-optimality, DuMouchel & Jones 1994): guarded against without a run for each' },
      ),
    );
  }
  lines.push('');

  const count = (purpose: string) => plan.runs.filter((run) => run.purpose === purpose).length;
  const centre = count('centre');
  const holdout = count('holdout');
  lines.push(
    `Runs: ${metrics.N} fitting + ${counted(centre, 'centre replicate')} + ${holdout} holdout (validation only, not used for fitting) = ${plan.runs.length} ` +
      `(${metrics.runsNote})`,
  );
  lines.push(`D-efficiency, textbook form 100·|X'X|^(1/p)/N in coded units: ${efficiencyText(metrics.dEfficiency)}`);
  lines.push(
    metrics.boundEfficiency === null
      ? `Efficiency relative to the continuous optimum: not computed — ${metrics.boundNote}`
      : `Efficiency against the continuous optimum: ${efficiencyText(metrics.boundEfficiency)}, ${metrics.boundNote}`,
  );
  lines.push(`Average prediction variance over the region (I-criterion): ${varianceText(metrics.iCriterion)} σ²`);
  if (plan.schedule) lines.push(plan.schedule.note);
  if (metrics.gls && metrics.blocks) {
    lines.push(
      `Under the lab's error structure: ln det(X'V⁻¹X/n) = ${metrics.gls.logDetPerRun === null ? 'singular' : metrics.gls.logDetPerRun.toFixed(3)} over the fitted runs (η = ${metrics.gls.varianceRatio}); ` +
        `${metrics.blocks.sessions > 1 ? `the ${metrics.blocks.sessions} session effects leave ${metrics.blocks.informationKept === null ? 'an undefined share' : `${(100 * metrics.blocks.informationKept).toFixed(1)} %`} of the information per term` : 'one session, no block effects'}`,
    );
  }
  const split = splitPlotView(plan);
  if (split) {
    lines.push('');
    lines.push(split.wholePlotsLine);
    lines.push(
      renderTable(
        [{ header: 'Way of running it' }, ...split.headers.map((header) => ({ header, align: 'right' as const }))],
        split.rows.map((row) => [row.name, ...row.cells]),
      ),
    );
    lines.push(split.statement);
    lines.push(split.analysis);
  }

  const comparison = plan.comparison;
  if (comparison) {
    lines.push('');
    lines.push(comparison.summary);
  }
  if (plan.warnings.length > 0) {
    lines.push('');
    lines.push('Notes:');
    for (const warning of plan.warnings) lines.push(`  - ${warning}`);
  }
  return `${lines.join('\n')}\n`;
}

