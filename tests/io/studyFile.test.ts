/**
 * loadStudy: the bundled sample, defaults, and one test per study-file rule. Each bad input
 * must give exactly one line naming the file and the key path, and write nothing.
 */
import { chmodSync, mkdirSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/io/studyFile.js';
import { DEFAULT_DESIGN, DEFAULT_POLICY } from '../../src/core/study.js';
import { InputError } from '../../src/core/inputError.js';
import { baseStudy, BASE_INDEX_ROWS, expectInputError, writeFiles, writeStudy, BASE_INDICES_CSV, BASE_INTERACTIONS_CSV } from './studyScratch.js';

describe('the bundled spray-dryer sample', () => {
  it('loads with 15 factors, 4 responses, 60 index rows, 10 interaction rows and no warnings', async () => {
    const study = await loadStudy('samples/spray-dryer/study.yaml');
    expect(study.factors).toHaveLength(15);
    expect(study.factors.filter((factor) => factor.role === 'operating').map((factor) => factor.id)).toEqual([
      'inlet_temp',
      'feed_solids',
      'feed_rate',
      'atomiser_speed',
      'air_flow',
    ]);
    expect(study.responses.map((response) => [response.id, response.weight])).toEqual([
      ['moisture', 2],
      ['yield', 1],
      ['native_whey', 2],
      ['d50', 1],
    ]);
    expect(study.indices).toHaveLength(60);
    expect(study.interactions).toHaveLength(10);
    // The sample's tables are consistent, so reading them raises no finding.
    expect(study.warnings).toEqual([]);
    // Spot checks against samples/spray-dryer/indices.csv rows 3 and 7 and interactions.csv row 3.
    expect(study.indices[0]).toEqual({
      factor: 'inlet_temp',
      response: 'moisture',
      first: 0.245,
      total: 0.46,
      firstLow: 0.215,
      firstHigh: 0.275,
      totalLow: 0.403,
      totalHigh: 0.517,
    });
    expect(study.indices[4]).toEqual({ factor: 'feed_solids', response: 'moisture', first: 0.12, total: 0.2 });
    expect(study.interactions[0]).toEqual({ factorA: 'inlet_temp', factorB: 'feed_rate', response: 'moisture', index: 0.08 });
    expect(study.factors[0]).toEqual({
      id: 'inlet_temp',
      name: 'Inlet air temperature',
      unit: '°C',
      role: 'operating',
      low: 160,
      high: 200,
      nominal: 180,
      precision: 1,
      limits: { low: 140, high: 220 },
      hardToChange: true,
      settleMinutes: 40,
    });
    expect(study.constraints).toEqual(['feed_rate <= 0.2 * inlet_temp - 18']);
    expect(study.design).toEqual({ ...DEFAULT_DESIGN, seed: 20261201 });
    expect(study.policy).toEqual(DEFAULT_POLICY);
    expect(study.sessions).toEqual({ maxRuns: 6, label: 'Day', hours: 22 });
    expect(study.costs).toEqual({ currency: 'EUR', perRun: 850, hoursPerRun: 3, perLevelChange: { cost: 120, hours: 0.7 } });
    expect(study.source).toEqual({
      studyFile: 'samples/spray-dryer/study.yaml',
      indicesFile: 'indices.csv',
      interactionsFile: 'interactions.csv',
    });
  });
});

describe('defaults and merging', () => {
  it('fills weight, policy, design and session defaults and keeps table paths as written', async () => {
    const { studyPath } = writeStudy((study) => {
      study.policy = { critical: 0.4 };
      study.design = { runs: 14, levels: { moderate: 2 } };
      study.sessions = { maxRuns: 4 };
    });
    const study = await loadStudy(studyPath);
    expect(study.responses[0].weight).toBe(1);
    expect(study.responses[1].weight).toBe(2);
    expect(study.policy).toEqual({ ...DEFAULT_POLICY, critical: 0.4 });
    expect(study.design).toEqual({ ...DEFAULT_DESIGN, runs: 14, levels: { critical: 4, moderate: 2 } });
    expect(study.sessions).toEqual({ maxRuns: 4, label: 'Session', hours: 8 }); // DEFAULT_SESSION_HOURS
    expect(study.costs).toBeUndefined();
    expect(study.constraints).toEqual([]);
    expect(study.indices).toEqual(BASE_INDEX_ROWS);
    expect(study.interactions).toEqual([
      { factorA: 'temp', factorB: 'ph', response: 'titre', index: 0.08 },
      { factorA: 'ph', factorB: 'k_ref', response: 'purity', index: 0.01 },
    ]);
    expect(study.factors[2]).toEqual({ id: 'k_ref', name: 'Reference rate constant', unit: '1/h', role: 'model', low: 0.1, high: 1, nominal: 0.4 });
    expect(study.source).toEqual({ studyFile: studyPath, indicesFile: 'indices.csv', interactionsFile: 'interactions.csv' });
    expect(study.warnings).toEqual([]);
  });

  it('reads without an interactions table', async () => {
    const { studyPath } = writeStudy((study) => delete study.interactions);
    const study = await loadStudy(studyPath);
    expect(study.interactions).toEqual([]);
    expect(study.source).toEqual({ studyFile: studyPath, indicesFile: 'indices.csv' });
  });

  it('reads a JSON study file into the same Study as the YAML one', async () => {
    const { folder, studyPath } = writeStudy((study) => (study.design = { model: ['temp', 'ph', 'temp*ph', 'temp^2'] }));
    const fromYaml = await loadStudy(studyPath);
    const json = baseStudy();
    json.design = { model: ['temp', 'ph', 'temp*ph', 'temp^2'] };
    writeFileSync(join(folder, 'study.json'), JSON.stringify(json));
    const fromJson = await loadStudy(join(folder, 'study.json'));
    expect(fromJson).toEqual({ ...fromYaml, source: { ...fromYaml.source, studyFile: join(folder, 'study.json') } });
    expect(fromJson.design.model).toEqual(['temp', 'ph', 'temp*ph', 'temp^2']);
  });

  it('resolves table paths against the study folder, not the working folder', async () => {
    const folder = writeFiles({
      'project/study.yaml': JSON.stringify({ ...baseStudy(), indices: 'tables/indices.csv', interactions: undefined }),
      'project/tables/indices.csv': BASE_INDICES_CSV,
    });
    const relativePath = relative(process.cwd(), join(folder, 'project/study.yaml'));
    const study = await loadStudy(relativePath);
    expect(study.source).toEqual({ studyFile: relativePath, indicesFile: 'tables/indices.csv' });
    expect(study.indices).toHaveLength(6);
  });

  it('names a missing table by its path joined to the study path the user gave', async () => {
    const folder = writeFiles({ 'project/study.yaml': JSON.stringify({ ...baseStudy(), indices: 'tables/sobol.csv', interactions: undefined }) });
    const relativePath = relative(process.cwd(), join(folder, 'project/study.yaml'));
    await expectInputError(() => loadStudy(relativePath), `${join(relative(process.cwd(), folder), 'project/tables/sobol.csv')}: file not found`);
  });
});

describe('the study file itself', () => {
  it('refuses a missing file', async () => {
    const folder = writeFiles({});
    await expectInputError(() => loadStudy(join(folder, 'nothing.yaml')), `${folder}/nothing.yaml: file not found`, folder);
  });

  it('refuses an empty file', async () => {
    const folder = writeFiles({ 'study.yaml': '  \n' });
    await expectInputError(() => loadStudy(join(folder, 'study.yaml')), `${folder}/study.yaml: is empty`, folder);
  });

  it('refuses a file holding only comments', async () => {
    const folder = writeFiles({ 'study.yaml': '# nothing here yet\n' });
    await expectInputError(() => loadStudy(join(folder, 'study.yaml')), `${folder}/study.yaml: has no content (only comments?)`);
  });

  it('refuses a folder', async () => {
    const folder = writeFiles({});
    mkdirSync(join(folder, 'study.yaml'));
    await expectInputError(() => loadStudy(join(folder, 'study.yaml')), `${folder}/study.yaml: is a folder, not a study file`);
  });

  it('refuses an unsupported extension', async () => {
    const folder = writeFiles({ 'study.toml': 'title = "x"' });
    await expectInputError(
      () => loadStudy(join(folder, 'study.toml')),
      `${folder}/study.toml: unsupported study file type ".toml"; use .yaml, .yml or .json`,
    );
  });

  it.skipIf(process.getuid?.() === 0)('refuses an unreadable file', async () => {
    const { folder, studyPath } = writeStudy();
    chmodSync(studyPath, 0o000);
    await expectInputError(() => loadStudy(studyPath), `${folder}/study.yaml: cannot be read (permission denied)`);
  });

  it('reports a YAML syntax error with its line', async () => {
    const folder = writeFiles({ 'study.yaml': 'title: x\nfactors: [\n  - id: a\n' });
    await expectInputError(
      () => loadStudy(join(folder, 'study.yaml')),
      `${folder}/study.yaml: YAML syntax error at line 3, column 3: Block collections are not allowed within flow collections`,
    );
  });

  it('refuses a key given twice', async () => {
    const folder = writeFiles({ 'study.yaml': 'title: x\ntitle: y\n' });
    await expectInputError(() => loadStudy(join(folder, 'study.yaml')), `${folder}/study.yaml: YAML syntax error at line 2, column 1: Map keys must be unique`);
  });

  it('refuses a top-level list', async () => {
    const folder = writeFiles({ 'study.yaml': '- title: x\n' });
    await expectInputError(
      () => loadStudy(join(folder, 'study.yaml')),
      `${folder}/study.yaml: must be a mapping with keys such as title, factors, responses, indices, …`,
    );
  });

  it('refuses invalid JSON', async () => {
    const folder = writeFiles({ 'study.json': '{"title": }' });
    const error: unknown = await loadStudy(join(folder, 'study.json')).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).describe()).toMatch(new RegExp(`^${folder}/study.json: is not valid JSON (at|near) line 1, column \\d+: `));
  });
  it('refuses a study saved in a legacy 8-bit encoding, naming the line', async () => {
    // "unit: °C" in Windows-1252 is the byte 0xB0, which UTF-8 cannot read.
    const folder = writeFiles({ 'study.yaml': Buffer.concat([Buffer.from('title: x\nunit: '), Buffer.from([0xb0]), Buffer.from('C\n')]) });
    await expectInputError(
      () => loadStudy(join(folder, 'study.yaml')),
      `${folder}/study.yaml: is not UTF-8 text (line 2 has bytes UTF-8 cannot read, probably a legacy encoding such as Windows-1252); save it as UTF-8`,
      folder,
    );
  });
  it('refuses a key given twice in a JSON study (YAML does too)', async () => {
    const folder = writeFiles({ 'study.json': '{\n  "title": "a",\n  "title": "b"\n}' });
    await expectInputError(
      () => loadStudy(join(folder, 'study.json')),
      `${folder}/study.json: repeats the key "title" at line 3, column 3; give each key once`,
      folder,
    );
  });
});

