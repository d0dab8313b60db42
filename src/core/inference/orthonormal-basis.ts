// An orthonormal basis Q of the weighted design sqrt(W) X_E (estimable
// columns only), with X_E = Q R D: columns are first scaled to unit length
// (D), then orthogonalised by modified Gram–Schmidt applied twice ("twice is
// enough": Giraud, Langou & Rozložník 2005), which keeps Q orthonormal to
// rounding level for any design of full column rank.
//
// Why not use the fit's (X'WX)^-1 directly: a leverage x' C x formed from
// the explicit inverse cancels catastrophically when the columns are far from
// orthogonal (error about cond(X)^2 * 1e-16; 1e-7 on the NIST Longley data),
// whereas h_ii = |Q_i|^2 and x'(X'WX)^-1 x = |R^-T D^-1 x|^2 lose only about
// cond(X) * 1e-16.
import type { DesignMatrix, LeastSquaresFit } from '../types.ts';

export interface WeightedBasis {
  /** Columns of Q, one per estimable design column. */
  q: Float64Array[];
  /** Upper-triangular R (row-major, r[k][l] for l >= k), of the unit-length columns. */
  r: number[][];
  /** Column scales (2-norms of sqrt(W) x_j). */
  scale: number[];
}

/** Null when the estimable columns turn out numerically dependent (the caller then falls back). */
export function weightedBasis(
  fit: LeastSquaresFit,
  design: DesignMatrix,
  weights?: ArrayLike<number>,
): WeightedBasis | null {
  const n = design.rows;
  const p = fit.estimable.length;
  const q: Float64Array[] = [];
  const r: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const scale: number[] = [];
  for (let k = 0; k < p; k++) {
    const j = fit.estimable[k];
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = Math.sqrt(weights ? weights[i] : 1) * (design.high[j][i] + design.low[j][i]);
    let norm = Math.hypot(...v);
    if (!(norm > 0)) return null;
    scale.push(norm);
    for (let i = 0; i < n; i++) v[i] /= norm;
    for (let pass = 0; pass < 2; pass++) {
      for (let m = 0; m < k; m++) {
        let dot = 0;
        for (let i = 0; i < n; i++) dot += q[m][i] * v[i];
        for (let i = 0; i < n; i++) v[i] -= dot * q[m][i];
        r[m][k] += dot;
      }
    }
    norm = Math.hypot(...v);
    // A unit-length column left with less than this is dependent on the
    // previous ones to working precision.
    if (!(norm > 1e-13)) return null;
    r[k][k] = norm;
    for (let i = 0; i < n; i++) v[i] /= norm;
    q.push(v);
  }
  return { q, r, scale };
}

/** h_ii = sum_k Q_ik^2. */
export function basisLeverage(basis: WeightedBasis, i: number): number {
  let h = 0;
  for (const column of basis.q) h += column[i] * column[i];
  return h;
}

/** x' (X'WX)^-1 x = |R^-T D^-1 x|^2 for x over the estimable columns. */
export function basisQuadraticForm(basis: WeightedBasis, x: ArrayLike<number>): number {
  const p = basis.r.length;
  const z = new Float64Array(p);
  let total = 0;
  for (let k = 0; k < p; k++) {
    let s = x[k] / basis.scale[k];
    for (let m = 0; m < k; m++) s -= basis.r[m][k] * z[m];
    z[k] = s / basis.r[k][k];
    total += z[k] * z[k];
  }
  return total;
}
