// Streamed rows folded into a data summary: NDJSON and CSV bodies give the
// summary the core computes from the same rows in memory (corrected two-pass,
// Chan, Golub & LeVeque 1983), across block boundaries and chunk splits;
// malformed lines are 400s naming the line; an over-long body is a 413.
import { Readable } from 'node:stream';
import t, { type Test } from 'tap';
import { buildTestApp } from '../helper.ts';
import { summariseRows, type DataSummary } from '../../src/core/summary/index.ts';
import { foldRows } from '../../src/http/streaming/fold-body.ts';
import { BLOCK_ROWS } from '../../src/http/streaming/summary-folder.ts';
import type { Config } from '../../src/config.ts';

let seed = 7;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
const n = 2 * BLOCK_ROWS + 1234;
// Means large against spreads, where the one-pass formula would lose digits.
const temp = Float64Array.from({ length: n }, () => 1200 + 5 * uniform());
const moisture = Float64Array.from({ length: n }, () => 6 + uniform());
const shrink = Float64Array.from({ length: n }, (_, i) => 7 + 0.02 * (temp[i] - 1200) + 0.3 * moisture[i] + 0.1 * uniform());
const w = Float64Array.from({ length: n }, (_, i) => 0.5 + (i % 4));

function agrees(t: Test, got: DataSummary, want: DataSummary, what: string) {
  t.equal(got.rows, want.rows, `${what}: rows`);
  t.ok(got.means.every((m, j) => Math.abs(m - want.means[j]) <= 1e-13 * Math.abs(want.means[j])), `${what}: means`);
  const C = want.centredCrossProducts;
  t.ok(got.centredCrossProducts.every((r, j) => r.every((v, k) => Math.abs(v - C[j][k]) <= 1e-11 * Math.sqrt(C[j][j] * C[k][k]))), `${what}: centred cross products`);
  if (want.weights) t.ok(Math.abs(got.weights!.sumLog - want.weights.sumLog) <= 1e-12 * Math.abs(want.weights.sumLog), `${what}: sum of log weights`);
}

const ndjson = () => Array.from({ length: n }, (_, i) => JSON.stringify({ temp: temp[i], moisture: moisture[i], shrink: shrink[i], w: w[i], note: 'x' })).join('\n');
const csv = () => ['note,temp,moisture,shrink,w', ...Array.from({ length: n }, (_, i) => `"a, ""b""",${temp[i]},${moisture[i]},${shrink[i]},${w[i]}`)].join('\r\n') + '\r\n';

t.test('NDJSON and CSV bodies give the in-memory summary', async (t) => {
  const { app } = await buildTestApp(t);
  const want = summariseRows([temp, moisture, shrink], null, ['temp', 'moisture', 'shrink']);
  const wantWeighted = summariseRows([temp, moisture, shrink], w, ['temp', 'moisture', 'shrink']);
  for (const [type, body] of [['application/x-ndjson', ndjson()], ['text/csv; charset=utf-8', csv()]] as const) {
    const res = await app.inject({ method: 'POST', url: '/v1/summaries?columns=temp,moisture,shrink', headers: { 'content-type': type }, payload: body });
    t.equal(res.statusCode, 200, res.body.slice(0, 300));
    agrees(t, res.json().summary, want, type);
    t.equal(res.json().rowsRead, n);
    const weighted = await app.inject({ method: 'POST', url: '/v1/summaries?columns=temp,moisture,shrink&weights=w', headers: { 'content-type': type }, payload: body });
    agrees(t, weighted.json().summary, wantWeighted, `${type}, weighted`);
  }
});

