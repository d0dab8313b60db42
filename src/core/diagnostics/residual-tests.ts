// Tests on the residuals of one fit. With weights they are applied to the
// standardised residuals sqrt(w_i) e_i, which share one variance when the
// weights are right.
import { chiSquareUpperTail } from '../inference/distributions.ts';
import { auxiliaryRSquared } from './scaled-factor.ts';

/**
 * Jarque & Bera (1987): JB = n/6 (S^2 + (K - 3)^2 / 4) with the moment
 * skewness S and kurtosis K (central moments divided by n), asymptotically
 * chi-square with 2 df under normality. The chi-square reference is a
 * large-sample one; for small n the test rejects too rarely.
 * When the residuals are all equal (to rounding) the spread m2 is 0,
 * skewness and kurtosis are 0/0 and the test is undefined: every value is
 * null and `undefinedReason` says why.
 */
export function jarqueBera(residuals: ArrayLike<number>): {
  statistic: number | null; df: 2; pValue: number | null; skewness: number | null; kurtosis: number | null;
  undefinedReason: string | null;
} {
  const n = residuals.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += residuals[i];
  mean /= n;
  let m2 = 0, m3 = 0, m4 = 0;
  for (let i = 0; i < n; i++) {
    const d = residuals[i] - mean;
    const d2 = d * d;
    m2 += d2; m3 += d2 * d; m4 += d2 * d2;
  }
  m2 /= n; m3 /= n; m4 /= n;
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(residuals[i]));
  // A spread within a few units in the last place of the residuals is
  // rounding, not a distribution: its shape would be noise.
  if (!(Math.sqrt(m2) > 64 * Number.EPSILON * largest)) {
    return {
      statistic: null, df: 2, pValue: null, skewness: null, kurtosis: null,
      undefinedReason: 'All residuals are equal, so they have no spread and no shape: skewness, kurtosis and the Jarque–Bera test are undefined.',
    };
  }
  const skewness = m3 / Math.pow(m2, 1.5);
  const kurtosis = m4 / (m2 * m2);
  const statistic = (n / 6) * (skewness * skewness + ((kurtosis - 3) * (kurtosis - 3)) / 4);
  return { statistic, df: 2, pValue: chiSquareUpperTail(statistic, 2), skewness, kurtosis, undefinedReason: null };
}

/**
 * Koenker's (1981) studentised Breusch–Pagan test: LM = n R^2 of the squared
 * residuals regressed on a constant and the model's regressors, referred to
 * chi-square with as many df as independent non-constant regressors. Unlike
 * the original Breusch & Pagan (1979) statistic it does not assume normal
 * errors.
 */
export function breuschPaganKoenker(residuals: ArrayLike<number>, regressors: readonly ArrayLike<number>[]): {
  statistic: number; df: number; pValue: number | null;
} {
  const n = residuals.length;
  const squared = new Float64Array(n);
  for (let i = 0; i < n; i++) squared[i] = residuals[i] * residuals[i];
  return breuschPaganFromAuxiliary(n, auxiliaryRSquared(regressors, squared));
}

/** The same test from an auxiliary regression already made (rows n). */
export function breuschPaganFromAuxiliary(n: number, auxiliary: { rSquared: number; slopes: number }): {
  statistic: number; df: number; pValue: number | null;
} {
  const statistic = n * auxiliary.rSquared;
  const df = auxiliary.slopes;
  return { statistic, df, pValue: df > 0 ? chiSquareUpperTail(statistic, df) : null };
}

/**
 * Durbin & Watson (1950): d = sum_{t>=2} (e_t - e_{t-1})^2 / sum_t e_t^2,
 * about 2 without first-order autocorrelation, towards 0 for positive and
 * towards 4 for negative. Only meaningful when row order is time order.
 */
export function durbinWatson(residuals: ArrayLike<number>): number {
  let numerator = 0;
  let denominator = residuals.length > 0 ? residuals[0] * residuals[0] : 0;
  for (let t = 1; t < residuals.length; t++) {
    const d = residuals[t] - residuals[t - 1];
    numerator += d * d;
    denominator += residuals[t] * residuals[t];
  }
  return numerator / denominator;
}
