declare module "jstat" {
  interface Distribution {
    cdf(x: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  export const jStat: {
    normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
    gamma: {
      inv(p: number, shape: number, scale: number): number;
      cdf(x: number, shape: number, scale: number): number;
    };
    beta: { inv(p: number, a: number, b: number): number; cdf(x: number, a: number, b: number): number };
    binomial: { cdf(k: number, n: number, p: number): number; pdf(k: number, n: number, p: number): number };
    studentt: Distribution;
    chisquare: Distribution;
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
    /** Regularised lower incomplete gamma function P(a, x). */
    lowRegGamma(a: number, x: number): number;
    /** Natural log of the gamma function. */
    gammaln(x: number): number;
  };
  export default jStat;
}
