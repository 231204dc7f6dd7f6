/**
 * The files `tierplan analyze --out` writes, in the order they are listed: analysis.json
 * (the contract), analysis.xlsx and analysis.html.
 */
import type { AnalysisDocument } from '../core/results/campaignAnalysis.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { OutputFile } from './outputSet.js';

export function analysisJson(analysis: AnalysisDocument): string {
  return `${JSON.stringify(analysis, null, 2)}\n`;
}

export async function analysisFiles(analysis: AnalysisDocument, plan: PlanDocument): Promise<OutputFile[]> {
  // The workbook and chart libraries take a moment to load: only when files are written.
  const [{ analysisWorkbook }, { analysisReportHtml }] = await Promise.all([import('./analysisWorkbook.js'), import('./analysisReport.js')]);
  return [
    { name: 'analysis.json', content: analysisJson(analysis) },
    { name: 'analysis.xlsx', content: await analysisWorkbook(analysis) },
    { name: 'analysis.html', content: await analysisReportHtml(analysis, plan.study.title) },
  ];
}
