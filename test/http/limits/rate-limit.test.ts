// RATE_LIMIT_PER_MINUTE: per key id (per client address when open); 429 problem
// naming the setting, with Retry-After (RFC 9110 §10.2.3); other callers unaffected.
import t from 'tap';
import { buildTestApp } from '../../helper.ts';
import { bearer, testKeys } from '../security/test-keys.ts';

const { ring, secrets } = testKeys({ busy: ['read'], quiet: ['read'] });

t.test('a key over its rate gets 429 with Retry-After; another key does not', async (t) => {
  const { app } = await buildTestApp(t, { rateLimitPerMinute: 3 }, { keys: ring });
  const list = (key: string) => app.inject({ method: 'GET', url: '/v1/comparisons', headers: bearer(key) });
  for (let i = 0; i < 3; i++) t.equal((await list(secrets.busy)).statusCode, 200, `request ${i + 1} of 3`);
  const refused = await list(secrets.busy);
  t.equal(refused.statusCode, 429);
  t.match(refused.headers['content-type'], /^application\/problem\+json/);
  const seconds = Number(refused.headers['retry-after']);
  t.ok(Number.isInteger(seconds) && seconds >= 1 && seconds <= 60, `Retry-After is whole seconds within the window (${seconds})`);
  const body = refused.json();
  t.equal(body.status, 429);
  t.match(body.detail, /RATE_LIMIT_PER_MINUTE=3/);
  t.equal(body.setting, 'RATE_LIMIT_PER_MINUTE');
  t.match(body.detail, /"busy"/, 'names the key id, never the key');
  t.notMatch(refused.body, secrets.busy);

  t.equal((await list(secrets.quiet)).statusCode, 200, 'the other key keeps its own allowance');
  t.equal((await app.inject('/healthz')).statusCode, 200, 'probes are never limited');
  t.equal((await app.inject({ url: '/metrics', headers: bearer(secrets.busy) })).statusCode, 200, 'scrapes are never limited');
});

t.test('unknown keys spend nobody\'s allowance', async (t) => {
  const { app } = await buildTestApp(t, { rateLimitPerMinute: 2 }, { keys: ring });
  for (let i = 0; i < 5; i++) t.equal((await app.inject({ url: '/v1/comparisons', headers: bearer('guess') })).statusCode, 401);
  t.equal((await app.inject({ url: '/v1/comparisons', headers: bearer(secrets.busy) })).statusCode, 200);
});

t.test('open on loopback: the limit is per client address', async (t) => {
  const { app } = await buildTestApp(t, { rateLimitPerMinute: 2 });
  const from = (remoteAddress: string) => app.inject({ url: '/v1/comparisons', remoteAddress });
  t.equal((await from('127.0.0.2')).statusCode, 200);
  t.equal((await from('127.0.0.2')).statusCode, 200);
  t.equal((await from('127.0.0.2')).statusCode, 429);
  t.equal((await from('127.0.0.3')).statusCode, 200, 'another address is unaffected');
});
