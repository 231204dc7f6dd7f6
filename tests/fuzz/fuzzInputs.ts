/**
 * Generated and mutated input files for the fuzz harness: small invented studies that are
 * valid to begin with (1–4 settings, up to 2 model parameters, 1–2 responses, their index and
 * interaction tables), then broken on purpose — a key set to a hostile value, deleted or
 * misspelt, a table cell or row mangled, bytes inserted into the text.
 *
 * Everything comes from fast-check arbitraries, so a seed and a case number reproduce a case.
 * Workbooks are described as cells (`{ xlsx: rows }`) and written by the harness, because
 * exceljs writes asynchronously and arbitraries are synchronous.
 */
import fc from 'fast-check';
import { stringify } from 'yaml';
import type { ResultsSheetCase } from './resultsSheetInputs.js';

export type FileContent = string | Uint8Array | { xlsx: (string | number | null)[][] };
/** Relative path → content; `entry` is the study file the pipeline starts from. */
export interface FuzzFiles {
  files: Record<string, FileContent>;
  entry: string;
  /** What was done to the valid input, for the report of a failing case. */
  mutations: string[];
  /** For a plan-file case: the changes to make to the plan once it exists (see `mutatePlan`). */
  planMutations?: Mutation[];
  /** For a results-sheet case: the sheet to write and how to break it (resultsSheetInputs.ts). */
  resultsSheet?: ResultsSheetCase;
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

// ----------------------------------------------------------------------- valid studies

interface StudyShape {
  study: Record<string, Json>;
  indexRows: (string | number)[][];
  interactionRows: (string | number)[][];
}

const INDEX_HEADER = ['factor', 'response', 'first', 'total', 'total_low', 'total_high'];
const INTERACTION_HEADER = ['factor_a', 'factor_b', 'response', 'index'];

const factorArbitrary = (id: string, role: 'operating' | 'model') =>
  fc
    .record({
      low: fc.constantFrom(0, -5, 20, 140, 0.5),
      span: fc.constantFrom(1, 8, 15, 40, 1000),
      nominalAt: fc.constantFrom(0, 0.25, 0.5, 1),
      precision: fc.option(fc.constantFrom(0.001, 0.1, 0.5, 1), { nil: undefined }),
      limits: fc.option(fc.constantFrom(0, 0.1, 2), { nil: undefined }),
      levels: fc.option(fc.oneof(fc.integer({ min: 2, max: 5 }), fc.constant('list')), { nil: undefined }),
      hardToChange: fc.option(fc.boolean(), { nil: undefined }),
      total: fc.constantFrom(0.01, 0.04, 0.08, 0.2, 0.35, 0.6),
      firstShare: fc.constantFrom(0.5, 0.8, 1),
    })
    .map((f) => {
      const high = f.low + f.span;
      const factor: Record<string, Json> = {
        id,
        name: `Invented ${role} ${id}`,
        unit: role === 'operating' ? '°C' : '-',
        role,
        low: f.low,
        high,
        nominal: f.low + f.nominalAt * f.span,
      };
      if (f.precision !== undefined) factor.precision = f.precision;
      if (role === 'operating') {
        if (f.limits !== undefined) factor.limits = { low: f.low - f.limits * f.span, high: high + f.limits * f.span };
        if (f.levels === 'list') factor.levels = [f.low, f.low + f.span / 2, high];
        else if (f.levels !== undefined) factor.levels = f.levels;
        if (f.hardToChange !== undefined) factor.hardToChange = f.hardToChange;
      }
      return { factor, total: f.total, first: Number((f.total * f.firstShare).toFixed(4)) };
    });

const studyShapeArbitrary: fc.Arbitrary<StudyShape> = fc
  .record({
    operating: fc.integer({ min: 1, max: 4 }),
    model: fc.integer({ min: 0, max: 2 }),
    responses: fc.integer({ min: 1, max: 2 }),
  })
  .chain(({ operating, model, responses }) =>
    fc.record({
      factors: fc.tuple(
        ...Array.from({ length: operating }, (_, j) => factorArbitrary(`s${j + 1}`, 'operating')),
        ...Array.from({ length: model }, (_, j) => factorArbitrary(`k${j + 1}`, 'model')),
      ),
      responseIds: fc.constant(Array.from({ length: responses }, (_, r) => `y${r + 1}`)),
      withBounds: fc.boolean(),
      interactions: fc.option(fc.constantFrom(0.02, 0.06, 0.1), { nil: undefined }),
      constraint: fc.option(fc.constantFrom('sum', 'chain', 'function', 'not'), { nil: undefined }),
      design: fc.record(
        {
          runs: fc.oneof(fc.constant('auto'), fc.integer({ min: 4, max: 30 })),
          model: fc.constantFrom('linear', 'interactions', 'quadratic'),
          criterion: fc.constantFrom('D', 'I'),
          centreRuns: fc.integer({ min: 0, max: 4 }),
          holdoutRuns: fc.oneof(fc.constant('auto'), fc.integer({ min: 0, max: 3 })),
          seed: fc.integer({ min: 0, max: 1000 }),
          starts: fc.integer({ min: 1, max: 3 }),
        },
        { requiredKeys: [] },
      ),
      sessions: fc.option(fc.record({ maxRuns: fc.integer({ min: 1, max: 8 }), label: fc.constantFrom('Day', 'Shift') }), { nil: undefined }),
      costs: fc.option(fc.record({ currency: fc.constant('EUR'), perRun: fc.constantFrom(100, 850), hoursPerRun: fc.constantFrom(1, 3) }), {
        nil: undefined,
      }),
    }),
  )
  .map((drawn) => {
    const factors = drawn.factors.map((entry) => entry.factor);
    const operating = factors.filter((factor) => factor.role === 'operating');
    const study: Record<string, Json> = {
      title: 'Invented fuzz study (not a real process)',
      factors,
      responses: drawn.responseIds.map((id) => ({ id, name: `Response ${id}`, unit: '%' })),
      indices: 'indices.csv',
    };
    const indexRows: (string | number)[][] = [];
    for (const entry of drawn.factors) {
      for (const response of drawn.responseIds) {
        const row: (string | number)[] = [entry.factor.id as string, response, entry.first, entry.total];
        if (drawn.withBounds) row.push(Number(Math.max(0, entry.total - 0.03).toFixed(4)), Number(Math.min(1, entry.total + 0.03).toFixed(4)));
        indexRows.push(row);
      }
    }
    const interactionRows: (string | number)[][] = [];
    if (drawn.interactions !== undefined && operating.length >= 2) {
      study.interactions = 'interactions.csv';
      interactionRows.push([operating[0].id as string, operating[1].id as string, drawn.responseIds[0], drawn.interactions]);
    }
    if (drawn.constraint !== undefined) {
      const a = operating[0];
      const b = operating[1] ?? operating[0];
      const middle = ((a.low as number) + (a.high as number)) / 2;
      const constraint = {
        sum: `${a.id} + ${b.id} <= ${(a.high as number) + (b.high as number) - 0.1}`,
        chain: `${a.low} <= ${a.id} <= ${a.high}`,
        function: `sqrt(abs(${a.id} - ${middle})) <= 100`,
        not: `not (${a.id} > ${a.high})`,
      }[drawn.constraint];
      study.constraints = [constraint];
    }
    study.design = drawn.design as Record<string, Json>;
    if (drawn.sessions) study.sessions = drawn.sessions;
    if (drawn.costs) study.costs = drawn.costs;
    return { study, indexRows, interactionRows };
  });

// --------------------------------------------------------------------- hostile values

const hostileNumber = fc.constantFrom(
  0, -1, 1, 2, 3, 0.5, -0.5, 1e-320, 1e15, 1e15 + 2, -1e16, 1e308, -1e308, 2 ** 53, 4294967296, 1000, 1001, 10_000_000, 51, 50, 100, 101, 200, 201,
);

const hostileExpression = fc.constantFrom(
  'import("fs")',
  's1 = 3',
  'f(x) = x^2',
  'evaluate("1+1")',
  'parse("s1")',
  'simplify("s1")',
  'createUnit("foo")',
  '5 cm > s1',
  'unit("5 cm") > 1',
  's1.toString > 1',
  's1["a"] > 1',
  '[1, 2] > 1',
  '{a: 1}',
  '"text" == "text"',
  's1 > 1; s1 < 2',
  's1 ? 1 : 0',
  '1:3',
  `${'('.repeat(25)}s1${')'.repeat(25)} > 1`,
  `${'-'.repeat(40)}s1 > 1`,
  's1 > ',
  's1 >= 0 and',
  'sqrt(-1) > 0',
  's1 / 0 > 1',
  'log(0) < s1',
  'k1 > 0',
  'nosuch > 1',
  's1!',
  "s1'",
  's1 & 1',
  's1 to cm',
  '1 > 0',
  's1 + 1',
);

const hostileTerm = fc.constantFrom('s1^99999999', 's1**2', 's1*', '*s1', 's1^0', 's1^-1', 's1^1.5', 's1*s1*s1*s1*s1*s1*s1', 'k1', 'nosuch', 's1.x', '1', '', 'import', 's1 s2', 's1^2^2');

const hostileText = fc.oneof(
  fc.constantFrom('', ' ', '=1+1', '@SUM(A1)', '<script>alert(1)</script>', '{{title}}', '\u202e', '\u0000', 'x'.repeat(501), '°C', 'e', 'pi', 'in', 'auto', 'NaN', 'Infinity', '-', '__proto__'),
  fc.string({ maxLength: 12 }),
);

const hostileValue: fc.Arbitrary<Json> = fc.oneof(
  { weight: 4, arbitrary: hostileNumber },
  { weight: 3, arbitrary: hostileText },
  { weight: 2, arbitrary: hostileExpression },
  { weight: 1, arbitrary: hostileTerm },
  { weight: 1, arbitrary: fc.constantFrom<Json>(null, true, false, [], {}, [1, 2], { low: 1 }, 'auto', 'linear', 'quadratic', 'D', 'I', 'operating', 'model') },
  { weight: 1, arbitrary: fc.array(hostileExpression, { minLength: 1, maxLength: 3 }) as fc.Arbitrary<Json> },
  { weight: 1, arbitrary: fc.array(hostileTerm, { minLength: 1, maxLength: 3 }) as fc.Arbitrary<Json> },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Json> },
);

