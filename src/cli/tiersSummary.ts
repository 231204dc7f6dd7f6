/**
 * The human-readable tier report printed by `tierplan tiers`: factor tables (operating
 * settings and model parameters apart), interaction pairs, the calibration list and the
 * threshold sweep, grouped into cut-off ranges with equal counts.
 */
import type { Study } from '../core/study.js';
import type { FactorTier, SweepRow, TierResult } from '../core/sensitivity/tierTypes.js';
import { renderTable, type TextCell } from '../io/textTable.js';
import { indexText, significantText } from '../io/numberText.js';
import type { Painter } from '../io/terminalStyle.js';
import { counted } from '../core/countedNoun.js';

const BORDERLINE_MARK = '*';

/** A cut-off, printed as every other index and threshold is (numberText.ts `indexText`). */
const cutoff = indexText;

const AGGREGATE_WORDS: Record<Study['policy']['aggregate'], string> = {
  mean: 'mean over the responses',
  max: 'largest value over the responses',
  weighted: 'response-weighted mean',
};

export function tiersSummary(study: Pick<Study, 'title' | 'responses' | 'interactions'>, result: TierResult, paint: Painter): string {
  const { policy } = result;
  const out: string[] = [];
  const decidedOnUpper = policy.confidence === 'upper';

  out.push(paint.bold(`Tiers — ${study.title}`));
  const responseCount = study.responses.length;
  // Under `weighted` the reader needs the weights to redo the sum by hand.
  const responseNote =
    policy.aggregate === 'weighted'
      ? `weights ${study.responses.map((response) => `${response.id} ${significantText(response.weight)}`).join(', ')}`
      : counted(responseCount, 'response');
  out.push(
    `Total Sobol' index, ${AGGREGATE_WORDS[policy.aggregate]} (${responseNote}); ` +
      `critical ≥ ${cutoff(policy.critical)}, moderate ≥ ${cutoff(policy.moderate)}, ` +
      `tiered on the ${decidedOnUpper ? 'upper confidence bound' : 'estimate'}.`,
  );

  const sections: { label: string; factors: FactorTier[] }[] = [
    { label: 'Operating settings', factors: result.factors.filter((factor) => factor.role === 'operating') },
    { label: 'Model parameters', factors: result.factors.filter((factor) => factor.role === 'model') },
  ];
  const columns = [
    { header: 'Factor' },
    { header: 'Name' },
    { header: 'Unit' },
    { header: 'Total', align: 'right' as const },
    { header: 'Interval' },
    { header: 'First', align: 'right' as const },
    { header: 'Interaction', align: 'right' as const },
    ...(decidedOnUpper ? [{ header: 'Decided on', align: 'right' as const }] : []),
    { header: 'Tier' },
    { header: 'Margin', align: 'right' as const },
  ];
  for (const section of sections) {
    if (section.factors.length === 0) continue;
    const rows: TextCell[][] = section.factors.map((factor) => [
      factor.id,
      factor.name,
      factor.unit,
      indexText(factor.aggregatedTotal),
      factor.aggregatedTotalLow !== null && factor.aggregatedTotalHigh !== null
        ? `${indexText(factor.aggregatedTotalLow)} – ${indexText(factor.aggregatedTotalHigh)}`
        : null,
      indexText(factor.aggregatedFirst),
      indexText(factor.interactionShare),
      ...(decidedOnUpper ? [indexText(factor.decidedOn)] : []),
      paint.tier(factor.tier) + (factor.borderline ? ` ${BORDERLINE_MARK}` : ''),
      factor.margin === undefined || factor.margin === null ? null : indexText(factor.margin),
    ]);
    out.push('', renderTable(columns, rows, { title: paint.bold(`${section.label} (${section.factors.length})`) }).trimEnd());
  }
  out.push(
    '',
    'Total, First: aggregated total and first-order indices; Interval: aggregated confidence bounds of the total',
    '(– when not every response has them); Interaction: Total − First, the effect acting through interactions;',
    'Margin: distance from the decided value to the nearest cut-off.',
  );
  if (result.factors.some((factor) => factor.borderline)) {
    out.push(
      `${BORDERLINE_MARK} borderline: the interval crosses a cut-off, so a more precise sensitivity analysis could change the tier.`,
    );
  }
  for (const note of result.notes ?? []) out.push(`Note: ${note}.`);

  out.push('', paint.bold(`Interaction pairs (largest second-order index over the responses ≥ ${cutoff(policy.interaction)})`));
  if (result.interactionPairs.length === 0) {
    out.push(
      study.interactions.length === 0
        ? 'The study gives no second-order table (key `interactions`), so no pairs can be listed.'
        : `No pair reaches ${cutoff(policy.interaction)} for any response.`,
    );
  } else {
    out.push(
      renderTable(
        [{ header: 'Pair' }, { header: 'Index', align: 'right' }, { header: 'Reached in' }],
        result.interactionPairs.map((pair) => [`${pair.factorA} × ${pair.factorB}`, indexText(pair.index), pair.responses.join(', ')]),
      ).trimEnd(),
    );
  }

  const { calibration } = result;
  const borderline = new Set(result.factors.filter((factor) => factor.borderline).map((factor) => factor.id));
  out.push('', paint.bold('Calibration list (model parameters)'));
  if (calibration.entries.length === 0) {
    out.push('The study has no model parameters.');
  } else {
    out.push(
      renderTable(
        [{ header: 'Parameter' }, { header: 'Name' }, { header: 'Total', align: 'right' }, { header: 'Tier' }, { header: 'Action' }],
        calibration.entries.map((entry) => [
          entry.id,
          entry.name,
          indexText(entry.aggregatedTotal),
          paint.tier(entry.tier) + (borderline.has(entry.id) ? ` ${BORDERLINE_MARK}` : ''),
          entry.action === 'estimate' ? 'estimate precisely (lab fit or dedicated test)' : 'take a literature or nominal value',
        ]),
      ).trimEnd(),
      `${calibration.estimate} of ${counted(calibration.entries.length, 'parameter')} ${calibration.estimate === 1 ? 'needs' : 'need'} precise estimation; ` +
        `characterisation work avoided for ${calibration.literature}.`,
    );
  }

  out.push('', paint.bold('Threshold sweep (how the tier counts move with each cut-off; the other held at the policy value)'));
  const factorCount = result.factors.length;
  out.push(`Counts cover ${factorCount === 1 ? 'the one factor' : `all ${factorCount} factors`} as critical / moderate / negligible; operating and model split beside.`);
  for (const swept of ['critical', 'moderate'] as const) {
    const rows = result.sweep.filter((row) => row.swept === swept);
    if (rows.length === 0) continue;
    out.push(
      '',
      renderTable(
        [
          { header: `${swept === 'critical' ? 'Critical' : 'Moderate'} cut-off` },
          { header: 'Critical' },
          { header: 'Moderate' },
          { header: 'Negligible' },
          { header: 'Operating c/m/n' },
          { header: 'Model c/m/n' },
          { header: 'Note' },
        ],
        groupSweep(rows, swept).map((group) => [
          group.range,
          group.row.counts.critical,
          group.row.counts.moderate,
          group.row.counts.negligible,
          splitCounts(group.row, 'operating'),
          splitCounts(group.row, 'model'),
          group.hasPolicy ? '← policy' : '',
        ]),
      ).trimEnd(),
    );
  }
  return `${out.join('\n')}\n`;
}

