/**
 * The points of a grid, one at a time: every combination of one level per factor, last factor
 * fastest (an odometer). Lazy, so a caller can stop early or filter without holding the grid.
 * The order is part of the contract: ties in the candidate region and the centre search go to
 * the first point in this order, and the holdout search draws among tied candidates by their
 * place in it.
 */
export function* gridPoints(levelSets: readonly (readonly number[])[]): Generator<number[]> {
  const k = levelSets.length;
  if (levelSets.some((levels) => levels.length === 0)) return;
  const index = new Array<number>(k).fill(0);
  while (true) {
    yield index.map((at, j) => levelSets[j][at]);
    let j = k - 1;
    while (j >= 0) {
      index[j]++;
      if (index[j] < levelSets[j].length) break;
      index[j] = 0;
      j--;
    }
    if (j < 0) return;
  }
}