const KNOWN_KEYS = ['levels', 'limits', 'precision', 'runs', 'model', 'centreRuns', 'holdoutRuns', 'starts', 'seed', 'weight', 'constraints', 'maxRuns', 'critical', 'moderate'];

// ------------------------------------------------------------------ structure mutations

export interface Mutation {
  pick: number;
  op: 'set' | 'delete' | 'rename' | 'add' | 'duplicate';
  value: Json;
  key: string;
}

const mutationArbitrary: fc.Arbitrary<Mutation> = fc.record({
  pick: fc.nat(),
  op: fc.constantFrom('set', 'set', 'set', 'delete', 'rename', 'add', 'duplicate'),
  value: hostileValue,
  key: fc.oneof(fc.constantFrom(...KNOWN_KEYS), fc.string({ minLength: 1, maxLength: 8 })),
});

/** Every container and leaf of a JSON value, as parent and key. */
function slots(root: Json): { parent: Json[] | Record<string, Json>; key: string | number }[] {
  const found: { parent: Json[] | Record<string, Json>; key: string | number }[] = [];
  const stack: Json[] = [root];
  while (stack.length > 0) {
    const node = stack.pop()!;
    if (Array.isArray(node)) {
      node.forEach((child, i) => {
        found.push({ parent: node, key: i });
        stack.push(child);
      });
    } else if (node !== null && typeof node === 'object') {
      for (const [key, child] of Object.entries(node)) {
        found.push({ parent: node, key });
        stack.push(child);
      }
    }
  }
  return found;
}

