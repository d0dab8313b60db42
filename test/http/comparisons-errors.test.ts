// Every error class of POST /v1/comparisons answers RFC 9457 problem details
// (api.md "Errors", fixed form) with a field path, and never a 5xx or a stack.
import t, { type Test } from 'tap';
import { buildTestApp } from '../helper.ts';
import { requestDigest } from '../../src/audit/chain.ts';

const columns = {
  shrinkage: [6.1, 6.5, 7.2, 7.0, 7.9, 8.4, 8.1, 8.8],
  peakTemp: [1150, 1160, 1175, 1180, 1200, 1215, 1220, 1240],
  kiln: ['east', 'west', 'east', 'west', 'east', 'west', 'east', 'west'],
};
const valid = {
  data: { columns },
  response: 'shrinkage',
  candidates: [{ name: 'linear', terms: ['peakTemp'] }, { name: 'by-kiln', terms: ['peakTemp', 'kiln'] }],
};

function assertProblem(t: Test, res: { statusCode: number; headers: Record<string, unknown>; body: string }, status: number) {
  t.equal(res.statusCode, status, `status ${status}`);
  t.match(String(res.headers['content-type']), /^application\/problem\+json/, 'problem+json media type');
  const body = JSON.parse(res.body);
  t.equal(body.status, status, 'status repeated in the body');
  t.type(body.type, 'string');
  t.type(body.title, 'string');
  t.type(body.detail, 'string');
  t.notMatch(res.body, /\bat .+\.(ts|js):\d+/, 'no stack trace');
  return body;
}


t.test('a body that is not JSON is a 400 naming the problem', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload: '{"data": ' });
  const body = assertProblem(t, res, 400);
  t.equal(body.type, 'urn:parsimetry:problem:invalid-json');
});

t.test('a schema violation is a 400 with the exact JSON Pointer of the field', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { ...valid, candidates: [{ name: 'bad', terms: [{ kind: 'power', of: 'peakTemp', degree: 1 }] }] },
  });
  const body = assertProblem(t, res, 400);
  t.equal(body.type, 'urn:parsimetry:problem:invalid-request');
  t.ok(body.errors.some((e: { path: string }) => e.path.startsWith('candidates/0/terms/0')), JSON.stringify(body.errors));
});

t.test('an unknown top-level field is refused rather than silently ignored', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...valid, weigths: 'w' } });
  const body = assertProblem(t, res, 400);
  t.match(JSON.stringify(body.errors), /weigths/);
});

t.test('a JSON number that overflows to Infinity is a 400 at its cell', async (t) => {
  const { app } = await buildTestApp(t);
  const text = JSON.stringify(valid).replace('6.5', '1e999');
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload: text });
  const body = assertProblem(t, res, 400);
  t.ok(body.errors.some((e: { path: string; message: string }) => e.path === 'data/columns/shrinkage/1' && /finite/.test(e.message)), JSON.stringify(body.errors));
});

t.test('a prototype-polluting key is refused with a 400', async (t) => {
  const { app } = await buildTestApp(t);
  const text = '{"__proto__": {"polluted": true}, "data": {"columns": {}}}';
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload: text });
  assertProblem(t, res, 400);
  t.equal(({} as Record<string, unknown>).polluted, undefined, 'Object.prototype untouched');
});

t.test('a column named like an Object.prototype member is just an unknown column', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...valid, candidates: [{ name: 'm', terms: ['toString'] }] } });
  const body = assertProblem(t, res, 422);
  t.equal(body.errors[0].path, 'candidates/0/terms/0');
  t.equal(body.errors[0].code, 'unknown_column');
});

t.test('a body over the limit is a 413 naming the limit', async (t) => {
  const { app } = await buildTestApp(t, { bodyLimitBytes: 256 });
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: valid });
  const body = assertProblem(t, res, 413);
  t.match(body.detail, /256 bytes/);
  t.match(body.detail, /BODY_LIMIT_BYTES/);
});

t.test('a body that is not application/json is a 415', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'text/csv' }, payload: 'a,b\n1,2\n' });
  assertProblem(t, res, 415);
});

