/**
 * `tierplan tiers` on the bundled (invented) spray-dryer sample, its JSON and file outputs,
 * and its refusals.
 *
 * Expected tiers worked out by hand from samples/spray-dryer/indices.csv (mean of the four
 * response rows, default cut-offs 0.30 / 0.05):
 *   inlet_temp     (0.46 + 0.38 + 0.52 + 0.10) / 4 = 0.365   critical
 *   feed_solids    (0.20 + 0.30 + 0.08 + 0.70) / 4 = 0.32    critical (no bounds)
 *   feed_rate      (0.26 + 0.15 + 0.12 + 0.19) / 4 = 0.18    moderate
 *   atomiser_speed (0.02 + 0.06 + 0.01 + 0.36) / 4 = 0.1125  moderate
 *   air_flow       (0.07 + 0.05 + 0.03 + 0.02) / 4 = 0.0425  negligible; bounds
 *                  low (0.044 + 0.026 + 0.008 + 0)/4 = 0.0195, high (0.096 + 0.074 + 0.052 + 0.042)/4 = 0.066
 *                  cross 0.05 → borderline
 * Model parameters: d_eff 0.1175, e_denat 0.10, k_denat_ref 0.065, tg_offset 0.0825 moderate;
 * gab_m0 0.035, gab_c 0.01, gab_k 0.015, h_mult 0.0375, wall_dep 0.0325, shrink 0.025 negligible.
 */
import { copyFileSync, existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repoRoot, runCli } from '../support/runCli.js';
import { tiersSummary } from '../../src/cli/tiersSummary.js';
import { decideTiers } from '../../src/core/sensitivity/decideTiers.js';
import { painter } from '../../src/io/terminalStyle.js';
import { factor, policy, response, row } from '../core/sensitivity/studyFixture.js';

const sampleDir = join(repoRoot, 'samples/spray-dryer');
const sample = join(sampleDir, 'study.yaml');

const EXPECTED_TIERS: Record<string, string> = {
  inlet_temp: 'critical',
  feed_solids: 'critical',
  feed_rate: 'moderate',
  atomiser_speed: 'moderate',
  air_flow: 'negligible',
  d_eff: 'moderate',
  e_denat: 'moderate',
  k_denat_ref: 'moderate',
  gab_m0: 'negligible',
  gab_c: 'negligible',
  gab_k: 'negligible',
  tg_offset: 'moderate',
  h_mult: 'negligible',
  wall_dep: 'negligible',
  shrink: 'negligible',
};

function freshDir(): string {
  return mkdtempSync(join(tmpdir(), 'tierplan-tiers-'));
}

/** A copy of the sample study with edits applied to the study text and the index table. */
function editedSample(editStudy: (text: string) => string, editIndices: (text: string) => string = (text) => text): string {
  const dir = freshDir();
  copyFileSync(join(sampleDir, 'interactions.csv'), join(dir, 'interactions.csv'));
  writeFileSync(join(dir, 'indices.csv'), editIndices(readFileSync(join(sampleDir, 'indices.csv'), 'utf8')));
  writeFileSync(join(dir, 'study.yaml'), editStudy(readFileSync(sample, 'utf8')));
  return join(dir, 'study.yaml');
}

function lineOf(stdout: string, id: string): string {
  const line = stdout.split('\n').find((text) => text.startsWith(`${id} `));
  if (!line) throw new Error(`no line for ${id} in:\n${stdout}`);
  return line;
}

