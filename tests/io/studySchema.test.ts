/**
 * The shipped JSON Schema of the study file (schema/study.schema.json): up to date with the
 * validator it is generated from, and — checked by an independent JSON Schema validator, Ajv
 * (draft 2020-12) — accepting the bundled sample and refusing a misspelt key, a wrong type and
 * an unfilled placeholder, as an editor using it will.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { parse } from 'yaml';
import { describe, expect, it } from 'vitest';
import { studySchemaPath, studySchemaText } from '../../src/io/studySchemaFile.js';
import { repoRoot } from '../support/runCli.js';

const schema = JSON.parse(readFileSync(studySchemaPath(), 'utf8'));
const validate = new Ajv2020({ allErrors: true, strict: true }).compile(schema);
const sample = (): Record<string, any> => parse(readFileSync(join(repoRoot, 'samples/spray-dryer/study.yaml'), 'utf8'));

describe('schema/study.schema.json', () => {
  it('is what `npm run schema` writes from the validator (regenerate it when this fails)', () => {
    expect(readFileSync(studySchemaPath(), 'utf8')).toBe(studySchemaText());
  });

  it('is shipped in the package', () => {
    const files = JSON.parse(readFileSync(join(repoRoot, 'package.json'), 'utf8')).files as string[];
    expect(files).toContain('schema/study.schema.json');
  });

  it('accepts the bundled sample', () => {
    expect(validate(sample()), JSON.stringify(validate.errors)).toBe(true);
  });

  it('and the sample names it on its first line for the YAML language server', () => {
    const first = readFileSync(join(repoRoot, 'samples/spray-dryer/study.yaml'), 'utf8').split('\n')[0];
    expect(first).toBe('# yaml-language-server: $schema=../../schema/study.schema.json');
  });

  it.each([
    ['a misspelt factor key', (s: Record<string, any>) => (s.factors[0].nomnal = 1), '/factors/0', 'additionalProperties'],
    ['a misspelt top-level key', (s: Record<string, any>) => (s.polcy = {}), '', 'additionalProperties'],
    ['text where a number belongs', (s: Record<string, any>) => (s.factors[0].low = 'low'), '/factors/0/low', 'type'],
    ['a role that is not one of the two', (s: Record<string, any>) => (s.factors[0].role = 'setting'), '/factors/0/role', 'enum'],
    ['an unfilled placeholder', (s: Record<string, any>) => (s.responses[0].unit = 'TODO'), '/responses/0/unit', 'pattern'],
  ])('refuses %s', (_name, edit, instancePath, keyword) => {
    const study = sample();
    edit(study);
    expect(validate(study)).toBe(false);
    expect(validate.errors?.map((error) => [error.instancePath, error.keyword])).toContainEqual([instancePath, keyword]);
  });
});
