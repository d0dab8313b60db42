// A request past COMPUTE_DEADLINE_MS is stopped — its worker terminated and
// replaced — and answered 422 naming the deadline and its setting; nothing is
// recorded and the pool serves the next request. The clock counts compute
// time only, so a worker still starting does not use any of it.
import t, { type Test } from 'tap';
import { buildTestApp } from '../../helper.ts';
import type { ComputePool } from '../../../src/compute/index.ts';
import { computePoolFor } from '../../../src/http/app.ts';
import { defaultConfig } from '../../../src/config.ts';
import { manyLevels, zoneSearch } from './hostile-bodies.ts';

function ownPool(t: Test, overrides: Parameters<typeof defaultConfig>[0]): ComputePool {
  const pool = computePoolFor(defaultConfig(overrides));
  t.teardown(() => pool.close());
  return pool;
}

t.test('a search past COMPUTE_DEADLINE_MS is stopped: 422 naming the deadline, worker replaced, nothing recorded', async (t) => {
  // Two seconds of compute: far less than every subset of a 22-term pool needs, far more than a 2-term search.
  const overrides = { computeDeadlineMs: 2000, computeWorkers: 1 };
  const pool = ownPool(t, overrides);
  const { app, store } = await buildTestApp(t, overrides, { compute: pool });
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: zoneSearch(3000, 22) });
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  const body = res.json();
  t.equal(body.type, 'urn:parsimetry:problem:compute-deadline');
  t.equal(body.setting, 'COMPUTE_DEADLINE_MS');
  t.equal(body.limit, 2000);
  t.match(body.detail, /ran for more than 2000 ms \(COMPUTE_DEADLINE_MS\) and was stopped; nothing was recorded/);
  t.ok(pool.stats().replaced >= 1, 'the worker running it was terminated and replaced');
  t.equal((await store.list()).records.length, 0);
  const metrics = await app.inject({ method: 'GET', url: '/metrics' });
  t.match(metrics.body, /parsimetry_compute_refusals_total\{reason="compute-deadline"\} 1/);
  const small = await app.inject({ method: 'POST', url: '/v1/searches', payload: zoneSearch(50, 2) });
  t.equal(small.statusCode, 200, `the pool serves the next request: ${small.body.slice(0, 200)}`);
});

t.test('a comparison past the deadline in the pool is stopped the same way', async (t) => {
  const overrides = { computeDeadlineMs: 100, computeInlineWork: 0, computeWorkers: 1 };
  const pool = ownPool(t, overrides);
  const { app, store } = await buildTestApp(t, overrides, { compute: pool });
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: manyLevels(2000, 200, 1) });
  t.equal(res.statusCode, 422);
  t.equal(res.json().type, 'urn:parsimetry:problem:compute-deadline');
  t.equal((await store.list()).records.length, 0);
});
