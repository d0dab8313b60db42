// The access contract (issue 7): every route × every role × no key × a wrong key
// answers exactly 2xx / 401 / 403 as route-roles.ts says. Routes are taken from
// the app itself, so a route added later is checked without editing this file.
import t, { type Test } from 'tap';
import { buildTestApp } from '../../helper.ts';
import { demoColumns, demoComparison } from '../../../scripts/demo-data.ts';
import { accessFor, isListed, ROLES, type Role } from '../../../src/http/security/route-roles.ts';
import { bearer, newKey, testKeys } from './test-keys.ts';

const { ring, secrets } = testKeys({ scorer: ['score'], reader: ['read'], auditor: ['admin'] });
const keyFor: Record<Role, string> = { score: secrets.scorer, read: secrets.reader, admin: secrets.auditor };

interface Sample { query?: string; payload?: string | object; headers?: Record<string, string> }

/** A request each known route answers with 2xx given the right role. */
function sampleRequest(method: string, url: string): Sample {
  if (method !== 'POST') return {};
  if (url === '/v1/comparisons') return { payload: demoComparison() };
  if (url === '/v1/searches') {
    return { payload: { data: { columns: demoColumns() }, response: 'shrinkage', pool: ['peakTemp', 'holdMinutes', 'moisture'], rankBy: 'aicc', top: 3 } };
  }
  if (url === '/v1/summaries') {
    return { query: '?columns=shrinkage,peakTemp', payload: 'shrinkage,peakTemp\n0.41,1180\n0.44,1195\n0.47,1210\n', headers: { 'content-type': 'text/csv' } };
  }
  return {};
}

async function routesUnderTest(t: Test) {
  const { app, store } = await buildTestApp(t, { rateLimitPerMinute: 100_000, authFailuresPerMinute: 100_000 }, { keys: ring });
  const created = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison(), headers: bearer(secrets.scorer) });
  t.equal(created.statusCode, 200, 'a record to read, chart and replay');
  const id = created.json().id as string;
  const searched = await app.inject({ method: 'POST', url: '/v1/searches', payload: sampleRequest('POST', '/v1/searches').payload as object, headers: bearer(secrets.scorer) });
  t.equal(searched.statusCode, 200, 'a search record to read');
  const searchId = searched.json().id as string;
  // The life-data picture needs a comparison with a life model: the demo's response as a measurement.
  const life = await app.inject({
    method: 'POST', url: '/v1/comparisons', headers: bearer(secrets.scorer),
    payload: { ...demoComparison(), candidates: [{ name: 'normal', distribution: 'normal' }] },
  });
  t.equal(life.statusCode, 200, 'a record with a life picture');
  const lifeId = life.json().id as string;
  const idFor = (url: string) => (url.startsWith('/v1/searches/') ? searchId : url.endsWith('/life.svg') ? lifeId : id);
  const routes = app.registeredRoutes
    .filter((r) => r.method !== 'HEAD' && !r.url.startsWith('/docs'))
    .map((r) => ({ ...r, path: r.url.replace(/:id\b/g, idFor(r.url)) }));
  return { app, store, id, routes };
}


t.test('every registered route is in the route table (default-deny would make it admin-only)', async (t) => {
  const { app } = await buildTestApp(t);
  t.ok(app.registeredRoutes.length > 10, 'the route catalogue is filled');
  for (const r of app.registeredRoutes) {
    t.ok(isListed(r.method, r.url), `${r.method} ${r.url} is listed in src/http/security/route-roles.ts`);
  }
  t.same(accessFor('GET', '/v1/something-new'), { kind: 'role', role: 'admin' }, 'an unlisted route needs admin');
});

t.test('role matrix: 2xx with the role, 403 without it, 401 with no key or a wrong key', async (t) => {
  const { app, routes } = await routesUnderTest(t);
  for (const route of routes) {
    const access = accessFor(route.method, route.url);
    const sample = sampleRequest(route.method, route.url);
    const send = (headers: Record<string, string>) =>
      app.inject({ method: route.method as 'GET', url: route.path + (sample.query ?? ''), payload: sample.payload, headers: { ...sample.headers, ...headers } });
    const name = `${route.method} ${route.url}`;

    if (access.kind === 'public') {
      for (const headers of [{}, bearer(newKey())]) {
        const res = await send(headers);
        t.ok(res.statusCode >= 200 && res.statusCode < 300, `${name} is public (${res.statusCode})`);
      }
      continue;
    }
    for (const [label, headers] of [['no key', {}], ['a wrong key', bearer(newKey())], ['a malformed header', { authorization: 'Basic Zm9vOmJhcg==' }]] as const) {
      const res = await send(headers);
      t.equal(res.statusCode, 401, `${name} with ${label}: 401`);
      t.match(res.headers['www-authenticate'], /^Bearer /, `${name} with ${label}: WWW-Authenticate: Bearer (RFC 6750 §3)`);
      t.match(res.headers['content-type'], /^application\/problem\+json/);
    }
    for (const role of ROLES) {
      const res = await send(bearer(keyFor[role]));
      const allowed = access.kind === 'any-key' || access.role === role;
      if (allowed) {
        t.notOk([401, 403].includes(res.statusCode), `${name} with role ${role}: passes access control`);
        t.ok(res.statusCode >= 200 && res.statusCode < 300, `${name} with role ${role}: 2xx (got ${res.statusCode} ${res.body.slice(0, 200)})`);
      } else {
        t.equal(res.statusCode, 403, `${name} with role ${role}: 403`);
        t.equal(res.json().requiredRole, access.kind === 'role' ? access.role : undefined, `${name}: the 403 names the role needed`);
      }
    }
  }
});

t.test('the key id is the caller in the audit record; no keys: "anonymous"', async (t) => {
  const keyed = await buildTestApp(t, {}, { keys: ring });
  const res = await keyed.app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison(), headers: bearer(secrets.scorer) });
  t.equal((await keyed.store.get(res.json().id))!.caller, 'scorer');

  const open = await buildTestApp(t);
  const res2 = await open.app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
  t.equal((await open.store.get(res2.json().id))!.caller, 'anonymous');
});

t.test('with no keys configured every route is open', async (t) => {
  const { app } = await buildTestApp(t);
  for (const r of app.registeredRoutes.filter((x) => x.method !== 'HEAD' && !x.url.includes(':'))) {
    const sample = sampleRequest(r.method, r.url);
    const res = await app.inject({ method: r.method as 'GET', url: r.url + (sample.query ?? ''), payload: sample.payload, headers: sample.headers });
    t.not(res.statusCode, 401, `${r.method} ${r.url}`);
    t.not(res.statusCode, 403, `${r.method} ${r.url}`);
  }
});
