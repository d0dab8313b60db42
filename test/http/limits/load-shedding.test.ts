// EVENT_LOOP_MAX_DELAY_MS: while the event loop lags, new work is refused at once
// with 503 + Retry-After naming the setting; liveness still answers.
import t from 'tap';
import { setTimeout as sleep } from 'node:timers/promises';
import { buildTestApp } from '../../helper.ts';

function blockEventLoop(ms: number) {
  const end = Date.now() + ms;
  while (Date.now() < end) { /* the lag under-pressure must see */ }
}

t.test('503 while the event loop lags, service again once it recovers', async (t) => {
  const { app } = await buildTestApp(t, { eventLoopMaxDelayMs: 40 });
  await app.ready();
  t.equal((await app.inject('/v1/comparisons')).statusCode, 200, 'answers while idle');
  // Block for several sampling periods (sampleInterval = 50 ms at this limit)
  // so the mean delay over the next period is far above 40 ms.
  blockEventLoop(600);
  await sleep(5);
  const shed = await app.inject('/v1/comparisons');
  t.equal(shed.statusCode, 503);
  t.match(shed.headers['content-type'], /^application\/problem\+json/);
  t.equal(shed.headers['retry-after'], '2');
  t.equal(shed.json().setting, 'EVENT_LOOP_MAX_DELAY_MS');
  t.match(shed.json().detail, /EVENT_LOOP_MAX_DELAY_MS/);
  t.equal((await app.inject('/healthz')).statusCode, 200, 'liveness is not shed');
  await sleep(300);
  t.equal((await app.inject('/v1/comparisons')).statusCode, 200, 'recovered');
});

t.test('EVENT_LOOP_MAX_DELAY_MS=0 turns shedding off', async (t) => {
  const { app } = await buildTestApp(t, { eventLoopMaxDelayMs: 0 });
  await app.ready();
  blockEventLoop(300);
  t.equal((await app.inject('/v1/comparisons')).statusCode, 200);
});
