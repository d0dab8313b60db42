// Security headers, the CORS allowlist, /metrics and log redaction.
import { Writable } from 'node:stream';
import pino from 'pino';
import t, { type Test } from 'tap';
import { buildTestApp } from '../../helper.ts';
import { demoComparison } from '../../../scripts/demo-data.ts';
import { defaultConfig } from '../../../src/config.ts';
import { loggerOptions } from '../../../src/logger.ts';
import { openAuditStore } from '../../../src/audit/open.ts';
import { buildApp } from '../../../src/http/app.ts';
import { bearer, testKeys } from './test-keys.ts';

const { ring, secrets } = testKeys({ dashboard: ['score', 'read'], scraper: ['read'] });

t.test('helmet headers on every reply', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject('/healthz');
  t.equal(res.headers['x-content-type-options'], 'nosniff');
  t.equal(res.headers['x-frame-options'], 'SAMEORIGIN');
  t.match(res.headers['content-security-policy'], /default-src 'self'/);
  t.match(res.headers['strict-transport-security'], /max-age=/);
});

t.test('CORS: nothing allowed by default; exactly the listed origins when set', async (t) => {
  const closed = await buildTestApp(t);
  const r0 = await closed.app.inject({ url: '/healthz', headers: { origin: 'https://dash.example.org' } });
  t.equal(r0.headers['access-control-allow-origin'], undefined, 'default: no origin');

  const { app } = await buildTestApp(t, { corsOrigins: ['https://dash.example.org'] }, { keys: ring });
  const ok = await app.inject({ url: '/v1/comparisons', headers: { origin: 'https://dash.example.org', ...bearer(secrets.dashboard) } });
  t.equal(ok.headers['access-control-allow-origin'], 'https://dash.example.org');
  const refused401 = await app.inject({ url: '/v1/comparisons', headers: { origin: 'https://dash.example.org' } });
  t.equal(refused401.statusCode, 401);
  t.equal(refused401.headers['access-control-allow-origin'], 'https://dash.example.org', 'a refusal is readable by the allowed page');
  const other = await app.inject({ url: '/v1/comparisons', headers: { origin: 'https://evil.example.net', ...bearer(secrets.dashboard) } });
  t.equal(other.headers['access-control-allow-origin'], undefined);
  const preflight = await app.inject({ method: 'OPTIONS', url: '/v1/comparisons', headers: {
    origin: 'https://dash.example.org', 'access-control-request-method': 'POST', 'access-control-request-headers': 'authorization,content-type' } });
  t.equal(preflight.statusCode, 204, 'a preflight needs no key (it never carries one)');
  t.match(preflight.headers['access-control-allow-headers'], /authorization/);
});

t.test('/metrics: Prometheus text with the service counters; any key when keys exist', async (t) => {
  const { app } = await buildTestApp(t, {}, { keys: ring });
  t.equal((await app.inject('/metrics')).statusCode, 401);
  const post = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison(), headers: bearer(secrets.dashboard) });
  t.equal(post.statusCode, 200);
  await app.inject({ url: '/v1/comparisons/nope', headers: bearer(secrets.dashboard) });
  const res = await app.inject({ url: '/metrics', headers: bearer(secrets.scraper) });
  t.equal(res.statusCode, 200);
  t.match(res.headers['content-type'], /^text\/plain; version=0\.0\.4/, 'Prometheus text exposition format 0.0.4');
  const text = res.body;
  t.match(text, /^parsimetry_comparisons_total 1$/m);
  const fitted = post.json().models.length;
  t.match(text, new RegExp(`^parsimetry_models_fitted_total ${fitted}$`, 'm'), 'every demo candidate is fitted here');
  t.match(text, /^parsimetry_http_requests_total\{route="\/v1\/comparisons",method="POST",status="200"\} 1$/m);
  t.match(text, /^parsimetry_http_requests_total\{route="\/v1\/comparisons\/:id",method="GET",status="\d+"\} 1$/m, 'labelled by pattern, not by id');
  t.match(text, /^parsimetry_http_request_duration_seconds_bucket\{le="\+Inf",route="\/v1\/comparisons",method="POST",status="200"\} 1$/m);
  t.match(text, /^parsimetry_audit_append_duration_seconds_count 1$/m);
  t.match(text, /^parsimetry_audit_append_failures_total 0$/m);
  t.match(text, /^parsimetry_searches_total 0$/m);
});

/** An app logging at trace level with the service's logger options, and everything it logged so far. */
async function appLoggingAtTrace(t: Test) {
  const lines: string[] = [];
  const sink = new Writable({ write(chunk, _enc, done) { lines.push(String(chunk)); done(); } });
  const config = defaultConfig({ auditDb: ':memory:', logLevel: 'trace' });
  const store = await openAuditStore(':memory:');
  const app = await buildApp({ config, store, logger: pino(loggerOptions(config), sink), keys: ring });
  t.teardown(async () => { await app.close(); await store.close(); });
  return { app, logged: () => lines.join('') };
}

t.test('a key never reaches the logs, even at trace level', async (t) => {
  const { app, logged } = await appLoggingAtTrace(t);
  await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison(), headers: bearer(secrets.dashboard) });
  await app.inject({ url: '/v1/comparisons', headers: bearer('a-wrong-key-that-must-not-be-logged') });
  const all = logged();
  t.ok(all.length > 0, 'requests were logged');
  t.notOk(all.includes(secrets.dashboard), 'the valid key is absent');
  t.notOk(all.includes('a-wrong-key-that-must-not-be-logged'), 'a wrong key is absent');
});

t.test('a key sent in a query string never reaches the logs; the path does', async (t) => {
  const { app, logged } = await appLoggingAtTrace(t);
  const key = secrets.dashboard;
  const urls = [
    `/v1/comparisons?api_key=${key}`, // an unknown parameter: 400
    `/v1/comparisons?${key}`, // a bare key
    `/v1/comparisons?limit=5&key=${encodeURIComponent(key)}`, // alongside a real parameter
    `/no/such/route?token=${key}`, // 404
  ];
  for (const url of urls) await app.inject({ url, headers: bearer(key) });
  await app.inject({ url: `/v1/comparisons?token=${key}` }); // no bearer key: 401
  const all = logged();
  t.ok(all.includes('/v1/comparisons?[redacted]'), 'the path is logged, its query marked as redacted');
  t.ok(all.includes('/no/such/route?[redacted]'));
  t.notOk(all.includes(key), 'the key is absent from every line');
  t.notOk(all.includes(encodeURIComponent(key)), 'in any encoding');
  t.notOk(all.includes('api_key='), 'parameter names go too: a bare key would be one');
});
