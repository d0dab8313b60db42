// Triangular factors of scaled copies of design columns, the one tool behind
// the variance inflation factors, the condition number and the auxiliary
// regression of the Breusch–Pagan test. The n x p columns are factorised
// once by a streamed Householder QR (inference/streamed-qr.ts); everything
// after that is p x p algebra on R, whose singular values are the columns'.
// Scaling each column to unit length first makes them independent of units.
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { leveragesAndProjections, rowScaleOf, scaledColumns, streamedR, weightedMeans } from '../inference/streamed-qr.ts';

interface FactorSvd {
  /** Singular values, descending. */
  singularValues: number[];
  /** Right singular vectors as rows of V: v[j][k]. */
  v: number[][];
  /** Singular values above max(n, p) * eps * s_max (n the rows of the factorised columns). */
  rank: number;
}

function svdOf(m: number[][], rows: number): FactorSvd {
  const p = m.length;
  const svd = new SingularValueDecomposition(new Matrix(m), {
    computeLeftSingularVectors: false,
    computeRightSingularVectors: true,
  });
  const values = svd.diagonal.slice();
  const order = values.map((_, k) => k).sort((a, b) => values[b] - values[a]);
  const singularValues = order.map((k) => values[k]);
  const vm = svd.rightSingularVectors;
  const v = Array.from({ length: p }, (_, j) => order.map((k) => vm.get(j, k)));
  const tolerance = Math.max(rows, p) * Number.EPSILON * (singularValues[0] ?? 0);
  return { singularValues, v, rank: singularValues.filter((s) => s > tolerance).length };
}

/** The square block of row-major R (size p) from row and column `first` on. */
function trailingBlock(r: Float64Array, p: number, first: number): number[][] {
  return Array.from({ length: p - first }, (_, a) =>
    Array.from({ length: p - first }, (_, b) => (b >= a ? r[(a + first) * p + b + first] : 0)));
}

/**
 * s_max / s_min of the unit-length columns with factor R (p x p); null when
 * they are exactly dependent (rank below p at the max(n, p) * eps threshold).
 */
export function conditionFromFactor(r: Float64Array, p: number, rows: number): number | null {
  if (p === 0) return null;
  const svd = svdOf(trailingBlock(r, p, 0), rows);
  if (svd.rank < p) return null;
  return svd.singularValues[0] / svd.singularValues[p - 1];
}

/**
 * The factor of the centred regressors, each rescaled to unit length: the
 * block of R (of [constant, regressors], constant first) from row and column
 * 1 on, columns normalised. Null when some centred regressor is constant
 * (zero length); [] when there are no regressors.
 */
function centredUnitBlock(r: Float64Array, p: number): number[][] | null {
  const block = trailingBlock(r, p, 1);
  const m = block.length;
  for (let b = 0; b < m; b++) {
    let s = 0;
    for (let a = 0; a <= b; a++) s += block[a][b] * block[a][b];
    const norm = Math.sqrt(s);
    if (!(norm > 0)) return null;
    for (let a = 0; a <= b; a++) block[a][b] /= norm;
  }
  return block;
}

/**
 * Variance inflation factors from the factor R of [constant, regressors]
 * (constant first, so the block of R from row and column 1 on is the factor
 * of the centred regressors). Each centred column is rescaled to unit length
 * and VIF_j = sum_k V_jk^2 / s_k^2 from the SVD of that block: the diagonal of
 * the inverse correlation matrix (Marquardt 1970) without forming it. All null
 * when the centred regressors are exactly collinear (a constant one included).
 */
export function inflationFromFactor(r: Float64Array, p: number, rows: number): (number | null)[] {
  const block = centredUnitBlock(r, p);
  if (block === null) return trailingBlock(r, p, 1).map(() => null);
  const m = block.length;
  if (m === 0) return [];
  const svd = svdOf(block, rows);
  if (svd.rank < m) return block.map(() => null);
  return block.map((_, j) => {
    let s = 0;
    for (let k = 0; k < m; k++) s += (svd.v[j][k] * svd.v[j][k]) / (svd.singularValues[k] * svd.singularValues[k]);
    return s;
  });
}

