/**
 * Mixed-level full grid: every combination of the given coded levels of each factor.
 *
 * The general full factorial (Fisher 1935, "The design of experiments", ch. VI), used to compare
 * against the plan that tries every level of every varied factor. Order is the mixed-radix
 * analogue of standard order: the first factor cycles fastest through its levels in the order
 * given, the last factor slowest. Unrandomised.
 */

/** Refuse grids past this size rather than exhaust memory; the comparison reports their size instead. */
const MAX_GRID_POINTS = 5_000_000;

export function fullGrid(levels: number[][]): number[][] {
  if (levels.length === 0) throw new RangeError('a full grid needs at least one factor');
  let size = 1;
  levels.forEach((factorLevels, j) => {
    if (factorLevels.length === 0) throw new RangeError(`factor ${j + 1} has no levels`);
    size *= factorLevels.length;
  });
  if (size > MAX_GRID_POINTS) throw new RangeError(`a full grid of ${size} points is too large to build (limit ${MAX_GRID_POINTS})`);

  const k = levels.length;
  const points: number[][] = new Array(size);
  const digit = new Array<number>(k).fill(0);
  for (let i = 0; i < size; i++) {
    points[i] = digit.map((d, j) => levels[j][d]);
    // Advance the mixed-radix counter, first factor fastest.
    for (let j = 0; j < k; j++) {
      digit[j]++;
      if (digit[j] < levels[j].length) break;
      digit[j] = 0;
    }
  }
  return points;
}
