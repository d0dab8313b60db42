// Criterion of a subset from its residual sum of squares, under the
// service's one convention (api.md, Conventions):
//   -2 logL = n (ln 2 pi + ln(RSS/n) + 1) - sum ln w,   k = rank + 1.
// The formulas are those of src/core/criteria.ts and src/core/likelihood.ts;
// this file only binds them to (rss, k) for the kernel's inner loop.

import type { SearchCriterion } from './types.ts';

/** Criterion value of a subset with residual sum of squares rss and k parameters; NaN when undefined. */
export type SubsetScorer = (rss: number, parameters: number) => number;

export function subsetScorer(criterion: SearchCriterion, observations: number, logWeightSum: number): SubsetScorer {
  const n = observations;
  const constant = n * (Math.log(2 * Math.PI) + 1) - logWeightSum - n * Math.log(n);
  const lnN = Math.log(n);
  const lnLnN = Math.log(lnN);
  switch (criterion) {
    case 'aic':
      return (rss, k) => constant + n * Math.log(rss) + 2 * k;
    case 'aicc':
      return (rss, k) => (n - k - 1 > 0 ? constant + n * Math.log(rss) + 2 * k + (2 * k * (k + 1)) / (n - k - 1) : NaN);
    case 'bic':
      return (rss, k) => constant + n * Math.log(rss) + k * lnN;
    case 'hqc':
      return (rss, k) => constant + n * Math.log(rss) + 2 * k * lnLnN;
  }
}
