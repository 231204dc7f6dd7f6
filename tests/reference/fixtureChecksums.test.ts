/**
 * Every fixture under tests/reference/<name>/ is the bytes its generate.py writes. Each generator
 * is seeded, pins the BLAS kernel and thread count before numpy loads (reproducible.py: the last
 * bits of LAPACK results otherwise follow the CPU), holds the SHA-256 of each file it writes in
 * CHECKSUMS, and exits 1 when a rerun differs. This test (no Python needed) checks the committed
 * files against the same digests, and that no file in a generator's folder escapes them, so a
 * fixture edited by hand or regenerated without updating its generator fails here.
 *
 * Regenerating (then `git diff --exit-code tests/reference` shows nothing):
 *   python3 tests/reference/<name>/generate.py            numpy 2.4 / scipy 1.17 (pip)
 *   /usr/bin/python3 tests/reference/<name>/generate.py   numpy 1.24 / scipy 1.10 / statsmodels 0.13
 *     (apt-get install python3-numpy python3-scipy python3-statsmodels)
 * Each script's header names its interpreter (design-search, reml and splitplot: /usr/bin/python3).
 * After a deliberate change of a script, paste the digests it prints into its CHECKSUMS.
 * nist-strd/ holds published data files, not generated ones (see its README).
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const here = new URL('./', import.meta.url);
const sha256 = (path: string) => createHash('sha256').update(readFileSync(new URL(path, here))).digest('hex');

const generators = readdirSync(here)
  .filter((name) => statSync(new URL(name, here)).isDirectory())
  .filter((name) => readdirSync(new URL(`${name}/`, here)).includes('generate.py'))
  .sort();

function checksums(folder: string): Map<string, string> {
  const source = readFileSync(new URL(`${folder}/generate.py`, here), 'utf8');
  const block = /^CHECKSUMS = \{\n([\s\S]*?)\n\}$/m.exec(source)?.[1] ?? '';
  return new Map([...block.matchAll(/"([^"]+)": "([0-9a-f]{64})"/g)].map((m) => [m[1]!, m[2]!]));
}

describe('fixture checksums held by their generators', () => {
  it('finds every generator', () => {
    expect(generators).toEqual([
      'analysis', 'classical', 'design', 'design-search', 'evaluate', 'holdouts',
      'ishigami', 'ishigami-intake', 'precision', 'reml', 'sobol', 'splitplot',
    ]);
  });

  describe.each(generators)('%s/', (folder) => {
    const expected = checksums(folder);

    it('checksums every file beside the script, and pins the BLAS before numpy', () => {
      const files = readdirSync(new URL(`${folder}/`, here)).filter((name) => name !== 'generate.py').sort();
      expect([...expected.keys()].sort()).toEqual(files);
      const source = readFileSync(new URL(`${folder}/generate.py`, here), 'utf8');
      expect(source.indexOf('reproducible.pin_blas()')).toBeGreaterThan(-1);
      expect(source.indexOf('reproducible.pin_blas()')).toBeLessThan(source.indexOf('import numpy'));
      expect(source).toContain('reproducible.check(');
    });

    it.each([...expected])('%s', (name, digest) => {
      expect(sha256(`${folder}/${name}`)).toBe(digest);
    });
  });
});
