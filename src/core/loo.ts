// Exact leave-one-out prediction error from one fit, without refits.
// Dropping row i changes its residual from e_i to e_i / (1 - h_ii), where
// h_ii = w_i x_i' (X'WX)^-1 x_i is the leverage of the weighted fit
// (Cook & Weisberg 1982, "Residuals and Influence in Regression", ch. 2;
// the PRESS statistic is Allen 1974). The weighted form follows by applying
// the unweighted identity to the rows scaled by sqrt(w_i).
import type { DesignMatrix, LeastSquaresFit } from './types.ts';
import { weightAt } from './inference/design-rows.ts';
import { modelGeometry, type ModelGeometry } from './inference/model-geometry.ts';
import { rankModels, type RankingEntry } from './scoring/ranking.ts';

/**
 * A row whose 1 - h_ii falls below this is treated as having leverage 1: the
 * fit passes through it whatever its response, so leaving it out cannot be
 * predicted from the others. Computed leverages carry a relative error of
 * about cond(X) * 1e-16, far below this for any design worth fitting.
 */
export const UNIT_LEVERAGE_TOLERANCE = 1e-9;

export interface LeaveOneOutError {
  /** sum_i w_i (e_i / (1 - h_ii))^2; null when some row has leverage 1. */
  press: number | null;
  /**
   * sqrt(press / sum w): the weighted root-mean-square leave-one-out error,
   * in units of the response. Dividing by the weight total rather than n
   * makes it unchanged when relative weights are all scaled by one factor
   * (press scales with them); without weights sum w = n.
   */
  looRmse: number | null;
  /** h_ii per row. */
  leverages: Float64Array;
  /** Rows (0-based) with leverage 1, which make press undefined. */
  unitLeverageRows: number[];
  reason: string | null;
}

/**
 * h_ii = w_i x_i' (X'WX)^-1 x_i over the estimable columns, evaluated as the
 * squared row norms of an orthonormal basis of sqrt(W) X (see
 * orthonormal-basis.ts for why); the fit's unscaledCovariance is the
 * fallback should the basis find the columns dependent. Pass the model's
 * geometry when it is already at hand: it holds the leverages.
 */
export function leverages(
  fit: LeastSquaresFit,
  design: DesignMatrix,
  weights?: ArrayLike<number>,
  geometry: ModelGeometry = modelGeometry(fit, design, weights),
): Float64Array {
  return geometry.leverages;
}

export function leaveOneOutError(
  fit: LeastSquaresFit,
  design: DesignMatrix,
  weights?: ArrayLike<number>,
  geometry: ModelGeometry = modelGeometry(fit, design, weights),
): LeaveOneOutError {
  const h = geometry.leverages;
  const unitLeverageRows: number[] = [];
  let press = 0;
  let weightTotal = 0;
  for (let i = 0; i < design.rows; i++) weightTotal += weightAt(weights, i);
  for (let i = 0; i < design.rows; i++) {
    const complement = 1 - h[i];
    if (complement < UNIT_LEVERAGE_TOLERANCE) {
      unitLeverageRows.push(i);
      continue;
    }
    const deleted = fit.residuals[i] / complement;
    press += weightAt(weights, i) * deleted * deleted;
  }
  if (unitLeverageRows.length > 0) {
    return {
      press: null, looRmse: null, leverages: h, unitLeverageRows,
      reason: `${unitLeverageRows.length} row(s) have leverage 1: the model passes through them exactly, so leaving one out cannot be predicted from the rest and the leave-one-out error is undefined.`,
    };
  }
  if (!Number.isFinite(press)) {
    return {
      press: null, looRmse: null, leverages: h, unitLeverageRows,
      reason: 'The leave-one-out residuals are too large to square in double precision, so the leave-one-out error is undefined; rescale the response.',
    };
  }
  return { press, looRmse: Math.sqrt(press / weightTotal), leverages: h, unitLeverageRows, reason: null };
}

/**
 * rankings.loo: smaller leave-one-out RMSE is better. There are no weights:
 * exp(-delta/2) has no likelihood meaning for a prediction error. Models
 * without a value (fitted elsewhere, or leverage 1) come last with nulls.
 */
export function rankByLeaveOneOut(entries: readonly { name: string; looRmse: number | null }[]): RankingEntry[] {
  return rankModels(entries.map((e) => ({ name: e.name, value: e.looRmse })), { direction: 'smaller', weighted: false });
}
