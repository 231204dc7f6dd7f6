/**
 * The study skeleton `tierplan init` writes from an index table: YAML with every factor and
 * response the table names, a placeholder wherever only the user knows the value, a comment
 * explaining each key and the optional sections shown commented out with their defaults.
 *
 * Conventions fixed here:
 * - Placeholders are the study reader's PLACEHOLDER (`TODO`), which its schema refuses with
 *   "fill in …" naming the key, so `tiers` and `plan` stop until each one is filled. They
 *   stand for what the table cannot tell: the title, each factor's unit, role, low, high and
 *   nominal, each response's unit. A name starts as the id (usable, but worth rewriting).
 * - Key explanations are the descriptions of the study schema (studyFile.ts), the same text
 *   an editor shows from the JSON Schema; defaults are DEFAULT_POLICY and DEFAULT_DESIGN.
 * - The first line points the YAML language server at the shipped JSON Schema, by a path
 *   relative to the study file, so an editor checks the file as it is typed.
 * - Factors and responses keep the table's order (the order of first appearance).
 */
import { DEFAULT_DESIGN, DEFAULT_POLICY } from '../core/study.js';
import { PLACEHOLDER, studyJsonSchema } from './studyFile.js';

export interface SkeletonInput {
  factorIds: readonly string[];
  responseIds: readonly string[];
  /** The index table as the study file will name it (relative to the study file). */
  indicesPath: string;
  /** The JSON Schema as the study file will name it (relative path or URL). */
  schemaReference: string;
  /** The table as the user named it, for the opening comment. */
  tableShown: string;
  /** The study file as the user named it, for the commands in the opening comment. */
  studyShown: string;
}