/** Loads the base study after `edit` and expects `study.yaml, key <key>: <message>`. */
async function expectKeyError(edit: (study: Record<string, any>) => void, key: string, message: string): Promise<void> {
  const { folder, studyPath } = writeStudy(edit);
  await expectInputError(() => loadStudy(studyPath), `${studyPath}, key ${key}: ${message}`, folder);
}

describe('unknown keys are errors with a suggestion', () => {
  it('at the top level', () =>
    expectKeyError((study) => (study.indice = 'x.csv'), 'indice', 'unknown key "indice"; did you mean `indices`?'));
  it('in a factor', () =>
    expectKeyError(
      (study) => {
        study.factors[1].nomnal = 6;
        delete study.factors[1].nominal;
      },
      'factors[1].nomnal',
      'unknown key "nomnal"; did you mean `nominal`?',
    ));
  it('in factor limits', () =>
    expectKeyError((study) => (study.factors[1].limits.hgh = 9), 'factors[1].limits.hgh', 'unknown key "hgh"; did you mean `high`?'));
  it('in a response', () =>
    expectKeyError((study) => (study.responses[0].wieght = 3), 'responses[0].wieght', 'unknown key "wieght"; did you mean `weight`?'));
  it('in policy', () =>
    expectKeyError((study) => (study.policy = { critcal: 0.4 }), 'policy.critcal', 'unknown key "critcal"; did you mean `critical`?'));
  it('in design.levels', () =>
    expectKeyError(
      (study) => (study.design = { levels: { moderte: 3 } }),
      'design.levels.moderte',
      'unknown key "moderte"; did you mean `moderate`?',
    ));
  it('in costs.perLevelChange', () =>
    expectKeyError(
      (study) => (study.costs = { currency: 'EUR', perRun: 1, hoursPerRun: 1, perLevelChange: { cost: 1, hour: 1 } }),
      'costs.perLevelChange.hour',
      'unknown key "hour"; did you mean `hours`?',
    ));
  it('with no close key, lists the valid ones', () =>
    expectKeyError(
      (study) => (study.sessions = { maxRuns: 3, colour: 'red' }),
      'sessions.colour',
      'unknown key "colour"; expected one of maxRuns, label, hours',
    ));
});

