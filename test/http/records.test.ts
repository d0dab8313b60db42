// GET /v1/comparisons/{id} and GET /v1/comparisons: the record reads back as it
// was answered, pages walk every record once, newest first, and every bad query
// is a 400 naming its field.
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import t, { type Test } from 'tap';
import { defaultConfig } from '../../src/config.ts';
import { openAuditStore, requestDigest, type NewRecord } from '../../src/audit/open.ts';
import { buildApp } from '../../src/http/app.ts';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

const GENESIS = '0'.repeat(64);

/** Canonical JSON written out again for the tests: sorted keys, no white space. */
const sorted = (v: unknown): string => Array.isArray(v) ? `[${v.map(sorted).join(',')}]`
  : v !== null && typeof v === 'object' ? `{${Object.keys(v).sort().map((k) => `${JSON.stringify(k)}:${sorted((v as Record<string, unknown>)[k])}`).join(',')}}`
    : JSON.stringify(v);

/** An app over an SQLite file whose clock steps 1 s per record, so time filters have distinct instants. */
async function appWithClock(t: Test, startMs = Date.UTC(2026, 2, 1, 8, 0, 0)) {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-records-'));
  const file = join(dir, 'audit.sqlite');
  let now = startMs - 1000;
  const store = await openAuditStore(file, { clock: { now: () => (now += 1000) } });
  const app = await buildApp({ config: defaultConfig({ auditDb: file }), store, logger: false });
  t.teardown(async () => {
    await app.close();
    await store.close();
    rmSync(dir, { recursive: true, force: true });
  });
  return { app, store, file };
}

// Demo scenario (invented): a small shrinkage data set, varied per request.
function smallComparison(i: number, label = `firing ${i}`) {
  const peakTemp = [1150, 1165, 1180, 1195, 1210, 1225, 1240, 1250];
  const shrinkage = peakTemp.map((x, j) => 5 + 0.01 * (x - 1150) + ((j * 7) % 5) / 50 + i / 1000);
  return {
    data: { columns: { shrinkage, peakTemp } },
    response: 'shrinkage',
    candidates: [{ name: 'linear', terms: ['peakTemp'] }, { name: 'quadratic', terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }] }],
    label,
  };
}

function directRecord(over: Partial<NewRecord>): NewRecord {
  const request = { response: 'shrinkage', candidates: [{ name: 'linear', terms: ['peakTemp'] }] };
  return {
    kind: 'comparison', caller: 'key-west', label: null, serviceVersion: '0.0.9', conventionsVersion: '1', policy: null,
    datasetFingerprint: 'sha256:' + 'a'.repeat(64), requestDigest: requestDigest(request), request,
    result: { verdict: { chosen: 'linear' }, models: [] },
    ...over,
  };
}

t.test('POST then GET: the result is the POST response exactly, with request summary and chain position', async (t) => {
  const { app, store } = await buildTestApp(t);
  const post = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
  t.equal(post.statusCode, 200, post.body.slice(0, 300));
  const posted = post.json();
  const get = await app.inject({ method: 'GET', url: `/v1/comparisons/${posted.id}` });
  t.equal(get.statusCode, 200, get.body.slice(0, 300));
  const body = get.json();
  t.same(body.result, posted, 'deep-equal to what POST answered');
  t.equal(body.id, posted.id);
  t.equal(body.createdAt, posted.createdAt);
  t.equal(body.kind, 'comparison');
  t.equal(body.caller, 'anonymous');
  t.equal(body.label, demoComparison().label);
  t.equal(body.serviceVersion, posted.serviceVersion);
  t.equal(body.conventionsVersion, posted.conventions.version);
  t.equal(body.datasetFingerprint, posted.dataset.fingerprint);
  const demo = demoComparison();
  t.same(body.requestSummary, {
    candidates: demo.candidates.map((c: { name: string }) => c.name),
    response: 'shrinkage',
    rows: 120,
    columns: Object.keys(demo.data.columns),
  });
  t.same(body.request.data, demo.data, 'the full request is kept');
  t.equal(body.requestDigest, requestDigest(body.request), 'the digest is of the stored request');
  // Chain position: the first record links to the genesis hash, and its hash is
  // the documented formula (src/audit/README.md), written out again here.
  t.equal(body.chain.seq, 1);
  t.equal(body.chain.prevHash, GENESIS);
  const stored = await store.get(posted.id);
  const { prevHash, hash: _h, ...rest } = stored!;
  t.equal(body.chain.hash, createHash('sha256').update(prevHash + sorted(rest), 'utf8').digest('hex'));
  const verify = (await app.inject({ method: 'GET', url: '/v1/audit/verify' })).json();
  t.same(verify.head, { seq: 1, id: posted.id, hash: body.chain.hash }, 'the record is the chain head verify reports');
});

