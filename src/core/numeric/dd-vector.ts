// Double-double kernels on typed arrays for the O(n p) passes of iterative
// refinement and the Gram matrix. They are written out inline (no tuples) because
// they run millions of times per fit. Accumulation follows Ogita, Rump & Oishi
// (2005) "Dot2": products and partial sums are error-free, the error terms are
// summed in double, so the result is as accurate as if computed in twice the
// working precision and then rounded (error ~ eps^2 * n * sum|terms|).

import { split } from './double-double.ts';

const SPLITTER = 134217729;

/**
 * (fh + fl) -= (ah + al) * (xh + xl), elementwise over i, in double-double.
 * Entries of ah must be below 6.7e299 in magnitude (equilibrated columns are <= 1).
 */
export function subtractScaledColumn(
  fh: Float64Array, fl: Float64Array,
  ah: Float64Array, al: Float64Array,
  xh: number, xl: number,
): void {
  const [x1, x2] = split(xh);
  const n = fh.length;
  for (let i = 0; i < n; i++) {
    const a = ah[i];
    const p = a * xh;
    const t = SPLITTER * a;
    const a1 = t - (t - a);
    const a2 = a - a1;
    const e = a1 * x1 - p + a1 * x2 + a2 * x1 + a2 * x2 + (a * xl + al[i] * xh);
    const h = fh[i];
    const s = h - p;
    const bb = s - h;
    const lo = fl[i] + (h - (s - bb) + (-p - bb)) - e;
    const hi = s + lo;
    fl[i] = lo - (hi - s);
    fh[i] = hi;
  }
}

/**
 * sum_i (ah_i + al_i)(rh_i + rl_i) as [hi, lo]. Entries of ah and rh must be
 * below 6.7e299 in magnitude.
 */
export function dotDD(ah: Float64Array, al: Float64Array, rh: Float64Array, rl: Float64Array): [number, number] {
  let sh = 0;
  let sl = 0;
  const n = ah.length;
  for (let i = 0; i < n; i++) {
    const a = ah[i];
    const r = rh[i];
    const p = a * r;
    let t = SPLITTER * a;
    const a1 = t - (t - a);
    const a2 = a - a1;
    t = SPLITTER * r;
    const r1 = t - (t - r);
    const r2 = r - r1;
    const e = a1 * r1 - p + a1 * r2 + a2 * r1 + a2 * r2 + (a * rl[i] + al[i] * r);
    const s = sh + p;
    const bb = s - sh;
    sl += sh - (s - bb) + (p - bb) + e;
    sh = s;
  }
  const hi = sh + sl;
  return [hi, sl - (hi - sh)];
}

/** (fh + fl) <- (fh + fl) + (dh) elementwise, a double correction added in double-double. */
export function addCorrection(fh: Float64Array, fl: Float64Array, d: Float64Array): void {
  const n = fh.length;
  for (let i = 0; i < n; i++) {
    const h = fh[i];
    const v = d[i];
    const s = h + v;
    const bb = s - h;
    const lo = fl[i] + (h - (s - bb) + (v - bb));
    const hi = s + lo;
    fl[i] = lo - (hi - s);
    fh[i] = hi;
  }
}

/** sum_i (h_i + l_i)^2 as [hi, lo]. */
export function sumSquaresDD(h: Float64Array, l: Float64Array): [number, number] {
  return dotDD(h, l, h, l);
}

/** (fh + fl) <- (ah + al) - (bh + bl) elementwise, accurately (QD's "IEEE" add). */
export function differenceDD(
  ah: Float64Array, al: Float64Array, bh: Float64Array, bl: Float64Array,
  fh: Float64Array, fl: Float64Array,
): void {
  const n = ah.length;
  for (let i = 0; i < n; i++) {
    const x = ah[i];
    const y = -bh[i];
    const s = x + y;
    const sb = s - x;
    const e = x - (s - sb) + (y - sb);
    const u = al[i];
    const v = -bl[i];
    const t = u + v;
    const tb = t - u;
    const f = u - (t - tb) + (v - tb);
    const e1 = e + t;
    const h1 = s + e1;
    const l1 = e1 - (h1 - s) + f;
    const h2 = h1 + l1;
    fl[i] = l1 - (h2 - h1);
    fh[i] = h2;
  }
}

/** sum_i w_i (h_i + l_i) as [hi, lo] (w null: all ones). */
export function weightedSumDD(h: Float64Array, l: Float64Array, w: Float64Array | null): [number, number] {
  let sh = 0;
  let sl = 0;
  const n = h.length;
  for (let i = 0; i < n; i++) {
    let p = h[i];
    let e = l[i];
    if (w) {
      const wi = w[i];
      const a = p;
      p = a * wi;
      let t = SPLITTER * a;
      const a1 = t - (t - a);
      const a2 = a - a1;
      t = SPLITTER * wi;
      const w1 = t - (t - wi);
      const w2 = wi - w1;
      e = a1 * w1 - p + a1 * w2 + a2 * w1 + a2 * w2 + e * wi;
    }
    const s = sh + p;
    const bb = s - sh;
    sl += sh - (s - bb) + (p - bb) + e;
    sh = s;
  }
  const hi = sh + sl;
  return [hi, sl - (hi - sh)];
}

