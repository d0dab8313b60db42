// The extra-sum-of-squares F test for a pair of least-squares models the
// caller names as nested, at least one of them nonlinear (Bates & Watts
// 1988, section 3.10; Seber & Wild 1989, section 5.9):
//   F = ((RSS_s - RSS_l) / (p_l - p_s)) / (RSS_l / (n - p_l))  on (p_l - p_s, n - p_l),
// and the likelihood-ratio statistic n ln(RSS_s / RSS_l) against chi-square.
// Whether one expression is a special case of the other cannot be read off
// two expressions in general, so the pair is taken as the caller states it;
// what can be checked is checked: the same sample, fewer parameters in the
// smaller model, and a larger model that fits at least as well. For a
// nonlinear pair the F reference distribution is itself a linearisation.
import { chiSquareUpperTail, fUpperTail } from '../../inference/distributions.ts';
import type { NestedTest } from '../../inference/nested.ts';
import type { StatisticsIssue } from '../../inference/issue.ts';

export interface LeastSquaresFacts {
  name: string;
  /** Σ w e² on the sample's scale. */
  rss: number;
  /** Estimated mean parameters (rank of the design, or the expression's parameter count). */
  meanParameters: number;
  observations: number;
  /** Identity of the sample (response, transform, weights, rows): equal strings, same sample. */
  sample: string;
  exactFit: boolean;
}

/**
 * Relative slack for "the larger model fits at least as well": two fits of
 * one model from different starts agree to about this, so a larger RSS
 * within it is rounding and counts as equal.
 */
const RSS_SLACK = 1e-9;

export function extraSumOfSquaresTest(
  smaller: LeastSquaresFacts,
  larger: LeastSquaresFacts,
): { test: NestedTest } | { issue: StatisticsIssue } {
  const refuse = (message: string): { issue: StatisticsIssue } => ({
    issue: { code: 'nested-test-not-nested', message, facts: { smaller: smaller.name, larger: larger.name } },
  });
  if (smaller.sample !== larger.sample || smaller.observations !== larger.observations) {
    return refuse(`"${smaller.name}" and "${larger.name}" were not fitted to the same response, weights and rows, so they cannot be tested against each other.`);
  }
  const df = larger.meanParameters - smaller.meanParameters;
  if (df <= 0) {
    return refuse(`"${larger.name}" has ${larger.meanParameters} mean parameters and "${smaller.name}" ${smaller.meanParameters}; the larger model of a nested pair has more.`);
  }
  if (larger.rss > smaller.rss * (1 + RSS_SLACK)) {
    return refuse(`"${larger.name}" fits worse than "${smaller.name}" (RSS ${larger.rss} against ${smaller.rss}), which cannot happen when the smaller model is a special case of the larger one: either they are not nested or the larger fit stopped at a local minimum (try other start values).`);
  }
  const n = larger.observations;
  const residualDf = n - larger.meanParameters;
  const base = { smaller: smaller.name, larger: larger.name, df, residualDf };
  if (larger.exactFit || !(larger.rss > 0)) {
    return { test: { ...base, fStatistic: null, fPValue: null, lrStatistic: null, lrPValue: null, reason: `"${larger.name}" fits the data exactly (residuals at rounding level), so there is no residual variance to test against.` } };
  }
  const reduction = Math.max(0, smaller.rss - larger.rss);
  const lrStatistic = n * Math.log1p(reduction / larger.rss);
  const lrPValue = chiSquareUpperTail(lrStatistic, df);
  if (residualDf <= 0) {
    return { test: { ...base, fStatistic: null, fPValue: null, lrStatistic, lrPValue, reason: `"${larger.name}" leaves no residual degrees of freedom, so the F test is undefined.` } };
  }
  const fStatistic = (reduction / df) / (larger.rss / residualDf);
  return { test: { ...base, fStatistic, fPValue: fUpperTail(fStatistic, df, residualDf), lrStatistic, lrPValue, reason: null } };
}