t.test('a digest-only record reads back without request or summary', async (t) => {
  const { app, store } = await appWithClock(t);
  const full = directRecord({});
  const record = await store.append({ ...full, request: null });
  const body = (await app.inject({ method: 'GET', url: `/v1/comparisons/${record.id}` })).json();
  t.equal(body.request, null);
  t.equal(body.requestSummary, null);
  t.equal(body.requestDigest, full.requestDigest, 'the digest is still there to prove what was asked');
  t.same(body.result, { id: record.id, createdAt: record.createdAt, serviceVersion: '0.0.9', verdict: { chosen: 'linear' }, models: [] },
    'a record of an older shape reads back in its own shape');
});

t.test('unknown, malformed and non-comparison ids', async (t) => {
  const { app, store } = await appWithClock(t);
  const unknown = await app.inject({ method: 'GET', url: '/v1/comparisons/01890a5d-ac96-774b-bcce-b302099a8057' });
  t.equal(unknown.statusCode, 404);
  t.equal(unknown.json().type, 'urn:parsimetry:problem:not-found');
  t.match(unknown.headers['content-type'], /application\/problem\+json/);
  for (const bad of ['nope', '01890A5D-AC96-774B-BCCE-B302099A8057', '01890a5d-ac96-474b-bcce-b302099a8057']) {
    const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${bad}` });
    t.equal(res.statusCode, 400, bad);
    t.equal(res.json().errors[0].path, 'id');
  }
  const search = await store.append(directRecord({ kind: 'search' }));
  t.equal((await app.inject({ method: 'GET', url: `/v1/comparisons/${search.id}` })).statusCode, 404, 'a search record is not a comparison');
});

t.test('a record damaged in the database is a 500 that says what to run, not a crash', async (t) => {
  const { app, store, file } = await appWithClock(t);
  const record = await store.append(directRecord({}));
  const raw = new Database(file);
  raw.prepare('UPDATE audit_records SET result = ? WHERE seq = ?').run('{not json', record.seq);
  raw.close();
  const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${record.id}` });
  t.equal(res.statusCode, 500);
  const body = res.json();
  t.equal(body.type, 'urn:parsimetry:problem:internal');
  t.equal(body.detail, `the stored record ${record.seq} no longer reads back; run GET /v1/audit/verify`);
  t.notMatch(res.body, /at .*\.ts:\d+/, 'no stack trace');
  const list = (await app.inject({ method: 'GET', url: '/v1/comparisons' })).json();
  t.same(list.records.map((r: { id: string; best: string }) => [r.id, r.best]), [[record.id, 'linear']],
    'the list shows the envelope and never reads the result, so a damaged result does not hide the record');
  const again = new Database(file);
  again.prepare('UPDATE audit_records SET created_at = ? WHERE seq = ?').run('last Tuesday', record.seq);
  again.close();
  const damaged = (await app.inject({ method: 'GET', url: '/v1/comparisons' })).json();
  t.same(damaged.unreadable, [{ seq: record.seq, id: record.id }], 'a damaged envelope is named instead of hiding the page');
  t.same(damaged.records, []);
});

t.test('the list: newest first, cursor pages that cover every record once', async (t) => {
  const { app } = await appWithClock(t);
  const ids: string[] = [];
  for (let i = 0; i < 7; i++) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: smallComparison(i) });
    t.equal(res.statusCode, 200, res.body.slice(0, 200));
    ids.push(res.json().id);
  }
  const seen: { id: string; seq: number }[] = [];
  let cursor: string | null = null;
  let pages = 0;
  do {
    const url: string = `/v1/comparisons?limit=3${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`;
    const page = (await app.inject({ method: 'GET', url })).json();
    t.ok(page.records.length <= 3);
    seen.push(...page.records);
    cursor = page.nextCursor;
    pages += 1;
  } while (cursor !== null && pages < 10);
  t.equal(pages, 3, '7 records in pages of 3');
  t.same(seen.map((r) => r.id), [...ids].reverse(), 'every record once, newest first');
  t.same(seen.map((r) => r.seq), [7, 6, 5, 4, 3, 2, 1]);
  const first = (await app.inject({ method: 'GET', url: '/v1/comparisons?limit=1' })).json().records[0];
  t.same(Object.keys(first).sort(), ['best', 'caller', 'createdAt', 'datasetFingerprint', 'hash', 'id', 'kind', 'label', 'seq'],
    'summary items carry no request or result bodies');
  const full = (await app.inject({ method: 'GET', url: `/v1/comparisons/${first.id}` })).json();
  t.equal(first.best, full.result.verdict.chosen);
  t.equal(first.hash, full.chain.hash);
  t.equal((await app.inject({ method: 'GET', url: '/v1/comparisons' })).json().records.length, 7, 'default limit 20 holds all 7');
});

