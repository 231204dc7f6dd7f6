/**
 * YAML and JSON safety of the readers (src/io/documentText.ts): alias expansion capped, deep
 * nesting refused before a parser recurses into it, custom tags refused, repeated keys refused
 * in both syntaxes, prototype keys refused. Each refusal is one line naming the file and,
 * where the parser knows it, the line and column.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseJsonText, parseYamlText } from '../../src/io/documentText.js';
import { loadStudy } from '../../src/io/studyFile.js';
import { readIndexTable } from '../../src/io/indexTables.js';
import { InputError } from '../../src/core/inputError.js';
import { BASE_INDICES_CSV, STUDY_IDS, expectInputError, writeFiles } from './studyScratch.js';

function refusal(parse: () => unknown): string {
  try {
    parse();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const line = (error as InputError).describe();
    expect(line).not.toContain('\n');
    return line;
  }
  throw new Error('expected an InputError');
}

/** Nine anchors, each a list of nine aliases of the previous one: 9^9 strings if expanded. */
const ALIAS_BOMB = [
  'a: &a [x, x, x, x, x, x, x, x, x]',
  ...'bcdefghi'.split('').map((name, i) => {
    const previous = 'abcdefghi'[i];
    return `${name}: &${name} [${Array(9).fill(`*${previous}`).join(', ')}]`;
  }),
  '',
].join('\n');

