/**
 * Chart of the threshold sweep: how many factors land in each tier as one threshold moves.
 *
 * The sweep rows come from the tier stage (`TierResult.sweep`, see
 * src/core/sensitivity/thresholdSweep.ts). One chart shows one slice: the chosen threshold
 * moves along the x axis while the other stays at the policy value. A slice with fewer than
 * two distinct values gets no chart (the report keeps the table).
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
  // Tiers that end on the same count would print their labels on top of each other: fan them out.
  const endLabels = TIERS.map((tier) => {
    const tied = TIERS.filter((other) => last.counts[other] === last.counts[tier]);
    const dy = (tied.indexOf(tier) - (tied.length - 1) / 2) * 13;
    return { tier, threshold: last[axis], count: last.counts[tier], text: tier, dy };
  });
  const current = axis === 'critical' ? tiers.policy.critical : tiers.policy.moderate;
  const maxCount = Math.max(1, ...points.map((point) => point.count));
  const style = (key: keyof (typeof SWEEP_SERIES_STYLE)['critical']) =>
    TIERS.map((tier) => SWEEP_SERIES_STYLE[tier][key]);

  const spec: Spec = {
    width: 250,
    height: 140,
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
            dy: { field: 'dy' },
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
