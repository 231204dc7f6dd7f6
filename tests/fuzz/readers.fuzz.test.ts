/**
 * Fuzzing in the suite: generated and mutated study files, index tables and interaction tables
 * (fuzzInputs.ts) go through the readers, the tiers and the planner, plan files broken
 * after planning through the comparison, and filled run sheets (CSV and workbook) broken
 * cell by cell through the results reader and the analysis (fuzzTargets.ts). Property:
 * each case ends in a valid plan or an InputError with a location on one line, within
 * CASE_BOUND_MS. Fixed seed and case count, so the suite is reproducible and within its time
 * budget (about 20 s on 2 cores); `npm run fuzz -- --cases N --seed S` runs the same harness
 * for longer.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { FUZZ_TARGETS } from './fuzzTargets.js';
import { runFuzzCase } from './fuzzCase.js';

const SEED = 20260417;
/** Cases per target; a plan-file case plans first and a results-sheet case writes a workbook, so they get fewer. */
const CASES: Record<string, number> = { 'plan file': 300, 'results sheet': 40 };
const DEFAULT_CASES = 600;
/** A case is a small study: it plans in tens of milliseconds, so seconds mean a hang. */
const CASE_BOUND_MS = 10_000;

describe('fuzzing the readers, tiers and planner', () => {
  it.each(FUZZ_TARGETS.map((target, t) => [target.name, target, t] as const))(
    '%s: a plan or a located one-line InputError, every case in time',
    async (_, target, t) => {
      const cases = CASES[target.name] ?? DEFAULT_CASES;
      const counts = { valid: 0, inputError: 0 };
      await fc.assert(
        fc.asyncProperty(target.inputs, async (input) => {
          const outcome = await runFuzzCase(target, input, CASE_BOUND_MS);
          if (outcome.kind === 'crash' || outcome.kind === 'hang') {
            throw new Error(`${outcome.kind} after ${input.mutations.join(' | ') || 'no mutation'}: ${outcome.detail}`);
          }
          counts[outcome.kind]++;
        }),
        { seed: SEED + t, numRuns: cases },
      );
      // Not vacuous: valid plans and refusals both occur (shrinking may re-run cases, so only a floor).
      expect(counts.valid).toBeGreaterThan(cases / 20);
      expect(counts.inputError).toBeGreaterThan(cases / 10);
    },
    120_000,
  );
});
