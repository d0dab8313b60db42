// Multicollinearity measures of a design, from the triangular factor of its
// scaled columns (scaled-factor.ts): p x p algebra once the columns are
// factorised, never an SVD of the n x p data.
import { centringFactor, conditionFromFactor, inflationFromFactor, plainFactor } from './scaled-factor.ts';

/**
 * Variance inflation factors VIF_j = 1 / (1 - R_j^2), R_j^2 from regressing
 * column j on a constant and the other columns. They are the diagonal of the
 * inverse correlation matrix of the columns (Marquardt 1970), here read off
 * the factor of [constant, columns] (see inflationFromFactor). With weights
 * the columns are centred on weighted means and rows scaled by sqrt(w_i).
 * All null when a column is constant or the columns are exactly collinear
 * (infinite inflation).
 */
export function varianceInflationFactors(columns: readonly Float64Array[], weights?: ArrayLike<number>): (number | null)[] {
  if (columns.length === 0) return [];
  const rows = columns[0].length;
  return inflationFromFactor(centringFactor(columns, weights), columns.length + 1, rows);
}

/**
 * The scaled condition number of Belsley, Kuh & Welsch (1980, "Regression
 * Diagnostics", ch. 3): columns (intercept included, not centred; rows scaled
 * by sqrt(w_i)) rescaled to unit length, then s_max / s_min, which are the
 * extreme singular values of their R factor. Null when the columns are
 * exactly dependent.
 */
export function scaledConditionNumber(columns: readonly Float64Array[], weights?: ArrayLike<number>): number | null {
  if (columns.length === 0) return null;
  return conditionFromFactor(plainFactor(columns, weights), columns.length, columns[0].length);
}
