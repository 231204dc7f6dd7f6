/**
 * Every required key of the study file, left out, gives the same one line "… key <path>: is
 * required" — whatever its type (an enum such as `role` once said "not undefined") — and a
 * placeholder left by `tierplan init` gives "fill in …" naming the key.
 *
 * The table is checked against the `required` lists of the study's JSON Schema, so a required
 * key added to the validator without a row here fails the test.
 */
import { describe, expect, it } from 'vitest';
import { loadStudy, studyJsonSchema } from '../../src/io/studyFile.js';
import { expectInputError, writeStudy } from './studyScratch.js';

type Study = Record<string, any>;

/** Key path as messages write it → how to remove it from the scratch study (which has every section). */
const REQUIRED: [string, (study: Study) => void][] = [
  ['title', (s) => delete s.title],
  ['factors', (s) => delete s.factors],
  ['responses', (s) => delete s.responses],
  ['indices', (s) => delete s.indices],
  ['factors[0].id', (s) => delete s.factors[0].id],
  ['factors[0].name', (s) => delete s.factors[0].name],
  ['factors[0].unit', (s) => delete s.factors[0].unit],
  ['factors[0].role', (s) => delete s.factors[0].role],
  ['factors[0].low', (s) => delete s.factors[0].low],
  ['factors[0].high', (s) => delete s.factors[0].high],
  ['factors[0].nominal', (s) => delete s.factors[0].nominal],
  ['factors[0].analysedRange.low', (s) => { s.factors[0].analysedRange = { high: 210 }; }],
  ['factors[0].analysedRange.high', (s) => { s.factors[0].analysedRange = { low: 150 }; }],
  ['factors[1].limits.low', (s) => delete s.factors[1].limits.low],
  ['factors[1].limits.high', (s) => delete s.factors[1].limits.high],
  ['responses[0].id', (s) => delete s.responses[0].id],
  ['responses[0].name', (s) => delete s.responses[0].name],
  ['responses[0].unit', (s) => delete s.responses[0].unit],
  ['sessions.maxRuns', (s) => delete s.sessions.maxRuns],
  ['costs.currency', (s) => delete s.costs.currency],
  ['costs.perRun', (s) => delete s.costs.perRun],
  ['costs.hoursPerRun', (s) => delete s.costs.hoursPerRun],
  ['costs.perLevelChange.cost', (s) => delete s.costs.perLevelChange.cost],
  ['costs.perLevelChange.hours', (s) => delete s.costs.perLevelChange.hours],
];

/** The scratch study with the optional sections that hold required keys. */
function complete(study: Study): void {
  study.sessions = { maxRuns: 4, label: 'Shift' };
  study.costs = { currency: 'EUR', perRun: 100, hoursPerRun: 2, perLevelChange: { cost: 10, hours: 0.5 } };
}

/** Every required key path of a JSON Schema, list items written `[]`. */
function requiredPaths(node: Record<string, any>, at = ''): string[] {
  if (node.type === 'array' && node.items) return requiredPaths(node.items, `${at}[]`);
  if (node.type !== 'object' || !node.properties) return [];
  const own = ((node.required as string[] | undefined) ?? []).map((key) => (at === '' ? key : `${at}.${key}`));
  const nested = Object.entries(node.properties as Record<string, Record<string, any>>).flatMap(([key, child]) =>
    requiredPaths(child, at === '' ? key : `${at}.${key}`),
  );
  return [...own, ...nested];
}

describe('a missing required key', () => {
  it('the table lists every required key of the schema', () => {
    const listed = REQUIRED.map(([path]) => path.replace(/\[\d+\]/g, '[]')).sort();
    expect(listed).toEqual(requiredPaths(studyJsonSchema()).sort());
  });

  it.each(REQUIRED)('%s: is required', async (path, remove) => {
    const { folder, studyPath } = writeStudy((study) => {
      complete(study);
      remove(study);
    });
    await expectInputError(() => loadStudy(studyPath), `${studyPath}, key ${path}: is required`, folder);
  });
});

describe('a placeholder left by tierplan init', () => {
  it.each([
    ['title', (s: Study) => (s.title = 'TODO'), 'fill in the text (in place of TODO)'],
    ['factors[0].unit', (s: Study) => (s.factors[0].unit = 'TODO'), 'fill in the text (in place of TODO)'],
    ['factors[0].role', (s: Study) => (s.factors[0].role = 'TODO'), 'fill in one of "operating", "model" (in place of TODO)'],
    ['factors[0].low', (s: Study) => (s.factors[0].low = 'TODO'), 'fill in a number (in place of TODO)'],
    ['responses[1].unit', (s: Study) => (s.responses[1].unit = ' TODO '), 'fill in the text (in place of TODO)'],
  ])('%s', async (path, edit, message) => {
    const { folder, studyPath } = writeStudy(edit);
    await expectInputError(() => loadStudy(studyPath), `${studyPath}, key ${path}: ${message}`, folder);
  });

  it('is only the bare word: a unit or title that merely contains it is text like any other', async () => {
    const { studyPath } = writeStudy((study) => {
      study.title = 'TODO list for the bioreactor step';
    });
    expect((await loadStudy(studyPath)).title).toBe('TODO list for the bioreactor step');
  });
});
