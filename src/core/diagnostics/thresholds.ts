// Where each assumption check draws its line. All are conventions of the
// trade, not laws; each is reported beside its result so a reader can judge.
export const DIAGNOSTIC_THRESHOLDS = {
  /** Significance level of the normality and heteroscedasticity tests (common practice). */
  alpha: 0.05,
  /** Durbin–Watson outside this range suggests autocorrelation (rule of thumb, common practice). */
  durbinWatsonRange: [1.5, 2.5] as [number, number],
  /** VIF above this marks a badly inflated coefficient variance (rule of thumb, common practice). */
  varianceInflation: 10,
  /**
   * Condition number above this: strong near-dependencies. Belsley, Kuh &
   * Welsch (1980) drew the line at 30 for the scaled design; it is applied
   * here to the centred, scaled regressors (common practice), whose number
   * reflects dependence among regressors and not their distance from zero.
   */
  conditionNumber: 30,
  /** Cook's distance above this: a row that moves the whole fit (Cook & Weisberg 1982, rule of thumb). */
  cooksDistance: 1,
  /** Leverage above this multiple of p/n is high (Hoaglin & Welsch 1978: 2p/n). */
  leverageMultiple: 2,
} as const;
