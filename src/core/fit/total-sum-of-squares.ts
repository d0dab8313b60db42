// Total sum of squares of the response, in double-double: sum w (y - ybar_w)^2
// with an intercept, sum w y^2 without. The arithmetic is that of ddAdd, ddSub,
// ddMul and ddMulDouble (src/core/numeric/double-double.ts) written out in the
// loop, operation for operation, because the tuple-returning calls cost more than
// the arithmetic at 10^5 rows; the result is bit-identical to composing them.

import { ddDiv, splitHigh } from '../numeric/double-double.ts';

/** Weight of row i: a weight that is not a positive finite number counts as 0. */
function rowWeight(weights: Float64Array | undefined, i: number): number {
  if (!weights) return 1;
  const v = weights[i];
  return v > 0 && Number.isFinite(v) ? v : 0;
}

export function totalSumOfSquares(
  intercept: boolean,
  y: Float64Array,
  weights: Float64Array | undefined,
  weightTotal: number,
): number {
  const n = y.length;
  let mh = 0;
  let ml = 0;
  if (intercept && weightTotal > 0) {
    // s += y w and total += w, each as ddAdd(s, ddMulDouble(y, 0, w)).
    let sh = 0;
    let sl = 0;
    let th = 0;
    let tl = 0;
    for (let i = 0; i < n; i++) {
      const w = rowWeight(weights, i);
      const [ph, pl] = productDouble(y[i], 0, w);
      [sh, sl] = add(sh, sl, ph, pl);
      [th, tl] = add(th, tl, w, 0);
    }
    [mh, ml] = ddDiv(sh, sl, th, tl);
  }
  let th = 0;
  let tl = 0;
  for (let i = 0; i < n; i++) {
    const w = rowWeight(weights, i);
    if (w === 0) continue;
    // d = y - mean (ddSub), q = d * d (ddMul), p = q * w (ddMulDouble), t += p (ddAdd).
    const [dh, dl] = add(y[i], 0, -mh, -ml);
    const q = dh * dh;
    const d1 = splitHigh(dh);
    const d2 = dh - d1;
    const qe = d1 * d1 - q + d1 * d2 + d2 * d1 + d2 * d2;
    const qs = qe + (dh * dl + dl * dh);
    const qh = q + qs;
    const ql = qs - (qh - q);
    const [ph, pl] = productDouble(qh, ql, w);
    [th, tl] = add(th, tl, ph, pl);
  }
  return th;
}

/** ddMulDouble: (ah + al) * b. */
function productDouble(ah: number, al: number, b: number): [number, number] {
  const p = ah * b;
  const a1 = splitHigh(ah);
  const a2 = ah - a1;
  const b1 = splitHigh(b);
  const b2 = b - b1;
  const e = a1 * b1 - p + a1 * b2 + a2 * b1 + a2 * b2 + al * b;
  const h = p + e;
  return [h, e - (h - p)];
}

/** ddAdd, the accurate variant. */
function add(ah: number, al: number, bh: number, bl: number): [number, number] {
  let s = ah + bh;
  let bb = s - ah;
  let e = ah - (s - bb) + (bh - bb);
  const t = al + bl;
  bb = t - al;
  const f = al - (t - bb) + (bl - bb);
  e += t;
  let h = s + e;
  e = e - (h - s);
  s = h;
  e += f;
  h = s + e;
  return [h, e - (h - s)];
}
