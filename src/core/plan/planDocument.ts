/**
 * The plan document: everything `tierplan plan` decided, as written to plan.json.
 *
 * Key names are a contract with users and with later commands (`analyze`, `augment`), so
 * change them only with a version bump of `formatVersion`.
 */
import type { Criterion, Study } from '../study.js';
import type { TierResult } from '../sensitivity/tierTypes.js';
import type { FactorLevels, PlannedRun } from '../design/designTypes.js';
import type { Comparison } from '../compare/comparisonTypes.js';
import type { Schedule } from '../schedule/scheduleTypes.js';
import type { PlanPrecision } from '../precision/precisionTypes.js';
import type { SplitPlotSummary } from './groupingChoices.js';

export interface PlanModel {
  /** Always true: the intercept is implied by the term syntax. */
  intercept: true;
  /** Terms in study syntax, intercept excluded, e.g. `inlet_temp^2`, `inlet_temp*feed_rate`. */
  terms: string[];
  /** Every term with the reason it is there (intercept first, written `1`). */
  explained: { term: string; reason: string }[];
  /** How the term list was chosen: `tiers`, a preset name, or `explicit`. */
  source: 'tiers' | 'linear' | 'interactions' | 'quadratic' | 'explicit';
  /**
   * Potential terms (study syntax): guarded against by the Bayesian D-criterion
   * (DuMouchel & Jones 1994) but not fitted; empty when there are none.
   */
  potential: string[];
  /** Every potential term with the reason it is there (addition). */
  potentialExplained?: { term: string; reason: string }[];
}

export interface PlanMetrics {
  /** Number of model parameters, intercept included. */
  p: number;
  /** Fitting runs (centre and holdout runs excluded). */
  N: number;
  /** Natural log of det(X'X / N), coded units, fitting runs. */
  logDetPerRun: number;
  /** Textbook D-efficiency 100·|X'X|^(1/p) / N, coded units. */
  dEfficiency: number;
  /** 100 · (det M(exact) / det M(bound))^(1/p), relative to the approximate D-optimal design; fitting runs only (centre replicates excluded). */
  boundEfficiency: number | null;
  /** Why `boundEfficiency` is null, or how the bound was obtained. */
  boundNote: string;
  /** Average prediction variance over the region in σ² units, trace((X'X)^-1 · W) with W the region moment matrix, coded units. */
  iCriterion: number;
  criterion: Criterion;
  seed: number;
  starts: number;
  /** How N was chosen, with the lack-of-fit and pure-error degrees of freedom. */
  runsNote: string;
  /** Degrees of freedom of the fitted runs for lack of fit (distinct points − p) and pure error (runs − distinct points) (addition). */
  lackOfFit?: { distinctPoints: number; df: number; pureErrorDf: number; note: string };
  /**
   * η and ln det(X'V⁻¹X / n) over the n fitted runs (fitting runs and centre replicates),
   * V = I + η ZZ' from the runs' whole plots, session effects left out of X; with one whole plot
   * per run, V = (1 + η) I (evaluate/structuredPrecision.ts).
   */
  gls?: { varianceRatio: number; logDetPerRun: number | null };
  /** Sessions and the information the session effects leave, (det A / det M₀)^(1/(p−1)); 1 with one session. */
  blocks?: { sessions: number; informationKept: number | null };
}

export interface PlanDocument {
  formatVersion: 1;
  tool: { name: 'tierplan'; version: string };
  /** Short id printed on every sheet: derived from the checksum. */
  planId: string;
  /** SHA-256 of the document with `checksum`, `planId` and `createdAt` left out. */
  checksum: string;
  /** Metadata only; never part of the checksum. */
  createdAt: string;
  study: Omit<Study, 'warnings'>;
  tiers: TierResult;
  levels: FactorLevels[];
  model: PlanModel;
  runs: PlannedRun[];
  metrics: PlanMetrics;
  /** Whether the plan sees every effect the sensitivity analysis predicts, and how N was reached. */
  precision: PlanPrecision;
  warnings: string[];
  /** Filled by the comparison stage (`tierplan compare`). */
  comparison?: Comparison;
  /** Filled by the scheduling stage: randomised run order. */
  schedule?: Schedule;
  /** A plan with hard-to-change factors: its whole plots against the other ways to run it (plan/groupingChoices.ts). */
  splitPlot?: SplitPlotSummary;
  /** A revision made by `tierplan augment`: the plan it adds runs to. */
  parent?: { id: string; checksum: string };
}
