/**
 * The filled run sheets of a campaign, read and checked: the plan's own sheet, or — for a
 * plan revision (`tierplan augment`) — the sheet of the added runs together with the parent
 * plan and its filled sheet, combined into one set of results (core/results/revisionResults.ts).
 *
 * Each sheet is checked against its own plan by resultsSheet.ts; the parent plan against the
 * revision's `parent: { id, checksum }`. Refusals name the file they are about.
 */
import { InputError } from '../core/inputError.js';
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { SheetResults } from '../core/results/campaignAnalysis.js';
import { checkParentGiven, checkParentPlan, revisionResults } from '../core/results/revisionResults.js';
import { loadPlan } from './planFile.js';
import { readResultsSheet } from './resultsSheet.js';

export interface ParentFiles {
  /** The parent's plan.json. */
  plan: string;
  /** The parent's filled run sheet. */
  results: string;
}

export interface CampaignResults {
  sheet: SheetResults;
  /** Where the plan's own results came from. */
  source: { file: string; sheet: string | null };
  /** The parent's results, for a revision. */
  parent?: { plan: { id: string; checksum: string }; file: string; sheet: string | null };
}

/** A refusal about `file` when the thrower did not name one. */
async function about<T>(file: string, work: () => T | Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    throw error instanceof InputError ? error.inFile(file) : error;
  }
}

export async function readCampaignResults(plan: PlanDocument, planPath: string, resultsPath: string, parentFiles?: ParentFiles): Promise<CampaignResults> {
  await about(planPath, () => checkParentGiven(plan, parentFiles !== undefined));
  if (!parentFiles) {
    const sheet = await readResultsSheet(resultsPath, plan);
    return { sheet, source: { file: resultsPath, sheet: sheet.sheet } };
  }
  const parent = await loadPlan(parentFiles.plan);
  await about(parentFiles.plan, () => checkParentPlan(plan, parent));
  const parentSheet = await readResultsSheet(parentFiles.results, parent);
  const added = await readResultsSheet(resultsPath, plan);
  const sheet = await about(planPath, () => revisionResults(plan, parent, parentSheet, added));
  return {
    sheet,
    source: { file: resultsPath, sheet: added.sheet },
    parent: { plan: { id: parent.planId, checksum: parent.checksum }, file: parentFiles.results, sheet: parentSheet.sheet },
  };
}

/** The --parent / --parent-results pair of a command: both or neither. */
export function parentFilesOf(options: { parent?: string; parentResults?: string }): ParentFiles | undefined {
  if (options.parent === undefined && options.parentResults === undefined) return undefined;
  if (options.parent === undefined || options.parentResults === undefined) {
    throw new InputError(`--parent and --parent-results go together: give the parent's plan.json and its filled run sheet`, { key: options.parent === undefined ? '--parent' : '--parent-results' });
  }
  return { plan: options.parent, results: options.parentResults };
}
