/**
 * `tierplan augment` end to end on the sample with its invented results
 * (samples/spray-dryer/makeResults.ts, INVENTED): a new revision with a new plan id and its
 * parent, the added runs appended, the model extended by the rule when validation failed,
 * run sheets listing only the added runs, and the combined runs estimating the whole model
 * (rank checked with an outside library, ml-matrix's SVD). The D-optimality of the added runs
 * is checked against Dykstra's example in tests/core/design/augmentDesign.test.ts.
 */
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadPlan } from '../../src/io/planFile.js';
import { filledWorkbook } from '../../samples/spray-dryer/makeResults.js';
import { repoRoot, runCli } from '../support/runCli.js';

const work = mkdtempSync(join(tmpdir(), 'tierplan-augment-'));
const planPath = join(work, 'plan', 'plan.json');
const xlsx = join(work, 'results.xlsx');

beforeAll(async () => {
  expect(runCli(['plan', join(repoRoot, 'samples/spray-dryer/study.yaml'), '--out', join(work, 'plan'), '--starts', '4']).status).toBe(0);
  writeFileSync(xlsx, await filledWorkbook(await loadPlan(planPath)));
});

interface Run {
  point: string;
  purpose: string;
  coded: Record<string, number>;
}

describe('tierplan augment', () => {
  it('writes a revision whose added runs complete the extended model', () => {
    const out = join(work, 'revision');
    const analysis = JSON.parse(runCli(['analyze', planPath, xlsx, '--json']).stdout);
    const result = runCli(['augment', planPath, xlsx, '--runs', '4', '--out', out]);
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['plan.json', 'report.html', 'runsheet.csv', 'runsheet.xlsx', 'worksheets.html']);
    const parent = JSON.parse(readFileSync(planPath, 'utf8'));
    const revision = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    expect(revision.planId).not.toBe(parent.planId);
    expect(revision.parent).toEqual({ id: parent.planId, checksum: parent.checksum });
    expect(revision.runs.slice(0, parent.runs.length)).toEqual(parent.runs);
    const added: Run[] = revision.runs.slice(parent.runs.length);
    expect(added.map((run) => run.point)).toEqual(['A01', 'A02', 'A03', 'A04']);
    // The rule: lack of fit in any response adds the missing squares and interactions.
    const lackOfFit = analysis.responses.some((r: { verdictReasons: { kind: string }[] }) => r.verdictReasons.some((reason) => reason.kind === 'lackOfFit'));
    if (lackOfFit) {
      expect(revision.model.terms.length).toBeGreaterThan(parent.model.terms.length);
      expect(result.stdout).toMatch(/Model extended by .*\(lack of fit in \w+\)/);
    }
    expect(revision.model.terms.slice(0, parent.model.terms.length)).toEqual(parent.model.terms);
    // Every run done plus the added ones estimate the revision's whole model.
    const X = new Matrix(
      revision.runs.map((run: Run) => [1, ...revision.model.terms.map((term: string) => term.split('*').reduce((v, f) => v * run.coded[f.split('^')[0]] ** Number(f.split('^')[1] ?? 1), 1))]),
    );
    expect(new SingularValueDecomposition(X).rank).toBe(revision.model.terms.length + 1);
    // The run sheet lists the added runs only, numbered after the parent's last run.
    const text = readFileSync(join(out, 'runsheet.csv'), 'utf8').slice(1);
    // After the empty line: the column keys, then the header row, then the runs (runSheetCsv.ts).
    const rows = (parse(text.slice(text.indexOf('\r\n\r\n') + 4)) as string[][]).slice(1);
    expect(rows.slice(1).map((row) => row[rows[0].indexOf('Point')]).sort()).toEqual(['A01', 'A02', 'A03', 'A04']);
    expect(rows.slice(1).map((row) => Number(row[0])).sort((a, b) => a - b)).toEqual([1, 2, 3, 4].map((i) => parent.runs.length + i));
    // A split-plot parent: every added run a whole plot of its own after the parent's, in a session after the parent's.
    const lastPlot = Math.max(...parent.runs.map((run: { wholePlot: number }) => run.wholePlot));
    const lastSession = Math.max(...parent.runs.map((run: { session: number }) => run.session));
    expect(added.map((run) => (run as Run & { wholePlot: number }).wholePlot).sort((a, b) => a - b)).toEqual([1, 2, 3, 4].map((i) => lastPlot + i));
    for (const run of added) expect((run as Run & { session: number }).session).toBeGreaterThan(lastSession);
    expect(revision.metrics.blocks.sessions).toBe(lastSession + 1);
    expect(revision.splitPlot).toBeUndefined();
  });

  it('writes report.html for the revision: the parent, why runs were added, the added runs and their settings', () => {
    const out = join(work, 'revision');
    const parent = JSON.parse(readFileSync(planPath, 'utf8'));
    const revision = JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8'));
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).toContain(`<h1>Added runs: a revision of plan ${parent.planId}</h1>`);
    expect(html).toContain(`revision of plan ${parent.planId} (checksum ${parent.checksum})`);
    expect(html).toContain(`Plan ${revision.planId} adds 4 runs to plan ${parent.planId}`);
    // Why: the parent's verdict per response and the model note, as the command printed it.
    expect(html).toContain(`Verdict of plan ${parent.planId}`);
    const analysis = JSON.parse(runCli(['analyze', planPath, xlsx, '--json']).stdout);
    for (const response of analysis.responses) expect(html).toContain(`verdict-${response.verdict === 'calibrated' ? 'calibrated' : 'not-yet'}">${response.verdict}<`);
    const note = revision.warnings.at(-1) as string;
    expect(html).toContain(note.charAt(0).toUpperCase() + note.slice(1).replace(/'/g, '&#x27;').replace(/"/g, '&quot;'));
    // The added runs in run order, each with its point and settings, and the safety caution.
    const rows = [...html.matchAll(/<tr><td class="num">(\d+)<\/td><td class="num">\d+<\/td><td>(A\d+)<\/td>((?:<td class="num">[^<]*<\/td>)+)<\/tr>/g)];
    expect(rows.map((row) => row[2]).sort()).toEqual(['A01', 'A02', 'A03', 'A04']);
    expect(rows.map((row) => Number(row[1]))).toEqual(revision.schedule.order.map((run: { sequence: number }) => run.sequence));
    const varied = revision.levels.filter((level: { varied: boolean }) => level.varied);
    for (const row of rows) {
      const run = revision.runs.find((r: { point: string }) => r.point === row[2]);
      const cells = [...row[3].matchAll(/<td class="num">([^<]*)<\/td>/g)].map((cell) => Number(cell[1]));
      expect(cells).toEqual(varied.map((level: { id: string }) => expect.closeTo(run.settings[level.id], 6)));
    }
    expect(html).toContain('Caution before starting');
  });

  it('takes an explicit model, and refuses a run count below one', () => {
    const parent = JSON.parse(readFileSync(planPath, 'utf8'));
    const terms = [...parent.model.terms, 'feed_rate*atomiser_speed'];
    const result = runCli(['augment', planPath, xlsx, '--runs', '2', '--model', terms.join(','), '--json']);
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout).model.terms).toEqual(terms);
    const refused = runCli(['augment', planPath, xlsx, '--runs', '0']);
    expect(refused.status).toBe(2);
    expect(refused.stderr).toMatch(/--runs must be a whole number of at least 1, not 0/);
  });
});
