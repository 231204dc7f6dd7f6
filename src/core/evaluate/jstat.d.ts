// Minimal typing of the part of jstat (no bundled types) that the power calculations and the
// analysis of results use.
declare module 'jstat' {
  interface JStatStatic {
    noncentralt: { cdf(x: number, dof: number, ncp: number): number };
    studentt: { cdf(x: number, dof: number): number; inv(p: number, dof: number): number; pdf(x: number, dof: number): number };
    centralF: { cdf(x: number, df1: number, df2: number): number; inv(p: number, df1: number, df2: number): number };
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
    gammaln(x: number): number;
  }
  const jStat: JStatStatic;
  export default jStat;
}
