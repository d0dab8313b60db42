// POST /v1/comparisons end to end through app.inject: the contract's fixed
// names, the audit record behind every id, and certified numbers surviving the
// trip through JSON.
import { readFileSync } from 'node:fs';
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

function nist(name: string) {
  return JSON.parse(readFileSync(new URL(`../reference/nist/${name}.json`, import.meta.url), 'utf8'));
}

/** log relative error: digits of agreement (NIST StRD's measure). */
function lre(value: number, certified: number): number {
  if (value === certified) return 15;
  return -Math.log10(Math.abs(value - certified) / Math.abs(certified));
}

t.test('the demo comparison answers every fixed field of the contract', async (t) => {
  const { app, store } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
  t.equal(res.statusCode, 200, res.body.slice(0, 500));
  const body = res.json();
  t.type(body.id, 'string');
  t.match(body.dataset.fingerprint, /^sha256:[0-9a-f]{64}$/);
  t.equal(body.dataset.observations, 116, '120 rows less 4 with a missing value (api.md: common rows)');
  t.equal(body.dataset.rowsDropped, 4);
  t.equal(body.models.length, 5);
  for (const m of body.models) {
    for (const key of ['name', 'parameters', 'observations', 'logLikelihood', 'aic', 'aicc', 'bic', 'r2', 'adjustedR2', 'rss', 'coefficients']) {
      t.ok(key in m, `models[].${key}`);
    }
    t.equal(m.observations, 116);
    t.equal(m.parameters, m.coefficients.length + 1, 'k = coefficients + error variance when nothing is aliased');
  }
  for (const criterion of ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2']) {
    const ranking = body.rankings[criterion];
    t.equal(ranking.length, 5, `rankings.${criterion}`);
    t.equal(ranking[0].delta, 0, 'the best has delta 0');
    t.ok(ranking.every((e: { delta: number }) => e.delta >= 0), 'deltas are never negative');
  }
  t.ok(body.rankings.adjustedR2.every((e: { weight: null }) => e.weight === null), 'no weights over adjusted R²');
  // The demo data come from a known model (scripts/demo-data.ts): AICc must find it.
  t.equal(body.verdict.best.aicc, 'curve+moisture+kiln');
  t.type(body.verdict.agree, 'boolean');
  t.ok(body.cautions.some((c: { code: string }) => c.code === 'ranking_is_not_validation'), 'the standing caution');
  const record = await store.get(body.id);
  t.ok(record, 'an audit record stands behind the id');
  t.equal(record!.datasetFingerprint, body.dataset.fingerprint);
});

t.test('NIST Filip through HTTP: certified estimates to at least 10 digits after the JSON round trip', async (t) => {
  // Source: NIST StRD linear regression, Filip (higher difficulty), certified values.
  const d = nist('filip');
  const terms = ['x', ...Array.from({ length: 9 }, (_, i) => ({ kind: 'power', of: 'x', degree: i + 2 }))];
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: { y: d.data.y, x: d.data.x } }, response: 'y', candidates: [{ name: 'filip', terms }] },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const model = res.json().models[0];
  t.same(model.aliased, [], 'full rank: Filip must not be declared singular');
  d.certified.parameters.forEach((p: { estimate: string; standardDeviation: string }, j: number) => {
    t.ok(lre(model.coefficients[j].estimate, Number(p.estimate)) >= 10, `B${j} estimate`);
    t.ok(lre(model.coefficients[j].standardError, Number(p.standardDeviation)) >= 10, `B${j} standard deviation`);
  });
  t.ok(lre(model.r2, Number(d.certified.rSquared)) >= 10, 'R²');
});

t.test('NIST Wampler1 is an exact fit: 200 with coefficients, null likelihood criteria and a caution', async (t) => {
  // Source: NIST StRD Wampler1: y = 1 + x + ... + x^5 exactly; certified residual SD 0.
  const d = nist('wampler1');
  const terms = ['x', ...[2, 3, 4, 5].map((degree) => ({ kind: 'power', of: 'x', degree }))];
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: { y: d.data.y, x: d.data.x } }, response: 'y', candidates: [{ name: 'w1', terms }, { name: 'line', terms: ['x'] }] },
  });
  t.equal(res.statusCode, 200);
  const body = res.json();
  const exact = body.models.find((m: { name: string }) => m.name === 'w1');
  for (const key of ['logLikelihood', 'aic', 'aicc', 'bic', 'hqc']) t.equal(exact[key], null, `${key} is null, not a huge number`);
  t.ok(exact.cautions.some((c: { code: string }) => c.code === 'exact_fit'));
  exact.coefficients.forEach((c: { estimate: number }) => t.ok(Math.abs(c.estimate - 1) < 1e-9, `${c.estimate} ≈ 1`));
  t.equal(body.rankings.aicc[0].name, 'line', 'the model with a finite criterion ranks; the exact fit is listed last');
  t.equal(body.rankings.aicc[1].rank, null);
});

t.test('a model without intercept says its R² is uncentred', async (t) => {
  // Source: NIST StRD NoInt1 (y = B1 x); certified R² is the uncentred one.
  const d = nist('noint1');
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: { y: d.data.y, x: d.data.x } }, response: 'y', candidates: [{ name: 'origin', terms: ['x'], intercept: false }] },
  });
  const m = res.json().models[0];
  t.equal(m.r2Basis, 'uncentred');
  t.ok(lre(m.r2, Number(d.certified.rSquared)) >= 10, 'R² as NIST certifies it');
  t.ok(lre(m.coefficients[0].estimate, Number(d.certified.parameters[0].estimate)) >= 10);
  t.ok(m.cautions.some((c: { code: string }) => c.code === 'uncentred_r2'));
});

t.test('/healthz and /readyz answer', async (t) => {
  const { app } = await buildTestApp(t);
  t.equal((await app.inject({ method: 'GET', url: '/healthz' })).statusCode, 200);
  const ready = await app.inject({ method: 'GET', url: '/readyz' });
  t.equal(ready.statusCode, 200);
  t.equal(ready.json().status, 'ok');
});