describe('tierplan tiers on the sample (human output)', () => {
  const result = runCli(['tiers', sample]);

  it('exits 0 and prints every factor with the tier worked out by hand', () => {
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    for (const [id, tier] of Object.entries(EXPECTED_TIERS)) {
      expect(lineOf(result.stdout, id)).toMatch(new RegExp(`\\b${tier}\\b`));
    }
  });

  it('shows aggregated values, the interval and the borderline mark with its legend', () => {
    const inlet = lineOf(result.stdout, 'inlet_temp');
    // Indices print with the one index rule of numberText.ts: two decimals, halves up.
    expect(inlet).toContain('0.37'); // 0.365
    expect(inlet).toContain('0.32 – 0.41'); // 0.31575 and 0.41425
    expect(inlet).toContain('°C');
    expect(lineOf(result.stdout, 'air_flow')).toMatch(/negligible \*/);
    expect(lineOf(result.stdout, 'feed_rate')).not.toContain('*');
    expect(result.stdout).toMatch(/^\* borderline:/m);
  });

  it('separates operating settings from model parameters', () => {
    const operating = result.stdout.indexOf('Operating settings (5)');
    const model = result.stdout.indexOf('Model parameters (10)');
    expect(operating).toBeGreaterThan(-1);
    expect(model).toBeGreaterThan(operating);
    expect(result.stdout.indexOf('air_flow ')).toBeLessThan(model);
    expect(result.stdout.indexOf('d_eff ')).toBeGreaterThan(model);
  });

  it('lists interaction pairs, the calibration count and the sweep', () => {
    // Largest second-order index per pair over responses, from interactions.csv.
    expect(result.stdout).toMatch(/inlet_temp × feed_rate\s+0\.08\s+moisture/);
    expect(result.stdout).toMatch(/inlet_temp × e_denat\s+0\.05\s+native_whey/);
    expect(result.stdout).not.toContain('inlet_temp × air_flow');
    expect(result.stdout).toContain('4 of 10 parameters need precise estimation; characterisation work avoided for 6.');
    expect(result.stdout).toMatch(/0\.20 – 0\.30\s+2\s+6\s+7\s+2\/2\/1\s+0\/4\/6\s+← policy/);
  });

  it('lines up the unit column although °C and m³/h are multi-byte', () => {
    const lines = ['inlet_temp', 'air_flow', 'feed_rate'].map((id) => lineOf(result.stdout, id));
    const columnOfTotal = lines.map((line) => line.indexOf('0.'));
    expect(new Set(columnOfTotal).size).toBe(1);
  });

  it('prints no colour codes when stdout is not a terminal (NO_COLOR itself: terminalStyle.test.ts)', () => {
    expect(result.stdout).not.toContain('\u001b[');
  });
});

// The report text itself, without a process: details a reader relies on.
describe('tiersSummary', () => {
  // Invented: one response, weight 3. a: 0.40 critical; p (model): 0.04, bounds 0.03–0.06 → negligible, borderline.
  const study = {
    title: 'Invented',
    factors: [factor('a'), factor('p', 'model')],
    responses: [response('y', 3)],
    indices: [row('a', 'y', 0.3, 0.4), row('p', 'y', 0.02, 0.04, [0.03, 0.06])],
    interactions: [],
  };

  it('says "1 response", marks a borderline model parameter in the calibration list too', () => {
    const text = tiersSummary(study, decideTiers({ ...study, policy: policy() }), painter(false));
    expect(text).toContain('mean over the responses (1 response);');
    expect(text).toMatch(/^p\s+Factor p\s+0\.04\s+negligible \*\s+take a literature or nominal value$/m);
    expect(text).toMatch(/^\* borderline:/m);
    expect(text).toContain('The study gives no second-order table (key `interactions`), so no pairs can be listed.');
  });

  it('names the weights when the aggregate is weighted', () => {
    const withPair = { ...study, interactions: [{ factorA: 'a', factorB: 'p', response: 'y', index: 0.02 }] };
    const text = tiersSummary(withPair, decideTiers({ ...withPair, policy: policy({ aggregate: 'weighted' }) }), painter(false));
    expect(text).toContain('response-weighted mean (weights y 3);');
    expect(text).toContain('No pair reaches 0.05 for any response.');
  });
});

