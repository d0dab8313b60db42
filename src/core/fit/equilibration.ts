// Column equilibration of the weighted design before factorisation.
//
// The solver works on A = W^{1/2} (X - 1 m^T) D and b = W^{1/2} y, where m holds
// the weighted column means (0 for the intercept and for designs without one)
// and D = diag(2^-e_j) brings every column to a norm in (1/2, 1]. Centring removes
// the near-collinearity of raw columns with the intercept (Filip's powers of x);
// powers of two make the scaling exact in binary, so D changes no digit. A is held
// in double-double (hi + lo), because iterative refinement must see the exact
// design, and the map back to the caller's basis (beta = T D gamma) is exact
// algebra carried out in double-double.

import type { DesignMatrix } from '../types.ts';
import { ddDiv, splitHigh } from '../numeric/double-double.ts';
import { centreAndScaleRows, weightedSumDD } from '../numeric/dd-vector.ts';

export interface EquilibratedProblem {
  rows: number;
  cols: number;
  /** Column j of A is ah[j] + al[j]. */
  ah: Float64Array[];
  al: Float64Array[];
  /** b = c sqrt(w) y as bh + bl, with c = responseScale. */
  bh: Float64Array;
  bl: Float64Array;
  /** sqrt(w_i) as sh + sl; null when unweighted (all 1). */
  sh: Float64Array | null;
  sl: Float64Array | null;
  /** Index of the intercept column that the others were centred against, or -1. */
  interceptColumn: number;
  /** Weighted column means as mh + ml (0 for the intercept and when not centred). */
  mh: Float64Array;
  ml: Float64Array;
  /**
   * Power of two c bringing max |b_i| into (1/2, 1], so that refinement's
   * double-double kernels never split numbers near overflow; exact, undone at the end.
   */
  responseScale: number;
  /** Exact power-of-two column scale factors. */
  scale: Float64Array;
  /** Norm of each column of A (about 1, 0 for an all-zero column). */
  norm: Float64Array;
  /**
   * Columns that centring alone reduces to rounding level: their centred norm is
   * below tolerance times their uncentred norm, i.e. the intercept explains them.
   */
  aliasedByIntercept: boolean[];
  /** Sum of the weights of the rows with positive weight, and their count. */
  weightTotal: number;
  positiveRows: number;
}

/** Index of the intercept column when it is a nonzero constant column, else -1. */
function findIntercept(design: DesignMatrix): number {
  if (!design.intercept) return -1;
  const j = design.termOfColumn.indexOf(-1);
  if (j < 0) return -1;
  const hi = design.high[j];
  const lo = design.low[j];
  const c = design.rows > 0 ? hi[0] : 1;
  if (!(c !== 0 && Number.isFinite(c))) return -1;
  for (let i = 0; i < design.rows; i++) if (hi[i] !== c || lo[i] !== 0) return -1;
  return j;
}

/** 2^-e with 2^e the smallest power of two >= norm (1 for a zero or non-finite norm). */
function powerOfTwoScale(norm: number): number {
  if (!(norm > 0) || !Number.isFinite(norm)) return 1;
  let e = Math.ceil(Math.log2(norm));
  // log2 may be off by one near exact powers of two; settle it exactly.
  if (Math.pow(2, e - 1) >= norm) e -= 1;
  if (Math.pow(2, e) < norm) e += 1;
  return Math.pow(2, -e);
}

