// Elementary functions of a double-double argument (about 32 digits), for
// evaluating a model expression in extended precision: the logarithm, powers,
// sine, cosine, tangent and arctangent. exp and sqrt are in double-double.ts.
//
// Methods (Hida, Li & Bailey 2001, the "QD" library, for the shapes):
// - log: one Newton step on exp(y) = a from the double logarithm, which
//   squares its relative error (1e-16 -> 1e-32); near 1 the atanh series,
//   which keeps the relative accuracy of a small logarithm.
// - sin, cos: reduction by the nearest multiple of pi/2 held as three doubles
//   (so the reduced argument keeps ~32 digits for |a| up to 2^50), then
//   Taylor series on |r| <= pi/4 to 1e-33.
// - atan: one Newton step on sin(y) - a cos(y) = 0 from the double atan.
// Constants were split from 300-bit values computed with mpmath 1.2.1.
import { ddAdd, ddDiv, ddExp, ddMul, ddMulDouble, ddSub, quickTwoSum, twoProduct, type DD } from './double-double.ts';
import { addTo, mulTo, newCell } from './dd-cell.ts';

export const DD_PI: DD = [3.141592653589793, 1.2246467991473532e-16];
const PI_OVER_2: DD = [1.5707963267948966, 6.123233995736766e-17];
const PI_OVER_2_PARTS = [1.5707963267948966, 6.123233995736766e-17, -1.4973849048591698e-33] as const;
const INV_LN10: DD = [0.4342944819032518, 1.098319650216765e-17];

/** 1/k! for k = 0..30 in double-double. */
const INV_FACTORIAL: DD[] = (() => {
  const out: DD[] = [[1, 0]];
  let f: DD = [1, 0];
  for (let k = 1; k <= 30; k++) {
    f = ddMulDouble(f[0], f[1], k);
    out.push(ddDiv(1, 0, f[0], f[1]));
  }
  return out;
})();

const LN2: DD = [0.6931471805599453, 2.3190468138462996e-17];

/** 2^(j/64), j = 0..63, in double-double (from the series-and-squaring exp of double-double.ts). */
const EXP2_TABLE: DD[] = Array.from({ length: 64 }, (_, j) => {
  const [h, l] = ddMulDouble(LN2[0], LN2[1], j / 64);
  return ddExp(h, l);
});

/**
 * 1/k! for k = 2..6 in double-double, highest first: the part of expm1's
 * series that needs ~32 digits on |r| <= ln2/128.
 */
const EXPM1_HEAD: DD[] = INV_FACTORIAL.slice(2, 7).reverse();
/** 1/k! for k = 7..13 as doubles, highest first: the tail, summed in double. */
const EXPM1_TAIL: number[] = INV_FACTORIAL.slice(7, 14).reverse().map(([h]) => h);

/** The scratch cell of ddExpDD (one pair per call instead of dozens). */
const cell = newCell();

// ln2/64 in three parts, so that n ln2/64 for the largest n (about 65,500,
// at exp's overflow) keeps ~32 digits: with two parts the missing third
// (5.7e-34 ln2-units, from mpmath 1.2.1 at 60 digits) costs up to 6e-31.
const LN2_64_HI = LN2[0] / 64;
const LN2_64_LO = LN2[1] / 64;
const LN2_64_THIRD = 5.707708438416212e-34 / 64;

/**
 * exp(ah + al) in double-double, the table-driven way (Tang 1989): a =
 * (64k + j) ln2/64 + r with |r| <= ln2/128, exp(a) = 2^k 2^(j/64) exp(r),
 * expm1(r) = r + r² q(r) by its Taylor series to r^13/13! (< 3e-43 there).
 * q's terms from r^5/7! on are below 5e-16 of q's size, and q itself is
 * multiplied by r² <= 3e-5, so they are summed in double (their rounding
 * reaches the result below 1e-35); the five leading terms take the
 * double-double Horner steps. The arithmetic goes through allocation-free
 * helpers, so one call makes one pair: a fit evaluates exp for every row.
 * Checked against mpmath at 50 digits and against the series-and-squaring
 * ddExp of double-double.ts on [-700, 700].
 */
