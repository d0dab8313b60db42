// Data summaries: merge of halves equals the whole (Chan, Golub & LeVeque's
// pairwise rule is exact in exact arithmetic), fits from a summary equal QR
// on the rows (src/core/fit, checked against NIST StRD) to 1e-9 in the
// criteria, NIST Longley's certified RSS, and validation of bad summaries.

import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { loadStrd, strdDesign } from '../../reference/nist/strd.ts';
import { fitFromSummary, mergeSummaries, summariseRows, validateSummary } from '../../../src/core/summary/index.ts';
import { fitLeastSquares } from '../../../src/core/fit/index.ts';
import { sharedCriterion } from '../../../src/core/search/scorer.ts';

const demo = demoColumns();
const keep = demo.shrinkage.map((y, i) => y !== null && demo.moisture[i] !== null);
const col = (v: (number | string | null)[]) => Float64Array.from(v.filter((_, i) => keep[i]).map((x) => (typeof x === 'number' ? x : x === 'west' ? 1 : 0)));
const names = ['peakTemp', 'holdMinutes', 'moisture', 'kilnWest', 'shrinkage'];
const cols = [col(demo.peakTemp), col(demo.holdMinutes), col(demo.moisture), col(demo.kiln), col(demo.shrinkage)];
const n = cols[0].length;

t.test('merging summaries of two halves gives the summary of the whole', (t) => {
  for (const weights of [null, Float64Array.from({ length: n }, (_, i) => 0.5 + (i % 5) / 4)]) {
    const whole = summariseRows(cols, weights, names);
    const cut = 47;
    const a = summariseRows(cols.map((c) => c.subarray(0, cut)), weights?.subarray(0, cut), names);
    const b = summariseRows(cols.map((c) => c.subarray(cut)), weights?.subarray(cut), names);
    const merged = mergeSummaries(a, b);
    t.ok(merged.ok);
    if (!merged.ok) continue;
    t.equal(merged.summary.rows, whole.rows);
    t.ok(merged.summary.means.every((m, j) => Math.abs(m - whole.means[j]) <= 1e-13 * Math.abs(whole.means[j])), 'means');
    const C = whole.centredCrossProducts;
    t.ok(
      merged.summary.centredCrossProducts.every((r, j) => r.every((v, k) => Math.abs(v - C[j][k]) <= 1e-11 * Math.sqrt(C[j][j] * C[k][k]))),
      'centred cross products',
    );
    if (weights) t.ok(Math.abs(merged.summary.weights!.sumLog - whole.weights!.sumLog) < 1e-12, 'sum of log weights');
  }
  const other = summariseRows(cols.slice(0, 2), null, ['a', 'b']);
  const refused = mergeSummaries(summariseRows(cols.slice(0, 2), null, ['a', 'c']), other);
  t.equal(refused.ok ? '' : refused.issues[0].code, 'summary_columns_differ');
  t.end();
});

t.test('a fit from the summary gives the criteria of QR on the rows to 1e-9', (t) => {
  const summary = summariseRows(cols, null, names);
  for (const predictors of [['peakTemp'], ['peakTemp', 'moisture', 'kilnWest'], ['peakTemp', 'holdMinutes', 'moisture', 'kilnWest']]) {
    for (const intercept of [true, false]) {
      const idx = predictors.map((p) => names.indexOf(p));
      const high = [...(intercept ? [new Float64Array(n).fill(1)] : []), ...idx.map((j) => cols[j])];
      const design = {
        rows: n,
        labels: [...(intercept ? ['intercept'] : []), ...predictors],
        high,
        low: high.map(() => new Float64Array(n)),
        intercept,
        termOfColumn: [...(intercept ? [-1] : []), ...predictors.map((_, j) => j)],
      };
      const qr = fitLeastSquares(design, cols[4]);
      const out = fitFromSummary(summary, 'shrinkage', predictors, intercept);
      t.ok(out.ok);
      if (!out.ok) continue;
      const f = out.fit;
      t.equal(f.rank, qr.rank);
      for (const c of ['aic', 'aicc', 'bic', 'hqc'] as const) {
        const a = sharedCriterion(c, n, 0, f.rss, f.rank + 1);
        const b = sharedCriterion(c, n, 0, qr.rss, qr.rank + 1);
        t.ok(Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b)), `${c} ${predictors.join('+')} intercept=${intercept}: ${a} vs ${b}`);
      }
      t.ok(f.coefficients.every((v, j) => Math.abs((v as number) - (qr.coefficients[j] as number)) <= 1e-7 * Math.abs(qr.coefficients[j] as number) + 1e-12), 'coefficients');
      t.ok(f.standardErrors.every((v, j) => Math.abs((v as number) - (qr.standardErrors[j] as number)) <= 1e-7 * (qr.standardErrors[j] as number)), 'standard errors');
    }
  }
  t.end();
});

t.test('NIST StRD Longley from its summary: certified RSS and coefficients', (t) => {
  const ds = loadStrd('longley');
  const { design, y } = strdDesign(ds);
  const columns = [...ds.predictors.map((p) => Float64Array.from(ds.data[p])), y];
  const out = fitFromSummary(summariseRows(columns, null, [...ds.predictors, 'y']), 'y', ds.predictors, true);
  t.ok(out.ok);
  if (!out.ok) return t.end();
  const certified = Number(ds.certified.anova.residual.sumOfSquares);
  const relative = Math.abs(out.fit.rss - certified) / certified;
  t.comment(`Longley RSS from summary: relative error ${relative.toExponential(2)} (QR on rows: ${(Math.abs(fitLeastSquares(design, y).rss - certified) / certified).toExponential(2)})`);
  t.ok(relative < 1e-9, 'RSS to 9 digits');
  ds.certified.parameters.forEach((p, j) => {
    const rel = Math.abs((out.fit.coefficients[j] as number) - Number(p.estimate)) / Math.abs(Number(p.estimate));
    t.ok(rel < 1e-6, `${p.name} to 6 digits (${rel.toExponential(1)})`);
  });
  t.end();
});

t.test('validation reports bad summaries as issues', (t) => {
  const good = summariseRows(cols, null, names);
  t.same(validateSummary(good), []);
  const asym = structuredClone(good);
  asym.centredCrossProducts[0][1] *= 1.01;
  t.equal(validateSummary(asym)[0].code, 'summary_not_symmetric');
  const indefinite = structuredClone(good);
  const c = indefinite.centredCrossProducts;
  c[0][1] = c[1][0] = 1.5 * Math.sqrt(c[0][0] * c[1][1]);
  t.equal(validateSummary(indefinite)[0].code, 'summary_not_positive_semidefinite');
  const negative = structuredClone(good);
  negative.centredCrossProducts[2][2] = -1;
  t.equal(validateSummary(negative)[0].code, 'summary_negative_variance');
  t.equal(validateSummary({ ...good, means: [1] })[0].code, 'summary_size_mismatch');
  t.equal(validateSummary({ ...good, rows: 0 })[0].code, 'summary_rows_invalid');
  // Exactly collinear columns (a column and twice it) are real data: semidefinite, accepted.
  const twice = summariseRows([cols[0], cols[0].map((v) => 2 * v), cols[4]], null, ['a', 'b', 'y']);
  t.same(validateSummary(twice), []);
  t.end();
});