t.test('filters: fingerprint, caller, label and time range; searches are not listed', async (t) => {
  const start = Date.UTC(2026, 2, 1, 8, 0, 0);
  const { app, store } = await appWithClock(t, start);
  const fpA = 'sha256:' + 'a'.repeat(64);
  const fpB = 'sha256:' + 'b'.repeat(64);
  // One record per second from 08:00:00 (the store's clock above).
  await store.append(directRecord({ caller: 'key-east', datasetFingerprint: fpA, label: 'spring' })); // 08:00:00
  await store.append(directRecord({ caller: 'key-west', datasetFingerprint: fpA, label: 'autumn' })); // 08:00:01
  await store.append(directRecord({ caller: 'key-west', datasetFingerprint: fpB, label: 'spring' })); // 08:00:02
  await store.append(directRecord({ kind: 'search', caller: 'key-west', datasetFingerprint: fpB, label: 'spring' })); // 08:00:03
  await store.append(directRecord({ caller: 'key-east', datasetFingerprint: fpB, label: null })); // 08:00:04
  const list = async (query: string) => {
    const res = await app.inject({ method: 'GET', url: `/v1/comparisons?${query}` });
    t.equal(res.statusCode, 200, `${query}: ${res.body.slice(0, 200)}`);
    return res.json().records.map((r: { seq: number }) => r.seq);
  };
  t.same(await list(''), [5, 3, 2, 1], 'the search record (seq 4) is not a comparison');
  t.same(await list(`fingerprint=${encodeURIComponent(fpA)}`), [2, 1]);
  t.same(await list('caller=key-west'), [3, 2]);
  t.same(await list('label=spring'), [3, 1]);
  t.same(await list('label=spring&caller=key-east'), [1], 'filters combine');
  t.same(await list('label=rin'), [3, 1], 'label matches a substring');
  t.same(await list('label=Spring'), [], 'as written, case included');
  t.same(await list('from=2026-03-01T08:00:01Z&to=2026-03-01T08:00:04Z'), [3, 2], 'from inclusive, to exclusive');
  t.same(await list('from=2026-03-01T09:00:01%2B01:00'), [5, 3, 2], 'an offset is honoured (09:00:01+01:00 is 08:00:01Z)');
  t.same(await list('to=2026-03-01'), [], 'a date is its midnight UTC');
  t.same(await list('from=2026-03-01'), [5, 3, 2, 1]);
});

t.test('GET /v1/searches: the same filters and paging, searches only, each id under its own kind', async (t) => {
  const start = Date.UTC(2026, 2, 1, 8, 0, 0);
  const { app, store } = await appWithClock(t, start);
  const fpA = 'sha256:' + 'a'.repeat(64);
  const fpB = 'sha256:' + 'b'.repeat(64);
  const search = (over: Partial<NewRecord>) => directRecord({ kind: 'search', result: { models: [{ name: 'peakTemp' }] }, ...over });
  // One record per second from 08:00:00 (the store's clock above); comparisons interleaved with searches.
  await store.append(search({ caller: 'key-east', datasetFingerprint: fpA, label: 'spring' })); // 1, 08:00:00
  await store.append(directRecord({ caller: 'key-west', datasetFingerprint: fpA, label: 'spring' })); // 2, a comparison
  await store.append(search({ caller: 'key-west', datasetFingerprint: fpA, label: 'autumn' })); // 3, 08:00:02
  await store.append(search({ caller: 'key-west', datasetFingerprint: fpB, label: 'spring' })); // 4, 08:00:03
  await store.append(directRecord({ caller: 'key-east', datasetFingerprint: fpB, label: null })); // 5, a comparison
  await store.append(search({ caller: 'key-east', datasetFingerprint: fpB, label: null, result: { models: [] } })); // 6, 08:00:05
  const list = async (query: string, path = '/v1/searches') => {
    const res = await app.inject({ method: 'GET', url: `${path}?${query}` });
    t.equal(res.statusCode, 200, `${query}: ${res.body.slice(0, 200)}`);
    return res.json().records as { seq: number; kind: string; best: string | null; id: string }[];
  };
  const all = await list('');
  t.same(all.map((r) => r.seq), [6, 4, 3, 1], 'searches only, newest first');
  t.ok(all.every((r) => r.kind === 'search'));
  t.same(all.map((r) => r.best), [null, 'peakTemp', 'peakTemp', 'peakTemp'], 'best: the first model\'s name (none without models)');
  const comparisons = await list('', '/v1/comparisons');
  t.same(comparisons.map((r) => r.seq), [5, 2], 'and no search among the comparisons');
  t.notOk(comparisons.some((c) => all.some((s) => s.id === c.id)), 'no id in both listings');
  t.same((await list(`fingerprint=${encodeURIComponent(fpA)}`)).map((r) => r.seq), [3, 1]);
  t.same((await list('caller=key-west')).map((r) => r.seq), [4, 3]);
  t.same((await list('label=pri')).map((r) => r.seq), [4, 1], 'label matches a substring');
  t.same((await list('label=spring&caller=key-east')).map((r) => r.seq), [1], 'filters combine');
  t.same((await list('from=2026-03-01T08:00:02Z&to=2026-03-01T08:00:05Z')).map((r) => r.seq), [4, 3], 'from inclusive, to exclusive');
  const seen: number[] = [];
  let cursor: string | null = null;
  let pages = 0;
  do {
    const url: string = `/v1/searches?limit=3${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`;
    const page: { records: { seq: number }[]; nextCursor: string | null } = (await app.inject({ method: 'GET', url })).json();
    seen.push(...page.records.map((r) => r.seq));
    cursor = page.nextCursor;
    pages += 1;
  } while (cursor !== null && pages < 10);
  t.same(seen, [6, 4, 3, 1], 'cursor pages cover every search once');
  for (const [query, field] of [['limit=0', 'limit'], ['cursor=nope', 'cursor'], ['fingerprint=abc', 'fingerprint'], ['from=2026-03-02&to=2026-03-01', 'to']]) {
    const res = await app.inject({ method: 'GET', url: `/v1/searches?${query}` });
    t.equal(res.statusCode, 400, query);
    t.equal(res.json().errors[0].path, field, `${query} names ${field}`);
  }
});

