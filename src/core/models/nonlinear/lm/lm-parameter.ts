// The Levenberg–Marquardt parameter of Moré (1978, "The Levenberg–Marquardt
// algorithm: implementation and theory", Springer LNM 630, Numerical Analysis, ed. G. A. Watson),
// sections 5–7, as in MINPACK's lmpar and qrsolv: given J P = Q R, the scaling
// D and a trust-region radius Δ, find λ >= 0 with
//   x(λ) = argmin ||J x + f||² + λ ||D x||²,
// such that either λ = 0 and ||D x(0)|| <= 1.1 Δ (the Gauss–Newton step fits),
// or | ||D x(λ)|| - Δ | <= 0.1 Δ. λ is found by Newton's method on
// φ(λ) = ||D x(λ)|| - Δ, safeguarded by bounds [l, u] that always contain the
// root, at most 10 iterations. Each x(λ) is solved from (R; sqrt(λ) D P) by
// Givens rotations on R alone (O(p²) per λ, never touching the n rows).
import type { PivotedQR } from './pivoted-qr.ts';

const DWARF = Number.MIN_VALUE * 2 ** 52; // smallest normal double, 2.2e-308

export interface LmStep {
  /** The step x(λ) in the columns' own order (not pivoted). */
  step: Float64Array;
  lambda: number;
  /** ||D step||. */
  scaledNorm: number;
}

/**
 * Solves (R; sqrt(λ) D P) z = (Q^T f; 0) in the least-squares sense and
 * returns the step -P z. `sdiag` receives the diagonal of the triangular S
 * with S'S = P'(J'J + λ D²)P; S's strict lower part overwrites R's (R's upper
 * triangle and diagonal are kept).
 */
function dampedSolve(qr: PivotedQR, d: Float64Array, sdiag: Float64Array, out: Float64Array): void {
  const { cols: q, r, pivot, qtf } = qr;
  const rdiag = new Float64Array(q);
  const wa = qtf.slice();
  for (let j = 0; j < q; j++) {
    for (let i = j; i < q; i++) r[i * q + j] = r[j * q + i];
    rdiag[j] = r[j * q + j];
  }
  for (let j = 0; j < q; j++) {
    const dj = d[pivot[j]];
    if (dj !== 0) {
      for (let k = j; k < q; k++) sdiag[k] = 0;
      sdiag[j] = dj;
      let qtbpj = 0;
      for (let k = j; k < q; k++) {
        if (sdiag[k] === 0) continue;
        const rkk = r[k * q + k];
        let sin: number;
        let cos: number;
        if (Math.abs(rkk) < Math.abs(sdiag[k])) {
          const cotan = rkk / sdiag[k];
          sin = 0.5 / Math.sqrt(0.25 + 0.25 * cotan * cotan);
          cos = sin * cotan;
        } else {
          const tan = sdiag[k] / rkk;
          cos = 0.5 / Math.sqrt(0.25 + 0.25 * tan * tan);
          sin = cos * tan;
        }
        r[k * q + k] = cos * rkk + sin * sdiag[k];
        const t = cos * wa[k] + sin * qtbpj;
        qtbpj = -sin * wa[k] + cos * qtbpj;
        wa[k] = t;
        for (let i = k + 1; i < q; i++) {
          const rik = r[i * q + k];
          const u = cos * rik + sin * sdiag[i];
          sdiag[i] = -sin * rik + cos * sdiag[i];
          r[i * q + k] = u;
        }
      }
    }
    sdiag[j] = r[j * q + j];
    r[j * q + j] = rdiag[j];
  }
  let nsing = q;
  for (let j = 0; j < q; j++) {
    if (sdiag[j] === 0 && nsing === q) nsing = j;
    if (nsing < q) wa[j] = 0;
  }
  for (let j = nsing - 1; j >= 0; j--) {
    let s = 0;
    for (let i = j + 1; i < nsing; i++) s += r[i * q + j] * wa[i];
    wa[j] = (wa[j] - s) / sdiag[j];
  }
  for (let j = 0; j < q; j++) out[pivot[j]] = -wa[j];
}

