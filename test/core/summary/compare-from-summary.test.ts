// A comparison computed from a data summary against the comparison computed
// from the rows (compareModels, QR on the rows, checked against NIST StRD):
// the same criteria to 1e-9, unweighted and weighted; candidates fitted
// elsewhere by rss join; what needs rows is refused with the reason.
import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { compareModels, type CandidateInput } from '../../../src/core/compare.ts';
import { compareFromSummary } from '../../../src/core/comparison/from-summary.ts';
import { summariseRows } from '../../../src/core/summary/index.ts';
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
    const rows = compareModels({ columns, response: 'shrinkage', weights: weighted ? 'w' : null, candidates, ...policy }, { maxWorkCells: 1e8 });
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
