// Minimal types for the parts of jstat 1.9.6 the statistics tests use as an independent reference
// (jstat is CommonJS: import the default export).
declare module 'jstat' {
  interface ContinuousDistribution {
    pdf(x: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  const jStat: {
    normal: ContinuousDistribution;
    lognormal: ContinuousDistribution;
    uniform: ContinuousDistribution;
    chisquare: ContinuousDistribution;
  };
  export default jStat;
}
