// Heavy requests run in the compute pool, isolated from every other caller:
// asserted by behaviour — the work was on a worker (the pool was busy with
// it), /healthz answered while it ran, the process lives — never by timings.
// Many searches at once meet a bounded queue (503, Retry-After). One worker
// each: enough to show isolation, and quicker to start.
import t, { type Test } from 'tap';
import { buildTestApp } from '../../helper.ts';
import type { ComputePool } from '../../../src/compute/index.ts';
import { computePoolFor } from '../../../src/http/app.ts';
import { defaultConfig } from '../../../src/config.ts';
import { manyLevels, until, zoneSearch } from './hostile-bodies.ts';

function ownPool(t: Test, overrides: Parameters<typeof defaultConfig>[0]): ComputePool {
  const pool = computePoolFor(defaultConfig(overrides));
  t.teardown(() => pool.close());
  return pool;
}

t.test('a factor of 200 levels runs in the pool while /healthz answers, then is answered and recorded', async (t) => {
  const overrides = { computeWorkers: 1 };
  const pool = ownPool(t, overrides);
  const { app, store } = await buildTestApp(t, overrides, { compute: pool });
  let settled = false;
  const heavy = app.inject({ method: 'POST', url: '/v1/comparisons', payload: manyLevels(2000, 200, 1) }).finally(() => {
    settled = true;
  });
  await until(() => pool.stats().busy > 0 || settled, 'the comparison to start on a worker');
  t.equal(settled, false, 'the comparison is running on a worker');
  const health = await app.inject({ method: 'GET', url: '/healthz' });
  t.equal(health.statusCode, 200);
  t.equal(settled, false, '/healthz was answered while the comparison ran');
  const res = await heavy;
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  t.equal(res.json().models[0].coefficients.length, 200, 'intercept and 199 lot dummies');
  t.equal((await store.list()).records.length, 1);
});

t.test('many searches at once: a bounded queue, 503 with Retry-After beyond it, the rest answered', async (t) => {
  const pool = ownPool(t, { computeWorkers: 1, computeQueueLength: 1 });
  const { app, store } = await buildTestApp(t, { computeWorkers: 1, computeQueueLength: 1 }, { compute: pool });
  const payload = zoneSearch(1500, 14);
  const replies = await Promise.all(Array.from({ length: 5 }, () => app.inject({ method: 'POST', url: '/v1/searches', payload })));
  const busy = replies.filter((r) => r.statusCode === 503);
  const done = replies.filter((r) => r.statusCode === 200);
  t.equal(done.length + busy.length, 5, replies.map((r) => r.statusCode).join(' '));
  t.ok(done.length >= 2, 'the worker and the queue took one each');
  t.ok(busy.length >= 1, 'the others were turned away at once');
  for (const r of busy) {
    const body = r.json();
    t.equal(body.type, 'urn:parsimetry:problem:compute-busy');
    t.equal(body.setting, 'COMPUTE_QUEUE_LENGTH');
    t.equal(body.limit, 1);
    t.ok(Number(r.headers['retry-after']) >= 1, 'Retry-After says when to come back');
  }
  t.equal((await store.list()).records.length, done.length, 'one record per answered search, none for the refused');
  t.equal((await app.inject({ method: 'GET', url: '/healthz' })).statusCode, 200);
  t.equal(pool.stats().sessions, 0, 'every admitted request gave its place back');
});

