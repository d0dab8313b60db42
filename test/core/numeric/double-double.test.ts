import t from 'tap';
import {
  twoSum, twoProduct, split, ddAdd, ddSub, ddMul, ddMulDouble, ddDiv, ddPowInt,
  ddLog, ddSqrt, ddReciprocal, ddExp, ddSum, ddDot, splitHigh, type DD,
} from '../../../src/core/numeric/double-double.ts';

/** Relative difference of two double-doubles, computed in double-double. */
function relDiff(a: DD, b: DD): number {
  const [dh] = ddSub(a[0], a[1], b[0], b[1]);
  return Math.abs(dh) / Math.abs(b[0]);
}

t.test('twoSum and twoProduct are error-free (Knuth; Dekker 1971)', async (t) => {
  // 1 + 2^-60: the sum rounds to 1 and the error term holds 2^-60 exactly.
  t.same(twoSum(1, 2 ** -60), [1, 2 ** -60]);
  // (2^53 - 1)^2 = 2^106 - 2^54 + 1 exactly: fl gives 2^106 - 2^54, the error is +1.
  t.same(twoProduct(2 ** 53 - 1, 2 ** 53 - 1), [2 ** 106 - 2 ** 54, 1]);
  // (2^27 + 1)(2^27 - 1) = 2^54 - 1, which is not a double: rounds to 2^54, error -1.
  t.same(twoProduct(2 ** 27 + 1, 2 ** 27 - 1), [2 ** 54, -1]);
  // The square of a 54-bit-range double (3^34 rounded) has ~108 bits; hi + lo
  // must equal the exact product of the doubles (checked in BigInt).
  const a = 3 ** 34;
  const [p, e] = twoProduct(a, a);
  t.equal(BigInt(p) + BigInt(e), BigInt(a) * BigInt(a), 'exact as BigInt');
  // Random-ish integer pairs beyond 2^53 products: compare against BigInt.
  const pairs: [number, number][] = [[94906267, 94906265], [2 ** 52 + 7, 2 ** 40 + 3], [123456789012345, 987654321]];
  for (const [x, y] of pairs) {
    const [h, l] = twoProduct(x, y);
    t.equal(BigInt(h) + BigInt(l), BigInt(x) * BigInt(y), `${x}*${y}`);
  }
  // Dekker's split of a huge number must not overflow.
  const [sh, sl] = split(1.5e300);
  t.equal(sh + sl, 1.5e300);
  const [bh, bl] = twoProduct(1e300, 1.0000000000000002);
  t.ok(Number.isFinite(bh) && Number.isFinite(bl));
});

t.test('(1 + 2^-30)^2 = 1 + 2^-29 + 2^-60 exactly', async (t) => {
  t.same(ddPowInt(1 + 2 ** -30, 2), [1 + 2 ** -29, 2 ** -60]);
  t.same(ddMul(1 + 2 ** -30, 0, 1 + 2 ** -30, 0), [1 + 2 ** -29, 2 ** -60]);
  t.same(ddMulDouble(1 + 2 ** -30, 0, 1 + 2 ** -30), [1 + 2 ** -29, 2 ** -60]);
});

t.test('ddPowInt against exact integer and decimal powers', async (t) => {
  // 7^40 is an integer of 113 bits; the dd result rounds it to 106 bits.
  const exact = 7n ** 40n;
  const [h, l] = ddPowInt(7, 40);
  const err = Number(BigInt(h) + BigInt(l) - exact) / Number(exact);
  t.ok(Math.abs(err) < 1e-30, `7^40 relative error ${err}`);
  t.same(ddPowInt(5, 0), [1, 0]);
  t.same(ddPowInt(-3, 3), [-27, 0]);
  // Reference: Python 3.11 decimal, 60 digits, (double 1.1)^10 and (double 0.9)^10.
  t.ok(relDiff(ddPowInt(1.1, 10), [2.5937424601000023, -2.1738433861884157e-16]) < 1e-30);
  t.ok(relDiff(ddPowInt(0.9, 10), [0.3486784401000001, -1.1665384525016966e-17]) < 1e-30);
});

t.test('ddAdd keeps what double addition loses', async (t) => {
  const [h, l] = ddAdd(1, 1e-20, -1, 1e-25);
  t.ok(Math.abs(h + l - (1e-20 + 1e-25)) < 1e-35);
  const s = ddSum([1e16, 1, -1e16, 1]);
  t.same(s, [2, 0]);
  // sum(x_i y_i) with cancellation: 1e16*1 + 1*1 - 1e16*1 = 1 exactly.
  t.same(ddDot([1e16, 1, -1e16], [1, 1, 1]), [1, 0]);
  const [q0, q1] = ddDiv(1, 0, 3, 0);
  const [b0, b1] = ddMulDouble(q0, q1, 3);
  t.ok(Math.abs(b0 - 1 + b1) < 1e-31, '3 * (1/3) = 1 in dd');
});

