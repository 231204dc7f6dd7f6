/**
 * A power in the sentences the core writes (precision statements, the whole-plot comparison):
 * per cent to 0.1, rounded down so that a power just under a target never reads as meeting it
 * (79.96 % → "79.9 %"); "cannot be tested" when there is no test.
 */
export function powerPercent(power: number | null): string {
  return power === null ? 'cannot be tested' : `${(Math.floor(power * 1000) / 10).toFixed(1)} %`;
}
