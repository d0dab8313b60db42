// Double-double arithmetic: a value is the unevaluated sum hi + lo of two
// doubles with |lo| <= ulp(hi)/2, giving about 106 bits (~32 digits).
// Algorithms: Dekker (1971) and Knuth TAOCP vol. 2 for the error-free
// transformations; Hida, Li & Bailey (2001, "QD" library) for the
// renormalised add/mul/div and the exp argument reduction.
// JS has no fused multiply-add, so products use Dekker's split.

export type DD = [number, number];

/** 2^27 + 1: Dekker's splitting constant for 53-bit doubles. */
const SPLITTER = 134217729;
/** Above this magnitude SPLITTER * a overflows; split a scaled copy. */
const SPLIT_THRESHOLD = 6.69692879491417e299;
const TWO_M28 = 2 ** -28;
const TWO_28 = 2 ** 28;

/** s + e = a + b exactly, s = fl(a + b) (Knuth). */
export function twoSum(a: number, b: number): DD {
  const s = a + b;
  const bb = s - a;
  const e = a - (s - bb) + (b - bb);
  return [s, e];
}

/** s + e = a + b exactly, valid when |a| >= |b| or a = 0 (Dekker). */
export function quickTwoSum(a: number, b: number): DD {
  const s = a + b;
  return [s, b - (s - a)];
}

/** hi + lo = a with hi holding the top 26 bits (Dekker's split). */
export function split(a: number): DD {
  if (a > SPLIT_THRESHOLD || a < -SPLIT_THRESHOLD) {
    const as = a * TWO_M28;
    const t = SPLITTER * as;
    const hi = t - (t - as);
    const lo = as - hi;
    return [hi * TWO_28, lo * TWO_28];
  }
  const t = SPLITTER * a;
  const hi = t - (t - a);
  return [hi, a - hi];
}

/** split(a)[0] without the tuple, for row loops (the low part is a - high). */
export function splitHigh(a: number): number {
  if (a > SPLIT_THRESHOLD || a < -SPLIT_THRESHOLD) return split(a)[0];
  const t = SPLITTER * a;
  return t - (t - a);
}

/** p + e = a * b exactly, p = fl(a * b) (Dekker), barring under/overflow. */
export function twoProduct(a: number, b: number): DD {
  const p = a * b;
  const [ah, al] = split(a);
  const [bh, bl] = split(b);
  const e = ah * bh - p + ah * bl + al * bh + al * bl;
  return [p, e];
}

/** (ah + al) + (bh + bl), the accurate ("IEEE") variant of the QD library. */
export function ddAdd(ah: number, al: number, bh: number, bl: number): DD {
  let [s, e] = twoSum(ah, bh);
  const [t, f] = twoSum(al, bl);
  e += t;
  [s, e] = quickTwoSum(s, e);
  e += f;
  return quickTwoSum(s, e);
}

/** (ah + al) - (bh + bl). */
export function ddSub(ah: number, al: number, bh: number, bl: number): DD {
  return ddAdd(ah, al, -bh, -bl);
}

/** (ah + al) + b for a double b. */
export function ddAddDouble(ah: number, al: number, b: number): DD {
  const [s, e] = twoSum(ah, b);
  return quickTwoSum(s, e + al);
}

/** (ah + al) * (bh + bl). */
export function ddMul(ah: number, al: number, bh: number, bl: number): DD {
  const [p, e] = twoProduct(ah, bh);
  return quickTwoSum(p, e + (ah * bl + al * bh));
}

/** (ah + al) * b for a double b. */
export function ddMulDouble(ah: number, al: number, b: number): DD {
  const [p, e] = twoProduct(ah, b);
  return quickTwoSum(p, e + al * b);
}

/** (ah + al) / (bh + bl): three quotient digits, as in the QD library's accurate division. */
export function ddDiv(ah: number, al: number, bh: number, bl: number): DD {
  const q1 = ah / bh;
  let [rh, rl] = ddSub(ah, al, ...ddMulDouble(bh, bl, q1));
  const q2 = rh / bh;
  [rh, rl] = ddSub(rh, rl, ...ddMulDouble(bh, bl, q2));
  const q3 = rh / bh;
  const [s, e] = quickTwoSum(q1, q2);
  return ddAddDouble(s, e, q3);
}

/** 1 / x of a double x to double-double accuracy (one Newton correction). */
export function ddReciprocal(x: number): DD {
  const r = 1 / x;
  if (!Number.isFinite(r) || r === 0) return [r, 0];
  // 1 - r*x is exact as (1 - p) - e: p is within an ulp of 1 (Sterbenz).
  const [p, e] = twoProduct(r, x);
  return quickTwoSum(r, r * (1 - p - e));
}

/** sqrt(x) of a double x >= 0 to double-double accuracy (one Newton correction). */
export function ddSqrt(x: number): DD {
  const s = Math.sqrt(x);
  if (!(s > 0) || !Number.isFinite(s)) return [s, 0];
  // x - s^2 is exact as (x - p) - e: p is within an ulp of x (Sterbenz).
  const [p, e] = twoProduct(s, s);
  return quickTwoSum(s, (x - p - e) / (2 * s));
}

/** sqrt(hi + lo) to double-double accuracy. */
export function ddSqrtDD(hi: number, lo: number): DD {
  const s = Math.sqrt(hi);
  if (!(s > 0) || !Number.isFinite(s)) return [s, 0];
  const [p, e] = twoProduct(s, s);
  const [dh] = ddSub(hi, lo, p, e);
  return quickTwoSum(s, dh / (2 * s));
}