describe('types and required keys', () => {
  it('a number given as text', () =>
    expectKeyError((study) => (study.factors[2].low = 'low'), 'factors[2].low', 'must be a number, not "low"'));
  it('a missing required key', () => expectKeyError((study) => delete study.factors[0].unit, 'factors[0].unit', 'is required'));
  it('a missing indices key', () => expectKeyError((study) => delete study.indices, 'indices', 'is required'));
  it('an unknown role', () =>
    expectKeyError((study) => (study.factors[0].role = 'operatin'), 'factors[0].role', 'must be one of "operating", "model", not "operatin"; did you mean `operating`?'));
  it('a non-boolean hardToChange', () =>
    expectKeyError((study) => (study.factors[1].hardToChange = 'yes'), 'factors[1].hardToChange', 'must be true or false, not "yes"'));
  it('an empty title', () => expectKeyError((study) => (study.title = ''), 'title', 'must not be empty'));
  it('an infinite bound', () => expectKeyError((study) => (study.factors[0].high = '.inf'), 'factors[0].high', 'must be a number, not ".inf"'));
});

describe('factor rules', () => {
  it('ids must be identifiers, because constraints and model terms use them', () =>
    expectKeyError(
      (study) => (study.factors[0].id = 'jacket temp'),
      'factors[0].id',
      '"jacket temp" is not a usable id: start with a letter, then letters, digits or "_" (ids are written in constraints and model terms)',
    ));
  it('ids must not start with a digit', () =>
    expectKeyError(
      (study) => (study.factors[0].id = '2nd_temp'),
      'factors[0].id',
      '"2nd_temp" is not a usable id: start with a letter, then letters, digits or "_" (ids are written in constraints and model terms)',
    ));
  it('ids must be unique', () =>
    expectKeyError((study) => (study.factors[2].id = 'temp'), 'factors[2].id', 'id "temp" is already used by factors[0]; ids must be unique'));
  it('ids must not be words of the constraint language', () =>
    expectKeyError((study) => (study.factors[2].id = 'pi'), 'factors[2].id', '"pi" is reserved in constraint expressions; choose another id'));
  it('low must be below high', () =>
    expectKeyError((study) => (study.factors[0].low = 60), 'factors[0].high', 'high (60) must be greater than low (60)'));
  it('nominal must lie in the range', () =>
    expectKeyError((study) => (study.factors[0].nominal = 61), 'factors[0].nominal', 'nominal 61 lies outside the range 20 to 60'));
  it('limits must be ordered', () =>
    expectKeyError((study) => (study.factors[1].limits = { low: 9, high: 4 }), 'factors[1].limits.high', 'limits.high (4) must be greater than limits.low (9)'));
  it('the range must sit inside the equipment limits', () =>
    expectKeyError((study) => (study.factors[1].limits = { low: 5.5, high: 9 }), 'factors[1].low', 'low 5 is below the equipment limit 5.5 (limits.low)'));
  it('precision must be positive', () =>
    expectKeyError((study) => (study.factors[1].precision = 0), 'factors[1].precision', 'must be greater than 0, not 0'));
  it('a level count must be at least 2', () =>
    expectKeyError((study) => (study.factors[0].levels = 1), 'factors[0].levels', 'must be at least 2, not 1'));
  it('levels must be a count or a list', () =>
    expectKeyError(
      (study) => (study.factors[0].levels = 'three'),
      'factors[0].levels',
      'must be a level count (a whole number ≥ 2) or a list of at least 2 level values',
    ));
  it('explicit levels need two distinct values', () =>
    expectKeyError((study) => (study.factors[0].levels = [30, 30]), 'factors[0].levels', 'needs at least 2 distinct level values'));
  it('explicit levels must lie in the range', () =>
    expectKeyError((study) => (study.factors[0].levels = [20, 40, 65]), 'factors[0].levels[2]', 'level 65 lies outside the range 20 to 60'));
  it('accepts a valid level list and count', async () => {
    const { studyPath } = writeStudy((study) => {
      study.factors[0].levels = [20, 35, 60];
      study.factors[1].levels = 3;
    });
    const study = await loadStudy(studyPath);
    expect(study.factors[0].levels).toEqual([20, 35, 60]);
    expect(study.factors[1].levels).toBe(3);
  });
  it('needs at least one operating factor', () =>
    expectKeyError(
      (study) => study.factors.forEach((factor: Record<string, unknown>) => (factor.role = 'model')),
      'factors',
      'needs at least one factor with role "operating" (a setting the lab plan can vary)',
    ));
});

