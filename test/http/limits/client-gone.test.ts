// A client that goes away before its answer stops its work and leaves no
// record, for a JSON search, a streamed (SSE) search and a comparison in the
// pool alike. Over real sockets: the client closes its connection once the
// work is running on a worker; the service's worker is terminated and
// replaced, the request's place in the pool is given back, nothing is
// appended, and the service answers the next caller.
import { request as httpRequest, type ClientRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import t, { type Test } from 'tap';
import { buildTestApp } from '../../helper.ts';
import { computePoolFor } from '../../../src/http/app.ts';
import { defaultConfig, type Config } from '../../../src/config.ts';
import { manyLevels, until, zoneSearch } from './hostile-bodies.ts';

async function listening(t: Test, given: Partial<Config> = {}) {
  const overrides = { computeWorkers: 1, ...given };
  const pool = computePoolFor(defaultConfig(overrides));
  t.teardown(() => pool.close());
  const { app, store } = await buildTestApp(t, overrides, { compute: pool });
  await app.listen({ port: 0, host: '127.0.0.1' });
  const { port } = app.server.address() as AddressInfo;
  return { app, store, pool, port };
}

function post(port: number, path: string, body: unknown, headers: Record<string, string> = {}): ClientRequest {
  const req = httpRequest({ host: '127.0.0.1', port, path, method: 'POST', headers: { 'content-type': 'application/json', ...headers } });
  req.on('error', () => {}); // the connection is ours to break
  req.end(JSON.stringify(body));
  return req;
}

async function afterwards(t: Test, ctx: Awaited<ReturnType<typeof listening>>) {
  await until(() => ctx.pool.stats().sessions === 0, 'the abandoned request to leave the pool');
  t.ok(ctx.pool.stats().replaced >= 1, 'the worker running the abandoned work was terminated and replaced');
  t.equal((await ctx.store.list()).records.length, 0, 'no record appended');
  t.equal((await ctx.app.inject({ method: 'GET', url: '/healthz' })).statusCode, 200, 'the service answers afterwards');
  const metrics = await ctx.app.inject({ method: 'GET', url: '/metrics' });
  t.match(metrics.body, /parsimetry_compute_refusals_total\{reason="client_gone"\} 1/);
}

t.test('a JSON search whose client goes away: the work stops and no record is appended', async (t) => {
  const ctx = await listening(t);
  const req = post(ctx.port, '/v1/searches', zoneSearch(3000, 22));
  await until(() => ctx.pool.stats().busy > 0, 'the search to run on a worker');
  req.destroy();
  await afterwards(t, ctx);
});

t.test('a streamed search whose client goes away after its first progress event', async (t) => {
  const ctx = await listening(t);
  const req = post(ctx.port, '/v1/searches', zoneSearch(3000, 22), { accept: 'text/event-stream' });
  const firstEvent = await new Promise<string>((resolve) => {
    req.on('response', (res) => res.once('data', (chunk: Buffer) => resolve(chunk.toString())));
  });
  t.match(firstEvent, /^event: progress\n/);
  await until(() => ctx.pool.stats().busy > 0, 'the search to run on a worker');
  req.destroy();
  await afterwards(t, ctx);
});

t.test('a comparison in the pool whose client goes away', async (t) => {
  const ctx = await listening(t, { computeInlineWork: 0 });
  const req = post(ctx.port, '/v1/comparisons', manyLevels(2000, 200, 1));
  await until(() => ctx.pool.stats().busy > 0, 'the comparison to run on a worker');
  req.destroy();
  await afterwards(t, ctx);
});
