/**
 * The classical plans the proposed plan is set against, built by the tool itself from
 * src/core/classical for the same factors, coded ranges and centre replicates.
 *
 * Conventions fixed here:
 * - Every comparator gets the proposed plan's number of centre replicates (coded 0), except
 *   the full grid, which is the "every setting once" plan and gets none; the central
 *   composite and Box–Behnken plans receive them through their own centre-run argument.
 * - All runs of a comparator are fitting runs (it has no holdout runs).
 * - `conventional` varies every operating factor, negligible ones included; only the
 *   columns of the varied factors enter the target model. Its feasibility is checked on that
 *   projection (the other factors' settings are not in the region).
 * - The fractional factorial is the smallest regular 2^(k−p) fraction of resolution ≥ IV, or
 *   ≥ V when the model has two-factor interactions (so that they are clear of each other),
 *   with minimum aberration among those of that size (Fries & Hunter, 1980, "Minimum
 *   aberration 2^(k−p) designs", Technometrics 22).
 * - The central composite and Box–Behnken plans are built only when the model has a squared
 *   term; without one they are still listed, with `points: null` and the reason, as is any
 *   plan that cannot be built, so that no row disappears silently.
 * - Runs are counted as off limits when the region calls them infeasible (equipment limits or
 *   constraints) and as outside the range when a coded coordinate exceeds 1 in magnitude.
 */
import { ENUMERATION_LIMIT, type CandidateRegion } from '../region/candidateRegion.js';
import type { Factor } from '../study.js';
import type { ComparatorId } from './comparisonTypes.js';
import { twoLevelFullFactorial } from '../classical/fullFactorial.js';
import { minimumAberrationFraction } from '../classical/fractionalFactorial.js';
import { MAX_LETTERED_FACTORS } from '../classical/wordLengthPattern.js';
import { smallestPlackettBurman } from '../classical/plackettBurman.js';
import { centralComposite } from '../classical/centralComposite.js';
import { boxBehnken } from '../classical/boxBehnken.js';
import { fullGrid } from '../classical/fullGrid.js';
import { groupedLevelChanges } from './campaignCost.js';
import { toEngineering } from '../region/codedUnits.js';
import { comparatorLabel, romanNumeral } from './comparatorNames.js';
import { counted } from '../countedNoun.js';

/** Largest two-level cube (full factorial, conventional plan, composite cube) built point by point. */
const MAX_CONVENTIONAL_FACTORS = 16;
/**
 * Largest runs × p² of a plan that is evaluated (X'X, estimability, variance inflation each
 * cost about that many multiply-adds): about a second per plan on the reference machine.
 */
const EVALUATION_WORK = 3e8;

export interface ComparatorContext {
  /** Varied (design) factor ids, in coordinate order. */
  variedIds: string[];
  /** Every operating factor id, in study order. */
  operatingIds: string[];
  /** Operating factors the study marks hard to change. */
  hardToChange: string[];
  centreRuns: number;
  /** Planned coded levels of each varied factor. */
  plannedLevels: number[][];
  hasInteractions: boolean;
  hasSquares: boolean;
  /** Parameters of the target model (intercept included): sizes the evaluation of each plan. */
  p: number;
  factors: Factor[];
  region?: CandidateRegion;
  /** Region over every operating factor (coordinates in `operatingIds` order), for the conventional plan. */
  conventionalRegion?: CandidateRegion;
}

export interface ComparatorDesign {
  id: ComparatorId;
  label: string;
  /** Every run, coded, one coordinate per varied factor; null when the plan cannot be built. */
  points: number[][] | null;
  reason?: string;
  levelChanges: number | null;
  generators?: string[];
  resolution?: number;
  wordLengthPattern?: number[];
  /** Facts the verdict must mention besides feasibility: extra factors, axial runs outside the range. */
  notes: string[];
  /** Runs breaking constraints or equipment limits (0 when no region is given or nothing was built). */
  offLimitsRuns: number;
  /** Runs with a coded coordinate beyond ±1. */
  runsOutsideRange: number;
}

export function buildComparators(context: ComparatorContext): ComparatorDesign[] {
  const designs: ComparatorDesign[] = [
    conventional(context),
    fullFactorial(context),
    fractional(context),
    plackettBurman(context),
    grid(context),
  ];
  designs.push(...(context.hasSquares ? responseSurfacePlans(context) : responseSurfaceNotNeeded()));
  return designs;
}

function withCentres(points: number[][], k: number, c: number): number[][] {
  return [...points, ...Array.from({ length: c }, () => new Array<number>(k).fill(0))];
}

function variedColumn(context: ComparatorContext): (id: string) => number {
  return (id) => context.variedIds.indexOf(id);
}

type DesignCore = Omit<ComparatorDesign, 'levelChanges' | 'notes' | 'offLimitsRuns' | 'runsOutsideRange'>;

