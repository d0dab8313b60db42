// Rank, weights, interpolation, no-intercept and degenerate inputs of fitLeastSquares.
// References: NIST StRD certified values (Norris, Longley, Wampler1), and facts of
// the trade marked "common practice".

import t from 'tap';
import { fitLeastSquares } from '../../../src/core/fit/index.ts';
import type { DesignMatrix } from '../../../src/core/types.ts';
import { loadStrd, strdDesign, lre } from '../../reference/nist/strd.ts';

function withColumn(d: DesignMatrix, label: string, values: Float64Array, at = d.labels.length): DesignMatrix {
  const labels = [...d.labels];
  const high = [...d.high];
  const low = [...d.low];
  const terms = [...d.termOfColumn];
  labels.splice(at, 0, label);
  high.splice(at, 0, values);
  low.splice(at, 0, new Float64Array(d.rows));
  terms.splice(at, 0, Math.max(...terms) + 1);
  return { ...d, labels, high, low, termOfColumn: terms };
}

function relDiff(a: number, b: number): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);
}

const norris = loadStrd('norris');
const norrisCert = norris.certified.parameters.map((p) => p.estimate);

t.test('duplicate, doubled and shifted columns are aliased, the later one in caller order', async (t) => {
  const { design, y } = strdDesign(norris);
  const x = design.high[1];
  const cases: [string, Float64Array][] = [
    ['x copy', Float64Array.from(x)],
    ['2x', x.map((v) => 2 * v)],
    // Temperature in K beside degrees C: x + 273.15, collinear with intercept and x.
    ['x + 273.15', x.map((v) => v + 273.15)],
  ];
  for (const [label, col] of cases) {
    const fit = fitLeastSquares(withColumn(design, label, col), y);
    t.equal(fit.rank, 2, `${label}: rank 2`);
    t.same(fit.aliased, [label]);
    t.equal(fit.coefficients[2], null);
    t.equal(fit.standardErrors[2], null);
    t.same(fit.estimable, [0, 1]);
    // The kept columns reproduce NIST's certified Norris fit.
    t.ok(lre(fit.coefficients[0], norrisCert[0]) >= 10 && lre(fit.coefficients[1], norrisCert[1]) >= 10, `${label}: NIST Norris estimates`);
  }
  // Put the copy first: then the original x (now later) is the aliased one.
  const fit = fitLeastSquares(withColumn(design, 'x first', Float64Array.from(x), 1), y);
  t.same(fit.aliased, ['x']);
  t.ok(lre(fit.coefficients[1], norrisCert[1]) >= 10);
});

t.test('factor dummies plus intercept: the last dummy is aliased, coefficients are group means', async (t) => {
  // Norris rows split by parity into two groups; with an intercept and both
  // dummies, the second dummy is aliased and (common practice) the intercept is
  // the mean of the group without a dummy, the dummy coefficient the difference.
  const { y } = strdDesign(norris);
  const n = y.length;
  const even = Float64Array.from({ length: n }, (_, i) => (i % 2 === 0 ? 1 : 0));
  const odd = even.map((v) => 1 - v);
  const design: DesignMatrix = {
    rows: n,
    labels: ['intercept', 'group=even', 'group=odd'],
    high: [new Float64Array(n).fill(1), even, odd],
    low: [new Float64Array(n), new Float64Array(n), new Float64Array(n)],
    intercept: true,
    termOfColumn: [-1, 0, 0],
  };
  const fit = fitLeastSquares(design, y);
  t.equal(fit.rank, 2);
  t.same(fit.aliased, ['group=odd']);
  let se = 0, so = 0;
  for (let i = 0; i < n; i++) (i % 2 === 0 ? (se += y[i]) : (so += y[i]));
  const meanEven = se / Math.ceil(n / 2);
  const meanOdd = so / Math.floor(n / 2);
  t.ok(relDiff(fit.coefficients[0]!, meanOdd) < 1e-13, 'intercept = mean of odd rows');
  t.ok(relDiff(fit.coefficients[1]!, meanEven - meanOdd) < 1e-12, 'dummy = difference of means');
});

