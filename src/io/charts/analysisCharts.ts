/**
 * The four charts of the analysis report, per response:
 * - observed against predicted (fitted runs by their fitted value, holdouts by their
 *   prediction, drawn as different markers), with the line of equality;
 * - residuals against run order, to show drift over the campaign (Montgomery, 2017, "Design
 *   and Analysis of Experiments", §3.4, residuals in time sequence);
 * - the prediction interval at each holdout, with the prediction and the observed value;
 * - the total indices side by side: the process model's and the lab's, as shares of the
 *   varied factors (the comparison of campaignAnalysis.ts).
 *
 * Vega specifications with inline data, rendered to SVG by vegaSvg.ts (text marks escaped by
 * vega). Conventions: series differ by colour AND marker shape, so the charts read in grey
 * print too; nulls are left out of the data.
 */
import type { Spec } from 'vega';
import type { CampaignResponse } from '../../core/results/campaignAnalysis.js';
import { NEUTRAL, OKABE_ITO } from './chartPalette.js';
import { chartSpec } from './vegaSpecParts.js';
import { renderVegaSvg } from './vegaSvg.js';

const SIZE = 220;
const FIT = { key: 'fitted run', colour: OKABE_ITO.blue, shape: 'circle' } as const;
const HOLDOUT = { key: 'holdout run', colour: OKABE_ITO.vermillion, shape: 'diamond' } as const;

function axisTitle(text: string, unit: string): string {
  return unit && unit !== '-' ? `${text} [${unit}]` : text;
}

const kindScales = [
  { name: 'colour', type: 'ordinal', domain: [FIT.key, HOLDOUT.key], range: [FIT.colour, HOLDOUT.colour] },
  { name: 'shape', type: 'ordinal', domain: [FIT.key, HOLDOUT.key], range: [FIT.shape, HOLDOUT.shape] },
] as const;

export async function observedPredictedSvg(response: CampaignResponse): Promise<string> {
  const points = [
    ...response.runs.filter((r) => r.observed !== null && r.fitted !== null).map((r) => ({ kind: FIT.key, observed: r.observed, predicted: r.fitted, run: r.run })),
    ...response.holdout.filter((h) => h.observed !== null && h.predicted !== null).map((h) => ({ kind: HOLDOUT.key, observed: h.observed, predicted: h.predicted, run: h.run })),
  ];
  const values = points.flatMap((p) => [p.observed as number, p.predicted as number]);
  const low = Math.min(...values);
  const high = Math.max(...values);
  const pad = (high - low) * 0.05 || 1;
  const domain = [low - pad, high + pad];
  const spec: Spec = chartSpec({
    width: SIZE,
    height: SIZE,
    padding: 5,
    data: [
      { name: 'points', values: points },
      { name: 'equality', values: [{ v: domain[0] }, { v: domain[1] }] },
    ],
    scales: [
      { name: 'x', type: 'linear', domain, range: 'width', nice: false, zero: false },
      { name: 'y', type: 'linear', domain, range: 'height', nice: false, zero: false },
      ...kindScales,
    ] as Spec['scales'],
    axes: [
      { orient: 'bottom', scale: 'x', title: axisTitle('Predicted', response.unit), grid: true, tickCount: 5 },
      { orient: 'left', scale: 'y', title: axisTitle('Observed', response.unit), grid: true, tickCount: 5 },
    ],
    legends: [{ fill: 'colour', shape: 'shape', orient: 'bottom', direction: 'horizontal' }],
    marks: [
      { type: 'line', from: { data: 'equality' }, encode: { enter: { x: { scale: 'x', field: 'v' }, y: { scale: 'y', field: 'v' }, stroke: { value: NEUTRAL.axis }, strokeDash: { value: [4, 3] } } } },
      {
        type: 'symbol',
        from: { data: 'points' },
        encode: { enter: { x: { scale: 'x', field: 'predicted' }, y: { scale: 'y', field: 'observed' }, shape: { scale: 'shape', field: 'kind' }, stroke: { scale: 'colour', field: 'kind' }, fill: { value: '#ffffff' }, strokeWidth: { value: 1.5 }, size: { value: 45 } } },
      },
    ],
  });
  return renderVegaSvg(spec);
}

export async function residualOrderSvg(response: CampaignResponse): Promise<string> {
  const points = response.runs.filter((r) => r.residual !== null).map((r) => ({ run: r.run, residual: r.residual }));
  const spec: Spec = chartSpec({
    width: SIZE * 1.4,
    height: SIZE * 0.7,
    padding: 5,
    data: [{ name: 'points', values: points }],
    scales: [
      { name: 'x', type: 'linear', domain: { data: 'points', field: 'run' }, range: 'width', nice: true, zero: false },
      { name: 'y', type: 'linear', domain: { data: 'points', field: 'residual' }, range: 'height', nice: true, zero: true },
    ],
    axes: [
      { orient: 'bottom', scale: 'x', title: 'Run no. (order run)', tickMinStep: 1 },
      { orient: 'left', scale: 'y', title: axisTitle('Residual', response.unit), grid: true, tickCount: 5 },
    ],
    marks: [
      { type: 'rule', encode: { enter: { x: { value: 0 }, x2: { signal: 'width' }, y: { scale: 'y', value: 0 }, stroke: { value: NEUTRAL.axis } } } },
      { type: 'line', from: { data: 'points' }, encode: { enter: { x: { scale: 'x', field: 'run' }, y: { scale: 'y', field: 'residual' }, stroke: { value: NEUTRAL.pale } } } },
      { type: 'symbol', from: { data: 'points' }, encode: { enter: { x: { scale: 'x', field: 'run' }, y: { scale: 'y', field: 'residual' }, stroke: { value: FIT.colour }, fill: { value: '#ffffff' }, strokeWidth: { value: 1.5 }, size: { value: 40 } } } },
    ],
  });
  return renderVegaSvg(spec);
}

