// A search of a transformed response (responseTransform) against a comparison
// of every subset with the same `response` transform on each candidate: the
// same best models with the same numbers to the last digit, weights and
// importance over every subset to 1e-9. Independently of the service's own
// transform code, the log-likelihood of a model of g(y) equals that of the same
// model fitted to a column holding g(y), plus Σ ln g'(y) computed here (the
// change-of-variables rule, Box & Cox 1964).
// Data: the demo scenario's generator (scripts/demo-data.ts).
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoColumns } from '../../scripts/demo-data.ts';
import type { Term } from '../../src/core/types.ts';

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));
const pool: Term[] = ['peakTemp', 'holdMinutes', 'moisture', { kind: 'factor', of: 'kiln' }, { kind: 'power', of: 'peakTemp', degree: 2 }, { kind: 'product', of: ['peakTemp', 'holdMinutes'] }];
type Model = { name: string; terms: Term[]; aic: number; aicc: number; logLikelihood: number; rss: number; parameters: number; coefficients: unknown[]; delta: number; weight: number; responseTransform: { fn: string; jacobian: number } | null };

for (const transform of [{ fn: 'log' }, { fn: 'sqrt' }, { fn: 'boxcox', lambda: 0.5 }] as const) {
  t.test(`a search of ${transform.fn}(shrinkage) equals a comparison of every subset with that transform`, async (t) => {
    const { app, store } = await buildTestApp(t, { eventLoopMaxDelayMs: 0 });
    const columns = demoColumns();
    const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'shrinkage', pool, responseTransform: transform, rankBy: 'aicc', top: 64 } });
    t.equal(res.statusCode, 200, res.body.slice(0, 400));
    const body = res.json();
    const candidates = Array.from({ length: 2 ** pool.length }, (_, mask) => ({ name: `s${mask}`, terms: pool.filter((_, j) => (mask >>> j) & 1), response: transform }));
    const compared = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns }, response: 'shrinkage', candidates } });
    t.equal(compared.statusCode, 200, compared.body.slice(0, 400));
    const reference: Model[] = compared.json().models.map((m: Model, i: number) => ({ ...m, terms: candidates[i].terms }));
    const best = Math.min(...reference.map((m) => m.aicc));
    const total = reference.reduce((s, m) => s + Math.exp(-(m.aicc - best) / 2), 0);
    reference.sort((a, b) => a.aicc - b.aicc || a.terms.length - b.terms.length);
    t.equal(body.evaluated, 64);
    body.models.forEach((m: Model, i: number) => {
      const r = reference[i];
      t.same(m.terms, r.terms, `model ${i}: same terms`);
      for (const key of ['aic', 'aicc', 'logLikelihood', 'rss', 'parameters'] as const) t.equal(m[key], r[key], `model ${i}: ${key} to the last digit`);
      t.same(m.coefficients, r.coefficients, `model ${i}: coefficients`);
      t.same(m.responseTransform, r.responseTransform, `model ${i}: the refit reports the transform and its Jacobian`);
      t.ok(close(m.weight, Math.exp(-(r.aicc - best) / 2) / total), `model ${i}: weight`);
    });
    const importance = pool.map((term) => reference.filter((m) => m.terms.some((u) => JSON.stringify(u) === JSON.stringify(term))).reduce((s, m) => s + Math.exp(-(m.aicc - best) / 2) / total, 0));
    t.ok(body.importance.every((x: { weight: number }, j: number) => close(x.weight, importance[j])), 'importance over every subset');
    t.same({ ...body.responseTransform, jacobian: undefined }, { ...transform, jacobian: undefined }, 'the answer says which transform');
    const record = await store.get(body.id);
    t.same((record?.result as { responseTransform?: unknown }).responseTransform, body.responseTransform, 'and so does its audit record');
  });
}

t.test('the Jacobian, checked without the service\'s transform code', async (t) => {
  const { app } = await buildTestApp(t);
  const columns = demoColumns();
  const y = columns.shrinkage as (number | null)[];
  const kept = y.map((v, i) => (v !== null && columns.moisture[i] !== null ? i : -1)).filter((i) => i >= 0);
  const search = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'shrinkage', pool: ['peakTemp', 'moisture'], responseTransform: { fn: 'log' }, top: 4 } });
  t.equal(search.statusCode, 200, search.body.slice(0, 400));
  const full = search.json().models.find((m: Model) => m.terms.length === 2) as Model;
  // The same model fitted to a column holding ln y, as a model of that column (no transform, no Jacobian).
  const logColumn = y.map((v) => (v === null ? null : Math.log(v)));
  const direct = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns: { ...columns, logShrinkage: logColumn } }, response: 'logShrinkage', candidates: [{ name: 'direct', terms: ['peakTemp', 'moisture'] }] } });
  t.equal(direct.statusCode, 200, direct.body.slice(0, 400));
  let sumLog = 0;
  for (const i of kept) sumLog += Math.log(y[i] as number);
  const onLogScale = direct.json().models[0].logLikelihood;
  t.ok(close(full.logLikelihood, onLogScale - sumLog, 1e-12), `ln L on the scale of y = ln L of ln y − Σ ln y (${full.logLikelihood} vs ${onLogScale - sumLog})`);
  t.ok(close(full.rss, direct.json().models[0].rss, 1e-12), 'RSS on the transformed scale');
  t.ok(close(search.json().responseTransform.jacobian, -sumLog, 1e-12), 'the stated Jacobian is −Σ ln y');
});

t.test('a transform outside its domain, or with a data summary, is a 422 naming responseTransform', async (t) => {
  const { app } = await buildTestApp(t);
  const columns = { y: [1, 2, 0, 4, 5, 6], x: [1, 2, 3, 4, 5, 7] };
  const zero = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'y', pool: ['x'], responseTransform: { fn: 'log' } } });
  t.equal(zero.statusCode, 422, zero.body);
  t.equal(zero.json().errors[0].path, 'responseTransform');
  t.equal(zero.json().errors[0].code, 'response_transform_domain');
  const summary = { rows: 6, columns: ['x', 'y'], means: [3, 3], centredCrossProducts: [[17.5, 10], [10, 17.5]] };
  const fromSummary = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { summary }, response: 'y', pool: ['x'], responseTransform: { fn: 'sqrt' } } });
  t.equal(fromSummary.statusCode, 422, fromSummary.body);
  t.equal(fromSummary.json().errors[0].path, 'responseTransform');
  const noLambda = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'y', pool: ['x'], responseTransform: { fn: 'boxcox' } } });
  t.equal(noLambda.statusCode, 400);
  t.equal(noLambda.json().errors[0].path, 'responseTransform/lambda');
});
