/**
 * The short readable summary `tierplan plan` prints: first whether the campaign sees every
 * predicted effect (the precision block), then what is varied, the model and why (potential
 * terms included), how many runs, how good the plan is and relative to what, and what it saves.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import { counted } from '../core/countedNoun.js';
import { formatNumber, renderTable } from '../io/textTable.js';
import { precisionSummaryLines } from './precisionSummary.js';

export function planSummary(plan: PlanDocument): string {
  const lines: string[] = [];
  const { metrics } = plan;
  lines.push(plan.study.title);
  lines.push(`Plan ${plan.planId || '(unsealed)'} · seed ${metrics.seed} · tierplan ${plan.tool.version}`);
  lines.push('');
  lines.push(...precisionSummaryLines(plan));
  lines.push('');

  const tierOf = new Map(plan.tiers.factors.map((factor) => [factor.id, factor]));
  lines.push(
    renderTable(
      [{ header: 'Factor' }, { header: 'Tier' }, { header: 'Total index', align: 'right' }, { header: 'Settings' }, { header: 'Unit' }],
      plan.levels.map((level) => {
        const tier = tierOf.get(level.id);
        const settings = level.varied ? level.values.map(settingText).join(', ') : `fixed at ${settingText(level.fixedAt ?? NaN)}`;
        return [level.id, `${level.tier}${tier?.borderline ? ' (borderline)' : ''}`, tier ? formatNumber(tier.decidedOn, 3) : null, settings, level.unit];
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
  lines.push(`D-efficiency, textbook form 100·|X'X|^(1/p)/N in coded units: ${formatNumber(metrics.dEfficiency, 3)} %`);
  lines.push(
    metrics.boundEfficiency === null
      ? `Efficiency relative to the continuous optimum: not computed — ${metrics.boundNote}`
      : `Efficiency against the continuous optimum: ${formatNumber(metrics.boundEfficiency, 4)} %, ${metrics.boundNote}`,
  );
  lines.push(`Average prediction variance over the region (I-criterion): ${formatNumber(metrics.iCriterion, 3)} σ²`);
  if (plan.schedule) lines.push(plan.schedule.note);

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

/**
 * A setting as the operator will dial it: levels are already rounded to the factor's
 * precision, so print them in full (six significant figures, no padding zeros: 9.5, not 9.50).
 */
function settingText(value: number): string {
  return String(Number(value.toPrecision(6)));
}
