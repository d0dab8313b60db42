// GET /v1/searches/{id}/report and …/chart.svg: a stored search drawn from its
// record (its own Δ, weights, importance, proven, method, budget, passedOver),
// checked for integrity on read, bounded in size, every name escaped.
// Data: the demo scenario's generator (scripts/demo-data.ts); the label is
// hostile on purpose.
import Database from 'better-sqlite3';
import t from 'tap';
import { requestDigest } from '../../src/audit/open.ts';
import { buildTestApp } from '../helper.ts';
import { demoColumns } from '../../scripts/demo-data.ts';

const label = 'kiln pool <script>alert(1)</script> & "quotes"';
const pool = ['peakTemp', 'holdMinutes', 'moisture', { kind: 'factor', of: 'kiln' }, { kind: 'power', of: 'peakTemp', degree: 2 }];

async function storedSearch(t: Parameters<typeof buildTestApp>[0]) {
  const built = await buildTestApp(t);
  const res = await built.app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: demoColumns() }, response: 'shrinkage', pool, hierarchy: true, top: 6, label, responseTransform: { fn: 'log' } } });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  return { ...built, search: res.json() };
}

t.test('the report says what the search found, from the record, with every name escaped', async (t) => {
  const { app, search } = await storedSearch(t);
  const res = await app.inject({ method: 'GET', url: `/v1/searches/${search.id}/report` });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  t.match(res.headers['content-type'], /^text\/html/);
  t.match(res.headers['content-security-policy'], /default-src 'none'/);
  t.match(res.headers['cache-control'], /immutable/);
  const html = res.body;
  t.notMatch(html, /<script/, 'no script element, whatever the label says');
  t.match(html, /kiln pool &lt;script&gt;alert\(1\)&lt;\/script&gt; &amp; &quot;quotes&quot;|kiln pool &lt;script&gt;alert\(1\)&lt;\/script&gt; &amp; "quotes"/, 'the label escaped');
  t.match(html, /data-integrity="ok"/, 'integrity checked on read');
  const rows = html.match(/<tr data-model="[^"]*"/g) ?? [];
  t.equal(rows.length, search.models.length, 'one row per listed subset');
  for (const m of search.models) t.ok(html.includes(`data-model="${m.name.replace(/&/g, '&amp;')}"`), `row for ${m.name}`);
  const terms = html.match(/<tr data-term="[^"]*"/g) ?? [];
  t.equal(terms.length, pool.length, 'one importance row per pool term');
  // Each importance as the page prints it (a percentage of the record's weight), in pool order.
  const printed = [...html.matchAll(/<tr data-term="[^"]*"><td[^>]*>.*?<\/td><td class="num">([^<]*)<\/td>/g)].map((m) => m[1]);
  t.equal(printed.length, pool.length);
  // formatPercent writes ">99.9%" and "<0.1%" at the ends.
  const agrees = (text: string, w: number) => text.startsWith('&gt;') ? w > 0.999 : text.startsWith('&lt;') ? w < 0.001 : Math.abs(parseFloat(text) - 100 * w) < 0.1;
  search.importance.forEach((x: { weight: number }, j: number) => t.ok(agrees(printed[j], x.weight), `importance ${j}: ${printed[j]} vs ${x.weight}`));
  t.match(html, search.proven ? /proven<\/dt><dd>yes/ : /proven<\/dt><dd>no/);
  t.match(html, /every subset scored/, 'the method in words');
  t.match(html, /log \(criteria include the Jacobian/, 'the response scale');
  t.match(html, /budget<\/dt><dd>at most 16777216 subsets scored one by one/, 'the budget in words');
  t.match(html, /passed over<\/dt><dd>\d+ outside the hierarchy rule/, 'what was passed over, in words');
  t.match(html, /They do not show that any of them is valid/, 'the standing caution');
  t.match(html, /data-seq="\d+"/, 'the chain section');
});

t.test('the chart draws the best subsets by the search\'s criterion; other criteria and other kinds are refused', async (t) => {
  const { app, search } = await storedSearch(t);
  const res = await app.inject({ method: 'GET', url: `/v1/searches/${search.id}/chart.svg?size=wide` });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  t.match(res.headers['content-type'], /^image\/svg\+xml/);
  const desc = /<desc[^>]*>([\s\S]*?)<\/desc>/.exec(res.body)?.[1] ?? '';
  for (const m of search.models) t.ok(desc.includes(m.name), `the description names ${m.name}`);
  t.match(desc, new RegExp(`Best by AICc: ${search.models[0].name.replace(/[+^()]/g, '\\$&')}`));
  t.notMatch(res.body, /<script/);
  const bic = await app.inject({ method: 'GET', url: `/v1/searches/${search.id}/chart.svg?criterion=bic` });
  t.equal(bic.statusCode, 400, 'the search ranked by AICc only');
  t.equal(bic.json().errors[0].path, 'criterion');
  const comparison = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns: demoColumns() }, response: 'shrinkage', candidates: [{ name: 'a', terms: ['peakTemp'] }, { name: 'b', terms: ['moisture'] }] } });
  for (const what of ['chart.svg', 'report']) {
    const wrong = await app.inject({ method: 'GET', url: `/v1/searches/${comparison.json().id}/${what}` });
    t.equal(wrong.statusCode, 404);
    t.match(wrong.json().detail, /is a comparison, not a search/);
    const other = await app.inject({ method: 'GET', url: `/v1/comparisons/${search.id}/${what}` });
    t.equal(other.statusCode, 404);
    t.match(other.json().detail, /is a search, not a comparison/);
  }
});