export function studySkeleton(input: SkeletonInput): string {
  const describe = keyDescriptions();
  const lines: string[] = [];
  const comment = (path: string) => lines.push(`# ${capitalise(describe(path))}.`);
  const study = yamlScalar(input.studyShown);

  lines.push(
    `# yaml-language-server: $schema=${input.schemaReference}`,
    '#',
    `# A tierplan study, written by \`tierplan init\` from ${input.tableShown}.`,
    `# Fill in every ${PLACEHOLDER}: \`tierplan tiers\` and \`tierplan plan\` refuse the file, naming the key, until`,
    '# each one is filled. Then:',
    `#   tierplan tiers ${study}               the tier decision alone`,
    `#   tierplan plan ${study} --out plan     the lab campaign, its run sheets and the report`,
    '# Lines starting with "# key:" are optional keys, shown with their defaults: remove the "# " to use one.',
    '',
  );

  comment('title');
  lines.push(`title: ${PLACEHOLDER}`, '');

  comment('factors');
  lines.push('# Each factor has:');
  const factorKeys = ['id', 'name', 'unit', 'role', 'low', 'high', 'nominal'];
  const optionalFactorKeys = ['precision', 'limits', 'levels', 'hardToChange'];
  for (const key of factorKeys) lines.push(`#   ${key.padEnd(12)} ${describe(`factors[].${key}`)}`);
  lines.push('# and may have (operating settings only, except precision):');
  for (const key of optionalFactorKeys) lines.push(`#   ${key.padEnd(12)} ${describe(`factors[].${key}`)}`);
  lines.push('factors:');
  input.factorIds.forEach((id, i) => {
    lines.push(
      `  - id: ${id}`,
      `    name: ${id}`,
      `    unit: ${PLACEHOLDER}`,
      `    role: ${PLACEHOLDER}          # operating or model`,
      `    low: ${PLACEHOLDER}`,
      `    high: ${PLACEHOLDER}`,
      `    nominal: ${PLACEHOLDER}`,
    );
    if (i === 0) {
      lines.push(
        '    # precision: 1',
        `    # limits: { low: ${PLACEHOLDER}, high: ${PLACEHOLDER} }`,
        '    # levels: 3',
        '    # hardToChange: true',
      );
    }
  });
  lines.push('');

  comment('responses');
  lines.push('# Each response has:');
  for (const key of ['id', 'name', 'unit', 'weight']) lines.push(`#   ${key.padEnd(12)} ${describe(`responses[].${key}`)}`);
  lines.push('responses:');
  for (const id of input.responseIds) lines.push(`  - id: ${id}`, `    name: ${id}`, `    unit: ${PLACEHOLDER}`, '    # weight: 1');
  lines.push('');

  comment('indices');
  lines.push(`indices: ${yamlScalar(input.indicesPath)}`, '');
  comment('interactions');
  lines.push('# interactions: second-order.csv', '');

  const section = (key: string, entries: [string, string][]) => {
    comment(key);
    lines.push(`# ${key}:`);
    const width = Math.max(...entries.map(([name, value]) => name.length + value.length)) + 4;
    for (const [name, value] of entries) {
      lines.push(`#   ${`${name}: ${value}`.padEnd(width)} # ${describe(`${key}.${name}`)}`);
    }
    lines.push('');
  };
  section('policy', [
    ['aggregate', DEFAULT_POLICY.aggregate],
    ['critical', DEFAULT_POLICY.critical.toFixed(2)],
    ['moderate', DEFAULT_POLICY.moderate.toFixed(2)],
    ['interaction', DEFAULT_POLICY.interaction.toFixed(2)],
    ['confidence', DEFAULT_POLICY.confidence],
  ]);
  section('design', [
    ['runs', String(DEFAULT_DESIGN.runs)],
    ['model', 'quadratic'],
    ['criterion', DEFAULT_DESIGN.criterion],
    ['centreRuns', String(DEFAULT_DESIGN.centreRuns)],
    ['holdoutRuns', String(DEFAULT_DESIGN.holdoutRuns)],
    ['seed', String(DEFAULT_DESIGN.seed)],
    ['starts', String(DEFAULT_DESIGN.starts)],
    ['levels', `{ critical: ${DEFAULT_DESIGN.levels.critical}, moderate: ${DEFAULT_DESIGN.levels.moderate} }`],
  ]);
  comment('constraints');
  lines.push('# constraints:', `#   - ${input.factorIds[0] ?? 'a'} <= ${PLACEHOLDER}`, '');
  section('sessions', [
    ['maxRuns', '6'],
    ['label', 'Day'],
  ]);
  section('costs', [
    ['currency', 'EUR'],
    ['perRun', PLACEHOLDER],
    ['hoursPerRun', PLACEHOLDER],
    ['perLevelChange', `{ cost: ${PLACEHOLDER}, hours: ${PLACEHOLDER} }`],
  ]);
  while (lines[lines.length - 1] === '') lines.pop();
  return `${lines.join('\n')}\n`;
}

/** How many placeholders a skeleton leaves to fill (outside comments). */
export function placeholderCount(text: string): number {
  return text.split('\n').filter((line) => !line.trimStart().startsWith('#') && new RegExp(`:\\s*${PLACEHOLDER}\\b`).test(line)).length;
}

/** The schema's description of a key path (`factors[].unit`, `design.runs`), from the JSON Schema. */
function keyDescriptions(): (path: string) => string {
  const schema = studyJsonSchema();
  return (path) => {
    let node: Record<string, unknown> | undefined = schema;
    for (const part of path.split('.')) {
      const list = part.endsWith('[]');
      node = (node?.properties as Record<string, Record<string, unknown>> | undefined)?.[list ? part.slice(0, -2) : part];
      if (list) node = node?.items as Record<string, unknown> | undefined;
    }
    const description = node?.description;
    if (typeof description !== 'string') throw new Error(`the study schema has no description for ${path}`);
    return description;
  };
}

/** A path or name as a YAML scalar: plain when it is safe, double-quoted (JSON) otherwise. */
function yamlScalar(text: string): string {
  return /^[A-Za-z0-9_][A-Za-z0-9_./-]*$/.test(text) ? text : JSON.stringify(text);
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
