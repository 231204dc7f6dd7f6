/**
 * What each plan of the comparison is called, in one place: the family name (chart legends
 * and the report), the compact name of the terminal tables ("2^(5-1) res V") and the full
 * label every comparison row carries ("Two-level full factorial over all 5 operating
 * factors + 3 centre runs").
 *
 * Conventions fixed here: the design families keep the names the trade gives them
 * (Plackett–Burman, central composite, Box–Behnken); resolution is written in Roman
 * numerals, as Box & Hunter (1961, "The 2^(k−p) fractional factorial designs",
 * Technometrics 3) write it; counts of centre runs are spelt out ("no centre runs",
 * "1 centre run").
 */
import type { ComparatorId, ComparatorRow } from './comparisonTypes.js';
import { counted } from '../countedNoun.js';

/** Family names, for legends; the rows carry each plan's full label. */
export const COMPARATOR_SHORT_NAME: Readonly<Record<ComparatorId, string>> = {
  proposed: 'Proposed plan',
  conventional: 'Conventional plan',
  'full-factorial': 'Full factorial',
  fractional: 'Fractional factorial',
  'plackett-burman': 'Plackett–Burman',
  'full-grid': 'Full grid of levels',
  'ccd-face': 'Central composite (face-centred)',
  'ccd-rotatable': 'Central composite (rotatable)',
  'box-behnken': 'Box–Behnken',
};

/** What the compact table name needs to know about the plan the rows are set against. */
export interface ComparatorNaming {
  /** Factors the proposed plan varies. */
  variedFactors: number;
  /** Every operating factor of the study (the conventional plan varies them all). */
  operatingFactors: number;
  /** Centre replicates each comparator receives. */
  centreRuns: number;
  /** Planned level count of each varied factor. */
  levelCounts: readonly number[];
}

/** The name of a row in the terminal tables: short, with the size that sets it apart. */
export function comparatorTableName(row: ComparatorRow, naming: ComparatorNaming): string {
  const k = naming.variedFactors;
  switch (row.id) {
    case 'proposed':
      return 'Proposed';
    case 'conventional':
      return `Conventional 2^${naming.operatingFactors}`;
    case 'full-factorial':
      return `Full 2^${k}`;
    case 'fractional': {
      if (row.runs === null) return 'Fraction';
      if (!row.generators || row.generators.length === 0) return `Fraction (= full 2^${k})`;
      return `2^(${k}-${row.generators.length}) res ${romanNumeral(row.resolution ?? 0)}`;
    }
    case 'plackett-burman':
      return `Plackett–Burman${row.runs === null ? '' : ` ${row.runs - naming.centreRuns}`}`;
    case 'full-grid':
      return `Full grid ${naming.levelCounts.join('×')}`;
    case 'ccd-face':
      return 'CCD face-centred';
    case 'ccd-rotatable':
      return 'CCD rotatable';
    case 'box-behnken':
      return 'Box–Behnken';
  }
}

/** Full labels of the comparison rows, by plan. */
export const comparatorLabel = {
  proposed: (fit: number, centre: number, holdout: number): string =>
    `Optimal exact design: ${counted(fit, 'model run')} + ${centre} centre + ${counted(holdout, 'holdout run')}`,
  conventional: (operatingFactors: number, centre: number): string =>
    `Two-level full factorial over all ${operatingFactors} operating factors + ${centreText(centre)}`,
  fullFactorial: (k: number, centre: number): string => `Two-level full factorial over the ${k} varied factors + ${centreText(centre)}`,
  fractionNotFound: (minResolution: number, centre: number): string =>
    `Regular two-level fraction of resolution ${romanNumeral(minResolution)} or higher + ${centreText(centre)}`,
  fractionIsFull: (k: number, minResolution: number, centre: number): string =>
    `No smaller regular fraction of ${k} factors reaches resolution ${romanNumeral(minResolution)}: the full 2^${k} + ${centreText(centre)}`,
  fraction: (k: number, generators: readonly string[], resolution: number, centre: number): string =>
    `2^(${k}−${generators.length}) fraction, resolution ${romanNumeral(resolution)} (${generators.join(', ')}) + ${centreText(centre)}`,
  plackettBurman: (runs: number | null, centre: number): string =>
    runs === null ? `Plackett–Burman screening plan + ${centreText(centre)}` : `Plackett–Burman screening plan, ${runs} runs + ${centreText(centre)}`,
  fullGrid: (levelCounts: readonly number[], constraintText?: string): string =>
    constraintText === undefined
      ? `Every combination of the planned levels (${levelCounts.join('×')})`
      : `Every combination of the planned levels (${levelCounts.join('×')}), ${constraintText}, no extra centre runs`,
  /** `centre` is left out for a plan that is listed but not built. */
  ccdFace: (centre?: number): string => `Face-centred central composite${centre === undefined ? '' : ` + ${centreText(centre)}`}`,
  ccdRotatable: (alpha?: string, centre?: number): string =>
    alpha === undefined || centre === undefined
      ? 'Rotatable central composite'
      : `Rotatable central composite (axial distance ${alpha} coded) + ${centreText(centre)}`,
  boxBehnken: (centre?: number): string => `Box–Behnken${centre === undefined ? '' : ` + ${centreText(centre)}`}`,
};

/** Resolution III, IV, V, … of a regular fraction. */
export function romanNumeral(resolution: number): string {
  return ['', 'I', 'II', 'III', 'IV', 'V', 'VI', 'VII', 'VIII', 'IX', 'X'][resolution] ?? String(resolution);
}

function centreText(c: number): string {
  return c === 0 ? 'no centre runs' : counted(c, 'centre run');
}
