// Unscaled covariance (A^T A)^-1 of the equilibrated design.
//
// The plain double route, (R^T R)^-1 = R^-1 R^-T from the Householder R, has a
// relative error of about 2 kappa eps (the QR's backward error through the
// inverse); at Filip's equilibrated kappa ~ 5e9 that is ~6 digits. The accurate
// route forms the Gram matrix A^T A in double-double from the exact (hi + lo)
// design and inverts it by a double-double Cholesky factorisation, with error
// ~ kappa^2 * 2^-104 (Filip: ~1e-12). Refining each column of the inverse with the
// augmented system would cost 2 p double-double passes over n x p per step; the
// Gram matrix costs one p/2 such pass in all, so it wins at any size.
//
// The accurate route is used when the double route's bound 2 kappa eps exceeds
// DOUBLE_COVARIANCE_LIMIT, i.e. whenever the plain route might give fewer than
// ~13 digits (kappa > ~225); below it the O(n p^2) double-double pass (~200 ms at
// 100,000 x 30, a third of the fit) is skipped. Measured on 100,000-row polynomial
// designs, the two routes then agree to 1e-14 (kappa 1.2) and 1e-12 (kappa 1.9e3);
// NIST Wampler (kappa 1.75e3) gets 11.8 digits by the double route, 14.4 by the Gram.

import { ddAdd, ddDiv, ddMul, ddSqrtDD, type DD } from '../numeric/double-double.ts';
import { dotDD } from '../numeric/dd-vector.ts';
import { rEntry, type HouseholderQR } from './householder-qr.ts';

const EPS = 2 ** -52;
/** Largest acceptable relative error bound of the plain double covariance. */
export const DOUBLE_COVARIANCE_LIMIT = 1e-13;

export type CovarianceRoute = 'auto' | 'extended' | 'double';

/** Symmetric k x k double-double matrix as hi and lo parts, factorisation order. */
export interface MatrixDD {
  hi: number[][];
  lo: number[][];
}

export function equilibratedCovariance(
  qr: HouseholderQR,
  ah: Float64Array[],
  al: Float64Array[],
  columns: number[],
  conditionNumber: number,
  route: CovarianceRoute,
): { covariance: MatrixDD; method: 'extended' | 'double' } {
  const wantExtended = route === 'extended' || (route === 'auto' && 2 * conditionNumber * EPS > DOUBLE_COVARIANCE_LIMIT);
  if (wantExtended) {
    const accurate = gramInverse(ah, al, columns);
    if (accurate) return { covariance: accurate, method: 'extended' };
  }
  return { covariance: inverseFromR(qr), method: 'double' };
}

/** (A^T A)^-1 via the double-double Gram matrix and Cholesky; null if not positive definite. */
export function gramInverse(ah: Float64Array[], al: Float64Array[], columns: number[]): MatrixDD | null {
  const k = columns.length;
  const mh = square(k);
  const ml = square(k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      const [h, l] = dotDD(ah[columns[a]], al[columns[a]], ah[columns[b]], al[columns[b]]);
      mh[a][b] = mh[b][a] = h;
      ml[a][b] = ml[b][a] = l;
    }
  }
  // Cholesky M = L L^T in double-double.
  const lh = square(k);
  const ll = square(k);
  for (let j = 0; j < k; j++) {
    let d: DD = [mh[j][j], ml[j][j]];
    for (let m = 0; m < j; m++) {
      const [ph, pl] = ddMul(lh[j][m], ll[j][m], lh[j][m], ll[j][m]);
      d = ddAdd(d[0], d[1], -ph, -pl);
    }
    if (!(d[0] > 0)) return null;
    const [sh, sl] = ddSqrtDD(d[0], d[1]);
    lh[j][j] = sh;
    ll[j][j] = sl;
    for (let i = j + 1; i < k; i++) {
      let s: DD = [mh[i][j], ml[i][j]];
      for (let m = 0; m < j; m++) {
        const [ph, pl] = ddMul(lh[i][m], ll[i][m], lh[j][m], ll[j][m]);
        s = ddAdd(s[0], s[1], -ph, -pl);
      }
      [lh[i][j], ll[i][j]] = ddDiv(s[0], s[1], sh, sl);
    }
  }
  // L^-1 (lower triangular) by forward substitution, then C = L^-T L^-1.
  const ih = square(k);
  const il = square(k);
  for (let c = 0; c < k; c++) {
    for (let i = c; i < k; i++) {
      let s: DD = [i === c ? 1 : 0, 0];
      for (let m = c; m < i; m++) {
        const [ph, pl] = ddMul(lh[i][m], ll[i][m], ih[m][c], il[m][c]);
        s = ddAdd(s[0], s[1], -ph, -pl);
      }
      [ih[i][c], il[i][c]] = ddDiv(s[0], s[1], lh[i][i], ll[i][i]);
    }
  }
  const ch = square(k);
  const cl = square(k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      let s: DD = [0, 0];
      for (let m = b; m < k; m++) {
        const [ph, pl] = ddMul(ih[m][a], il[m][a], ih[m][b], il[m][b]);
        s = ddAdd(s[0], s[1], ph, pl);
      }
      ch[a][b] = ch[b][a] = s[0];
      cl[a][b] = cl[b][a] = s[1];
    }
  }
  return { hi: ch, lo: cl };
}

/** (R^T R)^-1 = R^-1 R^-T in double, lo parts zero. */
export function inverseFromR(qr: HouseholderQR): MatrixDD {
  const k = qr.rank;
  // U = R^-1 (upper triangular), column by column.
  const u = square(k);
  for (let c = 0; c < k; c++) {
    u[c][c] = 1 / qr.rdiag[c];
    for (let i = c - 1; i >= 0; i--) {
      let s = 0;
      for (let m = i + 1; m <= c; m++) s += rEntry(qr, i, m) * u[m][c];
      u[i][c] = -s / qr.rdiag[i];
    }
  }
  const hi = square(k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      let s = 0;
      for (let m = b; m < k; m++) s += u[a][m] * u[b][m];
      hi[a][b] = hi[b][a] = s;
    }
  }
  return { hi, lo: square(k) };
}

function square(k: number): number[][] {
  return Array.from({ length: k }, () => new Array<number>(k).fill(0));
}
