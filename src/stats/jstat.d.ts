// Minimal types for the parts of jstat the engine uses (the package ships none).
declare module 'jstat' {
  interface Distribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  const jstat: {
    jStat: {
      studentt: Distribution;
      centralF: Distribution;
      chisquare: Distribution;
      /** Regularized incomplete beta I_x(a, b). */
      ibeta(x: number, a: number, b: number): number;
    };
  };
  export default jstat;
}
