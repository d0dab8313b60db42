// The Gaussian log-likelihood under the service's one convention (api.md,
// "Conventions"): the full maximum-likelihood value with constants included,
//   logL = -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w_i,
// where RSS = Σ w_i e_i² and the w_i are relative weights (all 1 without
// weights). It is the log-density of the residuals under N(0, σ̂²/w_i) at the
// maximum-likelihood variance σ̂² = RSS/n. Rescaling every weight by c leaves it
// unchanged: -n/2 ln c from the RSS cancels +n/2 ln c from Σ ln w.

import { ddAdd, ddMulDouble, ddSum, twoProduct } from './numeric/double-double.ts';

const LN_2PI = 1.8378770664093453; // ln(2π)

export interface GaussianLikelihoodInput {
  /** Observations. */
  n: number;
  /** Σ w_i e_i² (plain Σ e_i² without weights). */
  rss: number;
  /** Σ ln w_i for relative weights; 0 (the default) without weights. */
  sumLogWeights?: number;
  /**
   * Log-Jacobian of a response transform, so a model of g(y) is scored on
   * the scale of y: for log(y) it is -Σ ln y_i. 0 when the response is untransformed.
   */
  jacobian?: number;
}

/**
 * The log-likelihood, or null when it has no finite value: an exact fit
 * (RSS = 0, the likelihood grows without bound as σ̂ → 0; the caller adds a
 * caution), no observations, or inputs that are not finite.
 */
export function gaussianLogLikelihood({ n, rss, sumLogWeights = 0, jacobian = 0 }: GaussianLikelihoodInput): number | null {
  if (!(n > 0) || !(rss > 0) || !Number.isFinite(rss) || !Number.isFinite(sumLogWeights) || !Number.isFinite(jacobian)) {
    return null;
  }
  // ln RSS - ln n rather than ln(RSS/n): the quotient can underflow for a tiny RSS.
  const value = (-n / 2) * (LN_2PI + Math.log(rss) - Math.log(n) + 1) + sumLogWeights / 2 + jacobian;
  return Number.isFinite(value) ? value : null;
}

/**
 * Σ w_i e_i² (Σ e_i² without weights), accumulated in double-double so that
 * a near-exact fit's small RSS keeps its digits; e.g. for a candidate sent by
 * its residuals.
 */
export function residualSumOfSquares(residuals: ArrayLike<number>, weights?: ArrayLike<number>): number {
  let sh = 0;
  let sl = 0;
  for (let i = 0; i < residuals.length; i++) {
    let [ph, pl] = twoProduct(residuals[i], residuals[i]);
    if (weights) [ph, pl] = ddMulDouble(ph, pl, weights[i]);
    [sh, sl] = ddAdd(sh, sl, ph, pl);
  }
  return sh + sl;
}

/** Σ ln w_i, compensated. */
export function sumOfLogs(values: ArrayLike<number>): number {
  const logs = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) logs[i] = Math.log(values[i]);
  const [hi, lo] = ddSum(logs);
  return hi + lo;
}
