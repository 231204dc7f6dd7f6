/**
 * Report charts: vega SVG with the tier thresholds where they belong, user text escaped, and
 * series that stay apart without colour.
 */
import { describe, expect, it } from 'vitest';
import { indexChartSvg } from '../../src/io/charts/indexChart.js';
import { sweepSlice, thresholdSweepChartSvg } from '../../src/io/charts/thresholdSweepChart.js';
import { predictionVarianceChartSvg } from '../../src/io/charts/predictionVarianceChart.js';
import { COMPARATOR_STYLE, OKABE_ITO, THRESHOLD_STYLE, TIER_STYLE } from '../../src/io/charts/chartPalette.js';
import { HOSTILE_NAME, makeHostilePlanFixture, makePlanFixture } from '../fixtures/plan/sprayDryerPlan.js';

/** The `<g class="... name">…</g>` group vega writes for the mark called `name`. */
function markGroup(svg: string, name: string): string {
  const start = svg.indexOf(`role-mark ${name}"`);
  expect(start, `mark ${name} present`).toBeGreaterThan(-1);
  return svg.slice(start, svg.indexOf('</g>', start));
}

function translateX(element: string): number[] {
  return [...element.matchAll(/<line transform="translate\(([-\d.e]+),/g)].map((match) => Number(match[1]));
}

describe('index chart', () => {
  it('draws both thresholds at their index values, dashed differently, with labels', async () => {
    const plan = makePlanFixture();
    const svg = await indexChartSvg(plan.tiers);
    expect(svg.startsWith('<svg')).toBe(true);
    const rules = markGroup(svg, 'thresholdLines');
    const [criticalX, moderateX] = translateX(rules);
    // x is linear from 0, so the pixel positions stand in the ratio of the thresholds (0.30 / 0.05).
    expect(criticalX / moderateX).toBeCloseTo(plan.tiers.policy.critical / plan.tiers.policy.moderate, 6);
    expect(rules).toContain(`stroke-dasharray="${THRESHOLD_STYLE.critical.dash.join(',')}"`);
    expect(rules).toContain(`stroke-dasharray="${THRESHOLD_STYLE.moderate.dash.join(',')}"`);
    expect(svg).toContain('critical ≥ 0.30');
    expect(svg).toContain('moderate ≥ 0.05');
  });

  it('draws one bar and one first-order marker per factor, bar length proportional to the total index', async () => {
    const plan = makePlanFixture();
    const svg = await indexChartSvg(plan.tiers);
    const bars = [...markGroup(svg, 'totalBars').matchAll(/<path[^>]*d="M0,[-\d.]+h([\d.]+)v/g)].map((m) => Number(m[1]));
    expect(bars).toHaveLength(plan.tiers.factors.length);
    const totals = [...plan.tiers.factors].map((f) => f.aggregatedTotal).sort((a, b) => b - a);
    // Sorted largest first; every bar width / total index is the same scale factor.
    const scale = bars[0] / totals[0];
    bars.forEach((width, index) => expect(width / totals[index]).toBeCloseTo(scale, 6));
    expect((markGroup(svg, 'firstOrder').match(/<path/g) ?? []).length).toBe(plan.tiers.factors.length);
    expect(svg).toContain(`fill="${TIER_STYLE.critical.fill}"`);
  });

  it('shows a hostile factor name as escaped text, never as markup', async () => {
    const svg = await indexChartSvg(makeHostilePlanFixture().tiers);
    expect(svg).not.toContain('<script');
    expect(svg).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp;');
    expect(HOSTILE_NAME).toContain('<script>');
  });
});

describe('threshold sweep chart', () => {
  it('takes each slice with the other threshold held at the policy value', () => {
    const tiers = makePlanFixture().tiers;
    const critical = sweepSlice(tiers, 'critical');
    const moderate = sweepSlice(tiers, 'moderate');
    expect(critical?.map((row) => row.critical)).toEqual([0.2, 0.25, 0.3, 0.35, 0.4]);
    expect(critical?.every((row) => row.moderate === 0.05)).toBe(true);
    expect(moderate?.map((row) => row.moderate)).toEqual([0.01, 0.02, 0.03, 0.04, 0.05, 0.1, 0.2]);
  });

  it('draws one line per tier, a marker per row and tier, and marks the threshold in use', async () => {
    const tiers = makePlanFixture().tiers;
    const svg = await thresholdSweepChartSvg(tiers, 'critical');
    expect(svg).not.toBeNull();
    expect((svg!.match(/role-mark sweepLines"/g) ?? []).length).toBe(3);
    expect((markGroup(svg!, 'sweepMarkers').match(/<path/g) ?? []).length).toBe(5 * 3);
    expect(svg).toContain('in use: 0.30');
    for (const tier of ['critical', 'moderate', 'negligible']) expect(markGroup(svg!, 'sweepLabels')).toContain(`>${tier}</text>`);
    // Labels in dark text (contrast on greyscale paper), never in the pale orange of the moderate line.
    expect(markGroup(svg!, 'sweepLabels')).not.toContain(`fill="${OKABE_ITO.orange}"`);
  });

  it('returns null when a slice has fewer than two thresholds', async () => {
    const tiers = { ...makePlanFixture().tiers, sweep: [] };
    expect(await thresholdSweepChartSvg(tiers, 'critical')).toBeNull();
  });
});

describe('prediction-variance (FDS) chart', () => {
  it('draws one curve per fitted plan with a legend, on a log axis when the curves span more than 20×', async () => {
    const comparison = makePlanFixture().comparison!;
    const svg = await predictionVarianceChartSvg(comparison);
    expect(svg).not.toBeNull();
    expect((svg!.match(/role-mark fdsLines"/g) ?? []).length).toBe(comparison.fdsCurves.length);
    expect(svg).toContain('Proposed plan');
    expect(svg).toContain('Box–Behnken');
    // Fixture curves run from 0.13 × 0.2 to 0.8: a span of about 31.
    expect(svg).toContain('(log scale)');
  });

  it('stays linear when the curves are close, and returns null without curves', async () => {
    const comparison = makePlanFixture().comparison!;
    const close = { ...comparison, fdsCurves: comparison.fdsCurves.filter((curve) => curve.id !== 'conventional') };
    expect(await predictionVarianceChartSvg(close)).not.toContain('log scale');
    expect(await predictionVarianceChartSvg({ ...comparison, fdsCurves: [] })).toBeNull();
  });
});

describe('chart palette', () => {
  // Luma from gamma-encoded RGB with the ITU-R BT.709 weights (0.2126, 0.7152, 0.0722): a
  // stand-in for how dark a colour prints in greyscale.
  function luma(hex: string): number {
    const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
    return 0.2126 * r + 0.7152 * g + 0.0722 * b;
  }

  it('uses Okabe–Ito colours (Okabe & Ito 2008) for every comparator', () => {
    const palette = new Set<string>(Object.values(OKABE_ITO));
    for (const style of Object.values(COMPARATOR_STYLE)) expect(palette.has(style.stroke)).toBe(true);
    expect(OKABE_ITO.vermillion).toBe('#D55E00');
    expect(OKABE_ITO.bluishGreen).toBe('#009E73');
  });

  it('gives every comparator its own dash pattern and marker, so greyscale print keeps them apart', () => {
    const styles = Object.values(COMPARATOR_STYLE);
    expect(new Set(styles.map((style) => style.dash.join(','))).size).toBe(styles.length);
    expect(new Set(styles.map((style) => style.shape)).size).toBe(styles.length);
  });

  it('keeps the three tier fills at least 0.15 apart in greyscale lightness', () => {
    const values = [TIER_STYLE.critical.fill, TIER_STYLE.moderate.fill, TIER_STYLE.negligible.fill].map(luma);
    for (let i = 0; i < values.length; i += 1) {
      for (let j = i + 1; j < values.length; j += 1) expect(Math.abs(values[i] - values[j])).toBeGreaterThan(0.15);
    }
  });
});
