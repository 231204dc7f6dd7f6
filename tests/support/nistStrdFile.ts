/**
 * Reader of a NIST Statistical Reference Datasets file for linear least squares
 * (https://www.itl.nist.gov/div898/strd/lls/lls.shtml), as NIST publishes it: the header
 * states the lines of the certified values and of the data ("Data (lines 61 to 142)").
 * Certified lines read "B0  estimate  standard deviation"; then "Residual Standard Deviation"
 * and "R-Squared". Data lines are whitespace-separated, response first.
 */
export interface NistStrdFile {
  name: string;
  estimates: number[];
  standardDeviations: number[];
  residualSd: number;
  rSquared: number;
  /** Response values. */
  y: number[];
  /** Predictor columns, one array per observation. */
  x: number[][];
}

export function readNistStrdFile(name: string, text: string): NistStrdFile {
  const lines = text.split(/\r?\n/);
  const range = /Data\s+\(lines\s+(\d+)\s+to\s+(\d+)\)/.exec(text);
  if (!range) throw new Error(`${name}: no data line range in the header`);
  const first = Number(range[1]);
  const last = Number(range[2]);
  const estimates: number[] = [];
  const standardDeviations: number[] = [];
  let residualSd = Number.NaN;
  let rSquared = Number.NaN;
  for (const line of lines.slice(0, first - 1)) {
    const parameter = /^\s*B(\d+)\s+(\S+)\s+(\S+)\s*$/.exec(line);
    if (parameter) {
      estimates[Number(parameter[1])] = Number(parameter[2]);
      standardDeviations[Number(parameter[1])] = Number(parameter[3]);
    }
    const sd = /Standard Deviation\s+(\S+)\s*$/.exec(line);
    if (sd && !/of Estimate/.test(line)) residualSd = Number(sd[1]);
    const r2 = /R-Squared\s+(\S+)\s*$/.exec(line);
    if (r2) rSquared = Number(r2[1]);
  }
  const y: number[] = [];
  const x: number[][] = [];
  for (const line of lines.slice(first - 1, last)) {
    const values = line.trim().split(/\s+/).map(Number);
    y.push(values[0]);
    x.push(values.slice(1));
  }
  if (estimates.some((v) => !Number.isFinite(v)) || !Number.isFinite(residualSd) || !Number.isFinite(rSquared)) {
    throw new Error(`${name}: certified values not read`);
  }
  return { name, estimates, standardDeviations, residualSd, rSquared, y, x };
}
