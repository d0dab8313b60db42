// A lifetime candidate as the comparison receives it: a distribution, and
// terms for the location when it is an accelerated-failure-time model.
import type { Term } from '../../types.ts';
import type { DistributionName } from './distributions.ts';
import type { LifeRowPrediction } from './life-predictions.ts';

export interface LifetimeCandidateInput {
  form: 'lifetime';
  name: string;
  distribution: DistributionName;
  /** Terms of the location (the intercept is always there); none for a plain distribution. */
  terms: Term[];
}

/** What a lifetime model adds to its report (fixed names, api-families.md). */
export interface LifetimeReportFields {
  distribution: DistributionName;
  distributionParameters: { name: string; estimate: number; standardError: number | null }[];
  convergence: { converged: boolean; iterations: number; rule: string; decrement: number };
  /** Only for a model without terms (with terms a percentile depends on the row); null when none were asked for. */
  percentiles: { probability: number; estimate: number; lower: number | null; upper: number | null }[] | null;
  /** Only for a model without terms: survival probabilities at options.survivalAt; null when none were asked for. */
  survival: { time: number; estimate: number; lower: number | null; upper: number | null }[] | null;
  /** Values at the options.predict rows (life-predictions.ts), one per row, null where not estimable; absent without rows. */
  lifePredictions?: (LifeRowPrediction | null)[];
  /** The same likelihood on the ln t scale, for matching tools that report it; never ranked. */
  logLikelihoodLogTime: number | null;
  censoring: { exact: number; right: number; left: number; interval: number };
}
