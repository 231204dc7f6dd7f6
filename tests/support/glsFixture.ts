/**
 * The split-plot GLS fixture (tests/reference/splitplot/generate.py → gls.json: dense numpy
 * with V and the session indicators built explicitly), its model and the structure of a case.
 */
import { readFileSync } from 'node:fs';
import { compileModel } from '../../src/core/model/modelMatrix.js';
import type { ErrorStructure } from '../../src/core/model/glsInformation.js';

export interface GlsCase {
  name: string;
  points: number[][];
  wholePlotOf: number[];
  sessionOfWholePlot: number[];
  varianceRatio: number;
  glsInformation: number[][];
  logDetPerRun: number;
  covariance: number[][];
  adjustedInformation?: number[][];
  informationKept?: number;
}

export const glsFixture = JSON.parse(readFileSync(new URL('../reference/splitplot/gls.json', import.meta.url), 'utf8')) as { cases: GlsCase[] };

/** The full quadratic in two factors the fixture uses (x1 hard to change). */
export const glsModel = compileModel(
  [{ powers: {} }, { powers: { x1: 1 } }, { powers: { x2: 1 } }, { powers: { x1: 1, x2: 1 } }, { powers: { x1: 2 } }, { powers: { x2: 2 } }],
  ['x1', 'x2'],
);

export function structureOf(c: GlsCase): ErrorStructure {
  return {
    wholePlotOf: Int32Array.from(c.wholePlotOf),
    sessionOfWholePlot: Int32Array.from(c.sessionOfWholePlot),
    wholePlots: c.sessionOfWholePlot.length,
    sessions: Math.max(...c.sessionOfWholePlot) + 1,
    varianceRatio: c.varianceRatio,
  };
}