function finish(context: ComparatorContext, design: DesignCore, notes: string[] = []): ComparatorDesign {
  const points = design.points;
  const levelChanges =
    points && context.hardToChange.length > 0 ? groupedLevelChanges(points, context.hardToChange, variedColumn(context)) : null;
  return { ...design, levelChanges, notes, ...runPlacement(context.region, points) };
}

/** Why a plan of `runs` runs is not evaluated on the target model, or null when it is. */
function tooLargeToEvaluate(context: ComparatorContext, runs: number): string | null {
  if (runs * context.p * context.p <= EVALUATION_WORK) return null;
  return `${runs} runs on a ${context.p}-term model is too large to evaluate within the time budget`;
}

function unbuilt(id: ComparatorId, label: string, reason: string): ComparatorDesign {
  return { id, label, points: null, reason, levelChanges: null, notes: [], offLimitsRuns: 0, runsOutsideRange: 0 };
}

function conventional(context: ComparatorContext): ComparatorDesign {
  const K = context.operatingIds.length;
  const k = context.variedIds.length;
  const c = context.centreRuns;
  const label = comparatorLabel.conventional(K, c);
  if (K > MAX_CONVENTIONAL_FACTORS) return unbuilt('conventional', label, `2^${K} = ${2 ** K} runs is too large to build and evaluate`);
  const tooLarge = tooLargeToEvaluate(context, 2 ** K + c);
  if (tooLarge) return unbuilt('conventional', label, tooLarge);
  const all = withCentres(twoLevelFullFactorial(K), K, c);
  const columns = context.variedIds.map((id) => context.operatingIds.indexOf(id));
  const points = all.map((x) => columns.map((j) => x[j]));
  const levelChanges =
    context.hardToChange.length > 0 ? groupedLevelChanges(all, context.hardToChange, (id) => context.operatingIds.indexOf(id)) : null;
  const extra = K - k;
  const notes = extra > 0 ? [`varies ${counted(extra, 'factor')} the model does not need`] : [];
  const offLimits = context.conventionalRegion
    ? { offLimitsRuns: all.filter((x) => !context.conventionalRegion!.isFeasible(x)).length, runsOutsideRange: 0 }
    : runPlacement(context.region, points);
  return { id: 'conventional', label, points, levelChanges, notes, ...offLimits };
}

function fullFactorial(context: ComparatorContext): ComparatorDesign {
  const k = context.variedIds.length;
  const c = context.centreRuns;
  const label = comparatorLabel.fullFactorial(k, c);
  if (k > MAX_CONVENTIONAL_FACTORS) return unbuilt('full-factorial', label, `2^${k} = ${2 ** k} runs is too large to build and evaluate`);
  const tooLarge = tooLargeToEvaluate(context, 2 ** k + c);
  if (tooLarge) return unbuilt('full-factorial', label, tooLarge);
  return finish(context, {
    id: 'full-factorial',
    label,
    points: withCentres(twoLevelFullFactorial(k), k, c),
  });
}

function fractional(context: ComparatorContext): ComparatorDesign {
  const k = context.variedIds.length;
  const c = context.centreRuns;
  const minResolution = context.hasInteractions ? 5 : 4;
  const roman = romanNumeral(minResolution);
  const unbuiltLabel = comparatorLabel.fractionNotFound(minResolution, c);
  if (k > MAX_LETTERED_FACTORS) {
    return unbuilt(
      'fractional',
      unbuiltLabel,
      `not built for ${k} factors, because regular fractions are built here for at most ${MAX_LETTERED_FACTORS} (one letter A–Z, I skipped, per factor)`,
    );
  }
  const fraction = minimumAberrationFraction(k, minResolution);
  if (!fraction) return unbuilt('fractional', unbuiltLabel, `no regular fraction of ${k} factors reaches resolution ${roman}`);
  const tooLarge = tooLargeToEvaluate(context, fraction.runs + c);
  if (tooLarge) return unbuilt('fractional', unbuiltLabel, tooLarge);
  const label =
    fraction.p === 0
      ? comparatorLabel.fractionIsFull(k, minResolution, c)
      : comparatorLabel.fraction(k, fraction.generators, fraction.resolution, c);
  return finish(context, {
    id: 'fractional',
    label,
    points: withCentres(fraction.points, k, c),
    generators: fraction.generators,
    resolution: fraction.resolution,
    wordLengthPattern: fraction.wordLengthPattern,
  });
}

function plackettBurman(context: ComparatorContext): ComparatorDesign {
  const k = context.variedIds.length;
  const c = context.centreRuns;
  const screening = smallestPlackettBurman(k);
  if (!screening) {
    return unbuilt('plackett-burman', comparatorLabel.plackettBurman(null, c), `no Plackett–Burman plan of 12, 20 or 24 runs takes ${k} factors`);
  }
  return finish(context, {
    id: 'plackett-burman',
    label: comparatorLabel.plackettBurman(screening.runs, c),
    points: withCentres(screening.points, k, c),
  });
}