function applyMutation(root: Record<string, Json>, mutation: Mutation): string {
  const all = slots(root);
  if (all.length === 0) return 'nothing to mutate';
  const { parent, key } = all[mutation.pick % all.length];
  const at = `${String(key)}`;
  const container = parent as Record<string, Json>;
  switch (mutation.op) {
    case 'set':
      container[key as string] = structuredClone(mutation.value);
      return `set ${at} to ${JSON.stringify(mutation.value)?.slice(0, 60)}`;
    case 'delete':
      if (Array.isArray(parent)) parent.splice(key as number, 1);
      else delete container[key as string];
      return `deleted ${at}`;
    case 'rename': {
      if (Array.isArray(parent)) return 'rename skipped (list)';
      const value = container[key as string];
      delete container[key as string];
      container[mutation.key] = value;
      return `renamed ${at} to ${mutation.key}`;
    }
    case 'add': {
      const target = container[key as string];
      if (target !== null && typeof target === 'object' && !Array.isArray(target)) {
        (target as Record<string, Json>)[mutation.key] = structuredClone(mutation.value);
        return `added ${mutation.key} under ${at}`;
      }
      if (Array.isArray(target)) {
        target.push(structuredClone(mutation.value));
        return `appended to ${at}`;
      }
      return 'add skipped (leaf)';
    }
    case 'duplicate':
      if (Array.isArray(parent)) {
        parent.push(structuredClone(parent[key as number]));
        return `duplicated entry ${at}`;
      }
      return 'duplicate skipped (mapping)';
  }
}

