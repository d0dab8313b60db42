import t from 'tap';
import { dotDD, subtractScaledColumn, differenceDD, weightedSumDD, centreAndScaleRows, refinementResiduals } from '../../../src/core/numeric/dd-vector.ts';

// Exact references by BigInt integer arithmetic on integer-valued doubles.
const a = Float64Array.from([2 ** 52 + 1, -(2 ** 40) - 3, 123456789, 2 ** 50 - 7]);
const b = Float64Array.from([2 ** 51 + 5, 2 ** 45 + 1, -987654321, 3]);
const zero = new Float64Array(4);
const exactDot = [...a].reduce((s, v, i) => s + BigInt(v) * BigInt(b[i]), 0n);

t.test('dotDD is exact here (within 106 bits) where a double dot product is not', async (t) => {
  const [h, l] = dotDD(a, zero, b, zero);
  t.equal(BigInt(h) + BigInt(l), exactDot);
  let plain = 0;
  for (let i = 0; i < 4; i++) plain += a[i] * b[i];
  t.not(BigInt(plain), exactDot, 'plain double loses the low bits');
});

t.test('subtractScaledColumn and differenceDD', async (t) => {
  const fh = Float64Array.from([1, 2, 3, 4]);
  const fl = new Float64Array(4);
  const x = 2 ** 30 + 1;
  subtractScaledColumn(fh, fl, a, zero, x, 0);
  for (let i = 0; i < 4; i++) {
    t.equal(BigInt(fh[i]) + BigInt(fl[i]), BigInt(i + 1) - BigInt(a[i]) * BigInt(x), `row ${i}`);
  }
  const dh = new Float64Array(4);
  const dl = new Float64Array(4);
  differenceDD(fh, fl, fh, fl, dh, dl);
  t.same([...dh, ...dl], new Array(8).fill(0));
});

t.test('weightedSumDD and centreAndScaleRows', async (t) => {
  const [h, l] = weightedSumDD(a, zero, b);
  t.equal(BigInt(h) + BigInt(l), exactDot);
  const [uh, ul] = weightedSumDD(Float64Array.from([1e16, 1, -1e16, 1]), zero, null);
  t.same([uh, ul], [2, 0]);
  const oh = new Float64Array(4);
  const ol = new Float64Array(4);
  centreAndScaleRows(a, zero, 2 ** 52, 0.5, null, null, oh, ol);
  t.equal(oh[0] + ol[0], 0.5, '(2^52 + 1) - (2^52 + 0.5) = 0.5');
});

t.test('refinementResiduals equals differenceDD, subtractScaledColumn and dotDD per column, bit for bit', async (t) => {
  // More rows than one tile (4096) and a ragged last tile; values with low parts.
  const n = 9000;
  const k = 3;
  let seed = 7;
  const u = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296 - 0.5);
  const vec = (scale: number) => Float64Array.from({ length: n }, () => u() * scale);
  const ah = [vec(1), vec(1), vec(1e-3)];
  const al = ah.map((c) => c.map((v) => v * u() * 2 ** -53));
  const xh = Float64Array.from([1.5 + u(), -3e5 * u(), 1e-7 * u()]);
  const xl = xh.map((v) => v * u() * 2 ** -53);
  const bh = vec(10);
  const bl = bh.map((v) => v * u() * 2 ** -53);
  const rh = vec(0.1);
  const rl = rh.map((v) => v * u() * 2 ** -53);

  const fh = new Float64Array(n);
  const fl = new Float64Array(n);
  differenceDD(bh, bl, rh, rl, fh, fl);
  for (let c = 0; c < k; c++) subtractScaledColumn(fh, fl, ah[c], al[c], xh[c], xl[c]);
  const g = ah.map((a, c) => -dotDD(a, al[c], rh, rl)[0]);

  const th = new Float64Array(n);
  const tl = new Float64Array(n);
  const tg = new Float64Array(k);
  refinementResiduals(ah, al, xh, xl, bh, bl, rh, rl, th, tl, tg);
  t.same([...th], [...fh], 'f high parts');
  t.same([...tl], [...fl], 'f low parts');
  t.same([...tg], g, 'g');
});
