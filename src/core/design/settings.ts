/**
 * Engineering settings of a design point: what the lab sets on the equipment.
 *
 * Converts a coded point (design factors only) to engineering units with the coding of
 * ../region/codedUnits.ts (low → −1, high → +1) and rounds every setting to the factor's settable step
 * (`settingStep`: its precision, the smallest step the equipment can be set to, or the implied
 * significant-figure step when the study gives none), exact halves towards the
 * middle of the range as for the levels (`settableValue`). Fixed operating factors
 * appear at their `fixedAt` value so that every run sheet row is complete.
 */
import type { Factor } from '../study.js';
import type { FactorLevels } from './designTypes.js';
import { roundToPrecision, settableValue, settingStep } from './levels.js';
import { toEngineering } from '../region/codedUnits.js';

/**
 * Factor id → engineering setting for every operating factor in `levels` (in that order).
 * Throws (our bug, not the user's) when a varied factor is missing from `coded`.
 */
export function settingsFor(
  coded: Record<string, number>,
  levels: FactorLevels[],
  factors: Factor[],
): Record<string, number> {
  const settings: Record<string, number> = {};
  for (const level of levels) {
    const factor = factors.find((f) => f.id === level.id);
    if (!factor) throw new Error(`levels name ${level.id}, which is not a study factor`);
    if (!level.varied) {
      settings[level.id] = level.fixedAt ?? roundToPrecision(factor.nominal, settingStep(factor));
      continue;
    }
    const x = coded[level.id];
    if (x === undefined) throw new Error(`design point has no coded value for ${level.id}`);
    settings[level.id] = settableValue(factor, toEngineering(factor, x));
  }
  return settings;
}
