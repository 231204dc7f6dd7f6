/**
 * The precision block of `tierplan plan`'s summary, printed before everything else: will the
 * campaign see every effect the sensitivity analysis predicts, and how was N reached.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import { precisionView } from '../io/precisionView.js';
import { renderTable } from '../io/textTable.js';

export function precisionSummaryLines(plan: Pick<PlanDocument, 'precision' | 'study' | 'levels'>): string[] {
  const view = precisionView(plan);
  if (plan.precision.basis === 'none') return ['Precision', view.headline];
  const lines: string[] = [`Precision (${view.target})`, view.headline];
  if (view.weakest) lines.push(`Weakest: ${view.weakest}`);
  if (view.factors.length > 0) {
    lines.push('');
    lines.push(
      renderTable(
        [{ header: 'Factor' }, { header: 'Response' }, { header: 'Effect' }, { header: 'In noise', align: 'right' }, { header: 'Power', align: 'right' }, { header: 'Terms tested together' }],
        view.factors.map((row) => [row.what, row.response, `${row.effect}${row.unit && row.unit !== '-' ? ` ${row.unit}` : ''}`, row.effectInNoise, row.power, row.tested]),
        { title: 'Each factor’s predicted effect, per response (effect = coded coefficient: half the change across the range)' },
      ),
    );
  }
  if (view.interactions.length > 0) {
    lines.push('');
    lines.push(
      renderTable(
        [{ header: 'Interaction' }, { header: 'Response' }, { header: 'Effect' }, { header: 'In noise', align: 'right' }, { header: 'Power', align: 'right' }],
        view.interactions.map((row) => [row.what, row.response, `${row.effect}${row.unit && row.unit !== '-' ? ` ${row.unit}` : ''}`, row.effectInNoise, row.power]),
        { title: 'Interaction terms of the model' },
      ),
    );
  }
  if (view.fixed.length > 0) {
    lines.push('');
    lines.push('Held fixed, the most each factor can leave unexplained (if all its total index were one linear trend, in noise units):');
    const byFactor = new Map<string, string[]>();
    for (const entry of view.fixed) byFactor.set(entry.factor, [...(byFactor.get(entry.factor) ?? []), `${entry.response} ${entry.largestEffectInNoise}`]);
    for (const [factor, entries] of byFactor) lines.push(`  ${factor}: ${entries.join(', ')}`);
  }
  if (view.runCurve) lines.push(`Run counts tried (weakest power): ${view.runCurve}`);
  for (const note of view.notes) lines.push(`  - ${note}`);
  return lines;
}