describe('response, policy, design, session and cost rules', () => {
  it('needs at least one response', () => expectKeyError((study) => (study.responses = []), 'responses', 'must list at least 1 entry'));
  it('response ids must be unique', () =>
    expectKeyError((study) => (study.responses[1].id = 'titre'), 'responses[1].id', 'id "titre" is already used by responses[0]; ids must be unique'));
  it('weights must be positive', () =>
    expectKeyError((study) => (study.responses[0].weight = 0), 'responses[0].weight', 'must be greater than 0, not 0'));
  it('critical must exceed moderate', () =>
    expectKeyError((study) => (study.policy = { critical: 0.1, moderate: 0.2 }), 'policy.critical', 'critical (0.1) must be greater than moderate (0.2)'));
  it('critical must be below 1', () =>
    expectKeyError((study) => (study.policy = { critical: 1 }), 'policy.critical', 'must lie strictly between 0 and 1, not 1'));
  it('interaction must be above 0', () =>
    expectKeyError((study) => (study.policy = { interaction: 0 }), 'policy.interaction', 'must lie strictly between 0 and 1, not 0'));
  it('aggregate must be a known rule', () =>
    expectKeyError((study) => (study.policy = { aggregate: 'median' }), 'policy.aggregate', 'must be one of "mean", "max", "weighted", not "median"; did you mean `mean`?'));
  it('runs must be a whole number or auto', () =>
    expectKeyError((study) => (study.design = { runs: 'many' }), 'design.runs', 'must be a whole number of runs (≥ 1) or "auto"'));
  it('holdoutRuns must not be negative', () =>
    expectKeyError((study) => (study.design = { holdoutRuns: -1 }), 'design.holdoutRuns', 'must be at least 0, not -1'));
  it('holdoutRuns must be a number or auto', () =>
    expectKeyError((study) => (study.design = { holdoutRuns: 'some' }), 'design.holdoutRuns', 'must be a whole number of runs (≥ 0) or "auto"'));
  it('centreRuns must be a whole number', () =>
    expectKeyError((study) => (study.design = { centreRuns: 2.5 }), 'design.centreRuns', 'must be a whole number, not 2.5'));
  it('criterion must be D or I', () =>
    expectKeyError((study) => (study.design = { criterion: 'A' }), 'design.criterion', 'must be one of "D", "I", not "A"'));
  it('varianceRatio must not be negative', () =>
    expectKeyError((study) => (study.design = { varianceRatio: -0.5 }), 'design.varianceRatio', 'must be at least 0, not -0.5'));
  it('wholePlots must be a whole number or auto', () =>
    expectKeyError((study) => (study.design = { wholePlots: 2.5 }), 'design.wholePlots', 'must be a whole number of whole plots (≥ 1) or "auto"'));
  it('starts must be at least 1', () =>
    expectKeyError((study) => (study.design = { starts: 0 }), 'design.starts', 'must be at least 1, not 0'));
  it('seed must fit the 32-bit generators', () =>
    expectKeyError((study) => (study.design = { seed: 4294967296 }), 'design.seed', 'must be at most 4294967295, not 4294967296'));
  it('tier level counts must be at least 2', () =>
    expectKeyError((study) => (study.design = { levels: { critical: 1 } }), 'design.levels.critical', 'must be at least 2, not 1'));
  it('model must be a preset or a term list', () =>
    expectKeyError(
      (study) => (study.design = { model: 'cubic' }),
      'design.model',
      'must be "linear", "interactions", "quadratic" or a list of model terms such as [inlet_temp, inlet_temp*feed_rate]',
    ));
  it('model terms must name operating factors', () =>
    expectKeyError(
      (study) => (study.design = { model: ['temp', 'ph*k_ref'] }),
      'design.model[1]',
      'term "ph*k_ref" uses k_ref, a model parameter; model terms use operating settings only',
    ));
  it('sessions need a positive run count', () =>
    expectKeyError((study) => (study.sessions = { maxRuns: 0 }), 'sessions.maxRuns', 'must be at least 1, not 0'));
  it('a session holds at most 24 hours', () =>
    expectKeyError((study) => (study.sessions = { maxRuns: 4, hours: 30 }), 'sessions.hours', 'must be at most 24, not 30'));
  it('a settling time is at most a day, in minutes', () =>
    expectKeyError((study) => ((study.factors as Record<string, unknown>[])[0].settleMinutes = 2000), 'factors[0].settleMinutes', 'must be at most 1440, not 2000'));
  it('costs need a positive cost per run', () =>
    expectKeyError((study) => (study.costs = { currency: 'EUR', perRun: 0, hoursPerRun: 2 }), 'costs.perRun', 'must be greater than 0, not 0'));
  it('costs need a currency', () =>
    expectKeyError((study) => (study.costs = { currency: '', perRun: 10, hoursPerRun: 2 }), 'costs.currency', 'must not be empty'));
  it('constraints must be a list of text', () =>
    expectKeyError((study) => (study.constraints = 'temp < 50'), 'constraints', 'must be a list, not "temp < 50"'));
});

