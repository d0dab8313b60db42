// Map the solution and covariance from the equilibrated basis back to the
// caller's columns. With gamma the coefficients on A = W^{1/2}(X - 1 m^T) D and
// c the response scale (b = c W^{1/2} y):
//   beta_j         = d_j gamma_j / c                          (j not the intercept)
//   beta_intercept = d_0 gamma_0 / c - sum_j m_j beta_j
// and Cov(beta) = L C L^T with L the same linear map (without 1/c, since the
// covariance is unscaled). Powers of two are exact; the sums over m_j run in
// double-double, because centring moves a large part of every coefficient into
// the intercept (Filip: |m_10| ~ 1e8) and that cancellation must not cost digits.

import { ddAdd, ddMul, ddMulDouble, type DD } from '../numeric/double-double.ts';
import type { EquilibratedProblem } from './equilibration.ts';
import type { MatrixDD } from './covariance.ts';

/**
 * Caller-basis coefficients (double-double) for the accepted columns
 * `columns` (factorisation order) with solution xh + xl.
 */
export function mapCoefficients(
  eq: EquilibratedProblem,
  columns: number[],
  xh: Float64Array,
  xl: Float64Array,
): Map<number, DD> {
  const out = new Map<number, DD>();
  const c = 1 / eq.responseScale;
  for (let k = 0; k < columns.length; k++) {
    const j = columns[k];
    const f = eq.scale[j] * c;
    out.set(j, [xh[k] * f, xl[k] * f]);
  }
  const ic = eq.interceptColumn;
  if (ic >= 0 && out.has(ic)) {
    let [sh, sl] = out.get(ic)!;
    for (const [j, [bh, bl]] of out) {
      if (j === ic) continue;
      const [ph, pl] = ddMul(eq.mh[j], eq.ml[j], bh, bl);
      [sh, sl] = ddAdd(sh, sl, -ph, -pl);
    }
    out.set(ic, [sh, sl]);
  }
  return out;
}

/**
 * Caller-basis unscaled covariance over the accepted columns, returned in
 * ascending design order of those columns (the order of `estimable`).
 */
export function mapCovariance(
  eq: EquilibratedProblem,
  columns: number[],
  cov: MatrixDD,
): { estimable: number[]; covariance: number[][] } {
  const k = columns.length;
  const ic = eq.interceptColumn;
  // Row of L for each accepted column, as sparse (position, dd coefficient) pairs.
  const lRows: [number, DD][][] = columns.map((j, pos) => {
    if (j !== ic) return [[pos, [eq.scale[j], 0]]];
    const row: [number, DD][] = [[pos, [eq.scale[j], 0]]];
    columns.forEach((jj, pp) => {
      if (jj !== ic) row.push([pp, ddMulDouble(-eq.mh[jj], -eq.ml[jj], eq.scale[jj])]);
    });
    return row;
  });
  const estimable = [...columns].sort((a, b) => a - b);
  const position = new Map(columns.map((j, pos) => [j, pos]));
  const out: number[][] = estimable.map(() => new Array<number>(k).fill(0));
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      const ra = lRows[position.get(estimable[a])!];
      const rb = lRows[position.get(estimable[b])!];
      let sh = 0;
      let sl = 0;
      for (const [pa, [ah, al]] of ra) {
        for (const [pb, [bh, bl]] of rb) {
          const [th, tl] = ddMul(ah, al, bh, bl);
          const [ph, pl] = ddMul(th, tl, cov.hi[pa][pb], cov.lo[pa][pb]);
          [sh, sl] = ddAdd(sh, sl, ph, pl);
        }
      }
      out[a][b] = out[b][a] = sh;
    }
  }
  return { estimable, covariance: out };
}