describe('tierplan tiers --json', () => {
  const result = runCli(['tiers', sample, '--json']);
  const document = JSON.parse(result.stdout);

  it('has the documented shape', () => {
    expect(result.status).toBe(0);
    expect(Object.keys(document)).toEqual([
      'title',
      'policy',
      'factors',
      'interactionPairs',
      'calibration',
      'sweep',
      'notes',
      'warnings',
    ]);
    expect(document.policy).toEqual({ aggregate: 'mean', critical: 0.3, moderate: 0.05, interaction: 0.05, confidence: 'point' });
    for (const factor of document.factors) {
      for (const key of ['id', 'name', 'unit', 'role', 'aggregatedTotal', 'aggregatedFirst', 'aggregatedTotalLow', 'aggregatedTotalHigh', 'decidedOn', 'tier', 'borderline', 'interactionShare', 'perResponse']) {
        expect(factor).toHaveProperty(key);
      }
    }
  });

  it('carries the hand-worked values', () => {
    const byId = Object.fromEntries(document.factors.map((factor: { id: string }) => [factor.id, factor]));
    expect(Object.fromEntries(document.factors.map((factor: { id: string; tier: string }) => [factor.id, factor.tier]))).toEqual(EXPECTED_TIERS);
    expect(byId.inlet_temp.aggregatedTotal).toBeCloseTo(0.365, 12);
    expect(byId.inlet_temp.aggregatedTotalLow).toBeCloseTo(0.31575, 12);
    // interaction share: mean first (0.245 + 0.203 + 0.277 + 0.053) / 4 = 0.1945; 0.365 − 0.1945 = 0.1705
    expect(byId.inlet_temp.interactionShare).toBeCloseTo(0.1705, 12);
    expect(byId.air_flow.borderline).toBe(true);
    expect(byId.air_flow.aggregatedTotalHigh).toBeCloseTo(0.066, 12);
    expect(byId.feed_solids.aggregatedTotalLow).toBeNull();
    expect(document.factors.filter((factor: { borderline: boolean }) => factor.borderline)).toHaveLength(1);
    expect(document.calibration.estimate).toBe(4);
    expect(document.calibration.literature).toBe(6);
    expect(document.interactionPairs).toHaveLength(4);
    expect(document.interactionPairs[0]).toEqual({ factorA: 'inlet_temp', factorB: 'feed_rate', index: 0.08, responses: ['moisture'] });
  });

  it('--out FILE.json writes the same document', () => {
    const dir = freshDir();
    const file = join(dir, 'tiers.json');
    expect(runCli(['tiers', sample, '--out', file]).status).toBe(0);
    expect(JSON.parse(readFileSync(file, 'utf8'))).toEqual(document);
    expect(readdirSync(dir)).toEqual(['tiers.json']);
  });

  it('options override the policy: upper bound tiering makes air_flow moderate and notes factors without bounds', () => {
    const upper = runCli(['tiers', sample, '--json', '--confidence', 'upper']);
    expect(upper.status).toBe(0);
    const doc = JSON.parse(upper.stdout);
    const airFlow = doc.factors.find((factor: { id: string }) => factor.id === 'air_flow');
    expect(airFlow.decidedOn).toBeCloseTo(0.066, 12);
    expect(airFlow.tier).toBe('moderate');
    expect(doc.policy.confidence).toBe('upper');
    expect(doc.notes[0]).toMatch(/^no confidence bounds for feed_solids, k_denat_ref/);
  });

  it('--aggregate max and --critical change the decision as the rule says', () => {
    // max over responses: air_flow 0.07 → moderate; gab_m0 0.12 → moderate; critical 0.5: feed_solids 0.70, inlet_temp 0.52
    const doc = JSON.parse(runCli(['tiers', sample, '--json', '--aggregate', 'max', '--critical', '0.5']).stdout);
    const tiers = Object.fromEntries(doc.factors.map((factor: { id: string; tier: string }) => [factor.id, factor.tier]));
    expect(tiers.inlet_temp).toBe('critical');
    expect(tiers.feed_solids).toBe('critical');
    expect(tiers.atomiser_speed).toBe('moderate'); // 0.36 < 0.5
    expect(tiers.air_flow).toBe('moderate');
    expect(tiers.gab_m0).toBe('moderate');
    expect(tiers.gab_c).toBe('negligible'); // max 0.03
  });
});

