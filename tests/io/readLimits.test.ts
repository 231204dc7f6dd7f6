/**
 * Every limit of src/core/inputLimits.ts that a reader enforces: the value at the limit is
 * read, one more is refused with one line naming the file, the key and the limit, and
 * nothing is written. (Limits enforced later, in the planner, are tested in
 * tests/core/plan/planLimits.test.ts.)
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { idProblem, loadStudy } from '../../src/io/studyFile.js';
import { indexTableIds, readIndexTable } from '../../src/io/indexTables.js';
import { limitOf } from '../../src/core/inputLimits.js';
import { BASE_INDICES_CSV, STUDY_IDS, expectInputError, writeFiles, writeStudy } from './studyScratch.js';

const SEE = '(see "Limits" in the README)';

interface KeyCase {
  name: string;
  key: string;
  /** Sets the value under test to `value`. */
  set: (study: Record<string, any>, value: number) => void;
  limit: number;
  message: (over: number) => string;
}

const factorCount = (study: Record<string, any>, count: number, role: 'operating' | 'model') => {
  const template = study.factors.find((factor: any) => factor.role === role);
  const others = study.factors.filter((factor: any) => factor.role !== role);
  const added = Array.from({ length: count }, (_, i) => ({ ...template, id: `${role[0]}${i}` }));
  study.factors = role === 'operating' ? [...added, ...others] : [...others, ...added];
};

const KEY_CASES: KeyCase[] = [
  { name: 'fitting runs', key: 'design.runs', set: (s, v) => (s.design = { runs: v }), limit: limitOf('fittingRuns'), message: (v) => `${v} runs is above the limit of 1000 runs ${SEE}` },
  { name: 'centre runs', key: 'design.centreRuns', set: (s, v) => (s.design = { centreRuns: v }), limit: limitOf('centreRuns'), message: (v) => `${v} runs is above the limit of 100 runs ${SEE}` },
  { name: 'holdout runs', key: 'design.holdoutRuns', set: (s, v) => (s.design = { holdoutRuns: v }), limit: limitOf('holdoutRuns'), message: (v) => `${v} runs is above the limit of 200 runs ${SEE}` },
  { name: 'starts', key: 'design.starts', set: (s, v) => (s.design = { starts: v }), limit: limitOf('starts'), message: (v) => `${v} starts is above the limit of 1000 starts ${SEE}` },
  { name: 'session runs', key: 'sessions.maxRuns', set: (s, v) => (s.sessions = { maxRuns: v }), limit: limitOf('sessionRuns'), message: (v) => `${v} runs is above the limit of 1300 runs ${SEE}` },
  { name: 'level count', key: 'factors[0].levels', set: (s, v) => (s.factors[0].levels = v), limit: limitOf('levelsPerFactor'), message: (v) => `${v} levels is above the limit of 50 levels ${SEE}` },
  {
    name: 'level list',
    key: 'factors[0].levels',
    set: (s, v) => (s.factors[0] = { ...s.factors[0], low: 0, high: 1000, levels: Array.from({ length: v }, (_, i) => i) }),
    limit: limitOf('levelsPerFactor'),
    message: (v) => `lists ${v} levels, above the limit of 50 levels ${SEE}`,
  },
  { name: 'default level count', key: 'design.levels.critical', set: (s, v) => (s.design = { levels: { critical: v } }), limit: limitOf('levelsPerFactor'), message: (v) => `${v} levels is above the limit of 50 levels ${SEE}` },
  { name: 'title length', key: 'title', set: (s, v) => (s.title = 't'.repeat(v)), limit: limitOf('textLength'), message: (v) => `is ${v} characters long, above the limit of 500 characters ${SEE}` },
  { name: 'unit length', key: 'factors[1].unit', set: (s, v) => (s.factors[1].unit = 'u'.repeat(v)), limit: limitOf('textLength'), message: (v) => `is ${v} characters long, above the limit of 500 characters ${SEE}` },
  { name: 'id length', key: 'responses[0].id', set: (s, v) => (s.responses[0].id = 'r'.repeat(v)), limit: limitOf('idLength'), message: (v) => `is ${v} characters long, above the limit of 64 characters ${SEE}` },
  { name: 'constraints', key: 'constraints', set: (s, v) => (s.constraints = Array(v).fill('temp >= 20')), limit: limitOf('constraints'), message: (v) => `lists ${v} entries, above the limit of 50 constraints ${SEE}` },
  {
    name: 'constraint length',
    key: 'constraints[0]',
    set: (s, v) => (s.constraints = [`temp >= ${'0'.repeat(v - 8)}`]),
    limit: limitOf('expressionLength'),
    message: (v) => `is ${v} characters long, above the limit of 1000 characters ${SEE}`,
  },
  { name: 'model terms', key: 'design.model', set: (s, v) => (s.design = { model: Array(v).fill('temp') }), limit: limitOf('modelTerms'), message: (v) => `lists ${v} entries, above the limit of 500 model terms ${SEE}` },
  { name: 'factors', key: 'factors', set: (s, v) => factorCount(s, v - 2, 'model'), limit: limitOf('factors'), message: (v) => `lists ${v} entries, above the limit of 2000 factors ${SEE}` },
  { name: 'operating factors', key: 'factors', set: (s, v) => factorCount(s, v, 'operating'), limit: limitOf('operatingFactors'), message: (v) => `${v} operating factors is above the limit of 100 operating factors ${SEE}` },
  {
    name: 'responses',
    key: 'responses',
    set: (s, v) => (s.responses = Array.from({ length: v }, (_, i) => ({ id: `r${i}`, name: 'Response', unit: '-' }))),
    limit: limitOf('responses'),
    message: (v) => `lists ${v} entries, above the limit of 100 responses ${SEE}`,
  },
  { name: 'setting magnitude', key: 'factors[0].high', set: (s, v) => (s.factors[0].high = v), limit: limitOf('numberMagnitude'), message: (v) => `${v} is outside the limit of ±1e15 ${SEE}` },
  { name: 'cost magnitude', key: 'costs.perRun', set: (s, v) => (s.costs = { currency: 'EUR', perRun: v, hoursPerRun: 1 }), limit: limitOf('numberMagnitude'), message: (v) => `${v} is outside the limit of ±1e15 ${SEE}` },
];

