/**
 * Chart of the threshold sweep: how many factors land in each tier as one threshold moves.
 *
 * The sweep rows come from the tier stage (`TierResult.sweep`). When the sweep varies both
 * thresholds, the chart shows the slice through the chosen moderate threshold (critical
 * threshold on the x axis); when only the moderate threshold varies, it shows that instead.
 * A sweep with fewer than two usable rows gets no chart (the report keeps the table).
 * The threshold in use is marked by a labelled vertical line; each tier has its own colour,
 * dash pattern, marker and direct label (see chartPalette.ts). Counts exist only at the swept
 * thresholds; the straight segments between markers only guide the eye.
 */
import type { Spec } from 'vega';
import type { SweepRow, Tier, TierResult } from '../../core/sensitivity/tierTypes.js';
import { CHART_CONFIG, NEUTRAL, SWEEP_SERIES_STYLE } from './chartPalette.js';
import { renderVegaSvg } from './vegaSvg.js';

const TIERS: Tier[] = ['critical', 'moderate', 'negligible'];
const SAME = 1e-9;

/** The rows the chart draws and which threshold is on the x axis, or null when no slice has two rows. */
export function sweepSlice(tiers: TierResult): { axis: 'critical' | 'moderate'; rows: SweepRow[] } | null {
  const { critical, moderate } = tiers.policy;
  const byCritical = tiers.sweep
    .filter((row) => Math.abs(row.moderate - moderate) < SAME)
    .sort((a, b) => a.critical - b.critical);
  if (new Set(byCritical.map((row) => row.critical)).size >= 2) return { axis: 'critical', rows: byCritical };
  const byModerate = tiers.sweep
    .filter((row) => Math.abs(row.critical - critical) < SAME)
    .sort((a, b) => a.moderate - b.moderate);
  if (new Set(byModerate.map((row) => row.moderate)).size >= 2) return { axis: 'moderate', rows: byModerate };
  return null;
}

export async function thresholdSweepChartSvg(tiers: TierResult): Promise<string | null> {
  const slice = sweepSlice(tiers);
  if (slice === null) return null;
  const { axis, rows } = slice;
  const points = rows.flatMap((row) =>
    TIERS.map((tier) => ({ tier, threshold: row[axis], count: row.counts[tier] })),
  );
  const last = rows[rows.length - 1];
  const endLabels = TIERS.map((tier) => ({ tier, threshold: last[axis], count: last.counts[tier], text: tier }));
  const current = axis === 'critical' ? tiers.policy.critical : tiers.policy.moderate;
  const maxCount = Math.max(1, ...points.map((point) => point.count));
  const style = (key: keyof (typeof SWEEP_SERIES_STYLE)['critical']) =>
    TIERS.map((tier) => SWEEP_SERIES_STYLE[tier][key]);

  const spec: Spec = {
    width: 380,
    height: 190,
    padding: { left: 5, top: 20, right: 80, bottom: 5 },
    autosize: 'pad',
    config: CHART_CONFIG,
    data: [
      { name: 'points', values: points },
      { name: 'endLabels', values: endLabels },
      { name: 'inUse', values: [{ at: current, text: `in use: ${current.toFixed(2)}` }] },
    ],
    scales: [
      { name: 'x', type: 'linear', domain: { data: 'points', field: 'threshold' }, range: 'width', nice: false, zero: false },
      { name: 'y', type: 'linear', domain: [0, maxCount], range: 'height', nice: true, zero: true },
      { name: 'stroke', type: 'ordinal', domain: TIERS, range: style('stroke') as string[] },
      { name: 'dash', type: 'ordinal', domain: TIERS, range: style('dash') as number[][] },
      { name: 'shape', type: 'ordinal', domain: TIERS, range: style('shape') as string[] },
    ],
    axes: [
      { orient: 'bottom', scale: 'x', title: `${axis === 'critical' ? 'Critical' : 'Moderate'} threshold on the aggregated total index`, tickCount: 6 },
      { orient: 'left', scale: 'y', title: 'Number of factors', tickMinStep: 1, format: 'd', grid: true },
    ],
    marks: [
      {
        type: 'group',
        from: { facet: { name: 'series', data: 'points', groupby: 'tier' } },
        marks: [
          {
            type: 'line',
            name: 'sweepLines',
            from: { data: 'series' },
            encode: {
              enter: {
                x: { scale: 'x', field: 'threshold' },
                y: { scale: 'y', field: 'count' },
                stroke: { scale: 'stroke', field: 'tier' },
                strokeDash: { scale: 'dash', field: 'tier' },
                strokeWidth: { value: 2 },
              },
            },
          },
        ],
      },
      {
        type: 'symbol',
        name: 'sweepMarkers',
        from: { data: 'points' },
        encode: {
          enter: {
            x: { scale: 'x', field: 'threshold' },
            y: { scale: 'y', field: 'count' },
            shape: { scale: 'shape', field: 'tier' },
            stroke: { scale: 'stroke', field: 'tier' },
            fill: { value: '#ffffff' },
            size: { value: 40 },
            strokeWidth: { value: 1.5 },
          },
        },
      },
      {
        type: 'text',
        name: 'sweepLabels',
        from: { data: 'endLabels' },
        encode: {
          enter: {
            x: { scale: 'x', field: 'threshold', offset: 8 },
            y: { scale: 'y', field: 'count' },
            text: { field: 'text' },
            baseline: { value: 'middle' },
            fill: { scale: 'stroke', field: 'tier' },
            fontWeight: { value: 'bold' },
          },
        },
      },
      {
        type: 'rule',
        name: 'thresholdInUse',
        from: { data: 'inUse' },
        encode: {
          enter: {
            x: { scale: 'x', field: 'at' },
            y: { value: -6 },
            y2: { signal: 'height' },
            stroke: { value: NEUTRAL.text },
            strokeDash: { value: [5, 3] },
            strokeWidth: { value: 1.25 },
          },
        },
      },
      {
        type: 'text',
        name: 'thresholdInUseLabel',
        from: { data: 'inUse' },
        encode: {
          enter: {
            x: { scale: 'x', field: 'at', offset: 3 },
            y: { value: -8 },
            text: { field: 'text' },
            fontSize: { value: 10 },
          },
        },
      },
    ],
  };
  return renderVegaSvg(spec);
}
