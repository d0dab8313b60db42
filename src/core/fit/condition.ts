// 2-norm condition number of the factorised (weighted, equilibrated) design.
// The singular values of A equal those of its R factor, so the SVD of the small
// rank x rank R gives kappa_2(A) itself, not a bound, at O(p^3) cost. ml-matrix
// is adequate for this p x p algebra.

import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { upperTriangle, type HouseholderQR } from './householder-qr.ts';

/**
 * sigma_max / sigma_min of R. NaN when no column was accepted (rank 0):
 * a condition number of an empty matrix is undefined, and NaN keeps the
 * field's type while every reader maps a non-finite value to null
 * (results report it as null; the covariance route's "cond > limit" test
 * is false for NaN, as it should be with nothing to invert).
 */
export function conditionFromR(qr: HouseholderQR): number {
  if (qr.rank === 0) return Number.NaN;
  const svd = new SingularValueDecomposition(new Matrix(upperTriangle(qr)), {
    computeLeftSingularVectors: false,
    computeRightSingularVectors: false,
  });
  const s = svd.diagonal;
  const max = Math.max(...s);
  const min = Math.min(...s);
  return min > 0 ? max / min : Infinity;
}