t.test('weights', async (t) => {
  const longley = loadStrd('longley');
  const { design, y } = strdDesign(longley);
  const plain = fitLeastSquares(design, y);
  // Equal weights give the unweighted estimates and SEs (common practice);
  // rss and tss scale by the weight.
  const c = 3.7;
  const equal = fitLeastSquares(design, y, new Float64Array(y.length).fill(c));
  equal.coefficients.forEach((b, j) => t.ok(relDiff(b!, plain.coefficients[j]!) < 1e-12, `equal weights: b${j}`));
  equal.standardErrors.forEach((s, j) => t.ok(relDiff(s!, plain.standardErrors[j]!) < 1e-12, `equal weights: se${j}`));
  t.ok(relDiff(equal.rss, c * plain.rss) < 1e-13);
  t.ok(relDiff(equal.tss, c * plain.tss) < 1e-13);

  // Integer weights equal replicating rows (common practice): same estimates,
  // same weighted rss, same unscaled covariance.
  const w = Float64Array.from({ length: y.length }, (_, i) => 1 + (i % 3));
  const weighted = fitLeastSquares(design, y, w);
  const idx: number[] = [];
  w.forEach((wi, i) => { for (let k = 0; k < wi; k++) idx.push(i); });
  const rep: DesignMatrix = {
    ...design,
    rows: idx.length,
    high: design.high.map((col) => Float64Array.from(idx, (i) => col[i])),
    low: design.low.map((col) => Float64Array.from(idx, (i) => col[i])),
  };
  const replicated = fitLeastSquares(rep, Float64Array.from(idx, (i) => y[i]));
  weighted.coefficients.forEach((b, j) => t.ok(relDiff(b!, replicated.coefficients[j]!) < 1e-11, `replication: b${j}`));
  t.ok(relDiff(weighted.rss, replicated.rss) < 1e-12, 'replication: rss');
  t.ok(relDiff(weighted.tss, replicated.tss) < 1e-12, 'replication: tss');
  for (let a = 0; a < 7; a++) {
    t.ok(relDiff(weighted.unscaledCovariance[a][a], replicated.unscaledCovariance[a][a]) < 1e-11, `replication: cov ${a}`);
  }

  // A zero weight removes the row (common practice): same as dropping it.
  const w0 = new Float64Array(y.length).fill(1);
  w0[5] = 0;
  const zero = fitLeastSquares(design, y, w0);
  const keep = Array.from({ length: y.length }, (_, i) => i).filter((i) => i !== 5);
  const dropped = fitLeastSquares(
    { ...design, rows: keep.length, high: design.high.map((c) => Float64Array.from(keep, (i) => c[i])), low: design.low.map((c) => Float64Array.from(keep, (i) => c[i])) },
    Float64Array.from(keep, (i) => y[i]),
  );
  t.equal(zero.observations, 15);
  zero.coefficients.forEach((b, j) => t.ok(relDiff(b!, dropped.coefficients[j]!) < 1e-11, `zero weight: b${j}`));
  zero.standardErrors.forEach((s, j) => t.ok(relDiff(s!, dropped.standardErrors[j]!) < 1e-11, `zero weight: se${j}`));
  // The dropped row still gets its residual y - x b.
  let f = 0;
  for (let j = 0; j < 7; j++) f += design.high[j][5] * zero.coefficients[j]!;
  t.ok(Math.abs(zero.residuals[5] - (y[5] - f)) < 1e-6 * Math.abs(y[5]), 'residual of the zero-weight row');
});

t.test('n = p: exact interpolation', async (t) => {
  // First 6 rows of NIST Wampler1 (y = 1 + x + ... + x^5, x = 0..5) with the degree-5 model:
  // the interpolating polynomial has all coefficients 1 (NIST certified).
  const w1 = loadStrd('wampler1');
  const { design, y } = strdDesign(w1);
  const k = 6;
  const sub: DesignMatrix = { ...design, rows: k, high: design.high.map((c) => c.slice(0, k)), low: design.low.map((c) => c.slice(0, k)) };
  const fit = fitLeastSquares(sub, y.slice(0, k));
  t.equal(fit.rank, 6);
  t.equal(fit.sigma, null, 'no residual degrees of freedom');
  t.ok(fit.standardErrors.every((s) => s === null));
  t.equal(fit.exactFit, true);
  fit.coefficients.forEach((b, j) => t.ok(Math.abs(b! - 1) < 1e-12, `b${j} = 1`));
  t.ok(fit.residuals.every((e) => Math.abs(e) < 1e-9));
});

t.test('no intercept with several columns; tss uncentred', async (t) => {
  // Wampler1 minus 1 is x + x^2 + ... + x^5 exactly: without an intercept the
  // coefficients are 1 (NIST certified B1..B5) and the fit is exact.
  const w1 = loadStrd('wampler1');
  const { design, y } = strdDesign(w1);
  const d: DesignMatrix = { ...design, labels: design.labels.slice(1), high: design.high.slice(1), low: design.low.slice(1), intercept: false, termOfColumn: design.termOfColumn.slice(1) };
  const y1 = y.map((v) => v - 1);
  const fit = fitLeastSquares(d, y1);
  t.equal(fit.rank, 5);
  fit.coefficients.forEach((b, j) => t.ok(Math.abs(b! - 1) < 1e-13, `b${j + 1} = 1`));
  t.equal(fit.exactFit, true);
  let ss = 0;
  for (const v of y1) ss += v * v;
  t.ok(relDiff(fit.tss, ss) < 1e-15, 'tss = sum y^2 without intercept');
});

