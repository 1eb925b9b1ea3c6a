// Minimal types for the parts of jstat the engine uses (the package ships none).
declare module 'jstat' {
  interface Distribution {
    cdf(x: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  const jstat: {
    jStat: {
      studentt: Distribution;
      centralF: Distribution;
      chisquare: Distribution;
      /** log Γ(x) by the SPECFUN Stirling series (about 1e-15). */
      loggam(x: number): number;
    };
  };
  export default jstat;
}
