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
 */
export function jarqueBera(residuals: ArrayLike<number>): {
  statistic: number; df: 2; pValue: number; skewness: number; kurtosis: number;
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
  const skewness = m3 / Math.pow(m2, 1.5);
  const kurtosis = m4 / (m2 * m2);
  const statistic = (n / 6) * (skewness * skewness + ((kurtosis - 3) * (kurtosis - 3)) / 4);
  return { statistic, df: 2, pValue: chiSquareUpperTail(statistic, 2), skewness, kurtosis };
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