/** x^k for a double x and integer k >= 0, by binary powering in double-double. */
export function ddPowInt(x: number, k: number): DD {
  if (!Number.isInteger(k) || k < 0) return [NaN, 0];
  let rh = 1;
  let rl = 0;
  let bh = x;
  let bl = 0;
  let n = k;
  while (n > 0) {
    if (n & 1) [rh, rl] = ddMul(rh, rl, bh, bl);
    n = Math.floor(n / 2);
    if (n > 0) [bh, bl] = ddMul(bh, bl, bh, bl);
  }
  return [rh, rl];
}

// ln 2 as a double-double (QD library constants).
const LN2_HI = 6.931471805599452862e-1;
const LN2_LO = 2.319046813846299558e-17;

/** 1/k! for k = 3..14 in double-double, built by exact-ish dd division at load time. */
const INV_FACTORIAL: DD[] = (() => {
  const out: DD[] = [];
  let f: DD = [2, 0];
  for (let k = 3; k <= 14; k++) {
    f = ddMulDouble(f[0], f[1], k);
    out.push(ddDiv(1, 0, f[0], f[1]));
  }
  return out;
})();

/**
 * exp(ah + al) in double-double. Reduction as in the QD library:
 * a = k ln2 + r, exp(r) = (exp(r/512))^512 with expm1(r/512) by Taylor series,
 * squared up as expm1(2t) = 2 expm1(t) + expm1(t)^2 to keep the small part exact.
 */
export function ddExp(ah: number, al: number): DD {
  if (ah > 709.8) return [Infinity, 0];
  if (ah < -745.2) return [0, 0];
  if (ah === 0 && al === 0) return [1, 0];
  const k = Math.round(ah / LN2_HI);
  let [rh, rl] = ddSub(ah, al, ...twoProduct(k, LN2_HI));
  [rh, rl] = ddSub(rh, rl, ...twoProduct(k, LN2_LO));
  rh /= 512;
  rl /= 512;
  // expm1(r) = r + r^2/2 + r^3/3! + ... ; |r| <= 6.8e-4 so r^15/15! < 1e-60.
  let [ph, pl] = ddMul(rh, rl, rh, rl);
  let [sh, sl] = ddAdd(rh, rl, ph / 2, pl / 2);
  for (const [ch, cl] of INV_FACTORIAL) {
    [ph, pl] = ddMul(ph, pl, rh, rl);
    const [th, tl] = ddMul(ph, pl, ch, cl);
    [sh, sl] = ddAdd(sh, sl, th, tl);
    if (Math.abs(th) < 1e-36 * Math.abs(sh)) break;
  }
  for (let i = 0; i < 9; i++) {
    const [qh, ql] = ddMul(sh, sl, sh, sl);
    [sh, sl] = ddAdd(2 * sh, 2 * sl, qh, ql);
  }
  [sh, sl] = ddAddDouble(sh, sl, 1);
  return scaleByPowerOfTwo(sh, sl, k);
}

/** (hi + lo) * 2^k, exact unless the result under/overflows. */
function scaleByPowerOfTwo(hi: number, lo: number, k: number): DD {
  // Two steps so that 2^k itself never overflows or goes subnormal for |k| <= 1100.
  const k1 = Math.trunc(k / 2);
  const f1 = Math.pow(2, k1);
  const f2 = Math.pow(2, k - k1);
  return [hi * f1 * f2, lo * f1 * f2];
}

/**
 * ln x of a double x > 0 in double-double: y0 = Math.log(x), then one Newton
 * step y1 = y0 + x exp(-y0) - 1 with exp in double-double. The step squares the
 * relative error of y0 (~1e-16), so y1 is good to the dd exp's ~1e-32.
 * The absolute error is ~1e-32, so for x within 1e-10 of 1 the relative
 * accuracy of the small result is correspondingly less (still far beyond double).
 */
export function ddLog(x: number): DD {
  if (!(x > 0)) return [x === 0 ? -Infinity : NaN, 0];
  if (x === Infinity) return [Infinity, 0];
  if (x === 1) return [0, 0];
  const y0 = Math.log(x);
  const [eh, el] = ddExp(-y0, 0);
  const [th, tl] = ddMulDouble(eh, el, x);
  const [dh] = ddAddDouble(th, tl, -1);
  return quickTwoSum(y0, dh);
}

/** Sum of a list of doubles in double-double (compensated summation). */
export function ddSum(values: ArrayLike<number>): DD {
  let sh = 0;
  let sl = 0;
  for (let i = 0; i < values.length; i++) {
    const s = sh + values[i];
    const bb = s - sh;
    sl += sh - (s - bb) + (values[i] - bb);
    sh = s;
  }
  return quickTwoSum(sh, sl);
}

/**
 * Dot product sum(a[i] * b[i]) of doubles with products and sum error-free
 * accumulated ("Dot2" of Ogita, Rump & Oishi 2005): as accurate as if computed
 * in double-double and then rounded to [hi, lo].
 */
export function ddDot(a: ArrayLike<number>, b: ArrayLike<number>): DD {
  let sh = 0;
  let sl = 0;
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const [p, e] = twoProduct(a[i], b[i]);
    const s = sh + p;
    const bb = s - sh;
    sl += sh - (s - bb) + (p - bb) + e;
    sh = s;
  }
  return quickTwoSum(sh, sl);
}
