// Minimal declarations for the parts of jstat (a general-purpose statistics library from the
// registry) that the reference tests use.
declare module 'jstat' {
  interface Jstat {
    binomial: {
      cdf(k: number, n: number, p: number): number;
      pdf(k: number, n: number, p: number): number;
    };
    chisquare: {
      inv(p: number, dof: number): number;
      cdf(x: number, dof: number): number;
    };
    normal: { inv(p: number, mean: number, sd: number): number };
    gammaln(x: number): number;
    percentile(values: number[], k: number, exclusive?: boolean): number;
    gammap(a: number, x: number): number;
  }
  const jStat: Jstat;
  export default jStat;
}
