/**
 * Preloaded with `node --import` by the last-resort tests: plants one deliberate bug, chosen
 * by TIERPLAN_TEST_FAULT, so that the tests can watch the command line fail the way a real
 * internal error would. Never loaded by the tool itself.
 *
 * - `hash`: computing the plan checksum throws a TypeError (before anything is written);
 * - `rename`: the second rename of the output set throws a TypeError (files half-way in place);
 * - `async`: writing the first output file throws from a timer, outside any promise chain,
 *   while its temporary file exists (the write itself never completes).
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import { syncBuiltinESMExports } from 'node:module';

const fault = process.env.TIERPLAN_TEST_FAULT;
if (fault === 'hash') {
  crypto.createHash = () => {
    throw new TypeError('planted fault in createHash');
  };
} else if (fault === 'rename') {
  const rename = fs.promises.rename;
  let calls = 0;
  fs.promises.rename = async (from, to) => {
    calls += 1;
    if (calls === 2) throw new TypeError('planted fault in rename');
    return rename(from, to);
  };
} else if (fault === 'async') {
  const writeFile = fs.promises.writeFile;
  fs.promises.writeFile = async (path, content, options) => {
    await writeFile(path, content, options);
    setTimeout(() => {
      throw new TypeError('planted fault in a timer');
    }, 10);
    return new Promise(() => {});
  };
}
syncBuiltinESMExports();
