// The R factor of the weighted design sqrt(W) X_E (estimable columns only),
// with X_E = Q R D: columns first scaled to unit length (D), then factorised
// by Householder QR streamed over blocks of rows (streamed-qr.ts), which is
// backward stable for any design of full column rank. The intercept, when
// estimable, is factorised first, so that the trailing block of R is the
// factor of the weighted-centred regressors (what the variance inflation
// factors need).
//
// Why not use the fit's (X'WX)^-1 directly: a leverage x' C x formed from
// the explicit inverse cancels catastrophically when the columns are far from
// orthogonal (error about cond(X)^2 * 1e-16; 1e-7 on the NIST Longley data),
// whereas h_ii = |Q_i|^2 with Q_i = R^-T D^-1 sqrt(w_i) x_i, and likewise
// x'(X'WX)^-1 x = |R^-T D^-1 x|^2, lose only about cond(X) * 1e-16. For the
// same reason R is not taken from a Cholesky factor of X'WX (the Gram matrix
// already carries cond(X)^2 * 1e-16).
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import { rowScaleOf, scaledColumns, smallestPivot, streamedR, type ScaledColumns } from './streamed-qr.ts';

/**
 * A unit-length column left with less than this once the earlier columns are
 * projected out is dependent on them to working precision.
 */
export const DEPENDENT_COLUMN_TOLERANCE = 1e-13;

export interface WeightedBasis {
  /** Basis column k is fit.estimable[order[k]] (the intercept first when estimable). */
  order: number[];
  /** Upper-triangular R of the unit-length columns, row-major p x p, positive diagonal. */
  r: Float64Array;
  /** True when basis column 0 is the design's intercept. */
  interceptFirst: boolean;
  /** The row-scaled columns in basis order, with their 2-norms. */
  columns: ScaledColumns;
}

/** Null when the estimable columns turn out numerically dependent (the caller then falls back). */
export function weightedBasis(
  fit: LeastSquaresFit,
  design: DesignMatrix,
  weights?: ArrayLike<number>,
): WeightedBasis | null {
  const positions = fit.estimable.map((_, k) => k);
  const interceptAt = fit.estimable.findIndex((j) => design.termOfColumn[j] === -1);
  const order = interceptAt >= 0 ? [interceptAt, ...positions.filter((k) => k !== interceptAt)] : positions;
  const columns = scaledColumns(
    order.map((k) => design.high[fit.estimable[k]]),
    order.map((k) => design.low[fit.estimable[k]]),
    rowScaleOf(weights, design.rows),
    design.rows,
  );
  const r = streamedR(columns);
  if (!(smallestPivot(r, order.length) > DEPENDENT_COLUMN_TOLERANCE)) return null;
  return { order, r, interceptFirst: interceptAt >= 0, columns };
}

/** x' (X'WX)^-1 x = |R^-T D^-1 x|^2 for x over the estimable columns (in fit order). */
export function basisQuadraticForm(basis: WeightedBasis, x: ArrayLike<number>): number {
  const p = basis.order.length;
  const { r } = basis;
  const z = new Float64Array(p);
  let total = 0;
  for (let k = 0; k < p; k++) {
    let s = x[basis.order[k]] / basis.columns.scale[k];
    for (let m = 0; m < k; m++) s -= r[m * p + k] * z[m];
    z[k] = s / r[k * p + k];
    total += z[k] * z[k];
  }
  return total;
}
