// The textbook baseline: Householder QR of the raw double design (high parts
// only), no centring or scaling, no refinement, covariance R^-1 R^-T in double.
// Not used by the service; tests and scripts/lre-table.ts measure it beside
// fitLeastSquares to show what equilibration and refinement are worth.

import type { DesignMatrix } from '../types.ts';
import { householderQR, applyQt, solveUpper } from './householder-qr.ts';
import { inverseFromR } from './covariance.ts';

export interface PlainFit {
  rank: number;
  coefficients: number[];
  standardErrors: number[];
  rss: number;
  tss: number;
  sigma: number | null;
}

export function fitPlainHouseholder(design: DesignMatrix, y: Float64Array): PlainFit {
  const n = design.rows;
  const p = design.labels.length;
  const candidates = Array.from({ length: p }, (_, j) => j);
  const norms = design.high.map((col) => Math.hypot(...col));
  const qr = householderQR(design.high, n, candidates, norms, 0);
  const z = Float64Array.from(y);
  applyQt(qr, z);
  const x = z.slice(0, qr.rank);
  solveUpper(qr, x);
  const coefficients = new Array<number>(p).fill(NaN);
  qr.order.slice(0, qr.rank).forEach((c, k) => (coefficients[candidates[c]] = x[k]));
  let rss = 0;
  for (let i = 0; i < n; i++) {
    let f = 0;
    for (let j = 0; j < p; j++) if (!Number.isNaN(coefficients[j])) f += design.high[j][i] * coefficients[j];
    rss += (y[i] - f) ** 2;
  }
  let mean = 0;
  if (design.intercept) {
    for (let i = 0; i < n; i++) mean += y[i];
    mean /= n;
  }
  let tss = 0;
  for (let i = 0; i < n; i++) tss += (y[i] - mean) ** 2;
  const sigma = n > qr.rank ? Math.sqrt(rss / (n - qr.rank)) : null;
  const cov = inverseFromR(qr);
  const standardErrors = new Array<number>(p).fill(NaN);
  qr.order.slice(0, qr.rank).forEach((c, k) => {
    standardErrors[candidates[c]] = (sigma ?? NaN) * Math.sqrt(cov.hi[k][k]);
  });
  return { rank: qr.rank, coefficients, standardErrors, rss, tss, sigma };
}
