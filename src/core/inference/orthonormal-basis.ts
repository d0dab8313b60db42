// The R factor of the weighted design sqrt(W) X_E (estimable columns only),
// with X_E = Q R D: columns first scaled to unit length (D), then factorised
// by Householder QR streamed over blocks of rows (streamed-qr.ts), which is
// backward stable for any design of full column rank. The intercept, when
// estimable, is factorised first, so that the trailing block of R is the
// factor of the weighted-centred regressors (what the variance inflation
// factors need).
//
// With an intercept the other columns are first centred on their weighted
// means, which leaves the column space (so leverages, projections and the
// trailing block) as it was but spares the rounding the offset: a column of
// years or kelvins otherwise costs as many digits as its mean is larger than
// its spread (measured against exact rational arithmetic: the largest
// relative leverage error on NIST Longley is 5e-15 centred, 1e-12 not; the
// earlier Gram–Schmidt basis gave 2e-13).
// designFactor maps R back to the uncentred columns for the condition number.
//
// Why not use the fit's (X'WX)^-1 directly: a leverage x' C x formed from
// the explicit inverse cancels catastrophically when the columns are far from
// orthogonal (error about cond(X)^2 * 1e-16; 1e-7 on the NIST Longley data),
// whereas h_ii = |Q_i|^2 with Q_i = R^-T D^-1 sqrt(w_i) x_i, and likewise
// x'(X'WX)^-1 x = |R^-T D^-1 x|^2, lose only about cond(X) * 1e-16. For the
// same reason R is not taken from a Cholesky factor of X'WX (the Gram matrix
// already carries cond(X)^2 * 1e-16).
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import { rowScaleOf, scaledColumns, smallestPivot, streamedR, weightedMeans, type ScaledColumns } from './streamed-qr.ts';

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
  /** The intercept column's (constant) value, 1 without an intercept. */
  interceptValue: number;
  /** The row-scaled columns in basis order, their centres (0 for the intercept) and 2-norms. */
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
  const high = order.map((k) => design.high[fit.estimable[k]]);
  const low = order.map((k) => design.low[fit.estimable[k]]);
  const rowScale = rowScaleOf(weights, design.rows);
  const interceptValue = interceptAt >= 0 && design.rows > 0 ? high[0][0] + low[0][0] : 1;
  let centre: Float64Array | null = null;
  if (interceptAt >= 0 && interceptValue !== 0 && Number.isFinite(interceptValue)) {
    centre = weightedMeans(high, low, rowScale, design.rows);
    centre[0] = 0;
  }
  const columns = scaledColumns(high, low, rowScale, design.rows, centre);
  const r = streamedR(columns);
  if (!(smallestPivot(r, order.length) > DEPENDENT_COLUMN_TOLERANCE)) return null;
  return { order, r, interceptFirst: interceptAt >= 0, interceptValue: centre ? interceptValue : 1, columns };
}

/**
 * R of the uncentred unit-length columns (what the scaled condition number
 * is defined on). Column k (k >= 1) of the design is s~_k v~_k + c_k 1 with
 * v~_k the centred unit column and 1 = (s_0 / a) v_0, so R = R~ N column by
 * column, each then rescaled to unit length: p x p work, no pass over rows.
 */
export function designFactor(basis: WeightedBasis): Float64Array {
  const p = basis.order.length;
  const { r, columns } = basis;
  if (!columns.centre) return r;
  const out = new Float64Array(p * p);
  out[0] = r[0];
  const offsetScale = columns.scale[0] / basis.interceptValue;
  for (let k = 1; k < p; k++) {
    const s = columns.scale[k];
    out[k] = r[k] * s + r[0] * columns.centre[k] * offsetScale;
    for (let m = 1; m <= k; m++) out[m * p + k] = r[m * p + k] * s;
    let norm = 0;
    for (let m = 0; m <= k; m++) norm += out[m * p + k] * out[m * p + k];
    norm = Math.sqrt(norm);
    for (let m = 0; m <= k; m++) out[m * p + k] /= norm;
  }
  return out;
}

/** x' (X'WX)^-1 x = |R^-T D^-1 x|^2 for x over the estimable columns (in fit order). */
export function basisQuadraticForm(basis: WeightedBasis, x: ArrayLike<number>): number {
  const p = basis.order.length;
  const { r } = basis;
  const z = new Float64Array(p);
  let total = 0;
  // The centred coordinates of x: x_k - (c_k / a) x_intercept.
  const { centre } = basis.columns;
  const x0 = x[basis.order[0]] / basis.interceptValue;
  for (let k = 0; k < p; k++) {
    const xk = x[basis.order[k]] - (centre ? centre[k] * x0 : 0);
    let s = xk / basis.columns.scale[k];
    for (let m = 0; m < k; m++) s -= r[m * p + k] * z[m];
    z[k] = s / r[k * p + k];
    total += z[k] * z[k];
  }
  return total;
}