export function ddExpDD(ah: number, al: number): DD {
  if (ah > 709.78) return [Infinity, 0];
  if (ah < -745.2) return [0, 0];
  if (Number.isNaN(ah)) return [NaN, 0];
  const c = cell;
  const n = Math.round(ah / LN2_64_HI);
  const j = ((n % 64) + 64) % 64;
  const k = (n - j) / 64;
  // r = a - n ln2/64: n times each part exactly (Dekker), subtracted accurately.
  mulTo(c, n, 0, LN2_64_HI, 0);
  addTo(c, ah, al, -c.h, -c.l);
  const rh0 = c.h;
  const rl0 = c.l;
  mulTo(c, n, 0, LN2_64_LO, 0);
  addTo(c, rh0, rl0, -c.h, -c.l - n * LN2_64_THIRD);
  const rh = c.h;
  const rl = c.l;
  // The tail in double, then Horner in double-double: q = (..(tail r + c6) r + ..) r + c2.
  let tail = EXPM1_TAIL[0];
  for (let m = 1; m < EXPM1_TAIL.length; m++) tail = tail * rh + EXPM1_TAIL[m];
  let qh = tail;
  let ql = 0;
  for (let m = 0; m < EXPM1_HEAD.length; m++) {
    mulTo(c, qh, ql, rh, rl);
    addTo(c, c.h, c.l, EXPM1_HEAD[m][0], EXPM1_HEAD[m][1]);
    qh = c.h;
    ql = c.l;
  }
  mulTo(c, rh, rl, rh, rl);
  mulTo(c, c.h, c.l, qh, ql);
  addTo(c, rh, rl, c.h, c.l);
  const tab = EXP2_TABLE[j];
  const tabh = tab[0];
  const tabl = tab[1];
  mulTo(c, tabh, tabl, c.h, c.l);
  addTo(c, tabh, tabl, c.h, c.l); // 2^(j/64) (1 + expm1(r))
  // 2^k in two factors, so neither overflows nor goes subnormal before the product.
  const k1 = Math.trunc(k / 2);
  const f1 = 2 ** k1;
  const f2 = 2 ** (k - k1);
  return [c.h * f1 * f2, c.l * f1 * f2];
}

/** ln(ah + al) for ah + al > 0. */
export function ddLogDD(ah: number, al: number): DD {
  if (Number.isNaN(ah) || ah < 0) return [NaN, 0];
  if (ah === 0) return [-Infinity, 0];
  if (ah === Infinity) return [Infinity, 0];
  if (ah < 1e-290 || ah > 1e290) {
    // exp(-ln a) would overflow or underflow: scale by 2^-e exactly (in two
    // steps, so 2^-e itself stays finite) and add e ln 2.
    const e = Math.floor(Math.log2(ah));
    const half = Math.trunc(e / 2);
    const s1 = 2 ** -half;
    const s2 = 2 ** -(e - half);
    const [lh, ll] = ddLogDD(ah * s1 * s2, al * s1 * s2);
    const [kh, kl] = ddMulDouble(LN2[0], LN2[1], e);
    return ddAdd(lh, ll, kh, kl);
  }
  if (Math.abs(ah - 1) < 1 / 64) return logNearOne(ah, al);
  const y0 = Math.log(ah);
  const [eh, el] = ddExpDD(-y0, 0);
  const [th, tl] = ddMul(eh, el, ah, al);
  const [dh, dl] = ddAdd(th, tl, -1, 0);
  return ddAdd(y0, 0, dh, dl);
}

/**
 * ln a for a near 1 as 2 atanh(u) = 2 (u + u³/3 + u⁵/5 + ...), u = (a - 1)/(a + 1),
 * with a - 1 exact: the Newton step's a exp(-y) - 1 would lose the leading
 * digits of a small logarithm to cancellation. |u| < 1/127, so 12 terms
 * reach 1e-50.
 */
function logNearOne(ah: number, al: number): DD {
  const [nh, nl] = ddAdd(ah, al, -1, 0);
  const [dh, dl] = ddAdd(ah, al, 1, 0);
  const u = ddDiv(nh, nl, dh, dl);
  const u2 = ddMul(u[0], u[1], u[0], u[1]);
  let power: DD = u;
  let sum: DD = u;
  for (let k = 3; k <= 25; k += 2) {
    power = ddMul(power[0], power[1], u2[0], u2[1]);
    const term = ddDiv(power[0], power[1], k, 0);
    sum = ddAdd(sum[0], sum[1], term[0], term[1]);
    if (Math.abs(term[0]) < 1e-34 * Math.abs(sum[0])) break;
  }
  return [2 * sum[0], 2 * sum[1]];
}

export function ddLog10DD(ah: number, al: number): DD {
  const [lh, ll] = ddLogDD(ah, al);
  return ddMul(lh, ll, INV_LN10[0], INV_LN10[1]);
}

/** (ah + al)^n for an integer n, by binary powering (n < 0 through the reciprocal). */
export function ddPowIntDD(ah: number, al: number, n: number): DD {
  let k = Math.abs(n);
  let rh = 1;
  let rl = 0;
  let bh = ah;
  let bl = al;
  while (k > 0) {
    if (k % 2 === 1) [rh, rl] = ddMul(rh, rl, bh, bl);
    k = Math.floor(k / 2);
    if (k > 0) [bh, bl] = ddMul(bh, bl, bh, bl);
  }
  if (n >= 0) return [rh, rl];
  return rh === 0 || !Number.isFinite(rh) ? [1 / rh, 0] : ddDiv(1, 0, rh, rl);
}

