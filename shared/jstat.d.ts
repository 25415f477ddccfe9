// jstat ships no type declarations; this covers the distribution functions Sheaf uses.
// jstat is CommonJS: `require('jstat')` and an ESM default import both give the jStat
// object itself (which also carries a `jStat` property pointing at itself). Node's ESM
// loader exposes no named exports for it, so `import { jStat } from 'jstat'` fails at
// run time; import the default.
declare module 'jstat' {
  interface ContinuousDistribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
  }
  interface JStatStatic {
    studentt: ContinuousDistribution;
    centralF: ContinuousDistribution;
    chisquare: ContinuousDistribution;
    normal: ContinuousDistribution;
    tukey: {
      cdf(q: number, nmeans: number, df: number): number;
      inv(p: number, nmeans: number, df: number): number;
    };
    noncentralt: {
      cdf(x: number, dof: number, ncp: number): number;
      pdf(x: number, dof: number, ncp: number): number;
    };
    jStat: JStatStatic;
  }
  const jStat: JStatStatic;
  export default jStat;
}
