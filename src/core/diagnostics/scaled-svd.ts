// Singular value decompositions of scaled copies of design columns, the one
// tool behind the variance inflation factors, the condition number and the
// auxiliary regression of the Breusch–Pagan test. Scaling each column to unit
// length first makes the singular values independent of the columns' units.
import { Matrix, SingularValueDecomposition } from 'ml-matrix';

export interface ScaledSvd {
  /** Singular values, descending. */
  singularValues: number[];
  /** Right singular vectors as rows of V: v[j][k]. */
  v: number[][];
  /** Left singular vectors u[i][k] (only when asked for). */
  u: number[][] | null;
  /** Singular values above max(n, p) * eps * s_max. */
  rank: number;
}

/** Columns rescaled to unit 2-norm (a zero column stays zero). */
export function unitLengthColumns(columns: readonly Float64Array[]): Float64Array[] {
  return columns.map((c) => {
    let s = 0;
    for (let i = 0; i < c.length; i++) s += c[i] * c[i];
    const norm = Math.sqrt(s);
    return norm > 0 ? c.map((x) => x / norm) : c.slice();
  });
}

/** Columns with their (weighted) mean removed, each row scaled by sqrt(w_i). */
export function centredColumns(columns: readonly Float64Array[], weights?: ArrayLike<number>): Float64Array[] {
  return columns.map((c) => {
    let sw = 0;
    let swx = 0;
    for (let i = 0; i < c.length; i++) {
      const w = weights ? weights[i] : 1;
      sw += w;
      swx += w * c[i];
    }
    const mean = swx / sw;
    return c.map((x, i) => Math.sqrt(weights ? weights[i] : 1) * (x - mean));
  });
}

export function svdOfColumns(columns: readonly Float64Array[], withLeft = false): ScaledSvd {
  const n = columns[0]?.length ?? 0;
  const p = columns.length;
  const m = new Matrix(n, p);
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) m.set(i, j, columns[j][i]);
  const svd = new SingularValueDecomposition(m, {
    computeLeftSingularVectors: withLeft,
    computeRightSingularVectors: true,
    autoTranspose: true,
  });
  const singularValues = svd.diagonal.slice();
  const order = singularValues.map((_, k) => k).sort((a, b) => singularValues[b] - singularValues[a]);
  const sorted = order.map((k) => singularValues[k]);
  const vm = svd.rightSingularVectors;
  const v = Array.from({ length: p }, (_, j) => order.map((k) => vm.get(j, k)));
  const u = withLeft ? Array.from({ length: n }, (_, i) => order.map((k) => svd.leftSingularVectors.get(i, k))) : null;
  const tolerance = Math.max(n, p) * Number.EPSILON * (sorted[0] ?? 0);
  const rank = sorted.filter((s) => s > tolerance).length;
  return { singularValues: sorted, v, u, rank };
}

/**
 * R^2 of y regressed on a constant plus the given columns, and the rank of
 * the centred columns (the auxiliary regression's slope count).
 */
export function auxiliaryRSquared(regressors: readonly Float64Array[], y: Float64Array): { rSquared: number; slopes: number } {
  const [yc] = centredColumns([y]);
  let total = 0;
  for (let i = 0; i < yc.length; i++) total += yc[i] * yc[i];
  if (regressors.length === 0 || !(total > 0)) return { rSquared: 0, slopes: 0 };
  const svd = svdOfColumns(unitLengthColumns(centredColumns(regressors)), true);
  let explained = 0;
  for (let k = 0; k < svd.rank; k++) {
    let dot = 0;
    for (let i = 0; i < yc.length; i++) dot += svd.u![i][k] * yc[i];
    explained += dot * dot;
  }
  return { rSquared: Math.min(1, explained / total), slopes: svd.rank };
}
