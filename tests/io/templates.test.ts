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
  it('states the decision in two sentences with runs, cost, hours and sessions against the conventional and best classical plan', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    const decision = html.slice(html.indexOf('id="decision"'), html.indexOf('</section>', html.indexOf('id="decision"')));
    expect(count(decision, '<p>')).toBe(2);
    // Fixture: proposed 9 runs (6 + 2 centre + 1 holdout), EUR 7,650, 27 h, 5 runs a day → 2 days.
    expect(decision).toContain('Approve 9 lab runs over 2 days (6 to fit the model, 2 centre repeats and 1 validation run) at EUR 7,650 and 27 h of bench work.');
    // 84 − 9 = 75 runs; EUR 71,400 − 7,650 = 63,750; Box–Behnken is the smallest classical plan that fits (15 runs).
    expect(decision).toContain('with 75 runs fewer and EUR 63,750 less than the conventional plan; the best classical alternative that can, the Box–Behnken plan, needs 15 runs.');
    const figures = html.slice(html.indexOf('<table class="key-figures"'), html.indexOf('</table>', html.indexOf('key-figures')));
    expect(figures).toContain('<th class="num">Proposed plan</th><th class="num">Conventional plan</th><th class="num">Best classical alternative</th>');
    expect(figures).toContain('<td>Runs</td><td class="num">9</td><td class="num">84</td><td class="num">15</td>');
    expect(figures).toContain('<td>Cost (EUR)</td><td class="num">7,650</td><td class="num">71,400</td><td class="num">12,750</td>');
    expect(figures).toContain('<td>Bench hours</td><td class="num">27</td><td class="num">252</td><td class="num">45</td>');
    // ⌈84 / 5⌉ = 17, ⌈15 / 5⌉ = 3.
    expect(figures).toContain('<td>Days at the bench</td><td class="num">2</td><td class="num">17</td><td class="num">3</td>');
    expect(html).toContain('Conventional plan: 3-level full factorial of all 4 operating factors + 3 centre runs.');
    expect(html).toContain('<p class="small" id="sessions">2 days: Day 1: runs 1–5, 15 h; Day 2: runs 6–9, 12 h.</p>');
    expectSelfContained(html);
  });

  it('titles the result honestly: never "smaller" for a larger plan', async () => {
    const plan = makePlanFixture();
    expect(await managerReportHtml(plan)).toContain('<h1>Lab campaign plan: 9 runs where the conventional plan needs 84</h1>');
    const conventional = plan.comparison!.comparators.find((row) => row.id === 'conventional')!;
    Object.assign(conventional, { runs: 5, cost: 4250, hours: 15 });
    const larger = await managerReportHtml(plan);
    expect(larger).toContain('<h1>Lab campaign plan: 9 runs, 4 more than the conventional plan</h1>');
    expect(larger).not.toMatch(/smaller/i);
    expect(larger).toContain('with 4 runs more');
  });

  it('gives one main risk, the fallback with its size and cost, and an approval block', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    expect(count(html, 'class="risk"')).toBe(1);
    expect(html).toContain('<p class="risk" id="risk">Runs sharing a setting of Inlet air temperature are done together over 2 sessions');
    // max(3, ⌈7/4⌉) = 3 runs × (EUR 850 + 0) = EUR 2,550 and 3 × 3 h = 9 h.
    expect(html).toContain('about 3 runs are added to the runs already made (about EUR 2,550, 9 h and 1 more day)');
    const approval = html.slice(html.indexOf('id="approval"'), html.indexOf('</table>', html.indexOf('id="approval"')));
    for (const field of ['Name', 'Role', 'Date', 'Signature']) expect(approval).toContain(`<th>${field}</th>`);
    for (const role of ['Prepared by', 'Statistical review', 'Approved by']) expect(approval).toContain(`<td>${role}</td>`);
    // Page 1 carries the precision block: met, short of the target, or plainly not judged without a noise figure.
    expect(html).toMatch(/Every effect the sensitivity analysis predicts is detected|short of the \d+ % power target|Precision not judged \(no noise given\)/);
  });

  it('keeps method details out of page 1 and prints them in the appendix once', async () => {
    const plan = makePlanFixture();
    const html = await managerReportHtml(plan, plan.schedule);
    const pageOne = html.slice(html.indexOf('class="page-one"'), html.indexOf('</section>', html.lastIndexOf('id="approval"')));
    expect(pageOne).not.toMatch(/Halton|trace|X′X|X'X|D-efficiency/);
    expect(count(html, "100·|X'X|")).toBe(1);
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
    expect(html).toContain('Relative to an ideal orthogonal plan with the same number of runs, not to the proposed plan');
    expect(html).toContain('Relative to the proposed plan (= 1.00)');
    expect(html).toContain(`D-efficiency of the ${plan.metrics.N} fitting runs (relative to an ideal orthogonal plan of the same size)`);
    expect(html).toContain('also counts the 2 centre repeats as fitting runs');
    // One table row per comparator, the proposed one highlighted.
    expect(count(html, 'data-comparator="')).toBe(plan.comparison!.comparators.length);
    expect(html).toContain('<tr class="proposed" data-comparator="proposed">');
    // Power 0.71 → 71 %, one rule for power everywhere.
    expect(html).toContain('<td class="num power">71 %</td>');
    expect(html).not.toMatch(/>0\.71</);
  });

  it('lists parameters to estimate and to take from the literature, and the caveats', async () => {
    const html = await managerReportHtml(makePlanFixture());
    expect(html).toContain('Model parameters to estimate precisely from these runs: Effective moisture diffusivity; 1 other can be taken from the literature.');
    expect(html).toContain('come from a process model and carry its assumptions');
    expect(html).toContain('common-practice starting points');
    expect(html).toContain('The plan assumes the model form');
    expect(html).toMatch(/Feed total solids <span class="note">\[% w\/w\]<\/span><\/td><td>operating setting<\/td><td>critical <span class="flag">borderline<\/span>/);
  });

  it('shows the runs a plan cannot run as listed, from the comparison row', async () => {
    expect(runsOutsideLimits({ runs: 27, offLimitsRuns: 8 })).toBe('8 of 27');
    expect(runsOutsideLimits({ runs: 27, offLimitsRuns: 1 })).toBe('1 of 27');
    expect(runsOutsideLimits({ runs: 19, offLimitsRuns: 0 })).toBe('none');
    expect(runsOutsideLimits({ runs: 19 })).toBe('none');
    expect(runsOutsideLimits({ runs: null })).toBe('–');
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
    expect(html).toContain('It estimates all 7 model parameters; no comparison with conventional plans is stored in this plan');
    expect(html).not.toContain('no classical alternative to show');
    expectSelfContained(html);
  });
});
