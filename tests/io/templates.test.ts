/**
 * Lab worksheets and manager report rendered from the hand-made plan fixture: structure,
 * self-containment, escaping, the caution on every run page and the stated references.
 */
import { describe, expect, it } from 'vitest';
import { labWorksheetsHtml } from '../../src/io/labWorksheets.js';
import { managerReportHtml, runsOutsideLimits } from '../../src/io/managerReport.js';
import { InputError } from '../../src/core/inputError.js';
import { makeHostilePlanFixture, makePlanFixture, makeSchedule } from '../fixtures/plan/sprayDryerPlan.js';

const CAUTION = 'Check every setting on this sheet against the equipment’s rated limits and the site’s safety procedures before starting.';
const ESCAPED_HOSTILE = '&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;quoted&quot; &#x27;x&#x27;';

function count(text: string, needle: string): number {
  return text.split(needle).length - 1;
}

/** Nothing fetched from elsewhere: no remote src/href, no stylesheet links, no scripts, no CSS imports. */
function expectSelfContained(html: string): void {
  expect(html).not.toMatch(/\s(src|href)\s*=\s*["']?\s*(https?:)?\/\//i);
  expect(html).not.toMatch(/<link\b/i);
  expect(html).not.toMatch(/<script\b/i);
  expect(html).not.toMatch(/@import|url\(\s*["']?(https?:)?\/\//i);
  expect(html).not.toMatch(/<img\b/i);
}

/** The HTML of each run page, in document order. */
function runPages(html: string): string[] {
  return html.split('<section class="run-page"').slice(1);
}

describe('lab worksheets', () => {
  it('has one page block per scheduled run, in execution order, each with the caution', async () => {
    const plan = makePlanFixture();
    const schedule = makeSchedule();
    const html = await labWorksheetsHtml(plan, schedule);
    const pages = runPages(html);
    expect(pages).toHaveLength(schedule.order.length);
    pages.forEach((page, index) => {
      const entry = schedule.order[index];
      expect(page).toContain(`data-sequence="${entry.sequence}"`);
      expect(page).toContain(`point <strong>${entry.point}</strong>`);
      expect(page).toContain(`Day ${entry.session}`);
      expect(page).toContain(`Plan <strong>${plan.planId}</strong>`);
      expect(page).toContain(CAUTION);
      expect(page).toContain('This plan does not replace a hazard review.');
      expect(page).toContain('Local codes and licensed practice prevail');
      expect(page).toContain('Operator (name, signature)');
      // The kind of run in the run sheets' words (runSheetTable.ts PURPOSE_WORDS).
      const words = { fit: 'Model run', centre: 'Centre repeat', holdout: 'Validation run' }[entry.purpose];
      expect(page).toContain(`<strong>${words}</strong>`);
    });
    // Print CSS: a page break after every run page but the last.
    expect(html).toMatch(/\.run-page\s*\{[^}]*break-after:\s*page/);
    expect(html).toMatch(/\.run-page:last-child\s*\{[^}]*break-after:\s*auto/);
    expectSelfContained(html);
  });

  it('prints each run’s set-points with units, the fixed settings and a field per response', async () => {
    const plan = makePlanFixture();
    const html = await labWorksheetsHtml(plan, makeSchedule());
    // Run 1 is point C1: 180 °C, 37.5 % w/w, 12.0 kg/h; air flow fixed at 400 m³/h.
    const first = runPages(html)[0];
    expect(first).toMatch(/<td class="value">180<\/td>\s*<td class="unit">°C<\/td>/);
    expect(first).toMatch(/<td class="value">37\.5<\/td>\s*<td class="unit">% w\/w<\/td>/);
    expect(first).toMatch(/<td class="value">12\.0<\/td>\s*<td class="unit">kg\/h<\/td>/);
    expect(first).toContain('Drying air flow 400 m³/h');
    for (const response of plan.study.responses) expect(first).toContain(`<td>${response.name}</td><td>${response.unit}</td>`);
    expect(first).toContain('Set Feed rate to 12.0 kg/h.');
    expect(first).toContain('hard to change');
    // Run 2 (F03: 160 °C) follows C1 (180 °C) on the same day: the temperature changes.
    // The change says from what to what, in the step list too.
    expect(runPages(html)[1]).toContain('CHANGE from 180 to 160 °C');
    expect(runPages(html)[1]).toContain('Change Inlet air temperature from 180 to 160 °C.');
    expect(first).toContain('first run: set to 180 °C');
    // A box for the value actually set, and every record field of the run sheet by name.
    expect(first).toContain('As run, only if different');
    expect(first).toMatch(/<td class="as-run"><\/td>/);
    for (const field of ['Start time:', 'End time:', 'Material lot:', 'Operator (name, signature)', 'Checked by (name, signature)', 'Date:']) {
      expect(first).toContain(field);
    }
    // Model parameters are not bench settings.
    expect(html).not.toContain('Effective moisture diffusivity');
  });

  it('shows a wait step with the settling time after a hard-to-change setting changes', async () => {
    const plan = makePlanFixture();
    const inlet = plan.study.factors.find((factor) => factor.id === 'inlet_temp')!;
    inlet.settleMinutes = 40;
    const pages = runPages(await labWorksheetsHtml(plan, makeSchedule()));
    // Run 2 changes the inlet temperature: wait; a run that keeps it does not.
    expect(pages[1]).toContain('Wait 40 min for Inlet air temperature to settle after the change.');
    expect(pages[1]).toContain('<span class="tag">wait 40 min</span>');
    const kept = pages.filter((page) => page.includes('same as run'));
    for (const page of kept.filter((p) => !/CHANGE from [^<]* °C/.test(p))) expect(page).not.toContain('Wait 40 min');
  });

  it('shows each session’s bench hours and warns above sessions.hours', async () => {
    const plan = makePlanFixture();
    plan.study.costs = { ...(plan.study.costs ?? { currency: 'EUR', perRun: 100 }), hoursPerRun: 3 } as typeof plan.study.costs;
    plan.study.sessions = { ...plan.study.sessions!, hours: 8 };
    const html = await labWorksheetsHtml(plan, makeSchedule());
    const first = runPages(html)[0];
    expect(first).toMatch(/<p class="session">Day 1: runs 1–\d+, [\d.]+ h/);
    expect(first).toMatch(/<p class="session-warning">⚠ Day 1 holds [\d.]+ h of bench work, more than the 8 h one day may hold \(sessions\.hours\)/);
    plan.study.sessions = { ...plan.study.sessions!, hours: 100 };
    expect(runPages(await labWorksheetsHtml(plan, makeSchedule()))[0]).not.toContain('session-warning');
  });

  it('puts the run order and its seed in the page footer', async () => {
    const plan = makePlanFixture();
    const schedule = makeSchedule();
    const page = runPages(await labWorksheetsHtml(plan, schedule))[0];
    const foot = page.slice(page.indexOf('class="page-foot"'));
    expect(foot).toContain(String(schedule.seed));
  });

  it('escapes hostile factor names and units', async () => {
    const plan = makeHostilePlanFixture();
    const html = await labWorksheetsHtml(plan, plan.schedule);
    expect(html).toContain(ESCAPED_HOSTILE);
    expect(html).toContain('&lt;b&gt;°C&lt;/b&gt;');
    expect(html).not.toContain('<b>°C</b>');
    expectSelfContained(html);
  });

  it('falls back to plan order without a schedule and says on every page that it is not randomised', async () => {
    const plan = makePlanFixture({ schedule: undefined });
    const html = await labWorksheetsHtml(plan, undefined);
    const pages = runPages(html);
    expect(pages).toHaveLength(plan.runs.length);
    pages.forEach((page, index) => {
      expect(page).toContain('NOT RANDOMISED');
      expect(page).toContain(`point <strong>${plan.runs[index].point}</strong>`);
    });
  });

  it('refuses a schedule that names a point the plan lacks', async () => {
    const schedule = makeSchedule();
    schedule.order[3] = { ...schedule.order[3], point: 'F99' };
    await expect(labWorksheetsHtml(makePlanFixture(), schedule)).rejects.toBeInstanceOf(InputError);
  });
});

describe('manager report', () => {
  it('states the decision from the conventional row and the comparison summary', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    // Fixture: proposed 9 runs, EUR 7,650, 27 h; conventional 84 runs, EUR 71,400, 252 h.
    expect(html).toContain(`<p>${plan.comparison!.summary}</p>`);
    const figures = html.slice(html.indexOf('<table class="key-figures">'), html.indexOf('</table>', html.indexOf('key-figures')));
    // 84 − 9 = 75 runs = 89 % of 84; EUR 71,400 − 7,650 = 63,750 (89 %); 252 − 27 = 225 h (89 %).
    expect(figures).toMatch(/<td>Runs<\/td><td class="num">9<\/td><td class="num">84<\/td><td class="num">75 saved \(89 %\)<\/td>/);
    expect(figures).toMatch(/<td>Cost \(EUR\)<\/td><td class="num">7,650<\/td><td class="num">71,400<\/td><td class="num">63,750 saved \(89 %\)<\/td>/);
    expect(figures).toContain('225 saved (89 %)');
    expect(figures).toContain('<td class="num">all 7</td>');
    expect(html).toContain('3-level full factorial of all 4 operating factors + 3 centre runs. Differences are the proposed plan against this plan');
    expectSelfContained(html);
  });

  it('says "extra" when the conventional plan is the smaller one, and copes without a conventional row', async () => {
    const plan = makePlanFixture();
    const conventional = plan.comparison!.comparators.find((row) => row.id === 'conventional')!;
    Object.assign(conventional, { runs: 5, cost: 4250, hours: 15 });
    const html = await managerReportHtml(plan);
    // 9 − 5 = 4 runs more = 80 % of 5.
    expect(html).toContain('<td class="num">4 extra (+80 %)</td>');
    plan.comparison!.comparators = plan.comparison!.comparators.filter((row) => row.id !== 'conventional');
    const without = await managerReportHtml(plan);
    expect(without).toContain('No conventional plan could be built for this study, so no savings are shown.');
    expect(without).not.toContain('<table class="key-figures">');
  });

  it('draws the index chart with thresholds, both sweeps and the FDS curves', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    expect(count(html, '<svg ')).toBe(4);
    expect(html).toContain('role-mark thresholdLines');
    expect(html).toContain('id="sweep-critical-chart"');
    expect(html).toContain('id="sweep-moderate-chart"');
    expect(count(html, 'role-mark fdsLines')).toBe(plan.comparison!.fdsCurves.length);
    expect(html).toContain('Zahran, Anderson-Cook &amp; Myers, 2003');
  });

  it('says what every efficiency is relative to', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    expect(html).toContain('relative to an ideal orthogonal plan with the same number of runs, not to the proposed plan');
    expect(html).toContain('Relative to the proposed plan (= 1.00)');
    expect(html).toContain(`D-efficiency of the ${plan.metrics.N} fitting runs (relative to an ideal orthogonal plan of the same size)`);
    expect(html).toContain('also counts the 2 centre repeats as fitting runs');
    expect(html).toContain('Efficiency relative to the best approximate plan on the same candidates');
    // One table row per comparator, the proposed one highlighted.
    expect(count(html, 'data-comparator="')).toBe(plan.comparison!.comparators.length);
    expect(html).toContain('<tr class="proposed" data-comparator="proposed">');
    // Power 0.71 → 71 %; the weakest term is named when the comparison gives it.
    expect(html).toContain('<td class="num">71 %</td>');
    plan.comparison!.comparators[0].minPowerTerm = 'feed_solids^2';
    expect(await managerReportHtml(plan, plan.schedule)).toContain('<td class="num">71 % (feed_solids^2)</td>');
    expect(html).toContain('cannot estimate inlet_temp^2, feed_solids^2');
  });

  it('lists parameters to estimate and to take from the literature, and the caveats', async () => {
    const html = await managerReportHtml(makePlanFixture());
    expect(html).toMatch(/Estimate precisely from the lab data \(1\)[\s\S]*Effective moisture diffusivity/);
    expect(html).toMatch(/Fix at a literature or nominal value \(1\)[\s\S]*GAB energy constant C/);
    expect(html).toContain('come from a process model and carry its assumptions');
    expect(html).toContain('common-practice starting points');
    expect(html).toContain('The plan assumes the model form');
    expect(html).toContain('Feed total solids is borderline');
  });

  it('shows the runs a plan cannot run as listed, from the comparison row', async () => {
    expect(runsOutsideLimits({ runs: 27, offLimitsRuns: 8 })).toBe('8 of 27');
    expect(runsOutsideLimits({ runs: 27, offLimitsRuns: 1 })).toBe('1 of 27');
    expect(runsOutsideLimits({ runs: 19, offLimitsRuns: 0 })).toBe('none');
    expect(runsOutsideLimits({ runs: 19 })).toBe('none');
    expect(runsOutsideLimits({ runs: null })).toBe('—');
    const plan = makePlanFixture();
    const bbd = plan.comparison!.comparators.find((row) => row.id === 'box-behnken')!;
    bbd.offLimitsRuns = 3;
    const html = await managerReportHtml(plan, plan.schedule);
    const row = html.slice(html.indexOf('data-comparator="box-behnken"'), html.indexOf('</tr>', html.indexOf('data-comparator="box-behnken"')));
    expect(row).toContain('<td class="num">3 of 15</td>');
    expect(html).toContain('such a plan cannot be run as listed');
  });

  it('escapes a hostile factor name in the HTML and in the charts', async () => {
    const plan = makeHostilePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    expect(html).not.toMatch(/<script\b/i);
    expect(html).toContain(ESCAPED_HOSTILE);
    const svg = html.slice(html.indexOf('<svg '), html.indexOf('</svg>'));
    expect(svg).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
  });

  it('lists the run order in the run sheet\'s words: the session label and the kind of run', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    const table = html.slice(html.indexOf('Appendix E ·'), html.indexOf('Appendix F ·'));
    expect(table).toContain('<th class="num">Day</th><th>Point</th><th>Kind of run</th>');
    // Fixture schedule: run 1 is C1, run 2 is F03, run 5 is H1.
    expect(table).toContain('<td class="num">1</td><td class="num">1</td><td>C1</td><td>Centre repeat</td>');
    expect(table).toContain('<td>F03</td><td>Model run</td>');
    expect(table).toContain('<td>H1</td><td>Validation run</td>');
  });

  it('works without comparison and schedule, and says so', async () => {
    const plan = makePlanFixture({ comparison: undefined, schedule: undefined });
    const html = await managerReportHtml(plan, undefined);
    expect(html).toContain('No comparison with conventional plans is stored in this plan');
    expect(html).not.toContain('data-comparator=');
    expect(html).not.toContain('role-mark fdsLines');
    expect(html).toContain('role-mark thresholdLines');
    expect(html).toContain('runs are listed in plan order and are not randomised');
    expect(html).toContain('The proposed plan has 9 runs and estimates all 7 parameters');
    expectSelfContained(html);
  });
});
