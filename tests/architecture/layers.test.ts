/**
 * The shape of the source tree, checked from its import statements: the layers import one
 * way (core ← io ← cli), core stays pure (no file system, process, console or clock), and
 * the folders of core form no cycle, so each can be read, tested and moved on its own.
 * Rules from the contributor guide (common practice for layered code).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const SRC = resolve(dirname(fileURLToPath(import.meta.url)), '../../src');

interface SourceFile {
  /** Path below src/, with forward slashes. */
  path: string;
  text: string;
  /** Import specifiers: static, re-exports and dynamic `import('…')`. */
  specifiers: string[];
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(full);
    return entry.name.endsWith('.ts') ? [full] : [];
  });
}

/** Comments removed, so that a module header may mention `process` or an import. */
function withoutComments(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
}

const IMPORT = /(?:^|[\s;])(?:import|export)\s[^'"`;]*?from\s*['"]([^'"]+)['"]|(?:^|[\s;])import\s*['"]([^'"]+)['"]|\bimport\(\s*['"]([^'"]+)['"]\s*\)/g;

function read(full: string): SourceFile {
  const text = withoutComments(readFileSync(full, 'utf8'));
  const specifiers: string[] = [];
  for (const match of text.matchAll(IMPORT)) specifiers.push(match[1] ?? match[2] ?? match[3]);
  return { path: relative(SRC, full).split(sep).join('/'), text, specifiers };
}

const files = sourceFiles(SRC).map(read);

/** The src/ path an import resolves to (relative specifiers only), without extension. */
function target(file: SourceFile, specifier: string): string | null {
  if (!specifier.startsWith('.')) return null;
  const full = resolve(SRC, dirname(file.path), specifier);
  return relative(SRC, full).split(sep).join('/').replace(/\.(js|ts)$/, '');
}

function layer(path: string): string {
  return path.split('/')[0];
}

/** A core unit: the folder below src/core, or the file itself for files at its top. */
function coreUnit(path: string): string {
  const parts = path.split('/');
  return parts.length > 2 ? parts[1] : parts[1].replace(/\.ts$/, '');
}

describe('layers', () => {
  it('reads every import of the tree (a sanity check of the parser)', () => {
    expect(files.length).toBeGreaterThan(50);
    const exact = files.find((file) => file.path === 'core/design/exactDesign.ts');
    expect(exact?.specifiers).toContain('./exchangeState.js');
  });

  it('core imports nothing from io or cli', () => {
    const offending = files
      .filter((file) => layer(file.path) === 'core')
      .flatMap((file) => file.specifiers.map((s) => [file.path, target(file, s)] as const))
      .filter(([, to]) => to !== null && (layer(to) === 'io' || layer(to) === 'cli'))
      .map(([from, to]) => `${from} → ${to}`);
    expect(offending).toEqual([]);
  });

  it('io imports nothing from cli', () => {
    const offending = files
      .filter((file) => layer(file.path) === 'io')
      .flatMap((file) => file.specifiers.map((s) => [file.path, target(file, s)] as const))
      .filter(([, to]) => to !== null && layer(to) === 'cli')
      .map(([from, to]) => `${from} → ${to}`);
    expect(offending).toEqual([]);
  });

  it('core touches no file system, process, console or clock', () => {
    const node = /^(node:|fs$|fs\/|path$|os$|child_process$|url$)/;
    const impure = /\b(process|console)\s*\.|\bDate\.now\s*\(|\bnew\s+Date\s*\(|\bperformance\s*\.\s*now\s*\(/;
    const offending = files
      .filter((file) => layer(file.path) === 'core')
      .flatMap((file) => [
        ...file.specifiers.filter((s) => node.test(s)).map((s) => `${file.path} imports ${s}`),
        ...(impure.test(file.text) ? [`${file.path}: ${impure.exec(file.text)?.[0]}`] : []),
      ]);
    expect(offending).toEqual([]);
  });
});

describe('core folders', () => {
  const edges = new Map<string, Set<string>>();
  for (const file of files.filter((f) => layer(f.path) === 'core')) {
    const from = coreUnit(file.path);
    for (const specifier of file.specifiers) {
      const to = target(file, specifier);
      if (to === null || layer(to) !== 'core') continue;
      const unit = coreUnit(`${to}.ts`);
      if (unit === from) continue;
      if (!edges.has(from)) edges.set(from, new Set());
      edges.get(from)!.add(unit);
    }
  }

  /** Every cycle's units, found by depth-first search (each reported once from its least unit). */
  function cycles(): string[] {
    const found = new Set<string>();
    const walk = (start: string, at: string, path: string[]) => {
      for (const next of edges.get(at) ?? []) {
        if (next === start) {
          found.add([...path, start].join(' → '));
        } else if (!path.includes(next) && next > start) {
          walk(start, next, [...path, next]);
        }
      }
    };
    for (const unit of [...edges.keys()].sort()) walk(unit, unit, [unit]);
    return [...found];
  }

  it('form no import cycle', () => {
    expect(cycles()).toEqual([]);
  });

  it('are seen with their dependencies (a sanity check of the graph)', () => {
    expect(edges.get('design')).toContain('linalg');
    expect(edges.get('design')).toContain('region');
  });
});
