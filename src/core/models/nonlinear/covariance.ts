// The Jacobian at the solution: its rank, its condition and the unscaled
// covariance (J'WJ)^-1, by the linear engine's QR (src/core/fit) on the
// columns scaled to unit length by exact powers of two. The covariance takes
// the engine's route: R^-1 R^-T when 2 κ eps is small, otherwise the
// double-double Gram matrix and Cholesky (covariance.ts there says why).
//
// Rank: a column whose part not explained by the columns before it (in the
// order of the parameters) is below RANK_TOLERANCE of its length makes the
// Jacobian rank-deficient: some combination of parameters leaves the fitted
// curve unchanged to first order, so those parameters are not identified and
// no standard error exists. The threshold sits between the NIST StRD
// problems, whose smallest such ratio is 4.9e-5 (Bennett5, measured; MGH10
// 1.4e-3, Lanczos1-3 2.6e-3), and exactly redundant parameters (b1*b2*x,
// rounding level: 1e-16), with margins of about 5e5 and 1e6; the same value
// as the linear engine's aliasing tolerance.
import { householderQR, upperTriangle } from '../../fit/householder-qr.ts';
import { equilibratedCovariance } from '../../fit/covariance.ts';
import { conditionFromR } from '../../fit/condition.ts';

export const RANK_TOLERANCE = 1e-10;

export interface JacobianGeometry {
  rank: number;
  /** Parameters (indices) whose Jacobian column depends on the earlier ones. */
  dependent: number[];
  /** (J'WJ)^-1, p x p in parameter order; null when rank-deficient. */
  unscaledCovariance: number[][] | null;
  /** 2-norm condition number of the unit-column Jacobian; null when rank-deficient. */
  conditionNumber: number | null;
  /** Per parameter: relative remaining norm at its QR step (1 for the first). */
  remainingNorm: Float64Array;
  /** J D = Q R with D = diag(scale): R (p x p, upper) and the scale; null when rank-deficient. */
  factor: JacobianFactor | null;
}

/** The R factor of the Jacobian with columns scaled by exact powers of two, in parameter order. */
export interface JacobianFactor {
  r: number[][];
  scale: number[];
}

/**
 * |R^-T (D g)|² = g' (J'WJ)^-1 g for a gradient g (unweighted row of
 * derivatives): a prediction's variance factor, or with g a weighted row of J
 * the leverage of that row. Through R rather than the explicit inverse, which
 * would cost digits to cancellation on an ill-conditioned Jacobian.
 */
export function varianceFactor(factor: JacobianFactor, g: ArrayLike<number>): number {
  const { r, scale } = factor;
  const p = scale.length;
  const z = new Float64Array(p);
  let total = 0;
  for (let k = 0; k < p; k++) {
    let s = scale[k] * g[k];
    for (let l = 0; l < k; l++) s -= r[l][k] * z[l];
    z[k] = s / r[k][k];
    total += z[k] * z[k];
  }
  return total;
}

/** Exact power of two bringing a positive norm into (1/2, 1]. */
function powerOfTwoScale(norm: number): number {
  if (!(norm > 0) || !Number.isFinite(norm)) return 1;
  return 2 ** -Math.ceil(Math.log2(norm));
}

/** `jac` is the weighted Jacobian sqrt(w) d model / d b, column-major n x p. */
export function jacobianGeometry(jac: Float64Array, n: number, p: number): JacobianGeometry {
  const ah: Float64Array[] = [];
  const al: Float64Array[] = [];
  const scale = new Float64Array(p);
  const norms = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const col = jac.subarray(j * n, (j + 1) * n);
    let s = 0;
    for (let i = 0; i < n; i++) s += col[i] * col[i];
    scale[j] = powerOfTwoScale(Math.sqrt(s));
    const scaled = new Float64Array(n);
    let t = 0;
    for (let i = 0; i < n; i++) {
      scaled[i] = col[i] * scale[j];
      t += scaled[i] * scaled[i];
    }
    norms[j] = Math.sqrt(t);
    ah.push(scaled);
    al.push(new Float64Array(n));
  }
  const order = Array.from({ length: p }, (_, j) => j);
  const qr = householderQR(ah, n, order, norms, RANK_TOLERANCE);
  const remainingNorm = new Float64Array(p);
  order.forEach((j) => (remainingNorm[j] = qr.remainingNorm[j]));
  if (qr.rank < p) {
    const accepted = new Set(qr.order.slice(0, qr.rank));
    return {
      rank: qr.rank,
      dependent: order.filter((j) => !accepted.has(j)),
      unscaledCovariance: null,
      conditionNumber: null,
      remainingNorm,
      factor: null,
    };
  }
  const columns = qr.order.slice(0, qr.rank);
  const conditionNumber = conditionFromR(qr);
  const { covariance } = equilibratedCovariance(qr, ah, al, columns, conditionNumber, 'auto');
  const unscaled = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  columns.forEach((a, k) => {
    columns.forEach((b, l) => {
      unscaled[a][b] = (covariance.hi[k][l] + covariance.lo[k][l]) * scale[a] * scale[b];
    });
  });
  // Full rank keeps the parameters' order, so R's columns are the parameters.
  const factor = { r: upperTriangle(qr), scale: Array.from(scale) };
  return { rank: p, dependent: [], unscaledCovariance: unscaled, conditionNumber, remainingNorm, factor };
}
