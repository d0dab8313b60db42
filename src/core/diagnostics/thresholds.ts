// Where each assumption check draws its line. All are conventions of the
// trade, not laws; each is reported beside its result so a reader can judge.
export const DIAGNOSTIC_THRESHOLDS = {
  /** Significance level of the normality and heteroscedasticity tests (common practice). */
  alpha: 0.05,
  /** Durbin–Watson outside this range suggests autocorrelation (rule of thumb, common practice). */
  durbinWatsonRange: [1.5, 2.5] as [number, number],
  /** VIF above this marks a badly inflated coefficient variance (rule of thumb, common practice). */
  varianceInflation: 10,
  /** Scaled condition number above this: strong near-dependencies (Belsley, Kuh & Welsch 1980). */
  conditionNumber: 30,
  /** Cook's distance above this: a row that moves the whole fit (Cook & Weisberg 1982, rule of thumb). */
  cooksDistance: 1,
  /** Leverage above this multiple of p/n is high (Hoaglin & Welsch 1978: 2p/n). */
  leverageMultiple: 2,
} as const;
