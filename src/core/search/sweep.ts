// The sweep operator on a symmetric cross-product matrix (Beaton 1964;
// Goodnight 1979), in the symmetric form with a reverse sweep (Little &
// Rubin, "Statistical Analysis with Missing Data", sec. 7.4). Sweeping the
// columns S of [[Cxx, Cxy], [Cyx, Cyy]] leaves Cyy - Cys Css^-1 Csy, the
// residual sum of squares of y on S, in the response's diagonal, the
// coefficients in the response's row, and -Css^-1 in the swept block.
// Sweep and reverse sweep undo each other exactly in exact arithmetic, so a
// Gray-code walk needs one block sweep per subset.

/**
 * Sweep (direction 1) or reverse sweep (direction -1) of the d-by-d
 * row-major symmetric matrix `a` on pivot k. O(d^2).
 */
export function sweepPivot(a: Float64Array, d: number, k: number, direction: 1 | -1): void {
  const rk = k * d;
  const inv = 1 / a[rk + k];
  for (let i = 0; i < d; i++) {
    if (i === k) continue;
    const ri = i * d;
    const f = a[ri + k] * inv;
    if (f !== 0) {
      for (let j = 0; j < d; j++) a[ri + j] -= f * a[rk + j];
    }
    a[ri + k] = direction * f;
  }
  for (let j = 0; j < d; j++) a[rk + j] = a[j * d + k];
  a[rk + k] = -inv;
}

/**
 * Relative pivot tolerance: a column whose remaining sum of squares is below
 * this fraction of its own (1 - R^2 on the columns already in) is treated as
 * aliased and not swept. Normal-equation quantities carry about 1e-16 times
 * the squared condition number in relative error, so 1e-10 (a residual norm
 * ratio of 1e-5) is where a swept pivot stops carrying useful digits; QR on
 * the rows resolves further, which is why the top models are refitted.
 */
export const PIVOT_TOLERANCE = 1e-10;

/** True when column k can be swept in: its current pivot is a usable fraction of its original sum of squares. */
export function pivotUsable(a: Float64Array, d: number, k: number, original: number, tolerance = PIVOT_TOLERANCE): boolean {
  return original > 0 && a[k * d + k] > tolerance * original;
}
