// GET /v1/comparisons/{id}/chart.svg and /report through the service: the
// record the store holds, drawn and written up, with content types, security
// and cache headers, and every bad request a problem document. Outside
// parsers (Python's xml.dom.minidom and html.parser) read the bytes.
import t, { type Test } from 'tap';
import { requestDigest, type NewRecord } from '../../src/audit/open.ts';
import { reportContentSecurityPolicy } from '../../src/render/report-html.ts';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';
import { summariseHtml, summariseSvg, type SvgSummary } from '../render/parse-with-python.ts';
import { bearer, testKeys } from './security/test-keys.ts';

interface Entry { name: string; delta: number | null; band: string | null; rank: number | null }

const marked = (p: SvgSummary, cls: string) => (p.marked ?? []).filter((m) => m.class === cls);
const hostile = '<script>alert("kiln")</script>';

/** The demo comparison plus a candidate whose name is markup (an ordinary name to the service). */
function comparisonWithMarkupName() {
  const request = demoComparison();
  request.candidates.push({ name: hostile, terms: ['peakTemp', 'moisture'] } as (typeof request.candidates)[number]);
  return request;
}

// The outside parsers run synchronously in this process and stall its event
// loop; load shedding (EVENT_LOOP_MAX_DELAY_MS) would answer 503, so it is off here.
const calm = { eventLoopMaxDelayMs: 0 };

async function withComparison(t: Test) {
  const built = await buildTestApp(t, calm);
  const post = await built.app.inject({ method: 'POST', url: '/v1/comparisons', payload: comparisonWithMarkupName() });
  t.equal(post.statusCode, 200, post.body.slice(0, 300));
  return { ...built, result: post.json(), id: post.json().id as string };
}

t.test('chart.svg: SVG of the ranked-by criterion, one bar per model, the JSON\'s band words', async (t) => {
  const { app, result, id } = await withComparison(t);
  const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${id}/chart.svg` });
  t.equal(res.statusCode, 200);
  t.equal(res.headers['content-type'], 'image/svg+xml; charset=utf-8');
  t.equal(res.headers['content-security-policy'], "default-src 'none'; frame-ancestors 'self'");
  t.equal(res.headers['x-content-type-options'], 'nosniff');
  t.equal(res.headers['cache-control'], 'public, max-age=31536000, immutable', 'open service: shared caches may keep it');

  const parsed = summariseSvg(res.body);
  t.ok(parsed.wellFormed, parsed.error ?? 'well-formed XML');
  t.equal(parsed.root, 'svg');
  t.equal(parsed.rootAttributes?.['data-criterion'], result.verdict.rankBy);
  const entries: Entry[] = result.rankings[result.verdict.rankBy];
  t.same(marked(parsed, 'delta-bar').map((b) => b.data.model), entries.map((e) => e.name), 'bars in ranking order');
  t.notOk(parsed.tags?.includes('script'), `no script element, though a model is called ${hostile}`);
  // Pictures say what the JSON says: every entry's band, word for word.
  for (const e of entries) {
    const words = e.delta === 0 ? 'best' : e.band;
    if (words !== null) t.ok(parsed.desc?.includes(`${e.name}: Δ `) && parsed.desc.includes(`(${words})`), `${e.name}: ${words}`);
  }
  const legend = marked(parsed, 'band-legend')[0].text.replace(/\u00a0/g, ' ');
  t.match(legend, /In the words of policy “parsimetry-default”: Δ ≤ 2: substantial support/);
  t.same(marked(parsed, 'band-line').map((l) => l.data.at), ['2', '4', '7', '10']);
});

t.test('chart.svg?criterion=bic: Kass & Raftery\'s lines at 2, 6 and 10 with the JSON\'s BIC words', async (t) => {
  const { app, result, id } = await withComparison(t);
  const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${id}/chart.svg?criterion=bic&size=tile` });
  t.equal(res.statusCode, 200);
  const parsed = summariseSvg(res.body);
  t.equal(parsed.rootAttributes?.width, '420');
  t.same(marked(parsed, 'band-line').map((l) => l.data.at), ['2', '6', '10']);
  const legend = marked(parsed, 'band-legend')[0].text.replace(/\u00a0/g, ' ');
  for (const e of result.rankings.bic as Entry[]) {
    if (e.band !== null) t.ok(legend.includes(e.band), `the legend uses the JSON's words: ${e.band}`);
  }
  const none = await app.inject({ method: 'GET', url: `/v1/comparisons/${id}/chart.svg?criterion=adjustedR2` });
  t.equal(none.statusCode, 200);
  t.equal(marked(summariseSvg(none.body), 'band-line').length, 0, 'adjusted R²: no bands, as the JSON has none');
});

