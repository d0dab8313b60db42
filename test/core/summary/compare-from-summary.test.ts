// A comparison computed from a data summary against the comparison computed
// from the rows (compareModels, QR on the rows, checked against NIST StRD):
// the same criteria to 1e-9, unweighted and weighted; candidates fitted
// elsewhere by rss join; what needs rows is refused with the reason.
import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { compareModels, type CandidateInput } from '../../../src/core/compare.ts';
import { compareFromSummary } from '../../../src/core/comparison/from-summary.ts';
import { summariseRows, summaryFingerprint } from '../../../src/core/summary/index.ts';
import { PIVOT_TOLERANCE } from '../../../src/core/search/index.ts';
import { DEFAULT_ACTIVE_POLICY } from '../../../src/policy-file.ts';

const close = (a: number | null, b: number | null, tol = 1e-9) => a !== null && b !== null && Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));
const d = demoColumns();
const keep = d.shrinkage.map((y, i) => y !== null && d.moisture[i] !== null);
const pick = (v: (number | string | null)[]) => v.filter((_, i) => keep[i]) as number[];
const columns = { peakTemp: pick(d.peakTemp), holdMinutes: pick(d.holdMinutes), moisture: pick(d.moisture), shrinkage: pick(d.shrinkage), w: pick(d.peakTemp).map((_, i) => 1 + (i % 3)) };
const names = ['peakTemp', 'holdMinutes', 'moisture', 'shrinkage'];
const candidates: CandidateInput[] = [
  { form: 'fit', name: 'temp', terms: ['peakTemp'], intercept: true },
  { form: 'fit', name: 'temp+moisture', terms: ['peakTemp', 'moisture'], intercept: true },
  { form: 'fit', name: 'all, no intercept', terms: ['peakTemp', 'holdMinutes', 'moisture'], intercept: false },
  { form: 'rss', name: 'elsewhere', rss: 4.2, parameters: 3, observations: columns.peakTemp.length },
];
const policy = { policy: DEFAULT_ACTIVE_POLICY.policy, policyHash: DEFAULT_ACTIVE_POLICY.hash };

for (const weighted of [false, true]) {
  t.test(`summary comparison equals the rows' comparison${weighted ? ', weighted' : ''}`, (t) => {
    const rows = compareModels({ columns, response: 'shrinkage', weights: weighted ? 'w' : null, candidates, ...policy });
    const summary = summariseRows(names.map((c) => Float64Array.from(columns[c as keyof typeof columns])), weighted ? Float64Array.from(columns.w) : null, names);
    const fromSummary = compareFromSummary({ summary, response: 'shrinkage', candidates, ...policy });
    if (!('result' in rows) || !('result' in fromSummary)) return t.fail(JSON.stringify([rows, fromSummary]).slice(0, 500));
    rows.result.models.forEach((m, i) => {
      const s = fromSummary.result.models[i];
      for (const key of ['logLikelihood', 'aic', 'aicc', 'bic', 'hqc', 'rss', 'r2', 'adjustedR2', 'sigma'] as const) {
        if (m.source === 'rss' && (key === 'r2' || key === 'adjustedR2')) continue; // R² of an rss candidate needs the response's rows
        t.ok(close(s[key], m[key]), `${m.name}: ${key} ${s[key]} vs ${m[key]}`);
      }
      t.equal(s.parameters, m.parameters);
    });
    t.same(fromSummary.result.verdict.best, rows.result.verdict.best, 'the same verdict');
    t.ok(fromSummary.result.cautions.some((c) => c.code === 'summary_input'));
    t.match(fromSummary.result.dataset.fingerprint, /^sha256:[0-9a-f]{64}$/);
    t.end();
  });
}

t.test('what needs the rows is refused with the reason', (t) => {
  const summary = summariseRows(names.map((c) => Float64Array.from(columns[c as keyof typeof columns])), null, names);
  const out = compareFromSummary({
    summary, response: 'shrinkage', ...policy,
    candidates: [
      { form: 'fit', name: 'square', terms: [{ kind: 'power', of: 'peakTemp', degree: 2 }], intercept: true },
      { form: 'residuals', name: 'r', residuals: [1, 2], parameters: 2 },
      { form: 'fit', name: 'log', terms: ['peakTemp'], intercept: true, response: { fn: 'log' } },
      { form: 'fit', name: 'unknown', terms: ['kiln'], intercept: true },
    ],
  });
  t.ok('issues' in out);
  if ('issues' in out) t.same(out.issues.map((i) => [i.code, i.path.join('/')]), [
    ['summary_rows_needed', 'candidates/0/terms/0'],
    ['summary_rows_needed', 'candidates/1/residuals'],
    ['summary_rows_needed', 'candidates/2/response'],
    ['summary_column_unknown', 'candidates/3/terms/0'],
  ]);
  t.end();
});

