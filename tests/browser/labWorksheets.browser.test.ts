/**
 * Lab worksheets in a real browser: printed to PDF, every run takes exactly one page, and
 * the caution box is on every page.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { labWorksheetsHtml } from '../../src/io/labWorksheets.js';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';
import { makeHostilePlanFixture, makePlanFixture, makeSchedule } from '../fixtures/plan/sprayDryerPlan.js';
import { announceAvailability, hasChromium, launchChromium, pdfPageCount } from './chromiumBrowser.js';

announceAvailability();

/** The fixture with every operating factor varied and six responses: the fullest page we expect. */
function crowdedPlan(): PlanDocument {
  const plan = makePlanFixture();
  plan.levels = plan.levels.map((level) =>
    level.id === 'air_flow' ? { ...level, varied: true, values: [350, 400, 450], coded: [-1, 0, 1], fixedAt: null } : level,
  );
  plan.study.responses = [
    ...plan.study.responses,
    { id: 'bulk_density', name: 'Bulk density after 100 taps', unit: 'g/mL', weight: 1 },
    { id: 'solubility', name: 'Solubility index', unit: 'mL', weight: 1 },
    { id: 'colour', name: 'Colour lightness L*', unit: '-', weight: 1 },
  ];
  plan.study.factors = plan.study.factors.map((factor) =>
    factor.id === 'feed_rate' ? { ...factor, name: 'Feed rate to the rotary atomiser measured at the dosing pump outlet' } : factor,
  );
  return plan;
}

describe.skipIf(!hasChromium)('lab worksheets in Chromium', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
  });

  async function printedPages(html: string): Promise<{ pages: number; cautionBoxes: number; requests: string[] }> {
    const page = await browser.newPage();
    const requests: string[] = [];
    page.on('request', (request) => requests.push(request.url()));
    await page.setContent(html, { waitUntil: 'load' });
    await page.emulateMedia({ media: 'print' });
    const cautionBoxes = await page.locator('.caution').evaluateAll(
      (boxes) => boxes.filter((box) => box.getBoundingClientRect().height > 0).length,
    );
    const pdf = await page.pdf({ preferCSSPageSize: true });
    await page.close();
    return { pages: pdfPageCount(pdf), cautionBoxes, requests };
  }

  it('prints one page per run, with a visible caution on each, and fetches nothing', async () => {
    const schedule = makeSchedule();
    const { pages, cautionBoxes, requests } = await printedPages(await labWorksheetsHtml(makePlanFixture(), schedule));
    expect(pages).toBe(schedule.order.length);
    expect(cautionBoxes).toBe(schedule.order.length);
    expect(requests.filter((url) => !url.startsWith('data:') && url !== 'about:blank')).toEqual([]);
  });

  it('still prints one page per run with four varied factors, six responses and a long factor name', async () => {
    const plan = crowdedPlan();
    const { pages } = await printedPages(await labWorksheetsHtml(plan, makeSchedule()));
    expect(pages).toBe(plan.runs.length);
  });

  it('shows a hostile factor name as text and runs no script', async () => {
    const plan = makeHostilePlanFixture();
    const page = await browser.newPage();
    let dialogs = 0;
    page.on('dialog', async (dialog) => {
      dialogs += 1;
      await dialog.dismiss();
    });
    await page.setContent(await labWorksheetsHtml(plan, plan.schedule), { waitUntil: 'load' });
    expect(await page.locator('script').count()).toBe(0);
    const firstName = await page.locator('.setpoints .name').first().innerText();
    expect(firstName).toContain('<script>alert(1)</script> & "quoted" \'x\'');
    expect(dialogs).toBe(0);
    await page.close();
  });
});
