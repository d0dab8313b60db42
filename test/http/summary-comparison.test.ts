// A comparison posted with data.summary gives the criteria of the same
// comparison posted with rows (the summary is exactly what a Gaussian linear
// model needs from them), and a stored search reads back under its own path.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoColumns } from '../../scripts/demo-data.ts';

const cols = demoColumns(80, 11);
const keep = cols.shrinkage.map((_, i) => i).filter((i) => cols.moisture[i] !== null && cols.shrinkage[i] !== null);
const rows = { shrinkage: keep.map((i) => cols.shrinkage[i]), peakTemp: keep.map((i) => cols.peakTemp[i]), moisture: keep.map((i) => cols.moisture[i]) };
const candidates = [{ name: 'temperature', terms: ['peakTemp'] }, { name: 'both', terms: ['peakTemp', 'moisture'] }];

t.test('summary input gives the same criteria as raw rows (to 1e-9)', async (t) => {
  const { app } = await buildTestApp(t);
  const csv = ['peakTemp,moisture,shrinkage', ...keep.map((_, k) => `${rows.peakTemp[k]},${rows.moisture[k]},${rows.shrinkage[k]}`)].join('\n');
  const folded = await app.inject({ method: 'POST', url: '/v1/summaries?columns=peakTemp,moisture,shrinkage', headers: { 'content-type': 'text/csv' }, payload: csv });
  t.equal(folded.statusCode, 200, folded.body.slice(0, 200));
  const { summary } = folded.json();
  const bySummary = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { summary }, response: 'shrinkage', candidates } });
  t.equal(bySummary.statusCode, 200, bySummary.body.slice(0, 300));
  const byRows = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns: rows }, response: 'shrinkage', candidates } });
  const a = bySummary.json();
  const b = byRows.json();
  for (const m of b.models) {
    const s = a.models.find((x: { name: string }) => x.name === m.name);
    for (const key of ['logLikelihood', 'aic', 'aicc', 'bic', 'hqc', 'r2', 'adjustedR2']) {
      t.ok(Math.abs(s[key] - m[key]) <= 1e-9 * Math.max(1, Math.abs(m[key])), `${m.name}.${key}: ${s[key]} vs ${m[key]}`);
    }
    t.equal(s.press, null, 'leave-one-out needs rows');
  }
});

t.test('a stored search reads back at GET /v1/searches/{id}, not under comparisons', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: rows }, response: 'shrinkage', pool: ['peakTemp', 'moisture'], top: 3 } });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const search = res.json();
  const back = await app.inject({ method: 'GET', url: `/v1/searches/${search.id}` });
  t.equal(back.statusCode, 200);
  t.same(back.json().result, search, 'the answer exactly');
  t.equal(back.json().kind, 'search');
  t.equal((await app.inject({ method: 'GET', url: `/v1/comparisons/${search.id}` })).statusCode, 404);
});