t.test('an exact fit from a summary is detected as on the rows', (t) => {
  // A response computed from peakTemp and holdMinutes (a definition): the rows' QR finds it exact (logLikelihood null);
  // the normal equations leave an RSS of rounding, about eps * Cyy, which the summary rule must call exact too.
  const y = columns.peakTemp.map((x, i) => 0.013 * x - 0.7 + 0.021 * columns.holdMinutes[i]);
  const cols = { ...columns, shrinkage: y };
  const exact: CandidateInput[] = [
    { form: 'fit', name: 'exact', terms: ['peakTemp', 'holdMinutes'], intercept: true },
    { form: 'fit', name: 'exact, no intercept', terms: ['peakTemp', 'holdMinutes', 'moisture'], intercept: false },
    { form: 'fit', name: 'temp only', terms: ['peakTemp'], intercept: true },
  ];
  const rows = compareModels({ columns: cols, response: 'shrinkage', weights: null, candidates: exact, ...policy });
  const summary = summariseRows(names.map((c) => Float64Array.from(cols[c as keyof typeof cols])), null, names);
  const fromSummary = compareFromSummary({ summary, response: 'shrinkage', candidates: exact, ...policy });
  if (!('result' in rows) || !('result' in fromSummary)) return t.fail('both compute');
  t.same(rows.result.models.map((m) => m.logLikelihood === null), [true, false, false], 'the rows: the first is exact; without an intercept the constant -0.7 is missing');
  t.same(fromSummary.result.models.map((m) => m.logLikelihood === null), [true, false, false], 'the summary agrees');
  t.ok(fromSummary.result.models[0].cautions.some((c) => c.code === 'exact_fit'));
  t.ok(close(fromSummary.result.models[2].aicc, rows.result.models[2].aicc), 'a model with scatter keeps its criterion');
  t.end();
});

t.test('a summary comparison states the rank rule it applied', (t) => {
  // z = x + 1e-6 * noise: QR on the rows resolves z (remaining norm ratio ~1e-7 > 1e-10); a sweep of the normal
  // equations cannot (squared ratio ~1e-14 < its 1e-10), and the conventions must say so rather than quote the rows' rule.
  const x = columns.peakTemp;
  const z = x.map((v, i) => v + 1e-6 * Math.sin(i * 7.3));
  const cols = { x, z, y: columns.shrinkage };
  const cands: CandidateInput[] = [{ form: 'fit', name: 'xz', terms: ['x', 'z'], intercept: true }];
  const summary = summariseRows([Float64Array.from(x), Float64Array.from(z), Float64Array.from(cols.y)], null, ['x', 'z', 'y']);
  const out = compareFromSummary({ summary, response: 'y', candidates: cands, ...policy });
  if (!('result' in out)) return t.fail('computes');
  const C = summary.centredCrossProducts;
  const remaining = (C[1][1] - (C[0][1] * C[0][1]) / C[0][0]) / C[1][1]; // 1 - R² of z on x
  t.ok(remaining < PIVOT_TOLERANCE, `z's remaining sum-of-squares ratio ${remaining.toExponential(1)} is below the sweep tolerance`);
  t.same(out.result.models[0].aliased, ['z'], 'so the summary fit aliases z');
  t.match(out.result.conventions.rank, String(PIVOT_TOLERANCE), 'and the conventions quote the sweep tolerance');
  t.match(out.result.conventions.rank, /sum of squares/, 'on sums of squares, not norms');
  const rows = compareModels({ columns: cols, response: 'y', weights: null, candidates: cands, ...policy });
  if ('result' in rows) {
    t.same(rows.result.models[0].aliased, [], 'the rows resolve z');
    t.notSame(rows.result.conventions.rank, out.result.conventions.rank, 'the rows state their own rule');
  }
  t.end();
});

t.test('a term repeated with a summary is a duplicate, as on the rows', (t) => {
  const summary = summariseRows(names.map((c) => Float64Array.from(columns[c as keyof typeof columns])), null, names);
  const cands: CandidateInput[] = [{ form: 'fit', name: 'twice', terms: ['peakTemp', 'moisture', 'peakTemp'], intercept: true }];
  const out = compareFromSummary({ summary, response: 'shrinkage', candidates: cands, ...policy });
  const rows = compareModels({ columns, response: 'shrinkage', weights: null, candidates: cands, ...policy });
  t.ok('issues' in out && 'issues' in rows);
  if ('issues' in out && 'issues' in rows) {
    t.same(out.issues.map((i) => [i.code, i.path.join('/')]), rows.issues.map((i) => [i.code, i.path.join('/')]), 'the same issue at the same path');
    t.same(out.issues.map((i) => [i.code, i.path.join('/'), (i as { first?: number }).first]), [['duplicate_term', 'candidates/0/terms/2', 0]]);
  }
  t.end();
});

t.test('the summary fingerprint treats -0 as 0, as the rows fingerprint does', (t) => {
  const summary = summariseRows(names.map((c) => Float64Array.from(columns[c as keyof typeof columns])), null, names);
  const negative = structuredClone(summary);
  negative.means[0] = 0;
  const signed = structuredClone(negative);
  signed.means[0] = -0;
  t.equal(summaryFingerprint(signed), summaryFingerprint(negative));
  const other = structuredClone(negative);
  other.means[0] = Number.MIN_VALUE;
  t.not(summaryFingerprint(other), summaryFingerprint(negative), 'a different number still differs');
  t.end();
});