/**
 * (outH + outL)_i = ((h_i + l_i) - (mh + ml)) * (sh_i + sl_i) in double-double;
 * s null means no row scaling. Entries must be below 6.7e299 in magnitude.
 */
export function centreAndScaleRows(
  h: Float64Array, l: Float64Array, mh: number, ml: number,
  sh: Float64Array | null, sl: Float64Array | null,
  outH: Float64Array, outL: Float64Array,
): void {
  const n = h.length;
  for (let i = 0; i < n; i++) {
    // (h + l) - (mh + ml), accurate double-double subtraction.
    const x = h[i];
    const s = x - mh;
    const sb = s - x;
    const e = x - (s - sb) + (-mh - sb);
    const u = l[i];
    const t = u - ml;
    const tb = t - u;
    const f = u - (t - tb) + (-ml - tb);
    const e1 = e + t;
    const h1 = s + e1;
    const l1 = e1 - (h1 - s) + f;
    let ch = h1 + l1;
    let cl = l1 - (ch - h1);
    if (sh) {
      const bh = sh[i];
      const bl = sl![i];
      const p = ch * bh;
      let tt = SPLITTER * ch;
      const a1 = tt - (tt - ch);
      const a2 = ch - a1;
      tt = SPLITTER * bh;
      const b1 = tt - (tt - bh);
      const b2 = bh - b1;
      const pe = a1 * b1 - p + a1 * b2 + a2 * b1 + a2 * b2 + (ch * bl + cl * bh);
      ch = p + pe;
      cl = pe - (ch - p);
    }
    outH[i] = ch;
    outL[i] = cl;
  }
}

/** Rows per tile of refinementResiduals: four n-vectors' tiles (128 KiB) stay in cache. */
const RESIDUAL_TILE = 4096;

/**
 * Refinement residuals of the augmented least-squares system, in double-double:
 *   (fh + fl) = (bh + bl) - (rh + rl) - sum_c (ah_c + al_c)(xh_c + xl_c),
 *   g_c = -hi(sum_i (ah_c,i + al_c,i)(rh_i + rl_i)).
 * The same arithmetic as differenceDD, then subtractScaledColumn and dotDD per
 * column, in the same order per entry and per column (bit-identical), but swept
 * over row tiles with f and g formed in one pass, so the design is read once and
 * f and r stay in cache. Entries of ah and rh must be below 6.7e299 in magnitude.
 */
export function refinementResiduals(
  ah: Float64Array[], al: Float64Array[],
  xh: Float64Array, xl: Float64Array,
  bh: Float64Array, bl: Float64Array,
  rh: Float64Array, rl: Float64Array,
  fh: Float64Array, fl: Float64Array,
  g: Float64Array,
): void {
  const n = fh.length;
  const k = ah.length;
  differenceDD(bh, bl, rh, rl, fh, fl);
  const x1 = new Float64Array(k);
  const x2 = new Float64Array(k);
  for (let c = 0; c < k; c++) [x1[c], x2[c]] = split(xh[c]);
  const gh = new Float64Array(k);
  const gl = new Float64Array(k);
  for (let start = 0; start < n; start += RESIDUAL_TILE) {
    const end = Math.min(n, start + RESIDUAL_TILE);
    for (let c = 0; c < k; c++) {
      const a_ = ah[c];
      const al_ = al[c];
      const xc = xh[c];
      const xlc = xl[c];
      const xc1 = x1[c];
      const xc2 = x2[c];
      let sh = gh[c];
      let sl = gl[c];
      for (let i = start; i < end; i++) {
        const a = a_[i];
        const alo = al_[i];
        const t = SPLITTER * a;
        const a1 = t - (t - a);
        const a2 = a - a1;
        // f_i -= a x (subtractScaledColumn).
        const p = a * xc;
        const e = a1 * xc1 - p + a1 * xc2 + a2 * xc1 + a2 * xc2 + (a * xlc + alo * xc);
        const h = fh[i];
        const s = h - p;
        const bb = s - h;
        const lo = fl[i] + (h - (s - bb) + (-p - bb)) - e;
        const hi = s + lo;
        fl[i] = lo - (hi - s);
        fh[i] = hi;
        // g_c += a r (dotDD).
        const r = rh[i];
        const q = a * r;
        const u = SPLITTER * r;
        const r1 = u - (u - r);
        const r2 = r - r1;
        const eq = a1 * r1 - q + a1 * r2 + a2 * r1 + a2 * r2 + (a * rl[i] + alo * r);
        const sq = sh + q;
        const bq = sq - sh;
        sl += sh - (sq - bq) + (q - bq) + eq;
        sh = sq;
      }
      gh[c] = sh;
      gl[c] = sl;
    }
  }
  for (let c = 0; c < k; c++) g[c] = -(gh[c] + gl[c]);
}
