/**
 * Builds `analyzeResponse` inputs from the reference fixtures: exponent vectors become a
 * CompiledModel with study-syntax labels, coded points become runs numbered 1, 2, ….
 */
import { compileModel, type CompiledModel } from '../../src/core/model/modelMatrix.js';
import { termLabel } from '../../src/core/model/modelTerm.js';
import type { AnalysisRun } from '../../src/core/analysis/analysisTypes.js';

export function modelOf(exponents: number[][], factorIds: string[]): { model: CompiledModel; terms: string[] } {
  const powers = exponents.map((e) => ({ powers: Object.fromEntries(e.flatMap((power, j) => (power ? [[factorIds[j], power]] : []))) }));
  return { model: compileModel(powers, factorIds), terms: powers.map((term) => termLabel(term, factorIds)) };
}

export function runsOf(points: number[][], observed: (number | null)[], first = 1, prefix = 'F', sessions?: number[]): AnalysisRun[] {
  return points.map((coded, i) => ({
    run: first + i,
    point: `${prefix}${String(i + 1).padStart(2, '0')}`,
    coded,
    observed: observed[i],
    ...(sessions ? { session: sessions[i] } : {}),
  }));
}
