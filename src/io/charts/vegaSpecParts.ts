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
 * readable; reference rules stay inside the plot and their labels sit above it, so no label is
 * ever struck through by a line.
 */
import type { EncodeEntry, Mark, Scale, Spec } from 'vega';
import { NEUTRAL, type SeriesStyle } from './chartPalette.js';

/**
 * Text size of every chart, in SVG pixels. The report never shows a chart larger than its
 * natural size, and each chart is sized so that its column shows it at no less than 0.89 of it
 * (report template widths), so 12 px prints at 8 pt or more (12 × 0.89 px = 8 pt at 96 px per
 * inch). Checked in the browser test.
 */
export const CHART_FONT_SIZE = 12;

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
    labelFontSize: CHART_FONT_SIZE,
    titleFontSize: CHART_FONT_SIZE,
  },
  legend: { labelFontSize: CHART_FONT_SIZE, titleFontSize: CHART_FONT_SIZE, labelColor: NEUTRAL.text, titleColor: NEUTRAL.text },
  text: { fill: NEUTRAL.text, fontSize: CHART_FONT_SIZE },
} as const;

/** A complete spec: the shared config and padding rule (`pad` unless the chart sizes its own frame). */
export function chartSpec(parts: Omit<Spec, 'config'>): Spec {
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
 * Labels of the reference rules, above the plot where no rule reaches: `datum.text` starting at
 * `datum.at`, its baseline at the y given (a constant, or a field of the datum; negative = above
 * the plot). Rules drawn with `above` smaller than the label's distance never cross it.
 */
export function referenceLabels(name: string, data: string, y: { value: number } | { field: string }, bold: boolean): Mark {
  return dataMark('text', name, data, {
    x: { scale: 'x', field: 'at', offset: -2 },
    y,
    text: { field: 'text' },
    baseline: { value: 'bottom' },
    fontSize: { value: CHART_FONT_SIZE },
    ...(bold ? { fontWeight: { value: 'bold' } } : {}),
  });
}
