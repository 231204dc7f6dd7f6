/**
 * report.html of a plan revision (`tierplan augment --out`): one self-contained page saying
 * which plan the revision extends (parent id and checksum), why runs were added (the parent's
 * verdict per response with its reasons, and the model note: which terms were added and why),
 * the model of the revision with the reason for each term, and the added runs in run order with
 * their settings — what a manager signs off and the bench runs next.
 *
 * Every figure is taken from the revision, its parent and the parent's analysis; this module
 * only words and formats (numberText.ts). User text goes through handlebars escaping; there are
 * no charts. Print rules as the other reports (A4, the safety caution partial); wording in
 * templates/revisionReport.hbs and below.
 */
import type { PlanDocument } from '../core/plan/planDocument.js';
import type { AnalysisDocument } from '../core/results/campaignAnalysis.js';
import { renderTemplate } from './templateRendering.js';
import { withUnit } from './textTable.js';
import { efficiencyText, settingText } from './numberText.js';

export async function revisionReportHtml(revision: PlanDocument, parent: PlanDocument, analysis: AnalysisDocument, modelNote: string): Promise<string> {
  const schedule = revision.schedule!;
  const runOf = new Map(revision.runs.map((run) => [run.point, run]));
  const varied = revision.levels.filter((level) => level.varied);
  const factorOf = new Map(revision.study.factors.map((factor) => [factor.id, factor]));
  const done = parent.runs.length - analysis.results.notDone.length;
  const added = schedule.order.length;
  return renderTemplate('revisionReport', {
    title: revision.study.title,
    planId: revision.planId,
    checksum: revision.checksum,
    parentId: revision.parent!.id,
    parentChecksum: revision.parent!.checksum,
    toolVersion: revision.tool.version,
    headline: `Plan ${revision.planId} adds ${added} run${added === 1 ? '' : 's'} to plan ${revision.parent!.id}: D-optimal given the ${done} runs done (Dykstra 1971), for a model of ${revision.model.terms.length + 1} terms.`,
    modelNote: modelNote.charAt(0).toUpperCase() + modelNote.slice(1) + '.',
    responses: analysis.responses.map((response) => ({
      heading: withUnit(response.name, response.unit),
      verdict: response.verdict,
      calibrated: response.verdict === 'calibrated',
      reasons: response.verdictReasons.map((reason) => reason.message),
      labNote: response.labVsModel.note,
    })),
    terms: revision.model.explained.map((entry) => ({ term: entry.term === '1' ? '1 (intercept)' : entry.term, reason: entry.reason })),
    dEfficiency: efficiencyText(revision.metrics.dEfficiency),
    runsNote: revision.metrics.runsNote,
    sessionLabel: schedule.sessionLabel,
    factorHeaders: varied.map((level) => withUnit(level.name, level.unit)),
    runs: schedule.order.map((scheduled) => {
      const run = runOf.get(scheduled.point)!;
      return {
        sequence: scheduled.sequence,
        session: scheduled.session,
        point: scheduled.point,
        settings: varied.map((level) => settingText(run.settings[level.id], factorOf.get(level.id)!)),
      };
    }),
    scheduleNote: schedule.note,
  });
}
