// jstat ships no type declarations; this covers the distribution functions Sheaf uses.
declare module 'jstat' {
  interface ContinuousDistribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
  }
  export const jStat: {
    studentt: ContinuousDistribution;
    centralF: ContinuousDistribution;
    chisquare: ContinuousDistribution;
    normal: ContinuousDistribution;
    tukey: { cdf(q: number, nmeans: number, df: number): number; inv(p: number, nmeans: number, df: number): number };
    noncentralt: { cdf(x: number, dof: number, ncp: number): number };
  };
  const _default: { jStat: typeof jStat } & typeof jStat;
  export default _default;
}
