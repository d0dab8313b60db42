// A comparison priced within COMPUTE_INLINE_WORK runs on the main thread when
// it is alone, and on an idle worker of the pool when other comparisons are in
// flight (the main thread has their records and answers to write). Either way
// the answer is the same to the last digit.
import t, { type Test } from 'tap';
import { defaultConfig } from '../../../src/config.ts';
import { computePoolFor } from '../../../src/http/app.ts';
import { buildTestApp } from '../../helper.ts';
import { demoComparison } from '../../../scripts/demo-data.ts';

async function countedPool(t: Test) {
  const pool = computePoolFor(defaultConfig({ computeWorkers: 2 }));
  pool.start();
  t.teardown(() => pool.close());
  while (pool.stats().ready < pool.size) await new Promise((resolve) => setTimeout(resolve, 20));
  const counts = { opened: 0 };
  const open = pool.open.bind(pool);
  pool.open = () => {
    counts.opened++;
    return open();
  };
  return { pool, counts };
}

t.test('alone, an inline-priced comparison stays on the main thread', async (t) => {
  const { pool, counts } = await countedPool(t);
  const { app } = await buildTestApp(t, {}, { compute: pool });
  for (let i = 0; i < 3; i++) {
    const r = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
    t.equal(r.statusCode, 200);
  }
  t.equal(counts.opened, 0, 'no session opened in the pool');
});

t.test('with others in flight, inline-priced comparisons also run on idle workers, with the same answers', async (t) => {
  const { pool, counts } = await countedPool(t);
  const { app } = await buildTestApp(t, {}, { compute: pool });
  const payload = demoComparison(200);
  const alone = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(alone.statusCode, 200);
  const replies = await Promise.all(Array.from({ length: 6 }, () => app.inject({ method: 'POST', url: '/v1/comparisons', payload })));
  // The answer's bytes without its own id and time.
  const strip = (body: string) => body.replace(/^\{"id":"[^"]*","createdAt":"[^"]*",/, '{');
  t.match(strip(alone.body), /^\{"serviceVersion"/, 'the answer opens with its id and time');
  for (const r of replies) {
    t.equal(r.statusCode, 200);
    t.equal(strip(r.body), strip(alone.body), 'the same bytes as the answer computed alone');
  }
  t.ok(counts.opened >= 1 && counts.opened < 6, `${counts.opened} of 6 ran on a worker, the rest on the main thread`);
  t.equal(pool.stats().sessions, 0, 'every session closed');
});