t.test('every bad query is a 400 naming its field', async (t) => {
  const { app } = await appWithClock(t);
  const cases: [string, string][] = [
    ['limit=0', 'limit'],
    ['limit=101', 'limit'],
    ['limit=abc', 'limit'],
    ['limit=2.5', 'limit'],
    ['limit=0x10', 'limit'],
    ['limit=1e1', 'limit'],
    ['limit=%2B5', 'limit'],
    ['limit=%205', 'limit'],
    ['limit=', 'limit'],
    ['cursor=not-a-cursor', 'cursor'],
    ['from=yesterday', 'from'],
    ['to=2026-13-45', 'to'],
    ['from=2026-03-02&to=2026-03-01', 'to'],
    ['caller=a&caller=b', 'caller'],
    ['fingerprints=x', ''],
  ];
  for (const [query, field] of cases) {
    const res = await app.inject({ method: 'GET', url: `/v1/comparisons?${query}` });
    t.equal(res.statusCode, 400, query);
    const body = res.json();
    t.equal(body.type, 'urn:parsimetry:problem:invalid-request', query);
    t.equal(body.errors[0].path, field, `${query} names ${field || 'the query itself'}`);
    if (field === 'limit') t.match(body.errors[0].message, /decimal digits/, `${query}: says how to write it`);
  }
  t.equal((await app.inject({ method: 'GET', url: '/v1/comparisons?limit=100' })).statusCode, 200, 'limit 100 is allowed');
});

t.test('AUDIT_REQUESTS=digest keeps only the request digest: the record reads back, replay explains why it cannot run', async (t) => {
  const { app, store } = await buildTestApp(t, { auditRequests: 'digest' });
  const posted = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
  t.equal(posted.statusCode, 200);
  const record = await store.get(posted.json().id);
  t.equal(record!.request, null, 'no request body stored');
  t.match(record!.requestDigest, /^[0-9a-f]{64}$/);
  const back = (await app.inject({ method: 'GET', url: `/v1/comparisons/${posted.json().id}` })).json();
  t.equal(back.requestSummary, null);
  const replay = await app.inject({ method: 'POST', url: `/v1/comparisons/${posted.json().id}/replay` });
  t.equal(replay.statusCode, 409);
  t.match(replay.json().detail, /digest-only/);
});

t.test('GET /v1/audit/records/{id} answers the record exactly as hashed: its hash recomputes outside the store', async (t) => {
  const { app } = await buildTestApp(t);
  const first = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).json();
  const second = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), label: 'second' } })).json();
  const a = (await app.inject({ method: 'GET', url: `/v1/audit/records/${first.id}` })).json();
  const b = (await app.inject({ method: 'GET', url: `/v1/audit/records/${second.id}` })).json();
  for (const raw of [a, b]) {
    const { prevHash, hash, ...rest } = raw;
    // The rule of src/audit/README.md, reimplemented here with node:crypto and a separate canonical JSON.
    t.equal(hash, createHash('sha256').update(prevHash + sorted(rest), 'utf8').digest('hex'), `record ${raw.seq}`);
  }
  t.equal(a.prevHash, GENESIS, 'the first record follows 64 zeros');
  t.equal(b.prevHash, a.hash, 'the second names the first');
  t.equal((await app.inject({ method: 'GET', url: `/v1/audit/records/${'0'.repeat(8)}-0000-7000-8000-${'0'.repeat(12)}` })).statusCode, 404);
});
