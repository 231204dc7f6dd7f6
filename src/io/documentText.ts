/**
 * YAML and JSON text from files the user gives, turned into plain values — or one line
 * saying what is wrong and where. Used for study files and JSON tables (and by any new
 * reader of YAML or JSON: results sheets, plan files).
 *
 * YAML 1.2 (core schema) is read with the `yaml` package, JSON with `JSON.parse` (which
 * decides validity) plus the `yaml` parser under its JSON schema for line and column.
 *
 * Safety conventions fixed here (limits in src/core/inputLimits.ts):
 * - Nesting deeper than `nestingDepth` is refused before parsing: parsers recurse per level,
 *   and a file of a million `[` otherwise exhausts the stack or the heap. The scan counts
 *   brackets outside quoted text (JSON exactly; YAML flow collections, a safe over-count
 *   only for absurd plain scalars); block nesting is measured on the parsed tree.
 * - YAML aliases (`*name`) may expand at most `yamlAliases` times (the `yaml` package's own
 *   guard against exponential "alias bombs", Billion-laughs style), with our message.
 * - YAML tags other than the core schema's (`!!str`, `!!int`, `!!float`, `!!bool`, `!!null`,
 *   `!!map`, `!!seq`) are refused: a custom `!tag` would otherwise pass silently as a string
 *   and `!!binary` or `!!timestamp` would turn a value into something no key expects.
 * - A repeated key is refused in both syntaxes (`JSON.parse` alone would keep the last).
 * - One document per file; `__proto__`, `constructor` and `prototype` are refused as keys
 *   (they would change the prototype of the object built from the file).
 */
import { LineCounter, parseDocument, isAlias, isCollection, isNode, isPair, isScalar, type Document, type Node } from 'yaml';
import { InputError } from '../core/inputError.js';
import { aboveLimit, INPUT_LIMITS, limitOf } from '../core/inputLimits.js';

const CORE_TAGS = new Set(
  ['str', 'int', 'float', 'bool', 'null', 'map', 'seq'].map((name) => `tag:yaml.org,2002:${name}`),
);
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

function where(lineCounter: LineCounter, offset: number): string {
  const { line, col } = lineCounter.linePos(offset);
  return `line ${line}, column ${col}`;
}

/** "line 3, column 7" of an offset, counted directly (before any parser has run). */
function textPosition(text: string, offset: number): string {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return `line ${line}, column ${offset - lineStart + 1}`;
}

function depthError(file: string, position: string | null): InputError {
  const at = position ? ` at ${position}` : '';
  return new InputError(`nests lists or mappings${at} deeper than allowed, ${aboveLimit('nestingDepth')}`, { file });
}

/**
 * The deepest bracket nesting outside quoted text, or the offset where it first passes
 * `limit`. JSON strings are double-quoted; YAML also has single quotes and comments.
 */
function bracketDepthOffset(text: string, limit: number, yaml: boolean): number | null {
  let depth = 0;
  let quote: string | null = null;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quote !== null) {
      if (c === '\\' && quote === '"') i++;
      else if (c === quote) quote = null;
      continue;
    }
    if (c === '"' || (yaml && c === "'" && (i === 0 || /[\s[{,:]/.test(text[i - 1])))) quote = c;
    else if (yaml && c === '#' && (i === 0 || /\s/.test(text[i - 1]))) {
      while (i < text.length && text[i] !== '\n') i++;
    } else if (c === '[' || c === '{') {
      depth++;
      if (depth > limit) return i;
    } else if ((c === ']' || c === '}') && depth > 0) depth--;
  }
  return null;
}

/** Depth of the parsed YAML tree (collections only), walked without recursion. */
function yamlTreeDepth(root: unknown): number {
  let deepest = 0;
  const stack: [unknown, number][] = [[root, 0]];
  while (stack.length > 0) {
    const [node, depth] = stack.pop()!;
    if (isCollection(node)) {
      deepest = Math.max(deepest, depth + 1);
      for (const item of node.items as unknown[]) {
        if (isPair(item)) {
          stack.push([item.key, depth + 1], [item.value, depth + 1]);
        } else stack.push([item, depth + 1]);
      }
    }
  }
  return deepest;
}

