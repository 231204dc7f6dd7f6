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
 *
 * Layout that keeps every label clear of every line: factor names left of the plot, the value
 * and tier of each bar in a column right of the plot, the threshold labels above the plot on
 * rows of their own, and the threshold rules inside the plot only.
 */
import type { Spec } from 'vega';
import type { Tier, TierResult } from '../../core/sensitivity/tierTypes.js';
import { NEUTRAL, THRESHOLD_STYLE, TIER_STYLE } from './chartPalette.js';
import { CHART_FONT_SIZE, chartSpec, dataMark, referenceLabels, referenceRules } from './vegaSpecParts.js';
import { indexText } from '../numberText.js';
import { renderVegaSvg } from './vegaSvg.js';

const ROW_HEIGHT = 18;
const TIERS: Tier[] = ['critical', 'moderate', 'negligible'];
const PLOT_WIDTH = 280;
/** Width of one character of CHART_FONT_SIZE text in a sans face, px, a little wide (common practice: 0.55 em). */
const CHAR_WIDTH = CHART_FONT_SIZE * 0.58;
/** Widest room for factor names, px; a longer name is cut with an ellipsis. */
const MAX_NAME_WIDTH = 360;

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
    caption: `${indexText(factor.aggregatedTotal)} ${factor.tier}${factor.borderline ? ' (borderline)' : ''}`,
    reach: Math.max(factor.aggregatedTotal, factor.aggregatedTotalHigh ?? 0),
  }));
  const largest = Math.max(tiers.policy.critical, ...rows.map((row) => row.reach));
  const xMax = Math.min(1, largest * 1.1 + 0.02);
  const { critical, moderate } = tiers.policy;
  // One row each above the plot, 16 px apart (more than a line of CHART_FONT_SIZE text).
  const thresholds = [
    { key: 'critical', at: critical, text: `critical ≥ ${indexText(critical)}`, dy: -20 },
    { key: 'moderate', at: moderate, text: `moderate ≥ ${indexText(moderate)}`, dy: -4 },
  ];
  const height = Math.max(ROW_HEIGHT * rows.length, ROW_HEIGHT);

  // The frame is sized from the text it must hold, not left to vega's headless text estimate
  // (about 0.8 em per character, far wider than print), so the chart's natural width is what it
  // needs and the report never has to shrink it below 8 pt text.
  const nameWidth = Math.min(MAX_NAME_WIDTH, Math.max(...rows.map((row) => row.label.length)) * CHAR_WIDTH) + 10;
  const captionWidth = Math.max(...rows.map((row) => row.caption.length)) * CHAR_WIDTH + 14;
  const spec: Spec = chartSpec({
    autosize: 'none',
    width: PLOT_WIDTH,
    height,
    padding: { left: nameWidth, top: 38, right: captionWidth, bottom: 42 },
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
        fontSize: { value: CHART_FONT_SIZE },
        // vega cuts text by its own estimate (0.8 em per character): this limit lets through
        // what fits MAX_NAME_WIDTH at CHAR_WIDTH, about 52 characters.
        limit: { value: Math.round((MAX_NAME_WIDTH * 0.8 * CHART_FONT_SIZE) / CHAR_WIDTH) },
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
        x: { signal: 'width', offset: 8 },
        y: { scale: 'y', field: 'key', band: 0.5 },
        text: { field: 'caption' },
        baseline: { value: 'middle' },
        fontSize: { value: CHART_FONT_SIZE },
      }),
      referenceRules('thresholdLines', 'thresholds', {
        above: 0,
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
