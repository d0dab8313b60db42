// householderQR against the textbook loop (for each reflector: dot product, then
// update, column by column; Golub & Van Loan, Matrix Computations, alg. 5.2.1,
// with the caller-order aliasing rule of LINPACK dqrdc2) written out here: the
// kernel fuses and interleaves these passes over several columns, and must give
// the same bits, because stored fits are replayed and compared value by value.

import t from 'tap';
import { householderQR, applyQt, applyQ } from '../../../src/core/fit/householder-qr.ts';

function textbookQR(columns: Float64Array[], n: number, tolerance: number, reference: number[]) {
  const q = columns.length;
  const work = new Float64Array(n * q);
  columns.forEach((col, c) => work.set(col, c * n));
  const accepted: number[] = [];
  const aliased: number[] = [];
  const rdiag = new Float64Array(q);
  const beta = new Float64Array(q);
  for (let c = 0; c < q; c++) {
    const k = accepted.length;
    const off = c * n;
    for (let j = 0; j < k; j++) {
      const offV = accepted[j] * n;
      let s = 0;
      for (let i = j; i < n; i++) s += work[offV + i] * work[off + i];
      const f = s / beta[j];
      for (let i = j; i < n; i++) work[off + i] -= f * work[offV + i];
    }
    let ss = 0;
    for (let i = k; i < n; i++) ss += work[off + i] * work[off + i];
    const nrm = Math.sqrt(ss);
    if (k >= n || !(nrm > tolerance * reference[c])) {
      aliased.push(c);
      continue;
    }
    const x0 = work[off + k];
    const alpha = x0 >= 0 ? -nrm : nrm;
    work[off + k] = x0 - alpha;
    rdiag[k] = alpha;
    beta[k] = -alpha * (x0 - alpha);
    accepted.push(c);
  }
  return { work, rdiag, beta, order: [...accepted, ...aliased], rank: accepted.length };
}

function randomColumns(n: number, p: number, seed: number): Float64Array[] {
  let s = seed;
  const uniform = () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 4294967296 - 0.5);
  const cols = Array.from({ length: p }, () => Float64Array.from({ length: n }, uniform));
  // Aliased columns in the middle and at the end: the kernel's groups of pending
  // columns then start at every offset.
  cols[4] = cols[1].map((v, i) => v - 3 * cols[2][i]);
  cols[p - 1] = cols[0].map((v) => 0.5 * v);
  return cols;
}

const firstDifference = (a: Float64Array, b: Float64Array) => a.findIndex((v, i) => !Object.is(v, b[i]));

for (const [n, p] of [[50, 7], [300, 13], [20000, 30]]) {
  t.test(`${n} x ${p}: the same bits as the textbook loop`, async (t) => {
    const cols = randomColumns(n, p, 20261202 + p);
    const reference = cols.map((c) => Math.hypot(...c));
    const candidates = cols.map((_, j) => j);
    const got = householderQR(cols, n, candidates, reference, 1e-10);
    const want = textbookQR(cols, n, 1e-10, reference);
    t.same(got.order, want.order, 'pivot order (the two aliased columns last)');
    t.equal(got.rank, p - 2);
    const accepted = (work: Float64Array, order: number[]) =>
      Float64Array.from(order.slice(0, p - 2).flatMap((c) => [...work.subarray(c * n, (c + 1) * n)]));
    t.equal(firstDifference(accepted(got.work, got.order), accepted(want.work, want.order)), -1, 'reflectors and R');
    t.equal(firstDifference(got.rdiag, want.rdiag), -1, 'diagonal of R');
    t.equal(firstDifference(got.beta, want.beta), -1, 'reflector scalars');
    // Q^T then Q returns a vector to itself to rounding (a check that the factors are a QR at all).
    const z = Float64Array.from(cols[3]);
    applyQt(got, z);
    applyQ(got, z);
    t.ok(z.every((v, i) => Math.abs(v - cols[3][i]) < 1e-13), 'Q Q^T z = z');
  });
}