export async function holdoutIntervalSvg(response: CampaignResponse): Promise<string | null> {
  const rows = response.holdout
    .filter((h) => h.lower !== null && h.upper !== null && h.predicted !== null)
    .map((h) => ({ label: `run ${h.run} (${h.point})`, lower: h.lower, upper: h.upper, predicted: h.predicted, observed: h.observed, inside: h.inside !== false }));
  if (rows.length === 0) return null;
  const spec: Spec = chartSpec({
    width: SIZE * 1.4,
    height: Math.max(40, rows.length * 28),
    padding: 5,
    data: [
      { name: 'rows', values: rows },
      { name: 'observed', source: 'rows', transform: [{ type: 'filter', expr: 'datum.observed != null' }] },
    ],
    scales: [
      { name: 'x', type: 'linear', domain: { data: 'rows', fields: ['lower', 'upper', 'observed'] }, range: 'width', nice: true, zero: false },
      { name: 'y', type: 'band', domain: rows.map((r) => r.label), range: 'height', padding: 0.4 },
    ],
    axes: [
      { orient: 'bottom', scale: 'x', title: axisTitle(response.name, response.unit), grid: true, tickCount: 5 },
      { orient: 'left', scale: 'y' },
    ],
    marks: [
      { type: 'rule', from: { data: 'rows' }, encode: { enter: { x: { scale: 'x', field: 'lower' }, x2: { scale: 'x', field: 'upper' }, y: { scale: 'y', field: 'label', band: 0.5 }, stroke: { value: FIT.colour }, strokeWidth: { value: 3 } } } },
      { type: 'rect', from: { data: 'rows' }, encode: { enter: { xc: { scale: 'x', field: 'predicted' }, width: { value: 2 }, y: { scale: 'y', field: 'label' }, height: { scale: 'y', band: 1 }, fill: { value: NEUTRAL.text } } } },
      {
        type: 'symbol',
        from: { data: 'observed' },
        encode: { enter: { x: { scale: 'x', field: 'observed' }, y: { scale: 'y', field: 'label', band: 0.5 }, shape: { value: 'diamond' }, fill: { signal: `datum.inside ? '#ffffff' : '${HOLDOUT.colour}'` }, stroke: { value: HOLDOUT.colour }, strokeWidth: { value: 1.5 }, size: { value: 70 } } },
      },
    ],
  });
  return renderVegaSvg(spec);
}

export async function indexComparisonSvg(response: CampaignResponse): Promise<string | null> {
  const rows = response.labVsModel.factors.flatMap((f) => [
    ...(f.planShare !== null ? [{ factor: f.factor, source: 'process model', share: f.planShare }] : []),
    ...(f.labShare !== null ? [{ factor: f.factor, source: 'lab', share: f.labShare }] : []),
  ]);
  if (rows.length === 0) return null;
  const factors = response.labVsModel.factors.map((f) => f.factor);
  const spec: Spec = chartSpec({
    width: SIZE * 1.4,
    height: factors.length * 34,
    padding: 5,
    data: [{ name: 'rows', values: rows }],
    scales: [
      { name: 'x', type: 'linear', domain: [0, 1], range: 'width', nice: false, zero: true },
      { name: 'y', type: 'band', domain: factors, range: 'height', padding: 0.2 },
      { name: 'colour', type: 'ordinal', domain: ['process model', 'lab'], range: [NEUTRAL.pale, OKABE_ITO.blue] },
      { name: 'offset', type: 'band', domain: ['process model', 'lab'], range: [0, { signal: "bandwidth('y')" }], padding: 0.1 } as never,
    ],
    axes: [
      { orient: 'bottom', scale: 'x', title: "Share of the varied factors' total index", grid: true, tickCount: 5 },
      { orient: 'left', scale: 'y' },
    ],
    legends: [{ fill: 'colour', orient: 'bottom', direction: 'horizontal' }],
    marks: [
      {
        type: 'rect',
        from: { data: 'rows' },
        encode: {
          enter: {
            x: { scale: 'x', value: 0 },
            x2: { scale: 'x', field: 'share' },
            y: { signal: "scale('y', datum.factor) + scale('offset', datum.source)" },
            height: { signal: "bandwidth('y') / 2 - 1" },
            fill: { scale: 'colour', field: 'source' },
            stroke: { value: NEUTRAL.axis },
            strokeWidth: { value: 0.5 },
          },
        },
      },
    ],
  });
  return renderVegaSvg(spec);
}