export function equilibrate(
  design: DesignMatrix,
  y: Float64Array,
  weights: Float64Array | undefined,
  aliasTolerance: number,
): EquilibratedProblem {
  const n = design.rows;
  const p = design.labels.length;
  // Weights: a non-positive or non-finite weight takes the row out of the fit.
  let sh: Float64Array | null = null;
  let sl: Float64Array | null = null;
  const w = new Float64Array(n);
  let weightTotal = 0;
  let positiveRows = 0;
  if (weights) {
    sh = new Float64Array(n);
    sl = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const wi = weights[i];
      if (wi > 0 && Number.isFinite(wi)) {
        w[i] = wi;
        // ddSqrt(wi) written out (no tuple per row): s + (wi - s^2) / (2 s), with
        // wi - s^2 exact as (wi - p) - e. sqrt of a double is far below split's limit.
        const s = Math.sqrt(wi);
        if (!(s > 0) || !Number.isFinite(s)) {
          sh[i] = s;
          sl[i] = 0;
        } else {
          const p = s * s;
          const s1 = splitHigh(s);
          const s2 = s - s1;
          const e = s1 * s1 - p + s1 * s2 + s2 * s1 + s2 * s2;
          const c = (wi - p - e) / (2 * s);
          const h = s + c;
          sh[i] = h;
          sl[i] = c - (h - s);
        }
        weightTotal += wi;
        positiveRows++;
      }
    }
  } else {
    w.fill(1);
    weightTotal = n;
    positiveRows = n;
  }

  const interceptColumn = findIntercept(design);
  const mh = new Float64Array(p);
  const ml = new Float64Array(p);
  if (interceptColumn >= 0 && weightTotal > 0) {
    // Weighted means in double-double, so that centring itself loses nothing.
    const [wh, wl] = weights ? weightedSumDD(w, new Float64Array(n), null) : [n, 0];
    for (let j = 0; j < p; j++) {
      if (j === interceptColumn) continue;
      const [th, tl] = weightedSumDD(design.high[j], design.low[j], weights ? w : null);
      [mh[j], ml[j]] = ddDiv(th, tl, wh, wl);
    }
  }

  const ah: Float64Array[] = [];
  const al: Float64Array[] = [];
  const scale = new Float64Array(p);
  const norm = new Float64Array(p);
  const aliasedByIntercept: boolean[] = new Array(p).fill(false);
  for (let j = 0; j < p; j++) {
    const hi = design.high[j];
    const lo = design.low[j];
    const ch = new Float64Array(n);
    const cl = new Float64Array(n);
    centreAndScaleRows(hi, lo, mh[j], ml[j], sh, sl, ch, cl);
    // Two power-of-two steps: by the largest entry (so squares cannot overflow),
    // then by the norm; the product is still an exact power of two.
    const sums = unscaledSums(ch, hi, sh, weights ? w : null);
    const d0 = powerOfTwoScale(sums.maxAbs);
    let ss: number;
    let ssRaw: number;
    if (sums.normalRange) {
      // Every square, scaled or not, is a normal number, so scaling by the power
      // of two d0 commutes with each rounding: the same sums as below, exactly.
      ss = sums.ss * d0 * d0;
      ssRaw = sums.ssRaw * d0 * d0;
    } else {
      ss = 0;
      ssRaw = 0;
      for (let i = 0; i < n; i++) {
        const v = ch[i] * d0;
        ss += v * v;
        const raw = (sh ? hi[i] * sh[i] : w[i] === 0 ? 0 : hi[i]) * d0;
        ssRaw += raw * raw;
      }
    }
    const d1 = powerOfTwoScale(Math.sqrt(ss));
    const d = d0 * d1;
    for (let i = 0; i < n; i++) {
      ch[i] *= d;
      cl[i] *= d;
    }
    ah.push(ch);
    al.push(cl);
    scale[j] = d;
    norm[j] = Math.sqrt(ss) * d1;
    if (interceptColumn >= 0 && j !== interceptColumn) {
      aliasedByIntercept[j] = !(Math.sqrt(ss) > aliasTolerance * Math.sqrt(ssRaw));
    }
  }

  const bh = new Float64Array(n);
  const bl = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (w[i] === 0) continue;
    if (sh) {
      // ddMulDouble(sh, sl, y) written out.
      const a = sh[i];
      const b = y[i];
      const p = a * b;
      const a1 = splitHigh(a);
      const a2 = a - a1;
      const b1 = splitHigh(b);
      const b2 = b - b1;
      const e = a1 * b1 - p + a1 * b2 + a2 * b1 + a2 * b2 + sl![i] * b;
      const h = p + e;
      bh[i] = h;
      bl[i] = e - (h - p);
    } else bh[i] = y[i];
  }
  let bMax = 0;
  for (let i = 0; i < n; i++) bMax = Math.max(bMax, Math.abs(bh[i]));
  const responseScale = powerOfTwoScale(bMax);
  for (let i = 0; i < n; i++) {
    bh[i] *= responseScale;
    bl[i] *= responseScale;
  }
  return {
    rows: n, cols: p, ah, al, bh, bl, sh, sl, interceptColumn, mh, ml, responseScale, scale, norm,
    aliasedByIntercept, weightTotal, positiveRows,
  };
}

/** |x| within [2^-250, 2^250] (or 0): its square, and its square times any such power of two squared, are normal. */
const SAFE_LOW = 2 ** -250;
const SAFE_HIGH = 2 ** 250;

/**
 * One pass: the largest |c_i|, and sum c_i^2 and sum raw_i^2 without scaling
 * (raw_i = hi_i s_i, or hi_i when unweighted, 0 where the weight is 0), and
 * whether every nonzero c_i and raw_i lies in the safe range.
 */
function unscaledSums(
  c: Float64Array, hi: Float64Array, sh: Float64Array | null, w: Float64Array | null,
): { maxAbs: number; ss: number; ssRaw: number; normalRange: boolean } {
  let maxAbs = 0;
  let ss = 0;
  let ssRaw = 0;
  let inRange = true;
  const n = c.length;
  for (let i = 0; i < n; i++) {
    const v = c[i];
    const a = Math.abs(v);
    maxAbs = Math.max(maxAbs, a);
    ss += v * v;
    const raw = sh ? hi[i] * sh[i] : w !== null && w[i] === 0 ? 0 : hi[i];
    ssRaw += raw * raw;
    const r = Math.abs(raw);
    if ((a !== 0 && (a < SAFE_LOW || a > SAFE_HIGH)) || (r !== 0 && (r < SAFE_LOW || r > SAFE_HIGH))) inRange = false;
  }
  return { maxAbs, ss, ssRaw, normalRange: inRange && maxAbs > 0 };
}
