// Errors of the records routes that must point the right way: an id of the
// other kind says what it is and where to read it, and a fingerprint filter
// that could never match a stored fingerprint is a 400 naming the field.
import t from 'tap';
import { requestDigest, type NewRecord } from '../../src/audit/open.ts';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

// Demo scenario (invented): a stored search over kiln settings.
function searchRecord(): NewRecord {
  const request = { response: 'shrinkage', pool: ['peakTemp', 'moisture'] };
  return {
    kind: 'search', caller: 'anonymous', label: null, serviceVersion: '0.1.0', conventionsVersion: '1', policy: null,
    datasetFingerprint: null, requestDigest: requestDigest(request), request, result: { evaluated: 4, models: [] },
  };
}

t.test('a search\'s id under /v1/comparisons says it is a search and where to read it', async (t) => {
  const { app, store } = await buildTestApp(t);
  const search = await store.append(searchRecord());
  for (const suffix of ['', '/chart.svg', '/report']) {
    const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${search.id}${suffix}` });
    t.equal(res.statusCode, 404, `GET /v1/comparisons/{id}${suffix}`);
    t.match(res.headers['content-type'], /^application\/problem\+json/);
    const body = res.json();
    t.equal(body.detail, `${search.id} is a search, not a comparison: read it at GET /v1/searches/${search.id}`);
    t.equal(body.recordKind, 'search');
    t.equal(body.href, `/v1/searches/${search.id}`);
  }
  const replay = await app.inject({ method: 'POST', url: `/v1/comparisons/${search.id}/replay` });
  t.equal(replay.statusCode, 404);
  t.equal(replay.json().href, `/v1/searches/${search.id}`);
  const found = await app.inject({ method: 'GET', url: `/v1/searches/${search.id}` });
  t.equal(found.statusCode, 200, 'and it is there');
});

t.test('a comparison\'s id under /v1/searches says it is a comparison', async (t) => {
  const { app } = await buildTestApp(t);
  const posted = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).json();
  const res = await app.inject({ method: 'GET', url: `/v1/searches/${posted.id}` });
  t.equal(res.statusCode, 404);
  t.equal(res.json().detail, `${posted.id} is a comparison, not a search: read it at GET /v1/comparisons/${posted.id}`);
  t.equal(res.json().href, `/v1/comparisons/${posted.id}`);
  const unknown = await app.inject({ method: 'GET', url: '/v1/searches/01890a5d-ac96-774b-bcce-b302099a8057' });
  t.equal(unknown.json().detail, 'no search with id 01890a5d-ac96-774b-bcce-b302099a8057', 'an unknown id is simply not found');
});

t.test('a malformed fingerprint filter is a 400 naming the field', async (t) => {
  const { app } = await buildTestApp(t);
  const posted = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).json();
  const fingerprint: string = posted.dataset.fingerprint;
  for (const bad of ['abc', fingerprint.slice(7), fingerprint.toUpperCase(), `${fingerprint}0`, 'sha256:xyz', 'sha1:' + 'a'.repeat(40)]) {
    const res = await app.inject({ method: 'GET', url: `/v1/comparisons?fingerprint=${encodeURIComponent(bad)}` });
    t.equal(res.statusCode, 400, bad);
    const body = res.json();
    t.equal(body.errors[0].path, 'fingerprint');
    t.match(body.errors[0].message, /expected "sha256:" and 64 lowercase hex digits/);
  }
  const good = await app.inject({ method: 'GET', url: `/v1/comparisons?fingerprint=${encodeURIComponent(fingerprint)}` });
  t.equal(good.statusCode, 200);
  t.same(good.json().records.map((r: { id: string }) => r.id), [posted.id]);
});
