/**
 * The results of a plan revision (`tierplan augment`): the revision's own sheet lists the
 * added runs only, so its analysis reads them together with the parent plan's sheet, and
 * fits the parent's runs and the added runs as one campaign.
 *
 * Checks (InputError; the command adds the file): the plan is a revision; the parent plan
 * given is the one the revision names (`parent: { id, checksum }`, both compared); the parent
 * is not itself a revision (a chain would need every ancestor's sheet: not supported); and,
 * together, the two sheets hold every run of the revision. Each sheet has already been checked
 * against its own plan by the results reader (identity, set-points, numbers, limits).
 *
 * Conventions fixed here: run numbers never repeat across the two sheets (the revision numbers
 * its added runs after the parent's last run); the parent sheet's warnings are kept, prefixed
 * with the parent's plan id.
 */
import { InputError } from '../inputError.js';
import type { PlanDocument } from '../plan/planDocument.js';
import type { SheetResults } from './campaignAnalysis.js';

/** Refuses a revision analysed without its parent's results, and a parent given for a plan that has none. */
export function checkParentGiven(plan: PlanDocument, parentGiven: boolean): void {
  if (plan.parent && !parentGiven) {
    throw new InputError(
      `plan ${plan.planId} is a revision of plan ${plan.parent.id} and its sheet lists the added runs only: give the parent with --parent <plan.json> --parent-results <its filled run sheet>`,
      { key: 'parent' },
    );
  }
  if (!plan.parent && parentGiven) {
    throw new InputError(`plan ${plan.planId} is not a revision (it has no parent): analyse it without --parent and --parent-results`, { key: 'parent' });
  }
}

/** Refuses a parent plan that is not the one the revision was made from, or is itself a revision. */
export function checkParentPlan(revision: PlanDocument, parent: PlanDocument): void {
  const named = revision.parent!;
  if (named.id !== parent.planId || named.checksum !== parent.checksum) {
    throw new InputError(
      `is plan ${parent.planId}, but revision ${revision.planId} was made from plan ${named.id} (checksum ${named.checksum.slice(0, 12)}…): give that plan's plan.json with --parent`,
      { key: 'planId' },
    );
  }
  if (parent.parent) {
    throw new InputError(
      `plan ${parent.planId} is itself a revision of plan ${parent.parent.id}: analysing a revision of a revision is not supported; augment the first plan again with more --runs instead`,
      { key: 'parent' },
    );
  }
}

/** One sheet for the whole revision: the parent's runs from its sheet, then the added runs. */
export function revisionResults(revision: PlanDocument, parent: PlanDocument, parentSheet: SheetResults, addedSheet: SheetResults): SheetResults {
  checkParentPlan(revision, parent);
  const runs = [...parentSheet.runs, ...addedSheet.runs];
  const points = new Set(runs.map((run) => run.point));
  const missing = revision.runs.filter((run) => !points.has(run.point)).map((run) => run.point);
  if (missing.length > 0) {
    throw new InputError(
      `point${missing.length === 1 ? '' : 's'} ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ` and ${missing.length - 10} more` : ''} of revision ${revision.planId} ${missing.length === 1 ? 'is' : 'are'} on neither sheet`,
      { key: 'runs' },
    );
  }
  return {
    planId: revision.planId,
    checksum: revision.checksum,
    runs,
    warnings: [...parentSheet.warnings.map((warning) => `parent plan ${parent.planId}: ${warning}`), ...addedSheet.warnings],
  };
}