/**
 * (ah + al)^(bh + bl) with the cases of Math.pow: an integer-valued exponent
 * by binary powering (any sign of base), otherwise exp(b ln a) for a > 0,
 * 0 or infinity at a = 0, and NaN for a negative base.
 */
export function ddPowDD(ah: number, al: number, bh: number, bl: number): DD {
  if (bl === 0 && Number.isInteger(bh) && Math.abs(bh) <= 2 ** 31) return ddPowIntDD(ah, al, bh);
  if (Number.isNaN(ah) || Number.isNaN(bh)) return [NaN, 0];
  if (ah === 0) return bh > 0 ? [0, 0] : [Infinity, 0];
  if (ah < 0) return [NaN, 0];
  const [lh, ll] = ddLogDD(ah, al);
  const [xh, xl] = ddMul(bh, bl, lh, ll);
  return ddExpDD(xh, xl);
}

/** sin and cos of |r| <= pi/4 by their Taylor series. */
function sinCosReduced(rh: number, rl: number): { sin: DD; cos: DD } {
  const [r2h, r2l] = ddMul(rh, rl, rh, rl);
  let sin: DD = [rh, rl];
  let cos: DD = [1, 0];
  let term: DD = [rh, rl]; // r^(2m+1) and r^(2m) alternate below
  let even: DD = [1, 0];
  for (let m = 1; m <= 14; m++) {
    even = ddMul(even[0], even[1], r2h, r2l);
    term = ddMul(term[0], term[1], r2h, r2l);
    const sign = m % 2 === 1 ? -1 : 1;
    const [ch, cl] = ddMul(even[0], even[1], INV_FACTORIAL[2 * m][0], INV_FACTORIAL[2 * m][1]);
    const [sh, sl] = ddMul(term[0], term[1], INV_FACTORIAL[2 * m + 1][0], INV_FACTORIAL[2 * m + 1][1]);
    cos = ddAdd(cos[0], cos[1], sign * ch, sign * cl);
    sin = ddAdd(sin[0], sin[1], sign * sh, sign * sl);
    if (Math.abs(ch) < 1e-34) break;
  }
  return { sin, cos };
}

/**
 * Beyond this many radians the three-part pi/2 no longer reduces to ~32
 * digits, and the double functions (exactly reduced) are used instead: an
 * angle that large has no meaningful low part anyway.
 */
const MAX_REDUCED_ARGUMENT = 2 ** 50;

/** sin and cos of ah + al together (they share the reduction). */
export function ddSinCos(ah: number, al: number): { sin: DD; cos: DD } {
  if (!Number.isFinite(ah)) return { sin: [NaN, 0], cos: [NaN, 0] };
  if (Math.abs(ah) > MAX_REDUCED_ARGUMENT) return { sin: [Math.sin(ah), 0], cos: [Math.cos(ah), 0] };
  const k = Math.round(ah / PI_OVER_2[0]);
  let r: DD = [ah, al];
  for (const part of PI_OVER_2_PARTS) {
    const [ph, pl] = twoProduct(k, part);
    r = ddSub(r[0], r[1], ph, pl);
  }
  const { sin, cos } = sinCosReduced(r[0], r[1]);
  const quadrant = ((k % 4) + 4) % 4;
  const neg = (x: DD): DD => [-x[0], -x[1]];
  switch (quadrant) {
    case 0: return { sin, cos };
    case 1: return { sin: cos, cos: neg(sin) };
    case 2: return { sin: neg(sin), cos: neg(cos) };
    default: return { sin: neg(cos), cos: sin };
  }
}

export function ddTanDD(ah: number, al: number): DD {
  const { sin, cos } = ddSinCos(ah, al);
  return ddDiv(sin[0], sin[1], cos[0], cos[1]);
}

/** atan(ah + al) in (-pi/2, pi/2). */
export function ddAtanDD(ah: number, al: number): DD {
  if (Number.isNaN(ah)) return [NaN, 0];
  if (ah === Infinity) return PI_OVER_2;
  if (ah === -Infinity) return [-PI_OVER_2[0], -PI_OVER_2[1]];
  const y0 = Math.atan(ah + al);
  const { sin: s, cos: c } = ddSinCos(y0, 0);
  // y1 = y0 - (s - a c) / (c + a s)
  const [ach, acl] = ddMul(ah, al, c[0], c[1]);
  const [ash, asl] = ddMul(ah, al, s[0], s[1]);
  const [nh, nl] = ddSub(s[0], s[1], ach, acl);
  const [dh, dl] = ddAdd(c[0], c[1], ash, asl);
  const [qh, ql] = ddDiv(nh, nl, dh, dl);
  const [yh, yl] = ddSub(y0, 0, qh, ql);
  return quickTwoSum(yh, yl);
}