function scaledNorm(d: Float64Array, x: Float64Array): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += (d[j] * x[j]) ** 2;
  return Math.sqrt(s);
}

/**
 * The damped step for radius `delta`, starting the search for λ from
 * `lambda` (the previous iteration's value). `d` is indexed like the columns.
 */
export function lmParameter(qr: PivotedQR, d: Float64Array, delta: number, lambda: number): LmStep {
  const { cols: q, r, pivot, qtf } = qr;
  const step = new Float64Array(q);
  const wa1 = new Float64Array(q);
  const wa2 = new Float64Array(q);
  const sdiag = new Float64Array(q);

  // Gauss–Newton direction (minimum-norm on the leading nonsingular block).
  let nsing = q;
  for (let j = 0; j < q; j++) {
    wa1[j] = qtf[j];
    if (r[j * q + j] === 0 && nsing === q) nsing = j;
    if (nsing < q) wa1[j] = 0;
  }
  for (let j = nsing - 1; j >= 0; j--) {
    wa1[j] /= r[j * q + j];
    const t = wa1[j];
    for (let i = 0; i < j; i++) wa1[i] -= r[i * q + j] * t;
  }
  for (let j = 0; j < q; j++) step[pivot[j]] = -wa1[j];

  let dxnorm = scaledNorm(d, step);
  let fp = dxnorm - delta;
  if (fp <= 0.1 * delta) return { step, lambda: 0, scaledNorm: dxnorm };

  // Lower bound from the Newton step at λ = 0 (only when R is nonsingular).
  let lower = 0;
  if (nsing >= q) {
    for (let j = 0; j < q; j++) {
      const l = pivot[j];
      wa1[j] = d[l] * ((d[l] * -step[l]) / dxnorm);
    }
    for (let j = 0; j < q; j++) {
      let s = 0;
      for (let i = 0; i < j; i++) s += r[i * q + j] * wa1[i];
      wa1[j] = (wa1[j] - s) / r[j * q + j];
    }
    const t = norm(wa1);
    lower = fp / delta / t / t;
  }
  // Upper bound: ||D^-1 J'f|| / Δ.
  for (let j = 0; j < q; j++) {
    let s = 0;
    for (let i = 0; i <= j; i++) s += r[i * q + j] * qtf[i];
    wa1[j] = s / d[pivot[j]];
  }
  const gnorm = norm(wa1);
  let upper = gnorm / delta;
  if (upper === 0) upper = DWARF / Math.min(delta, 0.1);

  let par = Math.min(Math.max(lambda, lower), upper);
  if (par === 0) par = gnorm / dxnorm;

  for (let iteration = 1; ; iteration++) {
    if (par === 0) par = Math.max(DWARF, 0.001 * upper);
    const sq = Math.sqrt(par);
    for (let j = 0; j < q; j++) wa1[j] = sq * d[j];
    dampedSolve(qr, wa1, sdiag, step);
    for (let j = 0; j < q; j++) wa2[j] = d[j] * step[j];
    dxnorm = norm(wa2);
    const previous = fp;
    fp = dxnorm - delta;
    if (Math.abs(fp) <= 0.1 * delta || (lower === 0 && fp <= previous && previous < 0) || iteration === 10) break;
    // Newton correction of λ.
    for (let j = 0; j < q; j++) {
      const l = pivot[j];
      wa1[j] = d[l] * (-wa2[l] / dxnorm);
    }
    for (let j = 0; j < q; j++) {
      wa1[j] /= sdiag[j];
      const t = wa1[j];
      for (let i = j + 1; i < q; i++) wa1[i] -= r[i * q + j] * t;
    }
    const t = norm(wa1);
    const correction = fp / delta / t / t;
    if (fp > 0) lower = Math.max(lower, par);
    if (fp < 0) upper = Math.min(upper, par);
    par = Math.max(lower, par + correction);
  }
  return { step, lambda: par, scaledNorm: dxnorm };
}

function norm(x: Float64Array): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += x[j] * x[j];
  return Math.sqrt(s);
}
