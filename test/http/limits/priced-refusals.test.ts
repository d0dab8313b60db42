// Requests that are small on the wire and ask for enormous work are refused
// from their price, before anything is built: a 422 problem of type
// work-limit naming the estimate, the cap and its setting, the part of the
// request to change, nothing recorded — and the service answers the next
// caller as before. (The wide product below would allocate gigabytes if it
// were built; the test finishing at all shows it was not.)
import t, { type Test } from 'tap';
import { buildTestApp } from '../../helper.ts';
import { manyLevels, manyPredictions, wideProductOfFactors, zoneSearch, zoneSummary } from './hostile-bodies.ts';

const small = { data: { columns: { thickness: [30.1, 29.4, 31.2, 30.8, 29.9, 30.5], lineSpeed: [50, 62, 41, 45, 58, 49] } }, response: 'thickness', candidates: [{ name: 'speed', terms: ['lineSpeed'] }] };

async function stillAnswers(t: Test, app: Awaited<ReturnType<typeof buildTestApp>>['app']) {
  t.equal((await app.inject({ method: 'GET', url: '/healthz' })).statusCode, 200, '/healthz answers afterwards');
  t.equal((await app.inject({ method: 'POST', url: '/v1/comparisons', payload: small })).statusCode, 200, 'a small comparison is answered afterwards');
}

function limitProblem(t: Test, res: { statusCode: number; headers: Record<string, unknown>; json(): any }, setting: string) {
  t.equal(res.statusCode, 422);
  t.match(res.headers['content-type'], /application\/problem\+json/);
  const body = res.json();
  t.equal(body.type, 'urn:parsimetry:problem:work-limit');
  t.equal(body.setting, setting, `the problem names ${setting}`);
  t.type(body.limit, 'number');
  t.ok(body.estimate > body.limit, `the estimate ${body.estimate} is over the limit ${body.limit}`);
  t.match(body.detail, new RegExp(setting));
  return body;
}

t.test('a product of three text factors: refused by MAX_DESIGN_COLUMNS before any column is built', async (t) => {
  const { app, store } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: wideProductOfFactors() });
  const body = limitProblem(t, res, 'MAX_DESIGN_COLUMNS');
  t.match(body.errors[0], { code: 'design_columns_limit', path: 'candidates/1/terms/0', limit: 2000 });
  t.ok(body.errors[0].columns > 2000);
  t.match(body.detail, /merge rare levels, drop products of factors, or send a data summary/);
  t.equal((await store.list()).records.length, 0, 'nothing recorded');
  await stillAnswers(t, app);
});

t.test('the same product in a search pool is refused the same way', async (t) => {
  const { app } = await buildTestApp(t);
  const wide = wideProductOfFactors();
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: wide.data, response: 'thickness', pool: ['supplier', { kind: 'product', of: ['supplier', 'resin', 'operator'] }] } });
  const body = limitProblem(t, res, 'MAX_DESIGN_COLUMNS');
  t.equal(body.errors[0].path, 'pool/1');
});

t.test('a factor of 600 levels in three models: refused by MAX_REQUEST_WORK, naming the largest part', async (t) => {
  const { app, store } = await buildTestApp(t);
  const payload = manyLevels(6000, 600, 3);
  t.ok(JSON.stringify(payload).length < 200_000, 'a small body');
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  const body = limitProblem(t, res, 'MAX_REQUEST_WORK');
  t.match(body.errors[0], { code: 'work_limit', unit: 'multiply-adds', path: 'candidates/2/terms/0' });
  t.match(body.errors[0].largest, /candidate 2 \("lots 2", 60\d design columns on 6000 rows\)/);
  t.match(body.detail, /fewer candidates or terms, merge factor levels/);
  t.equal((await store.list()).records.length, 0);
  await stillAnswers(t, app);
});

t.test('twenty models at 100,000 new rows: refused by MAX_REQUEST_WORK (the averaged bounds) and MAX_RESULT_BYTES before fitting', async (t) => {
  const { app, store } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: manyPredictions() });
  // Work is checked first; every cap the request is over is listed in errors[].
  const body = limitProblem(t, res, 'MAX_REQUEST_WORK');
  t.match(body.errors.find((e: { code: string }) => e.code === 'result_size_limit'), { measured: false, path: 'options/predict/columns', unit: 'bytes' });
  t.match(body.errors.find((e: { code: string }) => e.code !== 'result_size_limit'), { path: 'options/predict/columns' });
  t.match(body.detail, /Predict at fewer new rows/);
  t.equal((await store.list()).records.length, 0);
  await stillAnswers(t, app);
});

t.test('a 24-term pool asked for every subset: refused by MAX_REQUEST_WORK; without exhaustive it may run branch and bound', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: zoneSearch(400, 24, { exhaustive: true }) });
  const body = limitProblem(t, res, 'MAX_REQUEST_WORK');
  t.match(body.errors[0].largest, /scoring all 16777216 subsets of 24 pool terms/);
  t.match(body.detail, /Narrow the pool, move terms to always/);
});

t.test('a wide summary with always terms: its width counts, so every subset is refused by MAX_REQUEST_WORK', async (t) => {
  const { app } = await buildTestApp(t);
  const summary = zoneSummary(150);
  const payload = { data: { summary }, response: 'thickness', pool: summary.columns.slice(0, 20), always: summary.columns.slice(20, 149), exhaustive: true };
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload });
  const body = limitProblem(t, res, 'MAX_REQUEST_WORK');
  t.match(body.errors[0].largest, /over 150 cross-product columns/);
});

t.test('MAX_REQUEST_MEMORY_BYTES: a request whose designs would not fit is refused by name', async (t) => {
  const { app } = await buildTestApp(t, { maxRequestMemoryBytes: 1_000_000 });
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: manyLevels(3000, 40, 2) });
  const body = limitProblem(t, res, 'MAX_REQUEST_MEMORY_BYTES');
  t.match(body.errors[0], { code: 'memory_limit', unit: 'bytes' });
  t.match(body.detail, /MiB of working memory/);
});