/** The study reader's verdict on a value: 'read', or the one-line refusal for the key. */
async function verdict(testCase: KeyCase, value: number): Promise<{ folder: string; studyPath: string; error: unknown }> {
  const { folder, studyPath } = writeStudy((study) => testCase.set(study, value));
  const error = await loadStudy(studyPath).then(
    () => undefined,
    (caught: unknown) => caught,
  );
  return { folder, studyPath, error };
}

describe('study keys', () => {
  it.each(KEY_CASES.map((testCase) => [testCase.name, testCase] as const))('%s: the limit is read, one more is refused', async (_, testCase) => {
    const atLimit = await verdict(testCase, testCase.limit);
    // At the limit the key itself is accepted; a later rule may still object to the study.
    if (atLimit.error) expect(String((atLimit.error as Error).message)).not.toContain('limit of');
    const over = testCase.name === 'setting magnitude' || testCase.name === 'cost magnitude' ? testCase.limit * 10 : testCase.limit + 1;
    const { folder, studyPath } = writeStudy((study) => testCase.set(study, over));
    await expectInputError(() => loadStudy(studyPath), `${studyPath}, key ${testCase.key}: ${testCase.message(over)}`, folder);
  });
});

describe('file sizes and table rows', () => {
  it('refuses a study file above 1 MiB before parsing it', async () => {
    const { folder, studyPath } = writeStudy();
    writeFileSync(studyPath, `title: big\n# ${'x'.repeat(1024 * 1024)}\n`);
    await expectInputError(() => loadStudy(studyPath), `${studyPath}: is 1.0 MB, above the limit of 1 MiB ${SEE}`, folder);
  });

  it('refuses a CSV table above 32 MiB and a workbook above 16 MiB by their size', async () => {
    const big = `${BASE_INDICES_CSV}${'#'.repeat(32 * 1024 * 1024)}\n`;
    const folder = writeFiles({ 'indices.csv': big, 'indices.xlsx': Buffer.alloc(16 * 1024 * 1024 + 1) });
    await expectInputError(() => readIndexTable(join(folder, 'indices.csv'), 'indices.csv', STUDY_IDS), `indices.csv: is 33.6 MB, above the limit of 32 MiB ${SEE}`);
    await expectInputError(() => readIndexTable(join(folder, 'indices.xlsx'), 'indices.xlsx', STUDY_IDS), `indices.xlsx: is 16.8 MB, above the limit of 16 MiB ${SEE}`);
  });

  it('reads 200 000 data rows and refuses 200 001, in JSON and CSV', async () => {
    const entries = (count: number) => `[${Array(count).fill('{"factor":"temp"}').join(',')}]`;
    const lines = (count: number) => ['factor,response', ...Array(count).fill('t,r')].join('\n');
    const folder = writeFiles({
      'at.json': entries(limitOf('tableRows')),
      'over.json': entries(limitOf('tableRows') + 1),
      'over.csv': lines(limitOf('tableRows') + 1),
    });
    // At the limit the table is read; its missing columns are then refused by the table's own rule.
    await expectInputError(
      () => readIndexTable(join(folder, 'at.json'), 'at.json', STUDY_IDS),
      'at.json: missing column response (also accepted: output)',
    );
    await expectInputError(() => readIndexTable(join(folder, 'over.json'), 'over.json', STUDY_IDS), `over.json: 200001 data rows is above the limit of 200000 rows ${SEE}`);
    await expectInputError(() => readIndexTable(join(folder, 'over.csv'), 'over.csv', STUDY_IDS), `over.csv: 200001 data rows is above the limit of 200000 rows ${SEE}`);
  });

  it('refuses a JSON table with more than 1000 distinct columns', async () => {
    const entry = Object.fromEntries(Array.from({ length: 1001 }, (_, i) => [`c${i}`, i]));
    const folder = writeFiles({ 'wide.json': JSON.stringify([entry]) });
    await expectInputError(
      () => readIndexTable(join(folder, 'wide.json'), 'wide.json', STUDY_IDS),
      `wide.json, key [0].c1000: 1001 columns is above the limit of 1000 columns ${SEE}`,
    );
  });

  it('quotes at most 60 characters of a bad cell', async () => {
    const folder = writeFiles({ 'indices.csv': `factor,response,first,total\ntemp,titre,${'9'.repeat(10)}x${'y'.repeat(10_000)},0.2\n` });
    await expectInputError(
      () => readIndexTable(join(folder, 'indices.csv'), 'indices.csv', STUDY_IDS),
      `indices.csv, row 2, column first: must be a number, not "9999999999x${'y'.repeat(48)}…"`,
    );
  });

  it('init: an index table with more factors, more responses or longer ids than a study may have is refused', async () => {
    const rows = (factors: number, responses: number) =>
      ['factor,response,first,total', ...Array.from({ length: Math.max(factors, responses) }, (_, i) => `f${i % factors},r${i % responses},0.1,0.2`)].join('\n');
    const folder = writeFiles({
      'factors.csv': rows(limitOf('factors') + 1, 1),
      'responses.csv': rows(1, limitOf('responses') + 1),
      'long.csv': `factor,response,first,total\n${'f'.repeat(65)},r,0.1,0.2\n`,
    });
    await expectInputError(() => indexTableIds(join(folder, 'factors.csv'), 'factors.csv', idProblem), `factors.csv: 2001 factors is above the limit of 2000 factors ${SEE}`);
    await expectInputError(() => indexTableIds(join(folder, 'responses.csv'), 'responses.csv', idProblem), `responses.csv: 101 responses is above the limit of 100 responses ${SEE}`);
    await expectInputError(
      () => indexTableIds(join(folder, 'long.csv'), 'long.csv', idProblem),
      `long.csv, row 2, column factor: "${'f'.repeat(59)}…" is 65 characters long, above the limit of 64 characters ${SEE}; rename it in the table`,
    );
  });
});