describe('YAML', () => {
  it('refuses an alias bomb with the alias limit, quickly', () => {
    const started = performance.now();
    expect(refusal(() => parseYamlText(ALIAS_BOMB, 'study.yaml'))).toBe(
      'study.yaml: expands its YAML aliases (*name) too often, above the limit of 100 alias expansions (see "Limits" in the README); nested aliases grow exponentially — write the values out',
    );
    // Not a timing target: an expanded bomb would take minutes and gigabytes, not a second.
    expect(performance.now() - started).toBeLessThan(5000);
  });

  it('keeps a few ordinary aliases', () => {
    expect(parseYamlText('limits: &l {low: 1, high: 2}\nagain: *l\n', 'study.yaml')).toEqual({
      limits: { low: 1, high: 2 },
      again: { low: 1, high: 2 },
    });
  });

  it('refuses flow nesting past 64 levels before parsing, with its line and column', () => {
    // The mapping holding `a` is the first level.
    expect(parseYamlText(`a: ${'['.repeat(63)}${']'.repeat(63)}`, 'study.yaml')).toBeTruthy();
    expect(refusal(() => parseYamlText(`a: ${'['.repeat(64)}${']'.repeat(64)}`, 'study.yaml'))).toMatch(/deeper than allowed/);
    expect(refusal(() => parseYamlText(`title: x\na: ${'['.repeat(100_000)}${']'.repeat(100_000)}`, 'study.yaml'))).toBe(
      'study.yaml: nests lists or mappings at line 2, column 68 deeper than allowed, above the limit of 64 levels (see "Limits" in the README)',
    );
  });

  it('does not count brackets inside quotes or comments', () => {
    expect(parseYamlText(`title: "${'['.repeat(100)}"\nname: '${'{'.repeat(100)}' # ${'['.repeat(100)}\n`, 'study.yaml')).toEqual({
      title: '['.repeat(100),
      name: '{'.repeat(100),
    });
  });

  it('refuses block nesting past 64 levels', () => {
    const block = (depth: number) => `${Array.from({ length: depth }, (_, i) => `${' '.repeat(i)}k:`).join('\n')} 1\n`;
    expect(parseYamlText(block(64), 'study.yaml')).toBeTruthy();
    expect(refusal(() => parseYamlText(block(65), 'study.yaml'))).toBe(
      'study.yaml: nests lists or mappings deeper than allowed, above the limit of 64 levels (see "Limits" in the README)',
    );
    expect(refusal(() => parseYamlText(block(1200), 'study.yaml'))).toMatch(/^study\.yaml: nests lists or mappings at line \d+, column \d+ deeper than allowed/);
  });

  it.each([
    ['title: !secret text', '!secret', 'line 1, column 16'],
    ['title: !!binary aGVsbG8=', '!!binary', 'line 1, column 17'],
    ['title: !!timestamp 2026-01-02', '!!timestamp', 'line 1, column 20'],
    ['factors: !!set {a, b}', '!!set', 'line 1, column 16'],
  ])('refuses the tag in %j', (text, tag, at) => {
    expect(refusal(() => parseYamlText(text, 'study.yaml'))).toBe(
      `study.yaml: uses the YAML tag ${tag} at ${at}; tags are not part of a study file — write the plain value`,
    );
  });

  it('keeps the core-schema tags', () => {
    expect(parseYamlText('unit: !!str 12\nlow: !!float 1.5\nflag: !!bool true\n', 'study.yaml')).toEqual({ unit: '12', low: 1.5, flag: true });
  });

  it('refuses a repeated key, a second document and prototype keys', () => {
    expect(refusal(() => parseYamlText('title: x\ntitle: y\n', 'study.yaml'))).toBe(
      'study.yaml: YAML syntax error at line 2, column 1: Map keys must be unique',
    );
    expect(refusal(() => parseYamlText('title: x\n---\ntitle: y\n', 'study.yaml'))).toBe(
      'study.yaml: holds more than one YAML document (a second "---" at line 2, column 1); keep one',
    );
    expect(refusal(() => parseYamlText('title: x\n__proto__: {polluted: true}\n', 'study.yaml'))).toBe(
      'study.yaml: uses the reserved key "__proto__" at line 2, column 1',
    );
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('JSON', () => {
  it('refuses a repeated key (JSON.parse alone would keep the last)', () => {
    expect(refusal(() => parseJsonText('{\n  "title": "x",\n  "title": "y"\n}', 'study.json'))).toBe(
      'study.json: repeats the key "title" at line 3, column 3; give each key once',
    );
  });

  it('refuses nesting past 64 levels before parsing, not counting brackets in strings', () => {
    expect(parseJsonText(`${'['.repeat(64)}${']'.repeat(64)}`, 'rows.json')).toBeTruthy();
    expect(parseJsonText(`{"a": "${'['.repeat(200)}\\"["}`, 'rows.json')).toEqual({ a: `${'['.repeat(200)}"[` });
    const started = performance.now();
    expect(refusal(() => parseJsonText(`${'['.repeat(1_000_000)}${']'.repeat(1_000_000)}`, 'rows.json'))).toBe(
      'rows.json: nests lists or mappings at line 1, column 65 deeper than allowed, above the limit of 64 levels (see "Limits" in the README)',
    );
    expect(performance.now() - started).toBeLessThan(5000);
  });

  it('refuses prototype keys', () => {
    expect(refusal(() => parseJsonText('{"__proto__": {"x": 1}}', 'study.json'))).toBe('study.json: uses the reserved key "__proto__" at line 1, column 2');
    expect(refusal(() => parseJsonText('[{"constructor": 1}]', 'rows.json'))).toBe('rows.json: uses the reserved key "constructor" at line 1, column 3');
  });

  it('keeps the message of a syntax error on one short line', () => {
    const line = refusal(() => parseJsonText(`{"title": "${'x'.repeat(5000)}`, 'study.json'));
    expect(line.length).toBeLessThan(300);
    expect(line).toMatch(/^study\.json: is not valid JSON/);
  });
});

describe('through the readers', () => {
  it('the study reader refuses the alias bomb and a tag, writing nothing', async () => {
    const folder = writeFiles({ 'bomb.yaml': ALIAS_BOMB, 'tagged.yaml': 'title: !include other.yaml\n', 'indices.csv': BASE_INDICES_CSV });
    await expectInputError(
      () => loadStudy(join(folder, 'bomb.yaml')),
      `${folder}/bomb.yaml: expands its YAML aliases (*name) too often, above the limit of 100 alias expansions (see "Limits" in the README); nested aliases grow exponentially — write the values out`,
      folder,
    );
    await expectInputError(
      () => loadStudy(join(folder, 'tagged.yaml')),
      `${folder}/tagged.yaml: uses the YAML tag !include at line 1, column 17; tags are not part of a study file — write the plain value`,
      folder,
    );
  });

  it('the JSON table reader refuses deep nesting and repeated keys', async () => {
    const folder = writeFiles({
      'deep.json': `[${'['.repeat(70)}${']'.repeat(70)}]`,
      'twice.json': '[{"factor": "temp", "factor": "ph"}]',
    });
    await expectInputError(
      () => readIndexTable(join(folder, 'deep.json'), 'deep.json', STUDY_IDS),
      'deep.json: nests lists or mappings at line 1, column 65 deeper than allowed, above the limit of 64 levels (see "Limits" in the README)',
    );
    await expectInputError(
      () => readIndexTable(join(folder, 'twice.json'), 'twice.json', STUDY_IDS),
      'twice.json: repeats the key "factor" at line 1, column 21; give each key once',
    );
  });
});