/**
 * The condition number of the centred regressors scaled to unit length,
 * from the same factor: s_max / s_min, the square root of the condition
 * number of their correlation matrix. Unlike the uncentred number it does not
 * grow with the distance of the data from zero (a kiln at 1200 °C), only with
 * near-dependence among the regressors themselves. 1 for one regressor; null
 * for none, or when they are exactly dependent.
 */
export function centredConditionFromFactor(r: Float64Array, p: number, rows: number): number | null {
  const block = centredUnitBlock(r, p);
  if (block === null || block.length === 0) return null;
  const svd = svdOf(block, rows);
  if (svd.rank < block.length) return null;
  return svd.singularValues[0] / svd.singularValues[block.length - 1];
}

/** A column of ones as long as the given ones. */
function constantColumn(columns: readonly ArrayLike<number>[]): Float64Array {
  return new Float64Array(columns[0]?.length ?? 0).fill(1);
}

/**
 * R of the unit-length columns [constant, ...columns], rows scaled by
 * sqrt(w_i), the columns centred on their weighted means first: the same
 * column space, without the rounding of the offset (see orthonormal-basis.ts).
 */
export function centringFactor(columns: readonly ArrayLike<number>[], weights?: ArrayLike<number>): Float64Array {
  return streamedR(centredWithConstant(columns, rowScaleOf(weights, columns[0]?.length ?? 0)));
}

function centredWithConstant(columns: readonly ArrayLike<number>[], rowScale: Float64Array | null) {
  const n = columns[0]?.length ?? 0;
  const all = [constantColumn(columns), ...columns];
  const low = all.map(() => null);
  const centre = weightedMeans(all, low, rowScale, n);
  centre[0] = 0;
  return scaledColumns(all, low, rowScale, n, centre);
}

/** R of the unit-length columns, rows scaled by sqrt(w_i). */
export function plainFactor(columns: readonly ArrayLike<number>[], weights?: ArrayLike<number>): Float64Array {
  const n = columns[0]?.length ?? 0;
  return streamedR(scaledColumns(columns, columns.map(() => null), rowScaleOf(weights, n), n));
}

/**
 * R^2 of y regressed on a constant plus the given columns, and the number of
 * independent non-constant columns (the auxiliary regression's slopes). A
 * column left with less than max(n, p) * eps of its unit length once the
 * constant and the earlier columns are projected out is dropped as dependent
 * (the rank threshold of an SVD, met greedily in column order), and the rest
 * refactorised.
 */
export function auxiliaryRSquared(regressors: readonly ArrayLike<number>[], y: ArrayLike<number>): { rSquared: number; slopes: number } {
  const n = y.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += y[i];
  mean /= n;
  const centred = new Float64Array(n);
  let total = 0;
  for (let i = 0; i < n; i++) {
    centred[i] = y[i] - mean;
    total += centred[i] * centred[i];
  }
  if (regressors.length === 0 || !(total > 0)) return { rSquared: 0, slopes: 0 };
  let kept = [constantColumn(regressors), ...regressors];
  for (;;) {
    const columns = centredWithConstant(kept.slice(1), null);
    const r = streamedR(columns);
    const p = kept.length;
    const tolerance = Math.max(n, p) * Number.EPSILON;
    const dependent = kept.findIndex((_, k) => !(r[k * p + k] > tolerance));
    if (dependent > 0) {
      kept = kept.filter((_, k) => k !== dependent);
      continue;
    }
    if (p === 1) return { rSquared: 0, slopes: 0 };
    // The centred response is orthogonal to the constant (column 0).
    const { projections } = leveragesAndProjections(columns, r, [centred], false);
    let explained = 0;
    for (let k = 1; k < p; k++) explained += projections[0][k] * projections[0][k];
    return { rSquared: Math.min(1, explained / total), slopes: p - 1 };
  }
}
