// POST /v1/summaries under load: concurrent uploads per caller are bounded
// (SUMMARY_UPLOADS_PER_CALLER: 429 with Retry-After, before the body is read),
// and folding turns the event loop after every block, so /healthz answers while
// a wide body is summarised. Blocks shrink as columns grow (summary-folder.ts).
import { PassThrough } from 'node:stream';
import { setTimeout as sleep } from 'node:timers/promises';
import t from 'tap';
import { summariseRows } from '../../src/core/summary/index.ts';
import { BLOCK_ROWS, blockRowsFor } from '../../src/http/streaming/summary-folder.ts';
import { buildTestApp } from '../helper.ts';

const csvUpload = (payload: string | PassThrough, remoteAddress = '127.0.0.1') => ({
  method: 'POST' as const, url: '/v1/summaries?columns=dwell,thickness', headers: { 'content-type': 'text/csv' }, payload, remoteAddress,
});

t.test('a third upload in flight from one caller is a 429 naming the setting; others are unaffected', async (t) => {
  const { app } = await buildTestApp(t, { summaryUploadsPerCaller: 2 });
  // Demo scenario (invented): glaze thickness against dwell time, streamed from a kiln log.
  const open = () => {
    const body = new PassThrough();
    body.write('dwell,thickness\n20,0.41\n22,0.44\n');
    return body;
  };
  const first = open();
  const second = open();
  const answers = [app.inject(csvUpload(first)), app.inject(csvUpload(second))];
  await sleep(50); // both are in their handlers, reading
  const third = await app.inject(csvUpload('dwell,thickness\n25,0.47\n'));
  t.equal(third.statusCode, 429, third.body.slice(0, 300));
  t.match(third.headers['content-type'], /^application\/problem\+json/);
  t.equal(third.headers['retry-after'], '5');
  t.equal(third.headers.connection, 'close', 'its body is not read');
  t.match(third.json(), { type: 'urn:parsimetry:problem:uploads-in-flight', setting: 'SUMMARY_UPLOADS_PER_CALLER', limit: 2 });
  t.match(third.json().detail, /SUMMARY_UPLOADS_PER_CALLER=2/);
  t.equal((await app.inject(csvUpload('dwell,thickness\n25,0.47\n26,0.5\n', '127.0.0.9'))).statusCode, 200, 'another caller uploads meanwhile');
  first.end('24,0.45\n');
  second.end('24,0.45\n');
  for (const answer of await Promise.all(answers)) {
    t.equal(answer.statusCode, 200);
    t.equal(answer.json().rowsRead, 3);
  }
  t.equal((await app.inject(csvUpload('dwell,thickness\n25,0.47\n26,0.5\n'))).statusCode, 200, 'places are given back when uploads end');
  const broken = open();
  const failing = app.inject(csvUpload(broken));
  await sleep(20);
  broken.end('not,a,row\n');
  t.equal((await failing).statusCode, 400);
  t.equal((await app.inject(csvUpload('dwell,thickness\n25,0.47\n26,0.5\n'))).statusCode, 200, 'and when they fail');
});

t.test('blocks shrink as columns grow: a few milliseconds of work each', async (t) => {
  t.equal(blockRowsFor(3), BLOCK_ROWS);
  t.equal(blockRowsFor(20), BLOCK_ROWS);
  t.equal(blockRowsFor(200), 204);
  t.ok(blockRowsFor(200) * (200 * 201) / 2 <= 2 ** 22);
});

t.test('a wide upload folds in many blocks while /healthz answers, and agrees with the in-memory summary', async (t) => {
  const { app } = await buildTestApp(t);
  const p = 120;
  const rows = 6000; // 11 blocks of up to 559 rows at 120 columns
  let seed = 11;
  const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
  const names = Array.from({ length: p }, (_, j) => `sensor${j}`);
  const columns = names.map((_, j) => Float64Array.from({ length: rows }, () => 1000 * j + uniform()));
  const lines = [names.join(',')];
  for (let i = 0; i < rows; i++) lines.push(columns.map((c) => c[i]).join(','));
  let settled = false;
  const upload = app.inject({ method: 'POST', url: `/v1/summaries?columns=${names.join(',')}`, headers: { 'content-type': 'text/csv' }, payload: lines.join('\n') })
    .finally(() => { settled = true; });
  let answered = 0;
  while (!settled) {
    if ((await app.inject('/healthz')).statusCode === 200 && !settled) answered++;
    await sleep(1);
  }
  const res = await upload;
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  t.ok(answered >= 3, `/healthz answered ${answered} times during the fold`);
  const want = summariseRows(columns, null, names);
  const got = res.json().summary;
  t.ok(got.means.every((m: number, j: number) => Math.abs(m - want.means[j]) <= 1e-13 * Math.abs(want.means[j])), 'means');
  const C = want.centredCrossProducts;
  t.ok(got.centredCrossProducts.every((r: number[], j: number) => r.every((v, k) => Math.abs(v - C[j][k]) <= 1e-11 * Math.sqrt(C[j][j] * C[k][k]))), 'centred cross products, across block merges');
});