function grid(context: ComparatorContext): ComparatorDesign {
  const counts = context.plannedLevels.map((levels) => levels.length);
  const size = counts.reduce((a, b) => a * b, 1);
  // The full grid is built point by point: no larger than a region enumerates.
  if (size > ENUMERATION_LIMIT) {
    return unbuilt('full-grid', comparatorLabel.fullGrid(counts), `${size} combinations is too large to build and evaluate`);
  }
  const tooLarge = tooLargeToEvaluate(context, size);
  if (tooLarge) return unbuilt('full-grid', comparatorLabel.fullGrid(counts), tooLarge);
  const all = fullGrid(context.plannedLevels);
  const region = context.region;
  const points = region ? all.filter((x) => region.isFeasible(x)) : all;
  const dropped = all.length - points.length;
  const constraintText = region
    ? dropped > 0
      ? `constraints applied (${dropped} of ${all.length} combinations excluded)`
      : 'constraints applied (none excluded)'
    : 'constraints ignored';
  return finish(context, {
    id: 'full-grid',
    label: comparatorLabel.fullGrid(counts, constraintText),
    points,
  });
}

function responseSurfacePlans(context: ComparatorContext): ComparatorDesign[] {
  const k = context.variedIds.length;
  const c = context.centreRuns;
  const cubeTooLarge = k > MAX_CONVENTIONAL_FACTORS ? `its 2^${k} = ${2 ** k}-run cube is too large to build and evaluate` : tooLargeToEvaluate(context, 2 ** k + 2 * k + c);
  if (cubeTooLarge) {
    const reason = cubeTooLarge;
    return [
      unbuilt('ccd-face', comparatorLabel.ccdFace(), reason),
      unbuilt('ccd-rotatable', comparatorLabel.ccdRotatable(), reason),
      responseSurfaceBoxBehnken(context),
    ];
  }
  const face = centralComposite(k, 'face', c);
  const rotatable = centralComposite(k, 'rotatable', c);
  const alphaText = String(Number(rotatable.alpha.toFixed(3)));
  const designs: ComparatorDesign[] = [
    finish(context, { id: 'ccd-face', label: comparatorLabel.ccdFace(c), points: face.points }),
    finish(
      context,
      {
        id: 'ccd-rotatable',
        label: comparatorLabel.ccdRotatable(alphaText, c),
        points: rotatable.points,
      },
      axialNotes(context, rotatable.alpha),
    ),
  ];
  designs.push(responseSurfaceBoxBehnken(context));
  return designs;
}

function responseSurfaceBoxBehnken(context: ComparatorContext): ComparatorDesign {
  const k = context.variedIds.length;
  const c = context.centreRuns;
  const bbd = boxBehnken(k, c);
  if (bbd.points === null) return unbuilt('box-behnken', comparatorLabel.boxBehnken(), 'reason' in bbd ? bbd.reason : `no Box–Behnken plan for ${k} factors`);
  return finish(context, { id: 'box-behnken', label: comparatorLabel.boxBehnken(c), points: bbd.points });
}

/** Listed for a model without squared terms, so that the reader sees why they are absent. */
function responseSurfaceNotNeeded(): ComparatorDesign[] {
  const reason = 'the model has no squared terms, and estimating curvature is what this plan is for';
  return [
    unbuilt('ccd-face', comparatorLabel.ccdFace(), reason),
    unbuilt('ccd-rotatable', comparatorLabel.ccdRotatable(), reason),
    unbuilt('box-behnken', comparatorLabel.boxBehnken(), reason),
  ];
}

/** Axial points at ±α lie outside the studied range; say whether they also pass the equipment limits. */
function axialNotes(context: ComparatorContext, alpha: number): string[] {
  if (alpha <= 1 + 1e-12) return [];
  const beyond: string[] = [];
  for (const id of context.variedIds) {
    const factor = context.factors.find((f) => f.id === id);
    if (!factor?.limits) continue;
    const low = toEngineering(factor, -alpha);
    const high = toEngineering(factor, alpha);
    if (low < factor.limits.low || high > factor.limits.high) {
      beyond.push(`${id} (${round(low)}–${round(high)} ${factor.unit} against limits ${factor.limits.low}–${factor.limits.high})`);
    }
  }
  const notes = [
    `its axial runs lie outside the studied range (±${round(alpha)} coded), so part of its information comes from settings where the model has not been studied`,
  ];
  if (beyond.length > 0) notes.push(`axial settings beyond the equipment limits of ${beyond.join(', ')}`);
  return notes;
}

/** Runs outside equipment limits or constraints of the region, and runs outside the coded range. */
export function runPlacement(region: CandidateRegion | undefined, points: number[][] | null): { offLimitsRuns: number; runsOutsideRange: number } {
  if (!points) return { offLimitsRuns: 0, runsOutsideRange: 0 };
  return {
    offLimitsRuns: region ? points.filter((x) => !region.isFeasible(x)).length : 0,
    runsOutsideRange: points.filter((x) => x.some((value) => Math.abs(value) > 1 + 1e-9)).length,
  };
}

function round(value: number): string {
  return String(Number(value.toPrecision(4)));
}