t.test('a search edited in the database is drawn with the failure and never cached', async (t) => {
  const { app, config, search } = await storedSearch(t);
  const db = new Database(config.auditDb);
  try {
    db.prepare("UPDATE audit_records SET label = 'edited' WHERE id = ?").run(search.id);
  } finally {
    db.close();
  }
  for (const what of ['chart.svg', 'report']) {
    const res = await app.inject({ method: 'GET', url: `/v1/searches/${search.id}/${what}` });
    t.equal(res.statusCode, 200);
    t.equal(res.headers['cache-control'], 'no-store', what);
    t.match(res.body, /data-integrity="failed"/, what);
  }
});

t.test('a large or odd stored search gives a bounded page', async (t) => {
  const { app, store } = await buildTestApp(t);
  const request = { response: 'y', pool: ['x'] };
  const models = Array.from({ length: 300 }, (_, i) => ({ name: `subset ${i} <b>`, aicc: i, delta: i, weight: Math.exp(-i / 2) / 2, parameters: 3 }));
  const importance = Array.from({ length: 500 }, (_, j) => ({ term: `x${j}`, label: `x${j}`, weight: 0.5 }));
  const record = await store.append({
    kind: 'search', caller: 'anonymous', label: null, serviceVersion: '0.0.9', conventionsVersion: '2', policy: null, datasetFingerprint: null,
    requestDigest: requestDigest(request), request,
    result: { conventions: { rankBy: 'aicc' }, models, importance, budget: 'odd', passedOver: null, method: 'exhaustive', proven: true },
  });
  const res = await app.inject({ method: 'GET', url: `/v1/searches/${record.id}/report` });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  t.equal((res.body.match(/<tr data-model=/g) ?? []).length, 100, 'the first 100 subsets');
  t.equal((res.body.match(/<tr data-term=/g) ?? []).length, 60, 'the first 60 pool terms');
  t.match(res.body, /Showing the first 100 of 300 models; the stored record \(GET \/v1\/searches\//);
  t.notMatch(res.body, /<b>/, 'names escaped');
  const bare = await store.append({
    kind: 'search', caller: 'anonymous', label: null, serviceVersion: '0.0.1', conventionsVersion: '1', policy: null, datasetFingerprint: null,
    requestDigest: requestDigest(request), request, result: { models: 'none' },
  });
  const old = await app.inject({ method: 'GET', url: `/v1/searches/${bare.id}/report` });
  const chart = await app.inject({ method: 'GET', url: `/v1/searches/${bare.id}/chart.svg` });
  // As for a comparison without rankings: nothing to draw is a 422, not the caller's fault and never a 500.
  for (const res of [old, chart]) {
    t.equal(res.statusCode, 422, res.body.slice(0, 200));
    t.equal(res.json().errors[0].code, 'no_ranking');
  }
});
