// Weighted linear least squares for one candidate design.
//
// Pipeline: equilibrate (weights as row scaling, centring against the intercept,
// power-of-two column scaling) -> Householder QR with limited pivoting (rank and
// aliasing in the caller's column order) -> iterative refinement of the augmented
// system with double-double residuals -> covariance -> exact map back to the
// caller's basis. Pure: never throws on numerical input; degenerate inputs give a
// fit with rank 0, sigma null or exactFit true, for the caller to judge.
//
// Preconditions the caller checks (violations give NaN, not a throw): design and
// y finite; weights, when given, are relative weights >= 0 (a weight that is not
// a positive finite number takes its row out of the fit, as a zero weight does).
// The intercept column (termOfColumn -1, a constant column) is factorised first
// wherever the caller put it.

import type { DesignMatrix, LeastSquaresFit } from '../types.ts';
import { ddMul, ddSub, splitHigh, type DD } from '../numeric/double-double.ts';
import { sumSquaresDD } from '../numeric/dd-vector.ts';
import { equilibrate } from './equilibration.ts';
import { householderQR } from './householder-qr.ts';
import { MAX_REFINEMENT_STEPS, refineLeastSquares } from './refinement.ts';
import { equilibratedCovariance, type CovarianceRoute } from './covariance.ts';
import { mapCoefficients, mapCovariance } from './basis-map.ts';
import { conditionFromR } from './condition.ts';
import { totalSumOfSquares } from './total-sum-of-squares.ts';
import { isExactFit } from './exact-fit.ts';

/**
 * Relative remaining-norm threshold for aliasing. NIST Filip's smallest relative
 * remaining norm after centring is 6.06e-8 (measured) and must stay full rank;
 * exactly collinear columns (dummies plus intercept, x and 2x, degrees C and K)
 * leave 2e-16 to 4e-16 (measured on Norris). 1e-10 sits between them with a
 * margin of ~600 on the Filip side and ~1e5 on the collinear side.
 */
export const ALIAS_TOLERANCE = 1e-10;

export interface FitOptions {
  /** Relative remaining-norm threshold below which a column is aliased (default 1e-10). */
  aliasTolerance?: number;
  /** Refinement steps after the initial QR solve (default 10; 0 gives the plain equilibrated QR). */
  maxRefinementSteps?: number;
  /**
   * Covariance route: 'auto' (default) takes the double-double Gram matrix when the
   * plain route's error bound is too large; 'extended' and 'double' force one route
   * (for diagnostics and the accuracy tests).
   */
  covariance?: CovarianceRoute;
}

export { MAX_REFINEMENT_STEPS };

export function fitLeastSquares(
  design: DesignMatrix,
  y: Float64Array,
  weights?: Float64Array,
  options: FitOptions = {},
): LeastSquaresFit {
  const tolerance = options.aliasTolerance ?? ALIAS_TOLERANCE;
  const maxSteps = options.maxRefinementSteps ?? MAX_REFINEMENT_STEPS;
  const n = design.rows;
  const p = design.labels.length;
  const eq = equilibrate(design, y, weights, tolerance);

  // Factorisation order: the intercept first (centring already projected it out of
  // the others), then the caller's order; columns the intercept explains are aliased.
  const candidates: number[] = [];
  if (eq.interceptColumn >= 0) candidates.push(eq.interceptColumn);
  for (let j = 0; j < p; j++) {
    if (j !== eq.interceptColumn && !eq.aliasedByIntercept[j]) candidates.push(j);
  }
  const qr = householderQR(eq.ah, n, candidates, eq.norm, tolerance);
  const columns = qr.order.slice(0, qr.rank).map((c) => candidates[c]);
  const accepted = new Set(columns);

  const sol = refineLeastSquares(qr, eq.ah, eq.al, columns, eq.bh, eq.bl, maxSteps);
  const beta = mapCoefficients(eq, columns, sol.xh, sol.xl);

  // Residuals e = y - X beta: from the refined weighted residual where the weight
  // is positive (e = r / (c sqrt(w))), directly in double-double elsewhere.
  const c = eq.responseScale;
  const residuals = new Float64Array(n);
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const positive = eq.sh ? eq.sh[i] > 0 : true;
    if (positive && !eq.sh) {
      residuals[i] = (sol.rh[i] + sol.rl[i]) / c;
    } else if (positive) {
      // (rh + rl) / (sh + sl) to double accuracy: q + (rh - q sh + rl - q sl) / sh,
      // with rh - q sh exact via twoProduct.
      const sh = eq.sh![i];
      const q = sol.rh[i] / sh;
      const ph = q * sh;
      const q1 = splitHigh(q);
      const q2 = q - q1;
      const s1 = splitHigh(sh);
      const s2 = sh - s1;
      const pl = q1 * s1 - ph + q1 * s2 + q2 * s1 + q2 * s2; // twoProduct(q, sh) without the tuple
      residuals[i] = (q + (sol.rh[i] - ph - pl + sol.rl[i] - q * eq.sl![i]) / sh) / c;
    } else {
      let e: DD = [y[i], 0];
      for (const [j, [bh, bl]] of beta) {
        const [ph, pl] = ddMul(design.high[j][i], design.low[j][i], bh, bl);
        e = ddSub(e[0], e[1], ph, pl);
      }
      residuals[i] = e[0];
    }
    fitted[i] = y[i] - residuals[i];
  }

  // rss = ||r||^2 / c^2 (c a power of two), in double-double.
  const rssDD = sumSquaresDD(sol.rh, sol.rl);
  const rss = rssDD[0] / (c * c);
  const tss = totalSumOfSquares(design.intercept, y, weights, eq.weightTotal);
  const dof = eq.positiveRows - qr.rank;
  const sigma = dof > 0 ? Math.sqrt(rss / dof) : null;

  const conditionNumber = conditionFromR(qr);
  const { covariance: covEq } = equilibratedCovariance(
    qr, eq.ah, eq.al, columns, conditionNumber, options.covariance ?? 'auto',
  );
  const { estimable, covariance } = mapCovariance(eq, columns, covEq);

  const coefficients: (number | null)[] = [];
  const standardErrors: (number | null)[] = [];
  const aliased: string[] = [];
  for (let j = 0; j < p; j++) {
    if (!accepted.has(j)) {
      coefficients.push(null);
      standardErrors.push(null);
      aliased.push(design.labels[j]);
      continue;
    }
    coefficients.push(beta.get(j)![0]);
    const v = covariance[estimable.indexOf(j)][estimable.indexOf(j)];
    standardErrors.push(sigma === null || sigma === 0 ? null : sigma * Math.sqrt(v));
  }

  let bNorm = 0;
  for (let i = 0; i < n; i++) bNorm += eq.bh[i] * eq.bh[i];
  const exactFit = isExactFit(Math.sqrt(rssDD[0]), Math.sqrt(bNorm));

  return {
    observations: eq.positiveRows,
    rank: qr.rank,
    coefficients,
    standardErrors,
    aliased,
    unscaledCovariance: covariance,
    estimable,
    residuals,
    fitted,
    rss,
    tss,
    sigma,
    exactFit,
    conditionNumber,
    refinement: { steps: sol.steps, lastCorrection: sol.lastCorrection },
  };
}