function splitCounts(row: SweepRow, role: 'operating' | 'model'): string {
  const counts = row.countsByRole?.[role];
  return counts ? `${counts.critical}/${counts.moderate}/${counts.negligible}` : '–';
}

/** Consecutive sweep rows with the same counts, shown as one cut-off range. */
function groupSweep(rows: SweepRow[], swept: 'critical' | 'moderate'): { range: string; row: SweepRow; hasPolicy: boolean }[] {
  const groups: { first: SweepRow; last: SweepRow; hasPolicy: boolean }[] = [];
  const sameCounts = (a: SweepRow, b: SweepRow) =>
    a.counts.critical === b.counts.critical && a.counts.moderate === b.counts.moderate && a.counts.negligible === b.counts.negligible;
  for (const row of rows) {
    const current = groups[groups.length - 1];
    if (current && sameCounts(current.last, row)) {
      current.last = row;
      current.hasPolicy ||= row.isPolicy === true;
    } else {
      groups.push({ first: row, last: row, hasPolicy: row.isPolicy === true });
    }
  }
  return groups.map((group) => {
    const from = cutoff(group.first[swept]);
    const to = cutoff(group.last[swept]);
    return { range: from === to ? from : `${from} – ${to}`, row: group.first, hasPolicy: group.hasPolicy };
  });
}