t.test('chunks split anywhere, even inside a UTF-8 character; missing values drop the row', async (t) => {
  const text = 'a,b,"é"\n1,2,3\n4,,6\n7,8,9\n';
  const bytes = Buffer.from(text);
  const chunks = Array.from({ length: bytes.length }, (_, i) => bytes.subarray(i, i + 1));
  const out = await foldRows(Readable.from(chunks), { format: 'csv', columns: ['a', 'é'], maxBodyBytes: 1e6 });
  agrees(t, out.summary!, summariseRows([Float64Array.of(1, 4, 7), Float64Array.of(3, 6, 9)], null, ['a', 'é']), 'byte-by-byte');
  const dropped = await foldRows(Readable.from([text]), { format: 'csv', columns: ['a', 'b'], maxBodyBytes: 1e6 });
  t.equal(dropped.rowsDropped, 1);
  t.equal(dropped.summary!.rows, 2, 'the row with an empty field is left out');
});

t.test('malformed lines are 400s naming the line; too long a body is a 413', async (t) => {
  const { app } = await buildTestApp(t, { summaryBodyLimitBytes: 4096 } as Partial<Config>);
  const post = (type: string, payload: string, query = 'columns=a,b') =>
    app.inject({ method: 'POST', url: `/v1/summaries?${query}`, headers: { 'content-type': type }, payload });
  const cases: [string, string, number, RegExp][] = [
    ['application/x-ndjson', '{"a":1,"b":2}\n{"a":1,"b":"x"}\n', 2, /"b" is the string "x", not a number/],
    ['application/x-ndjson', '{"a":1,"b":2}\n\n{"a":1,', 3, /not valid JSON/],
    ['application/x-ndjson', '{"a":1}\n', 1, /no key "b"/],
    ['application/x-ndjson', '[1,2]\n', 1, /one JSON object/],
    ['text/csv', 'a,c\n1,2\n', 1, /header has no column "b"/],
    ['text/csv', 'a,b\n1,2\n3,zz\n', 3, /"b" is "zz", not a finite number/],
    ['text/csv', 'a,b\n1,2,3\n', 2, /3 fields, but the header names 2/],
  ];
  for (const [type, body, line, reason] of cases) {
    const res = await post(type, body);
    t.equal(res.statusCode, 400, `${JSON.stringify(body)}: ${res.body}`);
    t.equal(res.json().line, line);
    t.match(res.json().detail, reason);
  }
  const weight = await post('text/csv', 'a,b,w\n1,2,-1\n', 'columns=a,b&weights=w');
  t.equal(weight.json().line, 2);
  t.match(weight.json().detail, /weights must be positive \(0 leaves a row out\)/);
  // A zero weight leaves its row out, as in a comparison (counted with the dropped rows).
  const zero = (await post('text/csv', 'a,b,w\n1,2,0\n2,3,1\n4,1,2\n', 'columns=a,b&weights=w')).json();
  t.same([zero.rowsRead, zero.rowsDropped, zero.summary.rows, zero.summary.weights.sum], [3, 1, 2, 3]);
  t.equal((await post('text/csv', `a,b\n${'1,2\n'.repeat(2000)}`)).statusCode, 413);
  t.equal((await post('application/json', '{}')).statusCode, 415);
  t.equal((await post('text/csv', 'a,b\n,1\n')).statusCode, 422, 'no complete rows');
  t.equal((await post('text/csv', 'a,b\n1,2\n', 'columns=a,a')).statusCode, 400, 'a column listed twice');
});

t.test('CSV numbers are decimal notation only, and sums beyond double precision are a 422, not a 500', async (t) => {
  const { app } = await buildTestApp(t);
  const hex = await app.inject({ method: 'POST', url: '/v1/summaries?columns=a,b', headers: { 'content-type': 'text/csv' }, payload: 'a,b\n1,2\n0x10,3\n' });
  t.equal(hex.statusCode, 400);
  t.match(hex.json().detail, /0x10/);
  const huge = await app.inject({ method: 'POST', url: '/v1/summaries?columns=a,b', headers: { 'content-type': 'text/csv' }, payload: 'a,b\n1e300,1\n-1e300,2\n3,4\n' });
  t.equal(huge.statusCode, 422, huge.body.slice(0, 200));
  t.match(huge.json().errors[0], { path: 'columns/a', code: 'summary_not_representable' });
});
