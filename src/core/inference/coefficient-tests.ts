// The t statistic, two-sided p-value and confidence interval of each
// least-squares coefficient. Under independent Gaussian errors,
// (b_j − β_j) / se_j follows Student's t with n − p degrees of freedom (p the
// rank of the design), so t = b_j / se_j tests β_j = 0 and
// b_j ± t_{(1+L)/2, n−p} se_j covers β_j with probability L (common practice,
// the textbook result for the Gaussian linear model). With relative weights
// the same holds for the weighted fit, whose se_j are already scaled by
// σ̂² = Σ w e² / (n − p).
import { normalQuantile, tQuantile, tTwoSidedPValue } from './distributions.ts';

/** The confidence level of every interval unless a request says otherwise. */
export const DEFAULT_INTERVAL_LEVEL = 0.95;

export interface CoefficientTest {
  tStatistic: number | null;
  pValue: number | null;
  lower: number | null;
  upper: number | null;
}

const NONE: CoefficientTest = { tStatistic: null, pValue: null, lower: null, upper: null };

/**
 * Student's t quantile for a two-sided interval at `level` on `df` degrees of
 * freedom; null when there are none (n = p leaves nothing to estimate σ with).
 */
export function twoSidedCritical(level: number, df: number): number | null {
  if (!(df > 0) || !(level > 0 && level < 1)) return null;
  // df = Infinity: the standard normal, the large-sample interval of a GLM with its dispersion fixed by the family.
  const q = Number.isFinite(df) ? tQuantile((1 + level) / 2, df) : normalQuantile((1 + level) / 2);
  return Number.isFinite(q) ? q : null;
}

/**
 * The test and interval of one coefficient. Null everywhere when the estimate
 * or its standard error is missing (an aliased column, σ̂ undefined), and the
 * statistic and p-value null when the standard error is 0 (an exact fit: the
 * ratio is not a t variable).
 */
export function coefficientTest(estimate: number | null, standardError: number | null, df: number, critical: number | null): CoefficientTest {
  if (estimate === null || standardError === null || !Number.isFinite(standardError) || !(df > 0)) return NONE;
  const half = critical === null ? null : critical * standardError;
  const interval = half === null ? { lower: null, upper: null } : { lower: estimate - half, upper: estimate + half };
  if (!(standardError > 0)) return { tStatistic: null, pValue: null, ...interval };
  const tStatistic = estimate / standardError;
  const pValue = tTwoSidedPValue(tStatistic, df);
  return { tStatistic: Number.isFinite(tStatistic) ? tStatistic : null, pValue: Number.isFinite(pValue) ? pValue : null, ...interval };
}
