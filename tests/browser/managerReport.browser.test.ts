/**
 * Manager report in a real browser: the charts render as visible SVG, nothing logs an
 * error, nothing is fetched, and a hostile factor name stays text.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { managerReportHtml } from '../../src/io/managerReport.js';
import { HOSTILE_NAME, makeHostilePlanFixture, makePlanFixture } from '../fixtures/plan/sprayDryerPlan.js';
import { announceAvailability, hasChromium, launchChromium, pdfPageCount } from './chromiumBrowser.js';

announceAvailability();

describe.skipIf(!hasChromium)('manager report in Chromium', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
  });

  async function open(html: string): Promise<{ page: Page; problems: string[]; requests: string[] }> {
    const page = await browser.newPage();
    const problems: string[] = [];
    const requests: string[] = [];
    page.on('console', (message) => {
      if (message.type() === 'error' || message.type() === 'warning') problems.push(message.text());
    });
    page.on('pageerror', (error) => problems.push(error.message));
    page.on('dialog', async (dialog) => {
      problems.push(`dialog: ${dialog.message()}`);
      await dialog.dismiss();
    });
    page.on('request', (request) => requests.push(request.url()));
    await page.setContent(html, { waitUntil: 'load' });
    return { page, problems, requests };
  }

  it('renders every chart as a visible SVG without console errors or fetches', async () => {
    const plan = makePlanFixture();
    const { page, problems, requests } = await open(await managerReportHtml(plan, plan.schedule));
    const boxes = await page.locator('figure.chart > svg').evaluateAll((svgs) =>
      svgs.map((svg) => {
        const box = svg.getBoundingClientRect();
        return { width: box.width, height: box.height, texts: svg.querySelectorAll('text').length };
      }),
    );
    // Index chart, two sweep slices, prediction-variance curves.
    expect(boxes).toHaveLength(4);
    for (const box of boxes) {
      expect(box.width).toBeGreaterThan(100);
      expect(box.height).toBeGreaterThan(80);
      expect(box.texts).toBeGreaterThan(5);
    }
    // The threshold lines are drawn and lie inside the index chart.
    const ruleWidths = await page
      .locator('#index-chart .thresholdLines line')
      .evaluateAll((lines) => lines.map((line) => line.getBoundingClientRect().height));
    expect(ruleWidths).toHaveLength(2);
    for (const height of ruleWidths) expect(height).toBeGreaterThan(50);
    expect(problems).toEqual([]);
    expect(requests.filter((url) => !url.startsWith('data:') && url !== 'about:blank')).toEqual([]);
    await page.close();
  });

  it('shows a hostile factor name as text in the page and in the chart, and runs no script', async () => {
    const plan = makeHostilePlanFixture();
    const { page, problems } = await open(await managerReportHtml(plan, plan.schedule));
    expect(await page.locator('script').count()).toBe(0);
    const chartTexts = await page.locator('#index-chart svg text').allTextContents();
    expect(chartTexts.some((text) => text.startsWith('<script>alert(1)</script>'))).toBe(true);
    expect(await page.locator('body').innerText()).toContain(HOSTILE_NAME);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('prints with the appendix starting on a new page, also without a comparison', async () => {
    for (const plan of [makePlanFixture(), makePlanFixture({ comparison: undefined, schedule: undefined })]) {
      const { page, problems } = await open(await managerReportHtml(plan));
      const withAppendix = pdfPageCount(await page.pdf({ preferCSSPageSize: true }));
      await page.locator('.appendix').evaluate((appendix) => appendix.remove());
      const withoutAppendix = pdfPageCount(await page.pdf({ preferCSSPageSize: true }));
      expect(withoutAppendix).toBeGreaterThanOrEqual(1);
      // The case itself (decision, charts, comparison, calibration list, caveats) fits two A4 sheets.
      expect(withoutAppendix).toBeLessThanOrEqual(2);
      expect(withAppendix).toBeGreaterThan(withoutAppendix);
      expect(problems).toEqual([]);
      await page.close();
    }
  });
  it('holds the decision, the sessions and the approval block on printed page 1', async () => {
    const plan = makePlanFixture();
    const { page, problems } = await open(await managerReportHtml(plan, plan.schedule));
    for (const id of ['decision', 'key-figures', 'sessions', 'risk', 'fallback', 'approval']) {
      expect(await page.locator(`.page-one #${id}`).count(), id).toBe(1);
    }
    expect(await page.locator('.page-one #decision p').count()).toBe(2);
    expect(await page.locator('.page-one #approval tbody tr').count()).toBe(3);
    // Everything after page 1 removed, the rest prints on exactly one A4 page.
    await page.locator('.page-one').evaluate((one) => {
      while (one.nextSibling) one.nextSibling.remove();
      (one as unknown as { style: { breakAfter: string } }).style.breakAfter = 'auto';
    });
    expect(pdfPageCount(await page.pdf({ preferCSSPageSize: true, format: 'A4' }))).toBe(1);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('draws no chart text over other text or a line, at 8 pt or more as printed', async () => {
    const plan = makePlanFixture();
    const { page } = await open(await managerReportHtml(plan, plan.schedule));
    // A4 less 2 × 12 mm margins at 96 px per inch, in print media: the width the charts print at.
    await page.setViewportSize({ width: 703, height: 1000 });
    await page.emulateMedia({ media: 'print' });
    const charts = await page.locator('figure.chart > svg').evaluateAll((svgs) =>
      svgs.map((svg) => {
        const box = (el: { getBoundingClientRect(): { left: number; right: number; top: number; bottom: number } }) => {
          const r = el.getBoundingClientRect();
          return { left: r.left, right: r.right, top: r.top, bottom: r.bottom };
        };
        const viewBox = (svg as unknown as { viewBox: { baseVal: { width: number } | null } }).viewBox.baseVal;
        const scale = viewBox && viewBox.width > 0 ? svg.getBoundingClientRect().width / viewBox.width : 1;
        const texts = [...svg.querySelectorAll('text')]
          .filter((text) => (text.textContent ?? '').trim() !== '')
          .map((text) => ({ text: text.textContent!, ...box(text), size: parseFloat(svg.ownerDocument.defaultView!.getComputedStyle(text).fontSize) * scale }));
        const lines = [...svg.querySelectorAll('.thresholdLines line, .thresholdLines path')].map(box);
        return { id: svg.parentElement!.id, texts, lines };
      }),
    );
    expect(charts.length).toBe(4);
    const overlap = (a: { left: number; right: number; top: number; bottom: number }, b: typeof a) =>
      Math.min(a.right, b.right) - Math.max(a.left, b.left) > 0.5 && Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top) > 0.5;
    for (const chart of charts) {
      expect(chart.texts.length, chart.id).toBeGreaterThan(5);
      for (const text of chart.texts) {
        // 8 pt = 8 × 96 / 72 px.
        expect(text.size, `${chart.id}: ${text.text}`).toBeGreaterThanOrEqual((8 * 96) / 72 - 0.01);
        for (const line of chart.lines) expect(overlap(text, line), `${chart.id}: "${text.text}" on a threshold line`).toBe(false);
      }
      for (let i = 0; i < chart.texts.length; i++) {
        for (let j = i + 1; j < chart.texts.length; j++) {
          expect(overlap(chart.texts[i], chart.texts[j]), `${chart.id}: "${chart.texts[i].text}" and "${chart.texts[j].text}" ${JSON.stringify([chart.texts[i], chart.texts[j]])}`).toBe(false);
        }
      }
    }
    await page.close();
  });
});
