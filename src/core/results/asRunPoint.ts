/**
 * Where a run was actually made: its coded coordinates from the "as run" values the sheet
 * records (engineering units, coded over the study range: low → −1, high → +1, as in
 * region/codedUnits.ts), and the planned coded point for every factor the sheet gives no
 * as-run value for. The one home of that rule: the analysis fits at these points, and the
 * augmentation takes them as the runs already done (X₀).
 */
import type { PlannedRun } from '../design/designTypes.js';
import type { Factor } from '../study.js';
import { toCoded } from '../region/codedUnits.js';

/** Coded coordinates of `planned` as run, one per id of `factorIds`. */
export function asRunCoded(
  planned: Pick<PlannedRun, 'coded'>,
  asRun: Readonly<Record<string, number>>,
  factorIds: readonly string[],
  factorOf: ReadonlyMap<string, Pick<Factor, 'low' | 'high'>>,
): number[] {
  return factorIds.map((id) => {
    const actual = asRun[id];
    return actual === undefined ? planned.coded[id] : toCoded(factorOf.get(id)!, actual);
  });
}