t.test('well-formed requests that cannot be computed are 422s with facts', async (t) => {
  const { app } = await buildTestApp(t);
  const cases: [string, object, string, string][] = [
    ['unknown response column', { ...valid, response: 'yield' }, 'response', 'unknown_column'],
    ['constant response', { ...valid, data: { columns: { ...columns, shrinkage: columns.shrinkage.map(() => 7) } } }, 'response', 'response_constant'],
    ['log of a non-positive value', { ...valid, data: { columns: { ...columns, peakTemp: [0, ...columns.peakTemp.slice(1)] } }, candidates: [{ name: 'log', terms: [{ kind: 'transform', of: 'peakTemp', fn: 'log' }] }] }, 'candidates/0/terms/0', 'transform_domain'],
    ['more coefficients than rows', { ...valid, candidates: [{ name: 'wiggly', terms: ['peakTemp', ...[2, 3, 4, 5, 6, 7, 8].map((degree) => ({ kind: 'power', of: 'peakTemp', degree }))] }] }, 'candidates/0', 'too_few_rows'],
    ['weights negative', { ...valid, data: { columns: { ...columns, w: [1, 1, -0.5, 1, 1, 1, 1, 1] } }, weights: 'w' }, 'weights', 'weights_not_positive'],
    ['power of a text column', { ...valid, candidates: [{ name: 'p', terms: [{ kind: 'power', of: 'kiln', degree: 2 }] }] }, 'candidates/0/terms/0', 'term_not_numeric'],
    ['unknown reference level', { ...valid, candidates: [{ name: 'f', terms: [{ kind: 'factor', of: 'kiln', reference: 'north' }] }] }, 'candidates/0/terms/0', 'factor_level_unknown'],
  ];
  for (const [what, payload, path, code] of cases) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    const body = assertProblem(t, res, 422);
    t.ok(body.errors.some((e: { path: string; code: string }) => e.path.startsWith(path) && e.code === code), `${what}: ${JSON.stringify(body.errors)}`);
  }
});

t.test('the work cap refuses a request with a 422 naming MAX_REQUEST_WORK', async (t) => {
  const { app } = await buildTestApp(t, { maxRequestWork: 10 });
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: valid });
  const body = assertProblem(t, res, 422);
  t.equal(body.type, 'urn:parsimetry:problem:work-limit');
  t.equal(body.errors[0].code, 'work_limit');
  t.match(body.errors[0].message, /MAX_REQUEST_WORK/);
  t.equal(body.errors[0].limit, 10);
  t.equal(body.setting, 'MAX_REQUEST_WORK');
});

t.test('an unknown route is a 404 problem', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'GET', url: '/v1/nothing-here' });
  assertProblem(t, res, 404);
});

t.test('when the audit store cannot take the record, the caller gets a 503 and no result', async (t) => {
  const { app, store } = await buildTestApp(t);
  await store.close();
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: valid });
  const body = assertProblem(t, res, 503);
  t.notOk('models' in body, 'no result without a record');
  const ready = await app.inject({ method: 'GET', url: '/readyz' });
  t.equal(ready.statusCode, 503, '/readyz turns unready');
});

t.test('text that cannot be stored as text is refused with its path: a lone surrogate, a NUL', async (t) => {
  const { app } = await buildTestApp(t);
  for (const [text, reason] of [['x\\ud800y', /surrogate/], ['nul\\u0000here', /NUL/]] as const) {
    const raw = JSON.stringify({ ...valid, label: 'placeholder' }).replace('placeholder', text);
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload: raw });
    const body = assertProblem(t, res, 400);
    t.equal(body.errors[0].path, 'label');
    t.match(body.errors[0].message, reason);
  }
});

t.test('__proto__ is refused as an unsafe key, by name, not as broken JSON', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'application/json' }, payload: '{"data": {"columns": {"__proto__": [1, 2]}}}' });
  const body = assertProblem(t, res, 400);
  t.equal(body.errors[0].path, 'data/columns/__proto__');
  t.equal(body.errors[0].code, 'unsafe-key');
});

t.test('text/plain is an unsupported media type (415), like any other non-JSON body', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', headers: { 'content-type': 'text/plain' }, payload: JSON.stringify(valid) });
  assertProblem(t, res, 415);
});

t.test('the audit record keeps and digests the body exactly as sent, before schema defaults', async (t) => {
  const { app, store } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: valid });
  const record = await store.get(res.json().id);
  t.same(record!.request, valid, 'no defaults filled in');
  t.equal(record!.requestDigest, requestDigest(valid), 'SHA-256 of the canonical JSON of what was sent');
});

t.test('data at the edge of double precision never give a 5xx, and a refusal leaves no record', async (t) => {
  const { app, store } = await buildTestApp(t);
  const huge = { ...valid, data: { columns: { ...columns, shrinkage: columns.shrinkage.map((v) => v * 1e160) } } };
  const tiny = { ...valid, data: { columns: { ...columns, w: columns.peakTemp.map((_, i) => (i % 2 ? 1e-308 : 1e308)) } }, weights: 'w' };
  for (const [what, payload] of [['response near 1e160', huge], ['weights spanning 1e-308..1e308', tiny]] as const) {
    const before = (await store.list({ limit: 100 })).records.length;
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
    t.ok(res.statusCode === 200 || res.statusCode === 422, `${what}: ${res.statusCode} ${res.body.slice(0, 200)}`);
    const after = (await store.list({ limit: 100 })).records.length;
    if (res.statusCode === 200) {
      t.equal(after, before + 1, `${what}: recorded`);
      t.notMatch(res.body, /NaN|Infinity/);
    } else t.equal(after, before, `${what}: refused, nothing recorded`);
  }
});