t.test('residuals and fitted values', async (t) => {
  const { design, y } = strdDesign(loadStrd('pontius'));
  const fit = fitLeastSquares(design, y);
  for (let i = 0; i < y.length; i++) t.ok(Math.abs(fit.fitted[i] + fit.residuals[i] - y[i]) <= 1e-15 * Math.abs(y[i]));
  // Normal equations X^T e = 0 (least squares), relative to sum |x||e|.
  for (let j = 0; j < 3; j++) {
    let s = 0, a = 0;
    for (let i = 0; i < y.length; i++) { s += design.high[j][i] * fit.residuals[i]; a += Math.abs(design.high[j][i] * fit.residuals[i]); }
    t.ok(Math.abs(s) <= 1e-13 * a, `X^T e = 0, column ${j}`);
  }
  let ss = 0;
  for (const e of fit.residuals) ss += e * e;
  t.ok(relDiff(fit.rss, ss) < 1e-13);
});

t.test('degenerate inputs return a fit, never throw', async (t) => {
  const empty: DesignMatrix = { rows: 0, labels: ['intercept', 'x'], high: [new Float64Array(0), new Float64Array(0)], low: [new Float64Array(0), new Float64Array(0)], intercept: true, termOfColumn: [-1, 0] };
  const f0 = fitLeastSquares(empty, new Float64Array(0));
  t.equal(f0.rank, 0);
  t.same(f0.aliased, ['intercept', 'x']);
  t.equal(f0.sigma, null);
  t.equal(f0.rss, 0);

  const noCols: DesignMatrix = { rows: 3, labels: [], high: [], low: [], intercept: false, termOfColumn: [] };
  const f1 = fitLeastSquares(noCols, Float64Array.from([1, 2, 3]));
  t.equal(f1.rank, 0);
  t.same(f1.coefficients, []);
  t.equal(f1.rss, 14, 'residuals are y itself');
  t.same(Array.from(f1.residuals), [1, 2, 3]);
  t.equal(f1.sigma, Math.sqrt(14 / 3));

  const zeroCols: DesignMatrix = { rows: 3, labels: ['a', 'b'], high: [new Float64Array(3), new Float64Array(3)], low: [new Float64Array(3), new Float64Array(3)], intercept: false, termOfColumn: [0, 1] };
  const f2 = fitLeastSquares(zeroCols, Float64Array.from([1, 2, 3]));
  t.equal(f2.rank, 0);
  t.same(f2.aliased, ['a', 'b']);
  t.same(f2.unscaledCovariance, []);

  // More columns than rows: the columns after the first n are aliased, in order.
  const { design, y } = strdDesign(loadStrd('wampler1'));
  const k = 4;
  const few: DesignMatrix = { ...design, rows: k, high: design.high.map((c) => c.slice(0, k)), low: design.low.map((c) => c.slice(0, k)) };
  const f3 = fitLeastSquares(few, y.slice(0, k));
  t.equal(f3.rank, 4);
  t.same(f3.aliased, ['x^4', 'x^5']);
  t.equal(f3.sigma, null);

  // A constant response: exact fit, zero residuals.
  const { design: nd } = strdDesign(norris);
  const f4 = fitLeastSquares(nd, new Float64Array(nd.rows).fill(2.5));
  t.equal(f4.exactFit, true);
  t.ok(Math.abs(f4.coefficients[0]! - 2.5) < 1e-15 && Math.abs(f4.coefficients[1]!) < 1e-15);
  t.equal(f4.tss, 0);
});

t.test('a column scaled by a power of two far from 1 gives the coefficient scaled exactly', async (t) => {
  // Equilibration's column scales are exact powers of two, so scaling a column by
  // 2^300 (beyond the range where the column sums are taken unscaled, 2^±250)
  // must leave every other number unchanged and divide its coefficient by 2^300.
  const { design, y } = strdDesign(loadStrd('longley'));
  const base = fitLeastSquares(design, y);
  for (const e of [300, -300]) {
    const high = design.high.map((c, j) => (j === 2 ? c.map((v) => v * 2 ** e) : c));
    const low = design.low.map((c, j) => (j === 2 ? c.map((v) => v * 2 ** e) : c));
    const fit = fitLeastSquares({ ...design, high, low }, y);
    t.equal(fit.coefficients[2], base.coefficients[2]! * 2 ** -e, `2^${e}: scaled coefficient`);
    t.same(fit.coefficients.filter((_, j) => j !== 2), base.coefficients.filter((_, j) => j !== 2), `2^${e}: others`);
    t.equal(fit.rss, base.rss, `2^${e}: rss`);
  }
});
