/**
 * A bad study file, seen from the command line: one line on stderr naming file and key,
 * exit code 2, nothing on stdout and no file written.
 */
import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../support/runCli.js';
import { writeStudy } from './studyScratch.js';

describe('study intake errors on the command line', () => {
  it('tiers on a study with a misspelt key prints one line and exits 2', () => {
    const { folder, studyPath } = writeStudy((study) => {
      study.factors[1].nomnal = 6;
      delete study.factors[1].nominal;
    });
    const before = readdirSync(folder).sort();
    const result = runCli(['tiers', studyPath]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toBe(`tierplan: ${studyPath}, key factors[1].nomnal: unknown key "nomnal"; did you mean \`nominal\`?\n`);
    expect(readdirSync(folder).sort()).toEqual(before);
  });

  it('tiers on a bad index row names the table, row and column', () => {
    const { folder, studyPath } = writeStudy(undefined, {
      'indices.csv': '# invented\nfactor,response,first,total\ntemp,titre,0.42,0.55\ntemp,purity,0.1,lots\n',
    });
    const result = runCli(['tiers', studyPath]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toBe(`tierplan: ${folder}/indices.csv, row 4, column total: must be a number, not "lots"\n`);
  });
});
