/**
 * Analysing a plan revision end to end: plan the sample → fill its sheet with the invented
 * results (samples/spray-dryer/makeResults.ts, INVENTED) → `augment` → fill the revision's
 * sheet (the added runs only) → `analyze revision.json added.xlsx --parent plan.json
 * --parent-results results.xlsx`. The fit covers the parent's runs and the added runs together,
 * recomputed here from the two sheets' results with an outside library (ml-matrix's QR least
 * squares). A revision without its parent, another plan given as the parent, and another
 * plan's sheet given as the parent's results are refused with one line, exit 2.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { PlanDocument } from '../../src/core/plan/planDocument.js';
import { loadPlan } from '../../src/io/planFile.js';
import { filledWorkbook, inventedResults } from '../../samples/spray-dryer/makeResults.js';
import { repoRoot, runCli } from '../support/runCli.js';
import { glsReferenceFit } from '../support/glsReferenceFit.js';

const work = mkdtempSync(join(tmpdir(), 'tierplan-revision-'));
const parentPath = join(work, 'plan', 'plan.json');
const parentResults = join(work, 'results.xlsx');
const revisionPath = join(work, 'revision', 'plan.json');
const addedResults = join(work, 'added.xlsx');
const study = join(repoRoot, 'samples/spray-dryer/study.yaml');
let parent: PlanDocument;
let revision: PlanDocument;

beforeAll(async () => {
  expect(runCli(['plan', study, '--out', join(work, 'plan'), '--starts', '4']).status).toBe(0);
  parent = await loadPlan(parentPath);
  writeFileSync(parentResults, await filledWorkbook(parent));
  const augmented = runCli(['augment', parentPath, parentResults, '--runs', '4', '--out', join(work, 'revision')]);
  expect(augmented.stderr).toBe('');
  revision = await loadPlan(revisionPath);
  writeFileSync(addedResults, await filledWorkbook(revision));
});

interface Analysis {
  plan: { id: string; checksum: string };
  results: { file: string; runs: number; parent?: { plan: { id: string; checksum: string }; file: string } };
  responses: { id: string; n: number; terms: string[]; coefficients: { term: string; estimate: number }[]; runs: { run: number; point: string; observed: number }[]; holdout: { point: string }[] }[];
}

/** Point → the invented results written on a plan's sheet. */
function resultsByPoint(plan: PlanDocument): Map<string, Record<string, number>> {
  const byRun = inventedResults(plan);
  return new Map(plan.schedule!.order.map((run) => [run.point, byRun.get(run.sequence)!]));
}

describe('tierplan analyze on a revision with its parent', () => {
  it('fits the parent runs and the added runs together, as an outside GLS fit of both sheets does', () => {
    const result = runCli(['analyze', revisionPath, addedResults, '--parent', parentPath, '--parent-results', parentResults, '--json']);
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    const analysis = JSON.parse(result.stdout) as Analysis;
    expect(analysis.plan).toEqual({ id: revision.planId, checksum: revision.checksum });
    expect(analysis.results.parent).toEqual({ plan: { id: parent.planId, checksum: parent.checksum }, file: parentResults, sheet: 'Run sheet' });
    expect(analysis.results.runs).toBe(parent.runs.length + 4);

    const observed = new Map([...resultsByPoint(parent), ...resultsByPoint(revision)]);
    const fitted = revision.runs.filter((run) => run.purpose !== 'holdout');
    for (const response of analysis.responses) {
      expect(response.terms).toEqual(['1', ...revision.model.terms]);
      expect(response.n).toBe(fitted.length);
      // The added runs are among the fitted ones, with the results of the revision's sheet.
      const added = response.runs.filter((run) => run.point.startsWith('A'));
      expect(added.map((run) => run.point).sort()).toEqual(['A01', 'A02', 'A03', 'A04']);
      for (const run of added) expect(run.observed).toBe(observed.get(run.point)![response.id]);
      expect(Math.min(...added.map((run) => run.run))).toBeGreaterThan(parent.runs.length);
      expect(response.holdout.map((h) => h.point).sort()).toEqual(parent.runs.filter((run) => run.purpose === 'holdout').map((run) => run.point).sort());
      // GLS at the analysis's REML variance ratio, sessions as fixed blocks (a split-plot sample).
      const ratio = (response as { varianceComponents?: { ratio: number } | null }).varianceComponents?.ratio ?? 0;
      const { beta } = glsReferenceFit(
        fitted.map((run) => ({ ...run, y: observed.get(run.point)![response.id] })),
        revision.model.terms,
        ratio,
      );
      response.coefficients.forEach((c, j) => expect(c.estimate).toBeCloseTo(beta[j], 7));
    }
  });

  it('writes the analysis files with --out and names the parent in the summary', () => {
    const out = join(work, 'revision-analysis');
    const result = runCli(['analyze', revisionPath, addedResults, '--parent', parentPath, '--parent-results', parentResults, '--out', out]);
    expect(result.status).toBe(0);
    expect(result.stdout).toContain(`with the runs of its parent plan ${parent.planId} from ${parentResults}`);
    expect(readFileSync(join(out, 'analysis.html'), 'utf8')).toContain(`for the runs of parent plan ${parent.planId}`);
  });

  it('refuses a revision without its parent, naming the options to give', () => {
    const result = runCli(['analyze', revisionPath, addedResults, '--json']);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toBe(
      `tierplan: ${revisionPath}, key parent: plan ${revision.planId} is a revision of plan ${parent.planId} and its sheet lists the added runs only: give the parent with --parent <plan.json> --parent-results <its filled run sheet>\n`,
    );
  });

  it('refuses another plan as the parent, and another plan’s sheet as the parent’s results', () => {
    const otherDir = join(work, 'other');
    expect(runCli(['plan', study, '--out', otherDir, '--starts', '4', '--seed', '7']).status).toBe(0);
    const other = join(otherDir, 'plan.json');
    const wrongPlan = runCli(['analyze', revisionPath, addedResults, '--parent', other, '--parent-results', parentResults, '--json']);
    expect(wrongPlan.status).toBe(2);
    expect(wrongPlan.stderr).toMatch(new RegExp(`^tierplan: ${other.replace(/[.]/g, '\\.')}, key planId: is plan TP-\\w+, but revision ${revision.planId} was made from plan ${parent.planId}`));
    // The revision's own sheet given as the parent's results: another plan's sheet.
    const wrongSheet = runCli(['analyze', revisionPath, addedResults, '--parent', parentPath, '--parent-results', addedResults, '--json']);
    expect(wrongSheet.status).toBe(2);
    expect(wrongSheet.stderr).toMatch(/added\.xlsx, sheet Run sheet, row 2, column C: plan id TP-\w+ is not the plan id of this plan\.json/);
    const half = runCli(['analyze', revisionPath, addedResults, '--parent', parentPath, '--json']);
    expect(half.status).toBe(2);
    expect(half.stderr).toMatch(/--parent and --parent-results go together/);
    const notRevision = runCli(['analyze', parentPath, parentResults, '--parent', parentPath, '--parent-results', parentResults, '--json']);
    expect(notRevision.status).toBe(2);
    expect(notRevision.stderr).toMatch(/is not a revision \(it has no parent\)/);
  });

  it('refuses to augment a revision, pointing to the first plan', () => {
    const result = runCli(['augment', revisionPath, addedResults, '--runs', '2']);
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(new RegExp(`key parent: plan ${revision.planId} is itself a revision of plan ${parent.planId}: augmenting a revision is not supported`));
  });
});
