// The client against a live service: every method, refusals as errors with their problem details.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createClient, ParsimetryError } from '../dist/index.js';
import { baseUrl, tilesColumns, tilesCsv, runLabel } from './service.mjs';

const client = createClient({ baseUrl });
const columns = tilesColumns();
const n = columns.shrinkage.length;

// Least squares of shrinkage on peakTemp by the closed form, here in the test (not by the service).
function lineRss(x, y) {
  const mx = x.reduce((a, b) => a + b) / x.length;
  const my = y.reduce((a, b) => a + b) / y.length;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < x.length; i++) { sxy += (x[i] - mx) * (y[i] - my); sxx += (x[i] - mx) ** 2; }
  const b = sxy / sxx, a = my - b * mx;
  return x.reduce((s, xi, i) => s + (y[i] - a - b * xi) ** 2, 0);
}

const request = (label) => ({
  label,
  data: { columns },
  response: 'shrinkage',
  candidates: [
    { name: 'line-by-hand', rss: lineRss(columns.peakTemp, columns.shrinkage), parameters: 3, observations: n },
    { name: 'temperature-and-moisture', terms: ['peakTemp', 'moisture'] },
    { name: 'with-kiln', terms: ['peakTemp', 'moisture', 'kiln'] },
  ],
});

test('compare: the answer as the service computed it, under the published convention', async () => {
  const result = await client.compare(request(runLabel('compare')));
  assert.match(result.id, /^[0-9a-f-]{36}$/);
  assert.equal(result.dataset.observations, n);
  const line = result.models.find((m) => m.name === 'line-by-hand');
  // The convention (README): logL = -n/2 (ln 2π + ln(RSS/n) + 1), AIC = -2 logL + 2k.
  const rss = lineRss(columns.peakTemp, columns.shrinkage);
  const logL = -n / 2 * (Math.log(2 * Math.PI) + Math.log(rss / n) + 1);
  assert.ok(Math.abs(line.logLikelihood - logL) <= 1e-9 * Math.abs(logL), `${line.logLikelihood} vs ${logL}`);
  assert.ok(Math.abs(line.aic - (-2 * logL + 6)) <= 1e-9 * Math.abs(line.aic));
  const ranking = result.rankings[result.conventions.rankBy];
  assert.equal(ranking.length, 3);
  assert.equal(ranking[0].delta, 0);
  assert.ok(Math.abs(ranking.reduce((s, e) => s + e.weight, 0) - 1) < 1e-12, 'Akaike weights sum to one');
});

test('refusals raise ParsimetryError with status, type and the field paths', async () => {
  const bad = request(runLabel('refused'));
  bad.response = 'no-such-column';
  await assert.rejects(client.compare(bad), (error) => {
    assert.ok(error instanceof ParsimetryError);
    assert.equal(error.status, 422);
    assert.equal(error.problem.status, 422);
    assert.match(error.type, /^urn:parsimetry:problem:|^about:blank$|^https?:/);
    assert.ok(error.errors.some((e) => e.path === 'response'), JSON.stringify(error.errors));
    assert.match(error.message, /^422 /);
    return true;
  });
  await assert.rejects(client.compare({ response: 'y' }), (error) => error instanceof ParsimetryError && error.status === 400 && error.errors.length > 0);
  await assert.rejects(client.comparison('00000000-0000-7000-8000-000000000000'), (error) => error instanceof ParsimetryError && error.status === 404);
});

test('comparison, replay, chart and report read the stored record back', async () => {
  const made = await client.compare(request(runLabel('record')));
  const stored = await client.comparison(made.id);
  assert.equal(stored.id, made.id);
  assert.equal(stored.integrity.ok, true);
  assert.deepEqual(stored.result.models.map((m) => m.name), made.models.map((m) => m.name));

  const replay = await client.replay(made.id);
  assert.equal(replay.id, made.id);
  assert.deepEqual(replay.changes, [], 'the same code gives the same numbers');

  const svg = await client.chartSvg(made.id, { criterion: 'bic', size: 'tile' });
  assert.match(svg, /^<svg[\s>]/);
  assert.match(svg, /data-integrity="ok"/);
  const html = await client.reportHtml(made.id, { criterion: 'aic' });
  assert.match(html, /^<!doctype html>/i);
  assert.ok(html.includes('with-kiln'));
  await assert.rejects(client.chartSvg(made.id, { width: 10 }), (error) => error instanceof ParsimetryError && error.status === 400);
});

