/**
 * The committed outputs of the checksummed fixture generators are the bytes those generators
 * write: each generator holds the SHA-256 of its output and stops when a rerun differs, and this
 * test (no Python needed) checks the committed files against the same digests, so a fixture
 * edited by hand or regenerated without updating its generator fails here.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const here = new URL('./', import.meta.url);
const sha256 = (path: string) => createHash('sha256').update(readFileSync(new URL(path, here))).digest('hex');
const script = (path: string) => readFileSync(new URL(path, here), 'utf8');

describe('fixture checksums held by their generators', () => {
  it('design-search/design-search.json', () => {
    const expected = /^CHECKSUM = "([0-9a-f]{64})"$/m.exec(script('design-search/generate.py'))?.[1];
    expect(sha256('design-search/design-search.json')).toBe(expected);
  });

  it.each(['indices.csv', 'indices-semicolon.csv', 'ishigami-intake.json'])('ishigami-intake/%s', (name) => {
    const source = script('ishigami-intake/generate.py');
    const expected = new RegExp(`"${name.replace('.', '\\.')}": "([0-9a-f]{64})"`).exec(source)?.[1];
    expect(sha256(`ishigami-intake/${name}`)).toBe(expected);
  });
});