/** The first node carrying a tag outside the core schema, and the first forbidden key. */
function yamlProblems(root: unknown): { tagged?: Node; forbiddenKey?: Node } {
  const found: { tagged?: Node; forbiddenKey?: Node } = {};
  const stack: unknown[] = [root];
  while (stack.length > 0 && !(found.tagged && found.forbiddenKey)) {
    const node = stack.pop();
    if (isNode(node) && !isAlias(node) && node.tag !== undefined && !CORE_TAGS.has(node.tag)) found.tagged ??= node;
    if (isCollection(node)) {
      for (const item of node.items as unknown[]) {
        if (isPair(item)) {
          if (isScalar(item.key) && FORBIDDEN_KEYS.has(String(item.key.value))) found.forbiddenKey ??= item.key;
          stack.push(item.key, item.value);
        } else stack.push(item);
      }
    }
  }
  return found;
}

function offsetOf(node: Node | undefined): number {
  return node?.range?.[0] ?? 0;
}

/** YAML text to a plain value (object, array, scalar, or null for an empty document). */
export function parseYamlText(text: string, file: string): unknown {
  const tooDeep = bracketDepthOffset(text, limitOf('nestingDepth'), true);
  if (tooDeep !== null) throw depthError(file, textPosition(text, tooDeep));
  const lineCounter = new LineCounter();
  const document: Document.Parsed = parseDocument(text, { prettyErrors: false, lineCounter, uniqueKeys: true });
  const problem = document.errors[0];
  if (problem) {
    if (problem.code === 'RESOURCE_EXHAUSTION') throw depthError(file, where(lineCounter, problem.pos[0]));
    if (problem.code === 'MULTIPLE_DOCS') {
      throw new InputError(`holds more than one YAML document (a second "---" at ${where(lineCounter, problem.pos[0])}); keep one`, { file });
    }
    throw new InputError(`YAML syntax error at ${where(lineCounter, problem.pos[0])}: ${problem.message.split('\n')[0]}`, { file });
  }
  if (yamlTreeDepth(document.contents) > limitOf('nestingDepth')) throw depthError(file, null);
  const { tagged, forbiddenKey } = yamlProblems(document.contents);
  if (tagged) {
    const shown = tagged.tag!.replace(/^tag:yaml\.org,2002:/, '!!');
    throw new InputError(
      `uses the YAML tag ${shown} at ${where(lineCounter, offsetOf(tagged))}; tags are not part of a study file — write the plain value`,
      { file },
    );
  }
  if (forbiddenKey) {
    throw new InputError(`uses the reserved key "${String((forbiddenKey as { value?: unknown }).value)}" at ${where(lineCounter, offsetOf(forbiddenKey))}`, { file });
  }
  try {
    return document.toJS({ maxAliasCount: INPUT_LIMITS.yamlAliases.value });
  } catch (error) {
    if (error instanceof ReferenceError && /alias/i.test(error.message)) {
      throw new InputError(
        `expands its YAML aliases (*name) too often, ${aboveLimit('yamlAliases')}; nested aliases grow exponentially — write the values out`,
        { file },
      );
    }
    if (error instanceof ReferenceError || error instanceof RangeError) {
      throw new InputError(`YAML cannot be read: ${error.message.split('\n')[0]}`, { file });
    }
    throw error;
  }
}

/** What one pass over JSON text found: the first problem of each kind, by offset. */
interface JsonScan {
  /** Where nesting first passes the limit. */
  tooDeep?: number;
  /** Where the text first stops being JSON (JSON.parse's message says why). */
  syntax?: number;
  /** The first key repeated within one object: its offset and its text as written. */
  repeated?: { offset: number; written: string };
  /** The first `__proto__`, `constructor` or `prototype` key. */
  forbidden?: { offset: number; key: string };
}

const JSON_NUMBER = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;

/**
 * One linear pass over JSON text (RFC 8259 grammar), without recursion: nesting depth,
 * repeated and reserved keys, and the offset of the first syntax error. Costs about as much
 * as JSON.parse itself, where a general parser building a syntax tree costs a hundred times
 * more on a table of 200 000 rows.
 */
