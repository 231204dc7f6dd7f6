/**
 * Plackett–Burman two-level screening designs of 12, 20 and 24 runs.
 *
 * Plackett & Burman (1946), "The design of optimum multifactorial experiments", Biometrika 33:
 * for N = 12, 20 and 24 the N − 1 columns come from one generator row of signs; each further
 * row is the previous one shifted cyclically one place to the right, N − 1 rows in all, and a
 * last row sets every factor low. The columns are balanced and mutually orthogonal
 * (X'X = N·I for the ±1 columns), so N − 1 main effects are estimated independently.
 *
 * Conventions: coded units (low −1, high +1); rows in the construction order above,
 * unrandomised; a design for k < N − 1 factors takes the first k columns.
 */

export type PlackettBurmanRuns = 12 | 20 | 24;

/** Generator rows as printed by Plackett & Burman (1946), "+" high and "−" low. */
const GENERATOR_ROWS: Record<PlackettBurmanRuns, string> = {
  12: '++-+++---+-',
  20: '++--++++-+-+----++-',
  24: '+++++-+-++--++--+-+----',
};

export function plackettBurman(runs: PlackettBurmanRuns, k: number): number[][] {
  const generator = GENERATOR_ROWS[runs];
  if (generator === undefined) throw new RangeError(`Plackett–Burman designs are built here for 12, 20 or 24 runs, not ${runs}`);
  const columns = runs - 1;
  if (!Number.isInteger(k) || k < 1 || k > columns) {
    throw new RangeError(`a ${runs}-run Plackett–Burman design takes 1 to ${columns} factors, got ${k}`);
  }
  const signs = [...generator].map((sign) => (sign === '+' ? 1 : -1));
  const points: number[][] = [];
  for (let row = 0; row < columns; row++) {
    const point = new Array<number>(k);
    for (let j = 0; j < k; j++) point[j] = signs[(j - row + columns) % columns];
    points.push(point);
  }
  points.push(new Array<number>(k).fill(-1));
  return points;
}

/** The smallest of the 12-, 20- and 24-run designs that takes k factors; null when k > 23. */
export function smallestPlackettBurman(k: number): { runs: PlackettBurmanRuns; points: number[][] } | null {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`a Plackett–Burman design needs at least one factor, got ${k}`);
  for (const runs of [12, 20, 24] as const) if (k <= runs - 1) return { runs, points: plackettBurman(runs, k) };
  return null;
}