// References: Python 3.11 `decimal` at 60 digits, of the double argument,
// rounded to [hi, lo] as float(v), float(v - hi).
const LOG_REF: [number, DD][] = [
  [2, [0.6931471805599453, 2.3190468138462996e-17]],
  [10, [2.302585092994046, -2.1707562233822494e-16]],
  [0.1, [-2.3025850929940455, -1.7150243628057985e-16]],
  [1e-300, [-690.7755278982137, -2.3670096176709832e-14]],
  [12345.678, [9.421061321291832, -1.9085650743481053e-16]],
  [1.0000001, [9.999999505838704e-8, 1.5249709528441489e-24]],
];
const SQRT_REF: [number, DD][] = [
  [2, [1.4142135623730951, -9.667293313452913e-17]],
  [3, [1.7320508075688772, 1.0035084221806903e-16]],
  [0.1, [0.31622776601683794, 8.004969469767158e-19]],
  [1e300, [1e150, 4.5416783955164837e133]],
];
const RECIP_REF: [number, DD][] = [
  [3, [0.3333333333333333, 1.850371707708594e-17]],
  [10, [0.1, -5.551115123125783e-18]],
  [0.1, [10, -5.551115123125783e-16]],
  [1e-300, [9.999999999999999e299, 7.113783875736513e283]],
  [49, [0.02040816326530612, 1.6285159162231251e-18]],
];
const EXP_REF: [number, DD][] = [
  [1, [2.718281828459045, 1.4456468917292502e-16]],
  [-1, [0.36787944117144233, -1.2428753672788363e-17]],
  [0.5, [1.6487212707001282, -4.731568479435833e-17]],
  [100, [2.6881171418161356e43, -1.6101271449201627e27]],
  [700, [1.0142320547350045e304, 1.6666571920734673e287]],
];

t.test('ddLog, ddSqrt, ddReciprocal, ddExp against 60-digit decimal values', async (t) => {
  for (const [x, ref] of LOG_REF) {
    // log(1.0000001) is ~1e-7: absolute error ~1e-32 allows ~1e-25 relative.
    const tol = Math.abs(ref[0]) < 1e-3 ? 1e-24 : 1e-30;
    t.ok(relDiff(ddLog(x), ref) < tol, `log ${x}: ${relDiff(ddLog(x), ref)}`);
  }
  for (const [x, ref] of SQRT_REF) t.ok(relDiff(ddSqrt(x), ref) < 1e-30, `sqrt ${x}: ${relDiff(ddSqrt(x), ref)}`);
  for (const [x, ref] of RECIP_REF) t.ok(relDiff(ddReciprocal(x), ref) < 1e-30, `1/${x}: ${relDiff(ddReciprocal(x), ref)}`);
  for (const [x, ref] of EXP_REF) t.ok(relDiff(ddExp(x, 0), ref) < 1e-30, `exp ${x}: ${relDiff(ddExp(x, 0), ref)}`);
});

t.test('identities: sqrt squared, reciprocal times x, exp of log', async (t) => {
  for (const x of [2, 3, 5, 0.7, 1e-8, 123456.789, 2 ** 60 + 2 ** 9]) {
    const [sh, sl] = ddSqrt(x);
    const [qh, ql] = ddMul(sh, sl, sh, sl);
    t.ok(Math.abs(ddSub(qh, ql, x, 0)[0]) / x < 1e-31, `sqrt(${x})^2`);
    const [rh, rl] = ddReciprocal(x);
    const [ph, pl] = ddMulDouble(rh, rl, x);
    t.ok(Math.abs(ddSub(ph, pl, 1, 0)[0]) < 1e-31, `x * (1/${x})`);
    const [lh, ll] = ddLog(x);
    const [eh, el] = ddExp(lh, ll);
    // exp turns the log's absolute error (~|ln x| * 2^-106) into a relative one.
    const tol = 4e-31 * (1 + Math.abs(lh));
    t.ok(Math.abs(ddSub(eh, el, x, 0)[0]) / x < tol, `exp(log ${x})`);
  }
  t.same(ddLog(1), [0, 0]);
  t.equal(ddLog(0)[0], -Infinity);
  t.ok(Number.isNaN(ddLog(-1)[0]));
  t.same(ddSqrt(0), [0, 0]);
  t.ok(Number.isNaN(ddPowInt(2, 1.5)[0]), 'non-integer exponent is NaN, not a throw');
});

t.test('splitHigh is the high part of split, including beyond the overflow threshold', async (t) => {
  for (const a of [0, 1, -1 / 3, Math.PI * 1e10, 2 ** -1000, 1.7e308, -9e299, 6.7e299]) {
    const [hi, lo] = split(a);
    t.ok(Object.is(splitHigh(a), hi), `${a}: high part`);
    t.equal(a - splitHigh(a), lo, `${a}: low part is a - high`);
  }
});