t.test('report: HTML with every model as a row and every ranking\'s band words', async (t) => {
  const { app, result, id } = await withComparison(t);
  const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${id}/report` });
  t.equal(res.statusCode, 200);
  t.equal(res.headers['content-type'], 'text/html; charset=utf-8');
  t.equal(res.headers['content-security-policy'], `${reportContentSecurityPolicy}; frame-ancestors 'self'`);
  t.equal(res.headers['cache-control'], 'public, max-age=31536000, immutable');
  const parsed = summariseHtml(res.body);
  t.notOk(parsed.startTags.includes('script'), 'no script element');
  const names = result.models.map((m: { name: string }) => m.name);
  t.ok(names.includes(hostile));
  t.same(parsed.rows.filter((r) => r.table === 'models').map((r) => r.cells[0]), names, 'each model a row, its name as text');
  for (const criterion of ['aicc', 'aic', 'bic', 'hqc']) {
    const rows = parsed.rows.filter((r) => r.table === criterion);
    for (const e of result.rankings[criterion] as Entry[]) {
      const row = rows.find((r) => r.model === e.name)!;
      // The best model is worded apart ("best"); every other entry reads the JSON's band, word for word.
      const words = e.delta === 0 ? 'best' : e.band ?? '';
      t.ok(row.cells.includes(words), `${criterion} ${e.name}: support "${words}"`);
    }
  }
  t.match(parsed.text, /The support column gives the words of policy “parsimetry-default”/);
  t.match(parsed.text, /They do not show that any of them is valid/, 'the standing caution');
});

t.test('the same bytes every time; ETag and If-None-Match give 304', async (t) => {
  const { app, id } = await withComparison(t);
  for (const path of ['chart.svg', 'report']) {
    const url = `/v1/comparisons/${id}/${path}`;
    const a = await app.inject({ method: 'GET', url });
    const b = await app.inject({ method: 'GET', url });
    t.equal(a.body, b.body, `${path}: deterministic`);
    t.match(a.headers.etag, /^"[A-Za-z0-9_-]{32}"$/);
    t.equal(a.headers.etag, b.headers.etag);
    const again = await app.inject({ method: 'GET', url, headers: { 'if-none-match': `"other", ${a.headers.etag}` } });
    t.equal(again.statusCode, 304, `${path}: not modified`);
    t.equal(again.body, '');
    t.equal(again.headers['cache-control'], a.headers['cache-control']);
    const changed = await app.inject({ method: 'GET', url, headers: { 'if-none-match': '"other"' } });
    t.equal(changed.statusCode, 200);
  }
  const wide = await app.inject({ method: 'GET', url: `/v1/comparisons/${id}/chart.svg?size=wide` });
  const plain = await app.inject({ method: 'GET', url: `/v1/comparisons/${id}/chart.svg` });
  t.not(wide.headers.etag, plain.headers.etag, 'other options, other bytes, other tag');
});

t.test('with an API key the reply is private: a shared cache must not hand it to others (RFC 9111 §3.5)', async (t) => {
  const { ring, secrets } = testKeys({ scorer: ['score'], reader: ['read'] });
  const { app } = await buildTestApp(t, calm, { keys: ring });
  const post = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison(), headers: bearer(secrets.scorer) });
  t.equal(post.statusCode, 200);
  const url = `/v1/comparisons/${post.json().id}/chart.svg`;
  t.equal((await app.inject({ method: 'GET', url })).statusCode, 401, 'no key: refused');
  const res = await app.inject({ method: 'GET', url, headers: bearer(secrets.reader) });
  t.equal(res.statusCode, 200);
  t.equal(res.headers['cache-control'], 'private, max-age=31536000, immutable');
});

t.test('bad requests are problem documents naming each option', async (t) => {
  const { app, id } = await withComparison(t);
  const get = (url: string) => app.inject({ method: 'GET', url });

  for (const path of ['chart.svg', 'report']) {
    const malformed = await get(`/v1/comparisons/not-an-id/${path}`);
    t.equal(malformed.statusCode, 400, `${path}: malformed id`);
    t.match(malformed.headers['content-type'], /^application\/problem\+json/);
    t.same(malformed.json().errors.map((e: { path: string }) => e.path), ['id']);

    const unknown = await get(`/v1/comparisons/${id.slice(0, -4)}0000/${path}`);
    t.equal(unknown.statusCode, 404, `${path}: unknown id`);
    t.match(unknown.json(), { type: 'urn:parsimetry:problem:not-found', status: 404 });
    t.notOk(unknown.headers['cache-control'], 'a 404 is not cached for a year');
  }

  const cases: [string, string[], string[]][] = [
    ['width=100', ['width'], ['out_of_range']],
    ['width=12.5&height=abc', ['width', 'height'], ['not_an_integer', 'not_an_integer']],
    ['criterion=cp', ['criterion'], ['unknown_criterion']],
    ['size=huge&colour=red', ['colour', 'size'], ['unknown_option', 'unknown_size']],
    ['size=tile&size=wide', ['size'], ['repeated_option']],
  ];
  for (const [query, paths, codes] of cases) {
    const res = await get(`/v1/comparisons/${id}/chart.svg?${query}`);
    t.equal(res.statusCode, 400, query);
    t.match(res.headers['content-type'], /^application\/problem\+json/);
    const body = res.json();
    t.equal(body.type, 'urn:parsimetry:problem:invalid-request');
    t.same(body.errors.map((e: { path: string }) => e.path), paths, `${query}: paths`);
    t.same(body.errors.map((e: { code: string }) => e.code), codes, `${query}: codes`);
    for (const e of body.errors) t.ok(typeof e.message === 'string' && e.message.length > 0, `${query}: ${e.message}`);
  }
  const report = await get(`/v1/comparisons/${id}/report?criterion=cp`);
  t.equal(report.statusCode, 400, 'the report checks the same options');
});

t.test('older or odd records still draw; a record with nothing ranked is 422, not a crash', async (t) => {
  const { app, store } = await buildTestApp(t, calm);
  const request = { response: 'shrinkage', candidates: [{ name: 'linear', terms: ['peakTemp'] }] };
  const base: Omit<NewRecord, 'result'> = {
    kind: 'comparison', caller: 'anonymous', label: 'written by an older service', serviceVersion: '0.0.1', conventionsVersion: '1',
    policy: null, datasetFingerprint: null, requestDigest: requestDigest(request), request,
  };
  // A ranking entry from before bands existed: our own words are used.
  const older = await store.append({
    ...base,
    result: {
      models: [{ name: 'linear', parameters: 3 }, 'not a model', { name: 'quadratic', parameters: 4, coefficients: 'lost' }],
      rankings: { aicc: [{ rank: 1, name: 'quadratic', delta: 0, weight: 0.8 }, { rank: 2, name: 'linear', delta: 2.8, weight: 0.2 }, null] },
      verdict: { rankBy: 'aicc' },
    },
  });
  const chart = await app.inject({ method: 'GET', url: `/v1/comparisons/${older.id}/chart.svg` });
  t.equal(chart.statusCode, 200, chart.body.slice(0, 300));
  const parsed = summariseSvg(chart.body);
  t.same(marked(parsed, 'delta-bar').map((b) => b.data.model), ['quadratic', 'linear']);
  t.match(parsed.desc, /linear: Δ 2\.80 \(between bands\)/);
  const notRanked = await app.inject({ method: 'GET', url: `/v1/comparisons/${older.id}/chart.svg?criterion=bic` });
  t.equal(notRanked.statusCode, 400, 'a criterion this record did not rank');
  t.match(notRanked.json().errors, [{ path: 'criterion', code: 'criterion_not_ranked', ranked: ['aicc'] }]);
  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${older.id}/report` });
  t.equal(report.statusCode, 200);
  t.match(summariseHtml(report.body).text, /This record names no support bands/);

  const empty = await store.append({ ...base, result: { models: [], verdict: { chosen: null } } });
  for (const path of ['chart.svg', 'report']) {
    const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${empty.id}/${path}` });
    t.equal(res.statusCode, 422, `${path}: nothing to draw`);
    t.equal(res.json().errors[0].code, 'no_ranking');
  }
});

t.test('both routes are in the OpenAPI document with their media types', async (t) => {
  const { app } = await buildTestApp(t, calm);
  const doc = (await app.inject({ method: 'GET', url: '/openapi.json' })).json();
  const chart = doc.paths['/v1/comparisons/{id}/chart.svg']?.get;
  const report = doc.paths['/v1/comparisons/{id}/report']?.get;
  t.ok(chart?.responses?.['200']?.content?.['image/svg+xml'], 'chart: image/svg+xml');
  t.ok(report?.responses?.['200']?.content?.['text/html'], 'report: text/html');
  t.same(chart.parameters.filter((p: { in: string }) => p.in === 'query').map((p: { name: string }) => p.name), ['criterion', 'size', 'width', 'height']);
  for (const op of [chart, report]) t.ok(op.responses['404'] && op.responses['400'] && op.responses['304'], 'problems and 304 documented');
});
