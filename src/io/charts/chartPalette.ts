/**
 * Colours, dash patterns and marker shapes shared by every chart in the report.
 *
 * Colours come from the eight-colour set of Okabe & Ito (2008), "Color Universal Design
 * (CUD): how to make figures and presentations that are friendly to colorblind people",
 * chosen because the hues stay apart for the common forms of colour-vision deficiency.
 * Colour alone never carries meaning here: every series also gets its own dash pattern and
 * marker shape, and lines and thresholds carry direct text labels, so a greyscale print
 * still tells them apart. Tier colours are picked far apart in lightness (dark blue, mid
 * orange, pale grey) for the same reason.
 */
import type { ComparatorId } from '../../core/compare/comparisonTypes.js';
import type { Tier } from '../../core/sensitivity/tierTypes.js';

export const OKABE_ITO = {
  black: '#000000',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
} as const;

/** Neutral greys for axes, grid and the negligible tier (not part of the Okabe–Ito set). */
export const NEUTRAL = { axis: '#555555', grid: '#DDDDDD', pale: '#D9D9D9', text: '#222222' } as const;

export interface TierStyle {
  fill: string;
  /** Outline, so the pale negligible bar still shows on white paper. */
  stroke: string;
}

export const TIER_STYLE: Record<Tier, TierStyle> = {
  critical: { fill: OKABE_ITO.blue, stroke: OKABE_ITO.black },
  moderate: { fill: OKABE_ITO.orange, stroke: OKABE_ITO.black },
  negligible: { fill: NEUTRAL.pale, stroke: NEUTRAL.axis },
};

/** Threshold rules: distinct dash patterns so the two lines differ without colour. */
export const THRESHOLD_STYLE = {
  critical: { stroke: OKABE_ITO.vermillion, dash: [8, 4] },
  moderate: { stroke: OKABE_ITO.black, dash: [2, 3] },
} as const;

export interface SeriesStyle {
  stroke: string;
  dash: number[];
  /** A vega symbol shape. */
  shape: string;
  strokeWidth: number;
}

/** One fixed style per comparator, so a plan looks the same in every chart and report. */
export const COMPARATOR_STYLE: Record<ComparatorId, SeriesStyle> = {
  proposed: { stroke: OKABE_ITO.black, dash: [], shape: 'circle', strokeWidth: 3 },
  conventional: { stroke: OKABE_ITO.vermillion, dash: [8, 4], shape: 'square', strokeWidth: 2 },
  'full-factorial': { stroke: OKABE_ITO.blue, dash: [2, 3], shape: 'triangle-up', strokeWidth: 2 },
  fractional: { stroke: OKABE_ITO.bluishGreen, dash: [10, 3, 2, 3], shape: 'diamond', strokeWidth: 2 },
  // Plackett–Burman plans rarely fit a model with curvature, so sharing vermillion with the
  // conventional plan (different dash and marker) seldom puts both on one chart.
  'plackett-burman': { stroke: OKABE_ITO.vermillion, dash: [1, 3], shape: 'arrow', strokeWidth: 2 },
  'full-grid': { stroke: OKABE_ITO.skyBlue, dash: [12, 4, 2, 4, 2, 4], shape: 'triangle-down', strokeWidth: 2 },
  'ccd-face': { stroke: OKABE_ITO.orange, dash: [6, 2], shape: 'triangle-left', strokeWidth: 2 },
  'ccd-rotatable': { stroke: OKABE_ITO.blue, dash: [1, 2], shape: 'triangle-right', strokeWidth: 2 },
  'box-behnken': { stroke: OKABE_ITO.reddishPurple, dash: [3, 2, 8, 2], shape: 'cross', strokeWidth: 2 },
};

/** Series for the threshold sweep chart, one per tier. */
export const SWEEP_SERIES_STYLE: Record<Tier, SeriesStyle> = {
  critical: { stroke: OKABE_ITO.blue, dash: [], shape: 'circle', strokeWidth: 2.5 },
  moderate: { stroke: OKABE_ITO.orange, dash: [8, 4], shape: 'square', strokeWidth: 2.5 },
  negligible: { stroke: NEUTRAL.axis, dash: [2, 3], shape: 'triangle-up', strokeWidth: 2.5 },
};