describe('precision keys', () => {
  it('reads spread, noise, smallestEffect, analysedRange, design.precision, maxRuns and potential', async () => {
    const { studyPath } = writeStudy((study) => {
      study.responses[0] = { ...study.responses[0], spread: 1.5, noise: 0.2 };
      study.responses[1] = { ...study.responses[1], smallestEffect: 2, noise: 0.5 };
      study.factors[0].analysedRange = { low: 10, high: 70 };
      study.design = { precision: { power: 0.9 }, maxRuns: 40, potential: ['temp^2'] };
    });
    const study = await loadStudy(studyPath);
    expect(study.responses[0]).toMatchObject({ spread: 1.5, noise: 0.2 });
    expect(study.responses[1]).toMatchObject({ smallestEffect: 2, noise: 0.5 });
    expect(study.factors[0].analysedRange).toEqual({ low: 10, high: 70 });
    expect(study.design.precision).toEqual({ power: 0.9, alpha: 0.05 });
    expect(study.design.maxRuns).toBe(40);
    expect(study.design.potential).toEqual(['temp^2']);
  });
  it('defaults: power 0.8, alpha 0.05, potential auto, no maxRuns', async () => {
    const study = await loadStudy(writeStudy(() => {}).studyPath);
    expect(study.design.precision).toEqual({ power: 0.8, alpha: 0.05 });
    expect(study.design.potential).toBe('auto');
    expect(study.design.maxRuns).toBeUndefined();
  });
  it('noise must be positive', () =>
    expectKeyError((study) => (study.responses[0].noise = 0), 'responses[0].noise', 'must be greater than 0, not 0'));
  it('power must lie above alpha and below 1', () =>
    expectKeyError((study) => (study.design = { precision: { power: 1 } }), 'design.precision.power', 'must lie above the test level 0.05 and below 1, not 1'));
  it('alpha must lie in (0, 0.5]', () =>
    expectKeyError((study) => (study.design = { precision: { alpha: 0.6 } }), 'design.precision.alpha', 'must lie above 0 and at most 0.5, not 0.6'));
  it('an unknown precision key', () =>
    expectKeyError((study) => (study.design = { precision: { powr: 0.9 } }), 'design.precision.powr', 'unknown key "powr"; did you mean `power`?'));
  it('analysedRange must be ordered', () =>
    expectKeyError((study) => (study.factors[0].analysedRange = { low: 5, high: 5 }), 'factors[0].analysedRange.high', 'analysedRange.high (5) must be greater than analysedRange.low (5)'));
  it('potential terms must name operating factors', () =>
    expectKeyError((study) => (study.design = { potential: ['k_ref'] }), 'design.potential[0]', 'term "k_ref" uses k_ref, a model parameter; model terms use operating settings only'));
  it('potential must be auto or a list', () =>
    expectKeyError((study) => (study.design = { potential: 'none' }), 'design.potential', 'must be "auto" or a list of model terms such as [inlet_temp^3] ([] for none)'));
  it('warns that smallestEffect is not used when spread is given', async () => {
    const study = await loadStudy(writeStudy((s) => (s.responses[0] = { ...s.responses[0], spread: 1, smallestEffect: 2, noise: 0.1 })).studyPath);
    expect(study.warnings.some((warning) => warning.includes('responses[0].smallestEffect: is not used'))).toBe(true);
  });
});

