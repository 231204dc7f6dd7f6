/**
 * Where the centre replicates go in the sequence: evenly spaced from the first to the last run.
 *
 * Rule (fixed here): with c replicates in a sequence of n slots,
 * replicate k (0-based) takes slot round(k·(n − 1)/(c − 1)); one replicate takes the middle slot
 * floor((n − 1)/2). So 3 replicates open, halve and close the campaign. Spreading them this way
 * lets the centre runs double as a drift check across the campaign, which is common practice
 * (D. C. Montgomery, Design and Analysis of Experiments, 8th ed., 2013, §6.8 on centre points;
 * the even spacing itself is our convention).
 */

/** 0-based slots for `count` replicates in a sequence of `length` slots, ascending and distinct. */
export function spreadSlots(count: number, length: number): number[] {
  if (count > length) throw new RangeError(`cannot place ${count} replicates in ${length} slots`);
  if (count === 0) return [];
  if (count === 1) return [Math.floor((length - 1) / 2)];
  const slots: number[] = [];
  for (let k = 0; k < count; k++) {
    // The spacing (n − 1)/(c − 1) is at least 1 when c ≤ n, so rounded slots never collide.
    slots.push(Math.round((k * (length - 1)) / (count - 1)));
  }
  return slots;
}
