/**
 * Chart of the aggregated total and first-order Sobol' indices per factor, with the two tier
 * thresholds drawn as labelled vertical lines.
 *
 * Sobol' indices: Saltelli et al. (2008), "Global Sensitivity Analysis: The Primer". A bar is
 * the aggregated total index (coloured by tier and labelled with the tier in words), the white
 * diamond the aggregated first-order index, the whisker the interval of the total index when
 * the index table carries one. The gap between bar end and diamond is the part of the effect
 * that acts through interactions. Factors are sorted by total index, largest first.
 * Factor names are drawn as vega text marks (escaped by vega), never as axis labels built
 * from strings, so duplicate names cannot merge two bars.
 */
import type { Spec } from 'vega';
import type { Tier, TierResult } from '../../core/sensitivity/tierTypes.js';
import { NEUTRAL, THRESHOLD_STYLE, TIER_STYLE } from './chartPalette.js';
import { chartSpec, dataMark, referenceLabels, referenceRules } from './vegaSpecParts.js';
import { renderVegaSvg } from './vegaSvg.js';

const ROW_HEIGHT = 15;
const TIERS: Tier[] = ['critical', 'moderate', 'negligible'];
const PLOT_WIDTH = 340;

export async function indexChartSvg(tiers: TierResult): Promise<string> {
  const factors = [...tiers.factors].sort((a, b) => b.aggregatedTotal - a.aggregatedTotal);
  const rows = factors.map((factor) => ({
    key: factor.id,
    label: factor.role === 'model' ? `${factor.name} (model)` : factor.name,
    tier: factor.tier,
    total: factor.aggregatedTotal,
    first: factor.aggregatedFirst,
    low: factor.aggregatedTotalLow,
    high: factor.aggregatedTotalHigh,
    caption: `${factor.aggregatedTotal.toFixed(2)} ${factor.tier}${factor.borderline ? ' (borderline)' : ''}`,
    captionAt: Math.max(factor.aggregatedTotal, factor.aggregatedTotalHigh ?? 0),
  }));
  const largest = Math.max(tiers.policy.critical, ...rows.map((row) => row.captionAt));
  // Room on the right for the value-and-tier caption after the longest bar.
  const xMax = Math.min(1.35, largest * 1.3 + 0.02);
  const { critical, moderate } = tiers.policy;
  const thresholds = [
    { key: 'critical', at: critical, text: `critical at ${critical.toFixed(2)} and above`, dy: -20 },
    { key: 'moderate', at: moderate, text: `moderate at ${moderate.toFixed(2)} and above`, dy: -6 },
  ];
  const height = Math.max(ROW_HEIGHT * rows.length, ROW_HEIGHT);

  const spec: Spec = chartSpec({
    width: PLOT_WIDTH,
    height,
    padding: { left: 5, top: 5, right: 10, bottom: 5 },
    data: [
      { name: 'factors', values: rows },
      { name: 'intervals', source: 'factors', transform: [{ type: 'filter', expr: 'datum.low != null && datum.high != null' }] },
      { name: 'thresholds', values: thresholds },
    ],
    scales: [
      { name: 'x', type: 'linear', domain: [0, xMax], range: 'width', nice: false, zero: true },
      { name: 'y', type: 'band', domain: rows.map((row) => row.key), range: 'height', padding: 0.25 },
      { name: 'tierFill', type: 'ordinal', domain: TIERS, range: TIERS.map((tier) => TIER_STYLE[tier].fill) },
      { name: 'tierStroke', type: 'ordinal', domain: TIERS, range: TIERS.map((tier) => TIER_STYLE[tier].stroke) },
    ],
    axes: [
      {
        orient: 'bottom',
        scale: 'x',
        grid: true,
        tickCount: 6,
        title: `Sobol' index, aggregated over responses (${tiers.policy.aggregate})`,
      },
    ],
    marks: [
      dataMark('text', 'factorNames', 'factors', {
        x: { value: -8 },
        y: { scale: 'y', field: 'key', band: 0.5 },
        text: { field: 'label' },
        align: { value: 'right' },
        baseline: { value: 'middle' },
        fontSize: { value: 10 },
        // Headless vega guesses text width at 0.8 em per character, so this allows about 55 characters.
        limit: { value: 440 },
      }),
      dataMark('rect', 'totalBars', 'factors', {
        x: { scale: 'x', value: 0 },
        x2: { scale: 'x', field: 'total' },
        y: { scale: 'y', field: 'key' },
        height: { scale: 'y', band: 1 },
        fill: { scale: 'tierFill', field: 'tier' },
        stroke: { scale: 'tierStroke', field: 'tier' },
        strokeWidth: { value: 0.75 },
      }),
      dataMark('rule', 'totalIntervals', 'intervals', {
        x: { scale: 'x', field: 'low' },
        x2: { scale: 'x', field: 'high' },
        y: { scale: 'y', field: 'key', band: 0.5 },
        stroke: { value: NEUTRAL.text },
        strokeWidth: { value: 1.5 },
      }),
      dataMark('symbol', 'firstOrder', 'factors', {
        x: { scale: 'x', field: 'first' },
        y: { scale: 'y', field: 'key', band: 0.5 },
        shape: { value: 'diamond' },
        size: { value: 70 },
        fill: { value: '#ffffff' },
        stroke: { value: '#000000' },
        strokeWidth: { value: 1.25 },
      }),
      dataMark('text', 'barCaptions', 'factors', {
        x: { scale: 'x', field: 'captionAt', offset: 5 },
        y: { scale: 'y', field: 'key', band: 0.5 },
        text: { field: 'caption' },
        baseline: { value: 'middle' },
        fontSize: { value: 10 },
      }),
      referenceRules('thresholdLines', 'thresholds', {
        above: 8,
        strokeWidth: 1.5,
        stroke: { signal: `datum.key === 'critical' ? '${THRESHOLD_STYLE.critical.stroke}' : '${THRESHOLD_STYLE.moderate.stroke}'` },
        strokeDash: {
          signal: `datum.key === 'critical' ? [${THRESHOLD_STYLE.critical.dash.join(',')}] : [${THRESHOLD_STYLE.moderate.dash.join(',')}]`,
        },
      }),
      referenceLabels('thresholdLabels', 'thresholds', { field: 'dy' }, true),
    ],
  });
  return renderVegaSvg(spec);
}
