/**
 * Chart of the threshold sweep: how many factors land in each tier as one threshold moves.
 *
 * The sweep rows come from the tier stage (`TierResult.sweep`, see
 * src/core/sensitivity/thresholdSweep.ts). One chart shows one slice: the chosen threshold
 * moves along the x axis while the other stays at the policy value. A slice with fewer than
 * two distinct values gets no chart (the report keeps the table).
 * The threshold in use is marked by a labelled vertical line (label above the plot); each tier
 * has its own colour, dash pattern, marker and direct label at the end of its line, moved apart
 * where the lines end close together (`spreadLabels`) (see chartPalette.ts). Counts exist only at the swept
 * thresholds; the straight segments between markers only guide the eye.
 */
import type { Spec } from 'vega';
import type { SweepRow, Tier, TierResult } from '../../core/sensitivity/tierTypes.js';
import { NEUTRAL, SWEEP_SERIES_STYLE } from './chartPalette.js';
import { CHART_FONT_SIZE, chartSpec, dataMark, referenceLabels, referenceRules, seriesLines, seriesMarkers, seriesScales, type SeriesFields } from './vegaSpecParts.js';
import { indexText } from '../numberText.js';
import { renderVegaSvg } from './vegaSvg.js';

const TIERS: Tier[] = ['critical', 'moderate', 'negligible'];
const SAME = 1e-9;
const HEIGHT = 140;
/** Least vertical distance between two end labels, px: a line of CHART_FONT_SIZE text and air. */
const LABEL_GAP = CHART_FONT_SIZE + 3;

/**
 * End labels moved apart where their lines end close together: sorted by height, each at
 * least LABEL_GAP below the one above, then the whole stack shifted up if it runs past the
 * bottom of the plot. Keeps the order of the lines, so each label still reads next to its own.
 */
function spreadLabels<T extends { y: number }>(labels: T[]): T[] {
  const sorted = [...labels].sort((a, b) => a.y - b.y).map((label) => ({ ...label }));
  for (let i = 1; i < sorted.length; i++) sorted[i].y = Math.max(sorted[i].y, sorted[i - 1].y + LABEL_GAP);
  const overflow = sorted[sorted.length - 1].y - HEIGHT;
  if (overflow > 0) for (const label of sorted) label.y -= overflow;
  for (let i = sorted.length - 2; i >= 0; i--) sorted[i].y = Math.min(sorted[i].y, sorted[i + 1].y - LABEL_GAP);
  return sorted;
}

export type SweptThreshold = 'critical' | 'moderate';

/**
 * The sweep rows that move `axis` while the other threshold stays at the policy value, in
 * ascending order, or null when fewer than two distinct values remain.
 */
export function sweepSlice(tiers: TierResult, axis: SweptThreshold): SweepRow[] | null {
  const held: SweptThreshold = axis === 'critical' ? 'moderate' : 'critical';
  const rows: SweepRow[] = [];
  for (const row of tiers.sweep) {
    if (Math.abs(row[held] - tiers.policy[held]) >= SAME) continue;
    // The policy's own row belongs to both slices and may be listed twice: keep it once.
    if (rows.some((kept) => Math.abs(kept[axis] - row[axis]) < SAME)) continue;
    rows.push(row);
  }
  rows.sort((a, b) => a[axis] - b[axis]);
  return rows.length >= 2 ? rows : null;
}

export async function thresholdSweepChartSvg(tiers: TierResult, axis: SweptThreshold): Promise<string | null> {
  const rows = sweepSlice(tiers, axis);
  if (rows === null) return null;
  const points = rows.flatMap((row) =>
    TIERS.map((tier) => ({ tier, threshold: row[axis], count: row.counts[tier] })),
  );
  const last = rows[rows.length - 1];
  const current = axis === 'critical' ? tiers.policy.critical : tiers.policy.moderate;
  const maxCount = Math.max(1, ...points.map((point) => point.count));
  const endLabels = spreadLabels(
    TIERS.map((tier) => ({ tier, threshold: last[axis], text: tier, y: HEIGHT * (1 - last.counts[tier] / maxCount) })),
  );
  const series: SeriesFields = { data: 'points', series: 'tier', x: 'threshold', y: 'count' };

  const spec: Spec = chartSpec({
    width: 210,
    height: HEIGHT,
    padding: { left: 5, top: 22, right: 10, bottom: 5 },
    data: [
      { name: 'points', values: points },
      { name: 'endLabels', values: endLabels },
      { name: 'inUse', values: [{ at: current, text: `in use: ${indexText(current)}` }] },
    ],
    scales: [
      { name: 'x', type: 'linear', domain: { data: 'points', field: 'threshold' }, range: 'width', nice: false, zero: false },
      // No rounding of the domain: the end labels are placed in pixels from this exact scale.
      { name: 'y', type: 'linear', domain: [0, maxCount], range: 'height', nice: false, zero: true },
      ...seriesScales(TIERS, (tier) => SWEEP_SERIES_STYLE[tier]),
    ],
    axes: [
      { orient: 'bottom', scale: 'x', title: `${axis === 'critical' ? 'Critical' : 'Moderate'} threshold on the aggregated total index`, tickCount: 6, labelPadding: 6 },
      { orient: 'left', scale: 'y', title: 'Number of factors', tickMinStep: 1, format: 'd', grid: true },
    ],
    marks: [
      seriesLines('sweepLines', series, 2),
      seriesMarkers('sweepMarkers', series, 40),
      dataMark('text', 'sweepLabels', 'endLabels', {
        x: { scale: 'x', field: 'threshold', offset: 8 },
        y: { field: 'y' },
        text: { field: 'text' },
        baseline: { value: 'middle' },
        // Dark text, not the series colour: orange lettering fades on a greyscale print, and the
        // label sits at the end of its own line, so it needs no colour to say which line it names.
        fill: { value: NEUTRAL.text },
        fontWeight: { value: 'bold' },
      }),
      referenceRules('thresholdInUse', 'inUse', { above: 0, strokeWidth: 1.25, stroke: { value: NEUTRAL.text }, strokeDash: { value: [5, 3] } }),
      referenceLabels('thresholdInUseLabel', 'inUse', { value: -4 }, false),
    ],
  });
  return renderVegaSvg(spec);
}
