// AUTH_FAILURES_PER_MINUTE: missing, malformed and unknown keys count against
// the client address; past the limit every keyed request from that address is
// a 429 with Retry-After naming the setting, until its minute is over.
import t from 'tap';
import { FailedAuthentications } from '../../../src/http/security/failed-authentications.ts';
import { buildTestApp } from '../../helper.ts';
import { bearer, testKeys } from './test-keys.ts';

const { ring, secrets } = testKeys({ dashboard: ['read'], scorer: ['score'] });

t.test('invalid keys from one address: 401 up to the limit, then 429 for every keyed request from it', async (t) => {
  const { app } = await buildTestApp(t, { authFailuresPerMinute: 3 }, { keys: ring });
  const from = (remoteAddress: string, headers: Record<string, string> = {}) =>
    app.inject({ url: '/v1/comparisons', remoteAddress, headers });
  const guesser = '198.51.100.7';
  t.equal((await from(guesser, bearer('guess-1'))).statusCode, 401, 'an unknown key');
  t.equal((await from(guesser)).statusCode, 401, 'no key');
  t.equal((await from(guesser, { authorization: 'Basic eDp5' })).statusCode, 401, 'not a bearer key');
  const refused = await from(guesser, bearer('guess-4'));
  t.equal(refused.statusCode, 429);
  t.match(refused.headers['content-type'], /^application\/problem\+json/);
  const seconds = Number(refused.headers['retry-after']);
  t.ok(Number.isInteger(seconds) && seconds >= 1 && seconds <= 60, `Retry-After is whole seconds within the minute (${seconds})`);
  const body = refused.json();
  t.equal(body.setting, 'AUTH_FAILURES_PER_MINUTE');
  t.equal(body.limit, 3);
  t.match(body.detail, /AUTH_FAILURES_PER_MINUTE=3/);
  t.notMatch(refused.body, /guess-4/, 'the key tried is not echoed');

  t.equal((await from(guesser, bearer(secrets.dashboard))).statusCode, 429, 'a right key from the same address waits too: no oracle for the guesser');
  t.equal((await from('198.51.100.8', bearer(secrets.dashboard))).statusCode, 200, 'another address is unaffected');
  t.equal((await app.inject({ url: '/healthz', remoteAddress: guesser })).statusCode, 200, 'probes need no key and are never refused');
  t.equal((await app.inject({ url: '/readyz', remoteAddress: guesser })).statusCode, 200);
});

t.test('behind a trusted proxy (TRUST_PROXY) each client behind it has its own count', async (t) => {
  const { app } = await buildTestApp(t, { authFailuresPerMinute: 2, trustProxy: ['10.0.0.0/8'] }, { keys: ring });
  const via = (client: string, key: string, proxy = '10.0.0.5') =>
    app.inject({ url: '/v1/comparisons', remoteAddress: proxy, headers: { ...bearer(key), 'x-forwarded-for': client } });
  for (let i = 0; i < 2; i++) t.equal((await via('198.51.100.7', 'guess')).statusCode, 401);
  t.equal((await via('198.51.100.7', 'guess')).statusCode, 429, 'the guesser behind the proxy is limited');
  t.equal((await via('198.51.100.8', secrets.dashboard)).statusCode, 200, 'another client behind the same proxy is not');
  const spoofed = await app.inject({ url: '/v1/comparisons', remoteAddress: '198.51.100.7', headers: { ...bearer(secrets.dashboard), 'x-forwarded-for': '198.51.100.9' } });
  t.equal(spoofed.statusCode, 429, 'X-Forwarded-For from an untrusted peer is ignored');
});

t.test('a known key without the role is a 403 and does not count as a failed authentication', async (t) => {
  const { app } = await buildTestApp(t, { authFailuresPerMinute: 2 }, { keys: ring });
  for (let i = 0; i < 4; i++) {
    const res = await app.inject({ method: 'GET', url: '/v1/audit/verify', remoteAddress: '203.0.113.9', headers: bearer(secrets.scorer) });
    t.equal(res.statusCode, 403, `request ${i + 1}`);
  }
});

t.test('open (no keys): nothing to fail, nothing counted', async (t) => {
  const { app } = await buildTestApp(t, { authFailuresPerMinute: 1 });
  for (let i = 0; i < 3; i++) t.equal((await app.inject({ url: '/v1/comparisons', headers: bearer('anything') })).statusCode, 200);
});

t.test('the ledger: one-minute windows per address, bounded in size', async (t) => {
  let now = 1_000_000;
  const ledger = new FailedAuthentications(2, () => now, 3);
  ledger.record('a');
  t.equal(ledger.retryAfterSeconds('a'), 0, 'one failure of two allowed');
  now += 10_000;
  ledger.record('a');
  t.equal(ledger.retryAfterSeconds('a'), 50, 'the window started 10 s ago: 50 s left');
  now += 49_500;
  t.equal(ledger.retryAfterSeconds('a'), 1, 'never 0 while refused');
  now += 500;
  t.equal(ledger.retryAfterSeconds('a'), 0, 'a new minute');
  ledger.record('a');
  t.equal(ledger.retryAfterSeconds('a'), 0, 'and a fresh count');
  for (const address of ['b', 'c', 'd', 'e']) ledger.record(address);
  t.ok(ledger.addresses <= 3, `never more than the bound (${ledger.addresses})`);
});
