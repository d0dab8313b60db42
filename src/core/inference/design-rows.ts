// Row access to a design over the columns a fit could estimate, and the
// quadratic form x' C x with C = (X'WX)^-1 that leverages and prediction
// variances share.
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';

/** Row i of the design restricted to the fit's estimable columns (high + low rounded once). */
export function estimableRow(design: DesignMatrix, fit: LeastSquaresFit, i: number): Float64Array {
  const row = new Float64Array(fit.estimable.length);
  for (let k = 0; k < fit.estimable.length; k++) {
    const j = fit.estimable[k];
    row[k] = design.high[j][i] + design.low[j][i];
  }
  return row;
}

/** x' C x for a symmetric C; negative rounding noise is clamped to 0. */
export function quadraticForm(c: number[][], x: ArrayLike<number>): number {
  let total = 0;
  for (let a = 0; a < x.length; a++) {
    const xa = x[a];
    if (xa === 0) continue;
    const ca = c[a];
    let inner = 0;
    for (let b = 0; b < x.length; b++) inner += ca[b] * x[b];
    total += xa * inner;
  }
  return total > 0 ? total : 0;
}

/** The weight of row i (1 without weights). */
export function weightAt(weights: ArrayLike<number> | undefined, i: number): number {
  return weights === undefined ? 1 : weights[i];
}