describe('tierplan tiers --out', () => {
  it('writes a CSV with one row per factor', () => {
    const dir = freshDir();
    const file = join(dir, 'tiers.csv');
    const result = runCli(['tiers', sample, '--out', file]);
    expect(result.status).toBe(0);
    const lines = readFileSync(file, 'utf8').trimEnd().split('\r\n');
    expect(lines).toHaveLength(16);
    expect(lines[0]).toMatch(/^"id","name","unit","role","tier","borderline","aggregated_total",/);
    expect(lines[0]).toContain('"total_moisture","total_yield","total_native_whey","total_d50"');
    expect(lines[1]).toMatch(/^"inlet_temp","Inlet air temperature","°C","operating","critical","no",0\.365/);
    expect(lines[5]).toMatch(/^"air_flow",.*"negligible","yes",/);
    // a lone "-" unit cannot start a formula and stays as written (OWASP CSV injection guard, csvCell.ts)
    expect(lines.find((line) => line.startsWith('"gab_c"'))).toContain(`"-"`);
    expect(readdirSync(dir)).toEqual(['tiers.csv']);
  });

});

describe('tierplan tiers refusals', () => {
  const refused = (args: string[], pattern: RegExp) => {
    const dir = freshDir();
    const file = join(dir, 'tiers.csv');
    const result = runCli(['tiers', ...args, '--out', file]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    const lines = result.stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(pattern);
    expect(existsSync(file)).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  };

  it('a cut-off that is not a number strictly between 0 and 1 (the study file’s own rule)', () => {
    refused([sample, '--critical', 'abc'], /--critical must be a number strictly between 0 and 1 \(such as 0\.3\), not "abc"/);
    refused([sample, '--moderate', '1.5'], /--moderate must be a number strictly between 0 and 1/);
    // 0 would make every factor at least moderate; Number('0x1') is 1.
    refused([sample, '--interaction', '0'], /--interaction must be a number strictly between 0 and 1/);
    refused([sample, '--critical', '0x1'], /--critical must be a number strictly between 0 and 1/);
  });

  it('an --out file that is one of the study’s inputs is refused and the input kept', () => {
    const study = editedSample((text) => text);
    const indices = join(study, '..', 'indices.csv');
    const before = readFileSync(indices, 'utf8');
    const result = runCli(['tiers', study, '--out', indices]);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.trimEnd().split('\n')).toEqual([
      `tierplan: ${indices}: is an input of the study (the study file or one of its index tables); choose another --out file`,
    ]);
    expect(readFileSync(indices, 'utf8')).toBe(before);
    expect(readdirSync(join(study, '..')).sort()).toEqual(['indices.csv', 'interactions.csv', 'study.yaml']);
  });

  it('an unknown aggregate rule or confidence basis', () => {
    refused([sample, '--aggregate', 'median'], /--aggregate must be mean, max or weighted/);
    refused([sample, '--confidence', 'lower'], /--confidence must be point or upper/);
  });

  it('a critical cut-off below the study’s moderate one', () => {
    refused([sample, '--critical', '0.04'], /moderate cut-off must be below the critical one: moderate 0.05 \(from the study\) is not below --critical 0.04/);
  });

  it('an --out file type other than .csv or .json', () => {
    const dir = freshDir();
    const result = runCli(['tiers', sample, '--out', join(dir, 'tiers.txt')]);
    expect(result.status).toBe(2);
    expect(result.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(result.stderr).toMatch(/name the file \.csv or \.json/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a study that does not exist or does not parse', () => {
    refused([join(freshDir(), 'missing.yaml')], /missing\.yaml/);
    const broken = editedSample((text) => text.replace('critical: 0.30', 'critical: [0.30'));
    refused([broken], /study\.yaml/);
  });
});

describe('tierplan tiers warnings', () => {
  it('prints the study’s warnings on stderr and in the JSON', () => {
    // A total index of 1.004 is clipped to 1 with a warning (estimator noise).
    const study = editedSample(
      (text) => text,
      (text) => text.replace('feed_solids,d50,0.421,0.7,,,,', 'feed_solids,d50,0.421,1.004,,,,'),
    );
    const result = runCli(['tiers', study, '--json']);
    expect(result.status).toBe(0);
    expect(result.stderr).toMatch(/^warning: .*clipped/m);
    expect(JSON.parse(result.stdout).warnings.join('\n')).toMatch(/clipped/);
  });
});
