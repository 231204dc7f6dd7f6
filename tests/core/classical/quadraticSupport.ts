/**
 * Test support: full quadratic model matrix and its rank, to check that a response-surface
 * design can fit 1 + k + k(k−1)/2 + k terms. Rank comes from ml-matrix's SVD, a general-purpose
 * reference library independent of the design code.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';

export function fullQuadraticRows(points: number[][]): number[][] {
  return points.map((x) => {
    const row = [1, ...x];
    for (let a = 0; a < x.length; a++) for (let b = a + 1; b < x.length; b++) row.push(x[a] * x[b]);
    for (const value of x) row.push(value * value);
    return row;
  });
}

export function fullQuadraticTerms(k: number): number {
  return 1 + k + (k * (k - 1)) / 2 + k;
}

/** Rank of X'X for the full quadratic model (equal to the term count when the model can be fitted). */
export function quadraticInformationRank(points: number[][]): number {
  const X = new Matrix(fullQuadraticRows(points));
  const information = X.transpose().mmul(X);
  return new SingularValueDecomposition(information, { autoTranspose: true }).rank;
}