// ------------------------------------------------------------------------ text mutations

const SNIPPETS = [
  '&a ', '*a', '*nosuch', '!secret ', '!!binary ', '!!set ', '[[[[[[', ']]]', '{', '}', '"', "'", '\\', '\u0000', '\ufeff', '\r', '\n', '\t', ': ', ' - ',
  '---\n', '...\n', '# ', '%YAML 1.1\n', '<<: *a\n', '? ', '|', '>', '@', '`', ',', ';', '0,5', '1e400', '.nan', '.inf', '~', '0x1F', '0o17', '__proto__: {}\n',
  '\u00e9', '\uffff', '\ud800', '😀', 'NaN', '-Infinity', '9'.repeat(400),
];

interface TextMutation {
  at: number;
  op: 'insert' | 'delete' | 'duplicateLine' | 'truncate';
  snippet: string;
  length: number;
}

const textMutationArbitrary: fc.Arbitrary<TextMutation> = fc.record({
  at: fc.nat(),
  op: fc.constantFrom('insert', 'insert', 'delete', 'duplicateLine', 'truncate'),
  snippet: fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...SNIPPETS) }, { weight: 1, arbitrary: fc.string({ maxLength: 6, unit: 'binary' }) }),
  length: fc.integer({ min: 1, max: 20 }),
});

function applyTextMutation(text: string, mutation: TextMutation): { text: string; what: string } {
  const at = text.length === 0 ? 0 : mutation.at % text.length;
  switch (mutation.op) {
    case 'insert':
      return { text: text.slice(0, at) + mutation.snippet + text.slice(at), what: `inserted ${JSON.stringify(mutation.snippet).slice(0, 30)} at ${at}` };
    case 'delete':
      return { text: text.slice(0, at) + text.slice(at + mutation.length), what: `deleted ${mutation.length} characters at ${at}` };
    case 'duplicateLine': {
      const lines = text.split('\n');
      const line = mutation.at % lines.length;
      lines.splice(line, 0, lines[line]);
      return { text: lines.join('\n'), what: `duplicated line ${line + 1}` };
    }
    case 'truncate':
      return { text: text.slice(0, at), what: `truncated at ${at}` };
  }
}

// ------------------------------------------------------------------------ table writing

type TableFormat = 'csv' | 'semicolon' | 'json' | 'xlsx';

