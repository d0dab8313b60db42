// totalSumOfSquares writes ddAdd/ddSub/ddMul/ddMulDouble out inline; it must give
// the same bits as composing those functions (the reference below), and the
// textbook values on small exact cases (arithmetic by hand).

import t from 'tap';
import { totalSumOfSquares } from '../../../src/core/fit/total-sum-of-squares.ts';
import { ddAdd, ddDiv, ddMul, ddMulDouble, ddSub, type DD } from '../../../src/core/numeric/double-double.ts';

function composed(intercept: boolean, y: Float64Array, weights: Float64Array | undefined, weightTotal: number): number {
  const w = (i: number) => {
    if (!weights) return 1;
    const v = weights[i];
    return v > 0 && Number.isFinite(v) ? v : 0;
  };
  let mean: DD = [0, 0];
  if (intercept && weightTotal > 0) {
    let s: DD = [0, 0];
    let total: DD = [0, 0];
    for (let i = 0; i < y.length; i++) {
      s = ddAdd(s[0], s[1], ...ddMulDouble(y[i], 0, w(i)));
      total = ddAdd(total[0], total[1], w(i), 0);
    }
    mean = ddDiv(s[0], s[1], total[0], total[1]);
  }
  let acc: DD = [0, 0];
  for (let i = 0; i < y.length; i++) {
    if (w(i) === 0) continue;
    const [dh, dl] = ddSub(y[i], 0, mean[0], mean[1]);
    const [qh, ql] = ddMul(dh, dl, dh, dl);
    acc = ddAdd(acc[0], acc[1], ...ddMulDouble(qh, ql, w(i)));
  }
  return acc[0];
}

t.test('small exact cases', async (t) => {
  const y = Float64Array.from([1, 2, 3, 4]);
  t.equal(totalSumOfSquares(true, y, undefined, 4), 5, 'centred: 2.25 + 0.25 + 0.25 + 2.25');
  t.equal(totalSumOfSquares(false, y, undefined, 4), 30, 'uncentred: 1 + 4 + 9 + 16');
  const w = Float64Array.from([1, 0, -1, 2]);
  // Rows 2 and 3 count with weights 1 and 2 (a negative weight counts as 0): mean 3, 4 + 2.
  t.equal(totalSumOfSquares(true, y, w, 3), 6);
});

t.test('bit-identical to the composed double-double operations', async (t) => {
  let seed = 11;
  const u = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
  const cases: [string, Float64Array][] = [
    ['offset 1e6, spread 100', Float64Array.from({ length: 5000 }, () => 1e6 + 100 * u())],
    ['mixed signs and scales', Float64Array.from({ length: 5000 }, () => (u() - 0.5) * 10 ** Math.floor(20 * u() - 10))],
    ['beyond the split threshold', Float64Array.from({ length: 50 }, () => 1e300 * (u() + 1))],
  ];
  const w = Float64Array.from({ length: 5000 }, () => (u() < 0.1 ? 0 : u() * 3));
  for (const [name, y] of cases) {
    for (const intercept of [true, false]) {
      for (const weights of [undefined, w.subarray(0, y.length)]) {
        const total = weights ? weights.reduce((s, v) => s + v, 0) : y.length;
        const got = totalSumOfSquares(intercept, y, weights, total);
        t.ok(Object.is(got, composed(intercept, y, weights, total)), `${name}, intercept ${intercept}, ${weights ? 'weighted' : 'unweighted'}`);
      }
    }
  }
});