test('list follows the cursor across pages, newest first', async () => {
  const label = runLabel('list');
  const ids = [];
  for (let i = 0; i < 3; i++) ids.push((await client.compare(request(label))).id);
  const listed = [];
  for await (const item of client.list({ label, limit: 1 })) listed.push(item.id);
  assert.deepEqual(listed, ids.reverse());
  const page = await client.listPage({ label, limit: 2 });
  assert.equal(page.records.length, 2);
  assert.equal(typeof page.nextCursor, 'string');
  await assert.rejects(client.listPage({ cursor: 'not-a-cursor' }), (error) => error instanceof ParsimetryError && error.errors[0]?.path === 'cursor');
});

test('verify walks the chain', async () => {
  const report = await client.verify();
  assert.equal(report.ok, true);
  assert.ok(report.records >= 1);
});

const searchRequest = () => ({
  data: { columns },
  response: 'shrinkage',
  pool: ['peakTemp', 'holdMinutes', 'moisture', 'kiln', { kind: 'power', of: 'peakTemp', degree: 2 }],
  top: 5,
});

test('search and searchStream give the same models; the stream reports progress first', async () => {
  const plain = await client.search(searchRequest());
  const events = [];
  for await (const event of client.searchStream(searchRequest())) events.push(event);
  assert.ok(events.length >= 2);
  assert.equal(events[0].event, 'progress');
  assert.equal(events[0].data.total, 2 ** 5);
  const last = events.at(-1);
  assert.equal(last.event, 'result');
  assert.equal(last.data.evaluated, plain.evaluated);
  assert.deepEqual(last.data.models.map((m) => m.aicc), plain.models.map((m) => m.aicc));
  // Leaving the loop early closes the stream (the service stops the search); an abort rejects.
  for await (const event of client.searchStream(searchRequest())) { assert.equal(event.event, 'progress'); break; }
  const abort = new AbortController();
  await assert.rejects(async () => {
    for await (const _ of client.searchStream(searchRequest(), { signal: abort.signal })) abort.abort();
  }, (error) => error.name === 'AbortError');
  // A search that cannot start is refused before any event.
  await assert.rejects(async () => {
    for await (const _ of client.searchStream({ ...searchRequest(), response: 'missing' })) { /* none */ }
  }, (error) => error instanceof ParsimetryError && error.status === 422);
});

test('summarise folds CSV rows into a summary that compares like the rows', async () => {
  const upload = await client.summarise(tilesCsv, { columns: ['peakTemp', 'moisture', 'shrinkage'], format: 'csv' });
  assert.equal(upload.rowsRead, n);
  assert.equal(upload.rowsDropped, 0);
  const candidates = [{ name: 'temperature-and-moisture', terms: ['peakTemp', 'moisture'] }];
  const bySummary = await client.compare({ data: upload.data, response: 'shrinkage', candidates });
  const byRows = await client.compare({ data: { columns }, response: 'shrinkage', candidates });
  const [s, r] = [bySummary.models[0], byRows.models[0]];
  assert.ok(Math.abs(s.aicc - r.aicc) <= 1e-9 * Math.abs(r.aicc), `${s.aicc} vs ${r.aicc}`);
  const ndjson = columns.shrinkage.map((y, i) => JSON.stringify({ peakTemp: columns.peakTemp[i], shrinkage: y })).join('\n');
  const streamed = await client.summarise(new Blob([ndjson]).stream(), { columns: ['peakTemp', 'shrinkage'], format: 'ndjson' });
  assert.equal(streamed.rowsRead, n);
  await assert.rejects(client.summarise('a,b\n1,x\n', { columns: ['a', 'b'], format: 'csv' }), (error) => error instanceof ParsimetryError && error.status === 400);
});
