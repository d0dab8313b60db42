// Criterion of a subset from its residual sum of squares, under the
// service's one convention: the log-likelihood of src/core/likelihood.ts and
// the criterion of src/core/scoring/criteria.ts, k = rank + 1, so a search and a
// comparison cannot disagree on a formula.
//
// Speed: under the convention -2 logL = n ln RSS + (terms free of RSS), so
// every criterion is n ln RSS + offset(k). The offsets are taken from the
// shared criterion code once per k (evaluated at RSS = 1), and the inner
// loop adds n ln RSS: one logarithm per subset instead of building a fit
// summary (which cost 60% of the kernel's time). test/core/search/scorer
// checks the two agree.

import { criterionDefinition, type FitSummary } from '../scoring/criteria.ts';
import { gaussianLogLikelihood } from '../likelihood.ts';
import type { SearchCriterion } from './types.ts';

/** Criterion value of a subset with residual sum of squares rss and k parameters; NaN when undefined. */
export type SubsetScorer = (rss: number, parameters: number) => number;

const NO_R2 = { undefinedBecause: 'r2_unavailable' } as const;

/** The criterion through the shared code, for any rss > 0; NaN when undefined. */
export function sharedCriterion(criterion: SearchCriterion, observations: number, logWeightSum: number, rss: number, k: number, logJacobian = 0): number {
  const summary: FitSummary = {
    logLikelihood: gaussianLogLikelihood({ n: observations, rss, sumLogWeights: logWeightSum, jacobian: logJacobian }),
    parameters: k,
    observations,
    rss,
    tss: null,
    coefficientsIncludingIntercept: null,
    intercept: true,
  };
  const out = criterionDefinition(criterion).compute(summary, NO_R2);
  return 'value' in out ? out.value : NaN;
}

/** The Jacobian of a response transform is a constant of the log-likelihood, so it lives in the offsets with the other constants. */
export function subsetScorer(criterion: SearchCriterion, observations: number, logWeightSum: number, logJacobian = 0): SubsetScorer {
  const n = observations;
  const offsets: number[] = [];
  const offset = (k: number): number => {
    let v = offsets[k];
    if (v === undefined) {
      v = sharedCriterion(criterion, n, logWeightSum, 1, k, logJacobian);
      offsets[k] = v;
    }
    return v;
  };
  return (rss, k) => n * Math.log(rss) + offset(k);
}