describe('table errors reach the caller through loadStudy', () => {
  it('an interactions file that is missing', async () => {
    const { folder, studyPath } = writeStudy((study) => (study.interactions = 'pairs.csv'));
    await expectInputError(() => loadStudy(studyPath), `${folder}/pairs.csv: file not found`, folder);
  });
  it('an index table lacking a defined model parameter', async () => {
    const { folder, studyPath } = writeStudy(undefined, {
      'indices.csv': BASE_INDICES_CSV.split('\n').filter((line) => !line.startsWith('k_ref,titre')).join('\n'),
      'interactions.csv': BASE_INTERACTIONS_CSV,
    });
    await expectInputError(
      () => loadStudy(studyPath),
      `${folder}/indices.csv: no row for factor × response k_ref × titre; every factor in the study, operating or model, needs one row per response`,
    );
  });
});

describe('study-level warnings', () => {
  it('keys that cannot act on a model parameter are reported, not refused', async () => {
    const { studyPath } = writeStudy((study) => {
      study.factors[2].hardToChange = true;
      study.factors[2].levels = 3;
    });
    const study = await loadStudy(studyPath);
    expect(study.factors[2].hardToChange).toBe(true);
    expect(study.warnings).toEqual([
      `${studyPath}, key factors[2].levels: has no effect on a model parameter (only operating settings are set in the lab)`,
      `${studyPath}, key factors[2].hardToChange: has no effect on a model parameter (only operating settings are set in the lab)`,
    ]);
  });

  it('a settling time on a factor that is not hard to change is reported, not refused', async () => {
    const { studyPath } = writeStudy((study) => {
      study.factors[0].settleMinutes = 15;
      delete study.factors[0].hardToChange;
    });
    const study = await loadStudy(studyPath);
    expect(study.factors[0].settleMinutes).toBe(15);
    expect(study.warnings).toEqual([
      `${studyPath}, key factors[0].settleMinutes: has no effect unless hardToChange is true (only a hard-to-change setting gets a wait step)`,
    ]);
  });
});