function tableFile(header: string[], rows: (string | number | null)[][], format: TableFormat, name: string): { path: string; content: FileContent } {
  if (format === 'xlsx') return { path: `${name}.xlsx`, content: { xlsx: [header, ...rows] } };
  if (format === 'json') {
    const entries = rows.map((row) => Object.fromEntries(header.map((column, c) => [column, row[c] ?? null])));
    return { path: `${name}.json`, content: `${JSON.stringify(entries, null, 1)}\n` };
  }
  const separator = format === 'semicolon' ? ';' : ',';
  const cell = (value: string | number | null) => {
    if (value === null) return '';
    const text = format === 'semicolon' && typeof value === 'number' ? String(value).replace('.', ',') : String(value);
    return /[",;\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
  };
  const lines = ['# invented fuzz table', header.join(separator), ...rows.map((row) => row.map(cell).join(separator))];
  return { path: `${name}.csv`, content: `${lines.join('\n')}\n` };
}

const hostileCell = fc.oneof(
  { weight: 1, arbitrary: fc.constantFrom<string | number | null>(0.049, 0.051, 0.3, 0.299, -0.01, 1.01, 0.5, 0.9) },
  { weight: 2, arbitrary: rawHostileCell() },
);

function rawHostileCell(): fc.Arbitrary<string | number | null> {
  return fc.constantFrom<string | number | null>(
  null, '', 'NaN', 'nan', 'Infinity', '1e309', '-1e309', '25%', '0,5', '#DIV/0!', '#N/A', -0.06, -0.04, 1.04, 1.06, 2, 0, 1, 'x'.repeat(300), '"', '=1+1', 's1', 'y1', 'k1', 'nosuch', ' 0.1 ', '0x10', '1_000', '١', 1e-320,
  );
}

interface RowMutation {
  pick: number;
  column: number;
  op: 'cell' | 'deleteRow' | 'duplicateRow' | 'header' | 'deleteColumn' | 'addColumn' | 'swapRows';
  cell: string | number | null;
  header: string;
}

const rowMutationArbitrary: fc.Arbitrary<RowMutation> = fc.record({
  pick: fc.nat(),
  column: fc.nat(),
  op: fc.constantFrom('cell', 'cell', 'cell', 'deleteRow', 'duplicateRow', 'header', 'deleteColumn', 'addColumn', 'swapRows'),
  cell: hostileCell,
  header: fc.constantFrom('S1', 'ST', 'total_conf', 'first_high', 'Factor', 'output', 'unknown', '', 'total', 'factor_b', 'index', 'S2'),
});

function applyRowMutation(header: string[], rows: (string | number | null)[][], mutation: RowMutation): string {
  const r = rows.length === 0 ? 0 : mutation.pick % rows.length;
  const c = header.length === 0 ? 0 : mutation.column % header.length;
  switch (mutation.op) {
    case 'cell':
      if (rows.length === 0) return 'no row';
      rows[r][c] = mutation.cell;
      return `cell ${r + 1}/${header[c]} set to ${JSON.stringify(mutation.cell)?.slice(0, 30)}`;
    case 'deleteRow':
      rows.splice(r, 1);
      return `deleted row ${r + 1}`;
    case 'duplicateRow':
      if (rows.length > 0) rows.push([...rows[r]]);
      return `duplicated row ${r + 1}`;
    case 'header':
      header[c] = mutation.header;
      return `header ${c + 1} renamed ${mutation.header}`;
    case 'deleteColumn':
      header.splice(c, 1);
      for (const row of rows) row.splice(c, 1);
      return `deleted column ${c + 1}`;
    case 'addColumn':
      header.push(mutation.header);
      for (const row of rows) row.push(mutation.cell);
      return `added column ${mutation.header}`;
    case 'swapRows':
      if (rows.length > 1) [rows[0], rows[r]] = [rows[r], rows[0]];
      return `swapped rows 1 and ${r + 1}`;
  }
}

// -------------------------------------------------------------------------- the cases

/**
 * Applies plan-file mutations to a plan document (as parsed JSON) in place; returns what was
 * done. The harness seals the result again, so the checksum matches and the reader's shape
 * checks are what stand between the mutation and the comparison.
 */
export function mutatePlan(plan: Record<string, Json>, mutations: readonly Mutation[]): string[] {
  return mutations.map((mutation) => `plan: ${applyMutation(plan, mutation)}`);
}

/** Which file of the study the mutations go to (`plan`: the plan.json that compare reads). */
export type MutatedPart = 'study' | 'indices' | 'interactions' | 'plan';

export function fuzzFilesArbitrary(part: MutatedPart): fc.Arbitrary<FuzzFiles> {
  return fc
    .record({
      shape: studyShapeArbitrary,
      syntax: fc.constantFrom<'yaml' | 'json'>('yaml', 'yaml', 'json'),
      indexFormat: fc.constantFrom<TableFormat>('csv', 'csv', 'csv', 'semicolon', 'json', 'xlsx'),
      interactionFormat: fc.constantFrom<TableFormat>('csv', 'json'),
      // About one case in five is left valid, so that the planner is exercised on valid input too.
      mutations: fc.oneof({ weight: 1, arbitrary: fc.constant([]) }, { weight: 4, arbitrary: fc.array(mutationArbitrary, { minLength: 1, maxLength: 3 }) }),
      rowMutations: fc.oneof({ weight: 1, arbitrary: fc.constant([]) }, { weight: 4, arbitrary: fc.array(rowMutationArbitrary, { minLength: 1, maxLength: 3 }) }),
      textMutations: fc.array(textMutationArbitrary, { minLength: 1, maxLength: 2 }),
      mutateText: fc.integer({ min: 0, max: 9 }).map((draw) => draw < 3),
    })
    .map(({ shape, syntax, indexFormat, interactionFormat, mutations, rowMutations, textMutations, mutateText: textDrawn }) => {
      let mutateText = textDrawn;
      const done: string[] = [];
      const study = structuredClone(shape.study);
      const index = { header: [...INDEX_HEADER.slice(0, shape.indexRows[0]?.length ?? 4)], rows: shape.indexRows.map((row) => [...row]) as (string | number | null)[][] };
      const interaction = { header: [...INTERACTION_HEADER], rows: shape.interactionRows.map((row) => [...row]) as (string | number | null)[][] };
      if (part === 'indices') for (const mutation of rowMutations) done.push(`indices: ${applyRowMutation(index.header, index.rows, mutation)}`);
      if (part === 'interactions') {
        if (interaction.rows.length === 0) {
          // Give the study a table to break.
          const ids = (study.factors as Record<string, Json>[]).map((factor) => factor.id as string);
          interaction.rows.push([ids[0], ids[ids.length - 1], 'y1', 0.03]);
        }
        for (const mutation of rowMutations) done.push(`interactions: ${applyRowMutation(interaction.header, interaction.rows, mutation)}`);
      }
      const indexFile = tableFile(index.header, index.rows, indexFormat, 'indices');
      const files: Record<string, FileContent> = { [indexFile.path]: indexFile.content };
      study.indices = indexFile.path;
      if (study.interactions !== undefined || part === 'interactions') {
        const interactionFile = tableFile(interaction.header, interaction.rows, interactionFormat, 'interactions');
        files[interactionFile.path] = interactionFile.content;
        study.interactions = interactionFile.path;
      }
      if (part === 'study') for (const mutation of mutations) done.push(`study: ${applyMutation(study, mutation)}`);
      // A plan-file case keeps the study valid; its mutations wait for the plan.
      if (part === 'plan') mutateText = false;
      const entry = syntax === 'yaml' ? 'study.yaml' : 'study.json';
      let text = syntax === 'yaml' ? stringify(study) : `${JSON.stringify(study, null, 2)}\n`;
      if (mutateText) {
        const target = part === 'study' ? entry : part === 'indices' ? indexFile.path : Object.keys(files).find((name) => name.startsWith('interactions'))!;
        for (const mutation of textMutations) {
          const content = target === entry ? text : files[target];
          if (typeof content !== 'string') continue;
          const changed = applyTextMutation(content, mutation);
          if (target === entry) text = changed.text;
          else files[target] = changed.text;
          done.push(`${target} text: ${changed.what}`);
        }
      }
      files[entry] = text;
      if (part === 'plan') return { files, entry, mutations: done, planMutations: [...mutations] };
      return { files, entry, mutations: done };
    });
}