function scanJson(text: string, depthLimit: number): JsonScan {
  const result: JsonScan = {};
  // One entry per open collection: the keys of an object, or null for an array.
  const open: (Set<string> | null)[] = [];
  let i = 0;
  const n = text.length;
  const skipSpace = () => {
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09) i++;
      else break;
    }
  };
  /** Reads a string starting at the quote at i; returns its end (after the closing quote) or -1. */
  const readString = (): number => {
    // A plain loop: a regular expression over a string of millions of characters runs out of stack.
    for (let j = i + 1; j < n; j++) {
      const c = text.charCodeAt(j);
      if (c === 0x22) return j + 1;
      if (c < 0x20) return -1;
      if (c === 0x5c) {
        const escaped = text[j + 1];
        if (escaped === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(j + 2, j + 6))) return -1;
          j += 5;
        } else if (escaped !== undefined && '"\\/bfnrt'.includes(escaped)) j++;
        else return -1;
      }
    }
    return -1;
  };
  const fail = (at: number): JsonScan => ({ ...result, syntax: at });

  let expectValue = true;
  skipSpace();
  for (;;) {
    if (expectValue) {
      skipSpace();
      const c = text[i];
      if (c === '{' || c === '[') {
        open.push(c === '{' ? new Set() : null);
        if (open.length > depthLimit) return { ...result, tooDeep: i };
        i++;
        skipSpace();
        const close = c === '{' ? '}' : ']';
        if (text[i] === close) {
          open.pop();
          i++;
          expectValue = false;
        } else if (c === '{') {
          if (!readKey()) return fail(i);
        }
        // An array's first value, or the value after an object's first key, comes next.
        continue;
      }
      if (c === '"') {
        const end = readString();
        if (end < 0) return fail(i);
        i = end;
      } else if (c === 't' || c === 'f' || c === 'n') {
        const word = c === 't' ? 'true' : c === 'f' ? 'false' : 'null';
        if (!text.startsWith(word, i)) return fail(i);
        i += word.length;
      } else {
        JSON_NUMBER.lastIndex = i;
        if (!JSON_NUMBER.test(text)) return fail(i);
        i = JSON_NUMBER.lastIndex;
      }
      expectValue = false;
      continue;
    }
    // A value has just ended.
    skipSpace();
    if (open.length === 0) return i < n ? fail(i) : result;
    const keys = open[open.length - 1];
    const c = text[i];
    if (c === ',') {
      i++;
      if (keys !== null && !readKey()) return fail(i);
      expectValue = true;
    } else if (c === (keys === null ? ']' : '}')) {
      open.pop();
      i++;
    } else return fail(i);
  }

  /** At an object key (after `{` or `,`): reads `"key" :` and records the key; false on a syntax error. */
  function readKey(): boolean {
    skipSpace();
    if (text[i] !== '"') return false;
    const start = i;
    const end = readString();
    if (end < 0) return false;
    const written = text.slice(start, end);
    const key = written.includes('\\') ? (JSON.parse(written) as string) : written.slice(1, -1);
    const keys = open[open.length - 1]!;
    if (keys.has(key)) result.repeated ??= { offset: start, written };
    keys.add(key);
    if (FORBIDDEN_KEYS.has(key)) result.forbidden ??= { offset: start, key };
    i = end;
    skipSpace();
    if (text[i] !== ':') return false;
    i++;
    expectValue = true;
    return true;
  }
}

/**
 * JSON text to a value, or one line saying what is wrong and where. `JSON.parse` alone lets
 * a repeated key win silently, and its messages quote the text around the fault (line
 * breaks included) without a line number; one linear scan (`scanJson`) finds the line and
 * column, repeated and reserved keys and too deep nesting. `NaN` and `Infinity` (which
 * Python's json module writes by default) get their own advice.
 */
export function parseJsonText(text: string, file: string): unknown {
  const scan = scanJson(text, limitOf('nestingDepth'));
  if (scan.tooDeep !== undefined) throw depthError(file, textPosition(text, scan.tooDeep));
  if (scan.syntax !== undefined) {
    const at = scan.syntax;
    const nonFinite = /^[+-]?(?:NaN|Infinity)/.exec(text.slice(at, at + 9));
    if (nonFinite) {
      throw new InputError(
        `is not valid JSON at ${textPosition(text, at)}: ${nonFinite[0]} is not a JSON value; write a number (or null where a value may be empty)`,
        { file },
      );
    }
    let failure = 'unexpected text';
    try {
      JSON.parse(text);
    } catch (error) {
      failure = (error as Error).message;
    }
    // V8 quotes the text around the fault; keep the reason short and on one line.
    const reason = failure
      .replace(/\s+/g, ' ')
      .replace(/ (?:in JSON )?at position \d+.*$/, '')
      .replace(/, "[^"]*"(?:\.\.\.)? is not valid JSON$/, '')
      .slice(0, 120);
    throw new InputError(`is not valid JSON at ${textPosition(text, at)}: ${reason}`, { file });
  }
  if (scan.repeated) {
    throw new InputError(`repeats the key ${excerptKey(scan.repeated.written)} at ${textPosition(text, scan.repeated.offset)}; give each key once`, { file });
  }
  if (scan.forbidden) {
    throw new InputError(`uses the reserved key "${scan.forbidden.key}" at ${textPosition(text, scan.forbidden.offset)}`, { file });
  }
  return JSON.parse(text);
}

function excerptKey(key: string): string {
  return key.length > 60 ? `${key.slice(0, 57)}…"` : key;
}
