/**
 * The vega specification parts every report chart shares: the config (fonts, axis and legend
 * colours that print well), the chart frame, the per-series scales, one line per series,
 * hollow markers and a vertical reference rule with its label.
 *
 * Vega's own vocabulary throughout (J. Heer et al., Vega 5/6 specification: scales, marks,
 * facets, encode blocks). Keeping these in one place means the three charts cannot drift
 * apart in look, and a style change (say a larger font for print) is made once.
 *
 * Conventions fixed here: every chart pads its own layout (`autosize: 'pad'`); series are
 * told apart by stroke colour, dash pattern AND marker shape (see chartPalette.ts), so the
 * three scales are always made together; markers are white-filled so overlapping series stay
 * readable; reference rules start a few pixels above the plot so their label sits over them.
 */
import type { EncodeEntry, Mark, Scale, Spec } from 'vega';
import { NEUTRAL, type SeriesStyle } from './chartPalette.js';

/** Vega config shared by every chart: plain fonts that print well, quiet axes. */
const CHART_CONFIG = {
  background: '#ffffff',
  font: 'Helvetica, Arial, sans-serif',
  axis: {
    labelColor: NEUTRAL.text,
    titleColor: NEUTRAL.text,
    domainColor: NEUTRAL.axis,
    tickColor: NEUTRAL.axis,
    gridColor: NEUTRAL.grid,
    labelFontSize: 11,
    titleFontSize: 11,
  },
  legend: { labelFontSize: 11, titleFontSize: 11, labelColor: NEUTRAL.text, titleColor: NEUTRAL.text },
  text: { fill: NEUTRAL.text, fontSize: 11 },
} as const;

/** A complete spec: the shared config and padding rule around the chart's own parts. */
export function chartSpec(parts: Omit<Spec, 'config' | 'autosize'>): Spec {
  return { autosize: 'pad', config: CHART_CONFIG, ...parts };
}

/** A mark of `type` drawn once per row of `data`, with its encoding fixed on entry. */
export function dataMark(type: 'text' | 'rect' | 'rule' | 'symbol', name: string, data: string, enter: EncodeEntry): Mark {
  return { type, name, from: { data }, encode: { enter } } as Mark;
}

/**
 * Ordinal scales `stroke`, `dash` and `shape` (plus `width` when asked) from series keys to
 * their style, so every series differs in colour, dash and marker at once.
 */
export function seriesScales<K extends string>(keys: readonly K[], styleOf: (key: K) => SeriesStyle, withWidth = false): Scale[] {
  const scale = (name: string, range: unknown[]): Scale => ({ name, type: 'ordinal', domain: [...keys], range: range as string[] });
  const scales = [
    scale('stroke', keys.map((key) => styleOf(key).stroke)),
    scale('dash', keys.map((key) => styleOf(key).dash)),
    scale('shape', keys.map((key) => styleOf(key).shape)),
  ];
  if (withWidth) scales.push(scale('width', keys.map((key) => styleOf(key).strokeWidth)));
  return scales;
}

export interface SeriesFields {
  /** Data set holding one row per point of every series. */
  data: string;
  /** Field naming the series (the domain of the series scales). */
  series: string;
  x: string;
  y: string;
}

/**
 * One line per series (a facet group), styled by the series scales. `strokeWidth` is a number,
 * or 'scale' to take it from the `width` scale.
 */
export function seriesLines(name: string, fields: SeriesFields, strokeWidth: number | 'scale'): Mark {
  return {
    type: 'group',
    from: { facet: { name: `${name}Series`, data: fields.data, groupby: fields.series } },
    marks: [
      {
        type: 'line',
        name,
        from: { data: `${name}Series` },
        encode: {
          enter: {
            x: { scale: 'x', field: fields.x },
            y: { scale: 'y', field: fields.y },
            stroke: { scale: 'stroke', field: fields.series },
            strokeDash: { scale: 'dash', field: fields.series },
            strokeWidth: strokeWidth === 'scale' ? { scale: 'width', field: fields.series } : { value: strokeWidth },
          },
        },
      },
    ],
  };
}

/** White-filled markers shaped and outlined by the series scales. */
export function seriesMarkers(name: string, fields: SeriesFields, size: number): Mark {
  return dataMark('symbol', name, fields.data, {
    x: { scale: 'x', field: fields.x },
    y: { scale: 'y', field: fields.y },
    shape: { scale: 'shape', field: fields.series },
    stroke: { scale: 'stroke', field: fields.series },
    fill: { value: '#ffffff' },
    size: { value: size },
    strokeWidth: { value: 1.5 },
  });
}

export interface ReferenceRuleStyle {
  /** Pixels above the plot where the rule starts. */
  above: number;
  strokeWidth: number;
  /** A constant stroke and dash, or vega signal expressions choosing them per datum. */
  stroke: { value: string } | { signal: string };
  strokeDash: { value: number[] } | { signal: string };
}

/** Vertical rules at `datum.at` on the x scale, from just above the plot to its bottom. */
export function referenceRules(name: string, data: string, style: ReferenceRuleStyle): Mark {
  return dataMark('rule', name, data, {
    x: { scale: 'x', field: 'at' },
    y: { value: -style.above },
    y2: { signal: 'height' },
    stroke: style.stroke,
    strokeDash: style.strokeDash,
    strokeWidth: { value: style.strokeWidth },
  });
}

/**
 * Labels beside the reference rules: `datum.text` just right of `datum.at`, at the y given
 * (a constant, or a field of the datum).
 */
export function referenceLabels(name: string, data: string, y: { value: number } | { field: string }, bold: boolean): Mark {
  return dataMark('text', name, data, {
    x: { scale: 'x', field: 'at', offset: 3 },
    y,
    text: { field: 'text' },
    baseline: { value: 'bottom' },
    fontSize: { value: 10 },
    ...(bold ? { fontWeight: { value: 'bold' } } : {}),
  });
}
