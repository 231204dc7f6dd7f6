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
});
