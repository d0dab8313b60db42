// Iterative refinement of the least-squares solution on the augmented system
//
//     [ I   A ] [ r ]   [ b ]
//     [ A^T 0 ] [ x ] = [ 0 ]
//
// after Björck (1967), "Iterative refinement of linear least squares solutions I",
// BIT 7. Residuals f = b - r - A x and g = -A^T r are formed in double-double
// with A the exact (hi + lo) equilibrated design; the corrections are solved with
// the double Householder QR. Refining x alone (residual b - A x, then a QR solve)
// cannot remove the error term proportional to kappa^2 * ||r|| that dominates
// large-residual problems (NIST Wampler4/5); refining r and x together does.
//
// With A = Q [R; 0] and Q^T f = [f1; f2], the correction system is solved by
//   R^T h = g,   R dx = f1 - h,   dr = Q [h; f2].

import { applyQ, applyQt, solveUpper, solveUpperTransposed, type HouseholderQR } from './householder-qr.ts';
import { addCorrection, refinementResiduals } from '../numeric/dd-vector.ts';

/** Correction size below which refinement stops: well under double-double's reach for x. */
export const REFINEMENT_TARGET = 1e-20;
/**
 * Cap on refinement steps. Each step gains about -log10(kappa * eps) digits;
 * at the largest condition the rank tolerance admits (~1e10) that is ~6 digits a
 * step, so 10 steps always suffice to reach the target or the noise floor.
 */
export const MAX_REFINEMENT_STEPS = 10;

export interface RefinedSolution {
  /** Solution in factorisation order, as xh + xl. */
  xh: Float64Array;
  xl: Float64Array;
  /** Residual b - A x per row, as rh + rl. */
  rh: Float64Array;
  rl: Float64Array;
  steps: number;
  lastCorrection: number;
}

/**
 * Solve min ||b - A x|| for the accepted columns `columns` (factorisation order)
 * of the equilibrated design, with up to `maxSteps` refinement steps after the
 * initial QR solve.
 */
export function refineLeastSquares(
  qr: HouseholderQR,
  ah: Float64Array[],
  al: Float64Array[],
  columns: number[],
  bh: Float64Array,
  bl: Float64Array,
  maxSteps: number,
): RefinedSolution {
  const n = qr.rows;
  const k = qr.rank;
  const xh = new Float64Array(k);
  const xl = new Float64Array(k);
  const rh = new Float64Array(n);
  const rl = new Float64Array(n);
  const fh = new Float64Array(n);
  const fl = new Float64Array(n);
  const g = new Float64Array(k);
  const acceptedH = columns.map((c) => ah[c]);
  const acceptedL = columns.map((c) => al[c]);
  let bNorm = 0;
  for (let i = 0; i < n; i++) bNorm += bh[i] * bh[i];
  bNorm = Math.sqrt(bNorm);

  // Initial solve: r = 0, x = 0, so f = b and g = 0 (the plain QR solution).
  fh.set(bh);
  let { dr, dx } = solveCorrection(qr, fh, g);
  addCorrection(rh, rl, dr);
  addVector(xh, xl, dx);

  let steps = 0;
  let lastCorrection = 1;
  let previous = Infinity;
  while (steps < maxSteps) {
    // f = b - r - A x and g = -A^T r, both in double-double.
    refinementResiduals(acceptedH, acceptedL, xh, xl, bh, bl, rh, rl, fh, fl, g);
    ({ dr, dx } = solveCorrection(qr, fh, g));
    const correction = relativeSize(dx, xh, dr, bNorm);
    // A correction that does not shrink is rounding noise (or divergence when the
    // problem is too ill-conditioned for the double QR): leave the solution as it is.
    if (!(correction < previous)) {
      lastCorrection = correction;
      break;
    }
    addCorrection(rh, rl, dr);
    addVector(xh, xl, dx);
    steps++;
    lastCorrection = correction;
    previous = correction;
    if (correction <= REFINEMENT_TARGET) break;
  }
  return { xh, xl, rh, rl, steps, lastCorrection };
}

function solveCorrection(qr: HouseholderQR, f: Float64Array, g: Float64Array): { dr: Float64Array; dx: Float64Array } {
  const k = qr.rank;
  const z = Float64Array.from(f);
  applyQt(qr, z);
  const h = Float64Array.from(g);
  solveUpperTransposed(qr, h);
  const dx = new Float64Array(k);
  for (let c = 0; c < k; c++) dx[c] = z[c] - h[c];
  solveUpper(qr, dx);
  for (let c = 0; c < k; c++) z[c] = h[c];
  applyQ(qr, z);
  return { dr: z, dx };
}

/** max(|dx|_inf / |x|_inf, ||dr|| / ||b||), with zero denominators treated as 1. */
function relativeSize(dx: Float64Array, x: Float64Array, dr: Float64Array, bNorm: number): number {
  let dxMax = 0;
  let xMax = 0;
  for (let c = 0; c < dx.length; c++) {
    dxMax = Math.max(dxMax, Math.abs(dx[c]));
    xMax = Math.max(xMax, Math.abs(x[c]));
  }
  let drNorm = 0;
  for (let i = 0; i < dr.length; i++) drNorm += dr[i] * dr[i];
  drNorm = Math.sqrt(drNorm);
  const cx = dxMax / (xMax > 0 ? xMax : 1);
  const cr = drNorm / (bNorm > 0 ? bNorm : 1);
  return Math.max(cx, cr);
}

function addVector(xh: Float64Array, xl: Float64Array, d: Float64Array): void {
  addCorrection(xh, xl, d);
}
