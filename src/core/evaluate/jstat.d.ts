// Minimal typing of the part of jstat (no bundled types) that the power calculation uses.
declare module 'jstat' {
  interface JStatStatic {
    noncentralt: { cdf(x: number, dof: number, ncp: number): number };
    studentt: { cdf(x: number, dof: number): number; inv(p: number, dof: number): number };
  }
  const jStat: JStatStatic;
  export default jStat;
}
