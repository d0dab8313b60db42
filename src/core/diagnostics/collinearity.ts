// Multicollinearity measures of a design.
import { centredColumns, svdOfColumns, unitLengthColumns } from './scaled-svd.ts';

/**
 * Variance inflation factors VIF_j = 1 / (1 - R_j^2), R_j^2 from regressing
 * column j on a constant and the other columns. They are the diagonal of the
 * inverse correlation matrix of the columns (Marquardt 1970); with the
 * centred, unit-length columns Z = U S V' that diagonal is
 * sum_k V_jk^2 / s_k^2, which avoids forming and inverting Z'Z. With weights
 * the columns are centred on weighted means and rows scaled by sqrt(w_i).
 * Null for a column that is constant, or when the columns are exactly
 * collinear (infinite inflation).
 */
export function varianceInflationFactors(columns: readonly Float64Array[], weights?: ArrayLike<number>): (number | null)[] {
  if (columns.length === 0) return [];
  const centred = centredColumns(columns, weights);
  const constant = centred.map((c) => c.every((x) => x === 0));
  const svd = svdOfColumns(unitLengthColumns(centred));
  if (svd.rank < columns.length) return columns.map(() => null);
  return columns.map((_, j) => {
    if (constant[j]) return null;
    let s = 0;
    for (let k = 0; k < svd.rank; k++) s += (svd.v[j][k] * svd.v[j][k]) / (svd.singularValues[k] * svd.singularValues[k]);
    return s;
  });
}

/**
 * The scaled condition number of Belsley, Kuh & Welsch (1980, "Regression
 * Diagnostics", ch. 3): columns (intercept included, not centred; rows scaled
 * by sqrt(w_i)) rescaled to unit length, then s_max / s_min. Null when the
 * columns are exactly dependent.
 */
export function scaledConditionNumber(columns: readonly Float64Array[], weights?: ArrayLike<number>): number | null {
  if (columns.length === 0) return null;
  const rows = weights ? columns.map((c) => c.map((x, i) => Math.sqrt(weights[i]) * x)) : columns.slice();
  const svd = svdOfColumns(unitLengthColumns(rows));
  if (svd.rank < columns.length) return null;
  return svd.singularValues[0] / svd.singularValues[svd.singularValues.length - 1];
}
