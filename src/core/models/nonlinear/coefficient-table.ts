// The coefficient table of a least-squares fit with n - p residual degrees
// of freedom: t = estimate / standard error, its two-sided p-value from
// Student's t, and the interval estimate ± t(1 - α/2; n - p) × standard error.
// For a nonlinear model these are the usual large-sample (linearisation)
// statements (Bates & Watts 1988, ch. 2): exact only when the model is
// linear in its parameters.
import betainc from '@stdlib/math-base-special-betainc';
import studentT from '@stdlib/stats-base-dists-t';

export interface CoefficientRow {
  term: string;
  estimate: number;
  standardError: number | null;
  tStatistic: number | null;
  pValue: number | null;
  lower: number | null;
  upper: number | null;
}

/**
 * P(|T| > |t|) for T ~ t(df), as the regularised incomplete beta
 * I_{df/(df+t²)}(df/2, 1/2), which keeps its relative accuracy for tiny
 * p-values (1 - cdf would round them to 0).
 */
export function tTwoSidedPValue(t: number, df: number): number {
  if (!(df > 0) || Number.isNaN(t)) return NaN;
  if (!Number.isFinite(t)) return 0;
  return betainc(df / (df + t * t), df / 2, 0.5, true, false);
}

/** Recently used critical values: the quantile is an iterative inversion, and every fit of one comparison asks for the same few. */
const criticalValues = new Map<string, number>();

/** The two-sided critical value t(1 - (1 - level)/2; df). */
export function tCriticalValue(level: number, df: number): number {
  const key = `${level} ${df}`;
  let value = criticalValues.get(key);
  if (value === undefined) {
    value = studentT.quantile(1 - (1 - level) / 2, df);
    if (criticalValues.size >= 256) criticalValues.clear();
    criticalValues.set(key, value);
  }
  return value;
}

export function coefficientTable(
  terms: readonly string[],
  estimates: ArrayLike<number>,
  standardErrors: readonly (number | null)[],
  df: number,
  level: number,
): CoefficientRow[] {
  const critical = df > 0 ? tCriticalValue(level, df) : NaN;
  return terms.map((term, j) => {
    const estimate = estimates[j];
    const se = standardErrors[j];
    if (se === null || !(se > 0) || !Number.isFinite(se) || !(df > 0)) {
      return { term, estimate, standardError: se, tStatistic: null, pValue: null, lower: null, upper: null };
    }
    const t = estimate / se;
    return {
      term, estimate, standardError: se, tStatistic: t, pValue: tTwoSidedPValue(t, df),
      lower: estimate - critical * se, upper: estimate + critical * se,
    };
  });
}
