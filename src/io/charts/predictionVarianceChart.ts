/**
 * Fraction-of-design-space (FDS) chart: for each plan, the scaled prediction variance that a
 * given fraction of the design region stays below.
 *
 * Method: Zahran, Anderson-Cook & Myers (2003), "Fraction of design space to assess
 * prediction capability of response surface designs", Journal of Quality Technology 35(4).
 * The curves are computed by the comparison stage (`Comparison.fdsCurves`); this module only
 * draws them. Lower and flatter is better. Variance is in σ² units (not multiplied by N),
 * so a plan with more runs is not penalised for its size. The y axis turns logarithmic when
 * the curves span more than a factor of 20.
 */
import type { Spec } from 'vega';
import type { Comparison } from '../../core/compare/comparisonTypes.js';
import { COMPARATOR_SHORT_NAME } from '../../core/compare/comparatorNames.js';
import { COMPARATOR_STYLE } from './chartPalette.js';
import { chartSpec, seriesLines, seriesMarkers, seriesScales } from './vegaSpecParts.js';
import { renderVegaSvg } from './vegaSvg.js';

// The report imports the legend names from here; their one home is comparatorNames.ts.
export { COMPARATOR_SHORT_NAME };

/** Fractions where a marker is drawn, so dashed lines keep a shape cue even when they overlap. */
const MARKER_FRACTIONS = [0, 0.25, 0.5, 0.75, 1];

export async function predictionVarianceChartSvg(comparison: Comparison): Promise<string | null> {
  const curves = comparison.fdsCurves.filter((curve) => curve.fraction.length >= 2 && curve.fraction.length === curve.variance.length);
  if (curves.length === 0) return null;
  const ids = curves.map((curve) => curve.id);
  const points = curves.flatMap((curve) =>
    curve.fraction.map((fraction, index) => ({ id: curve.id, fraction, variance: curve.variance[index] })),
  );
  const markers = curves.flatMap((curve) =>
    MARKER_FRACTIONS.map((target) => {
      let best = 0;
      curve.fraction.forEach((fraction, index) => {
        if (Math.abs(fraction - target) < Math.abs(curve.fraction[best] - target)) best = index;
      });
      return { id: curve.id, fraction: curve.fraction[best], variance: curve.variance[best] };
    }),
  );
  const positive = points.map((point) => point.variance).filter((value) => value > 0);
  const low = Math.min(...positive);
  const high = Math.max(...positive);
  const logarithmic = positive.length === points.length && high / low > 20;

  const spec: Spec = chartSpec({
    width: 290,
    height: 140,
    padding: 5,
    data: [{ name: 'points', values: points }, { name: 'markers', values: markers }],
    scales: [
      { name: 'x', type: 'linear', domain: [0, 1], range: 'width' },
      logarithmic
        ? { name: 'y', type: 'log', domain: { data: 'points', field: 'variance' }, range: 'height', nice: true }
        : { name: 'y', type: 'linear', domain: { data: 'points', field: 'variance' }, range: 'height', nice: true, zero: true },
      ...seriesScales(ids, (id) => COMPARATOR_STYLE[id], true),
      { name: 'name', type: 'ordinal', domain: ids, range: ids.map((id) => COMPARATOR_SHORT_NAME[id]) },
    ],
    axes: [
      { orient: 'bottom', scale: 'x', title: 'Fraction of the design region', format: '.0%', tickCount: 5, grid: true, labelPadding: 6 },
      {
        orient: 'left',
        scale: 'y',
        // Written level above the axis: vega's headless text measure overestimates, and a rotated
        // title longer than the plot is tall would pad the chart with blank space.
        title: `Prediction variance, σ²${logarithmic ? ' (log scale)' : ''}`,
        titleAngle: 0,
        titleAlign: 'left',
        titleBaseline: 'bottom',
        titleX: -30,
        titleY: -8,
        grid: true,
        ...(logarithmic ? { tickCount: 4 } : {}),
      },
    ],
    legends: [
      {
        stroke: 'stroke',
        strokeDash: 'dash',
        orient: 'right',
        offset: 12,
        direction: 'vertical',
        title: 'Plan',
        symbolType: 'stroke',
        symbolSize: 400,
        symbolStrokeWidth: 2.5,
        labelLimit: 360,
        encode: { labels: { update: { text: { scale: 'name', field: 'value' } } } },
      },
    ],
    marks: [
      seriesLines('fdsLines', { data: 'points', series: 'id', x: 'fraction', y: 'variance' }, 'scale'),
      seriesMarkers('fdsMarkers', { data: 'markers', series: 'id', x: 'fraction', y: 'variance' }, 45),
    ],
  });
  return renderVegaSvg(spec);
}
