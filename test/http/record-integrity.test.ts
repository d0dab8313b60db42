// Integrity on read through the service: records stored in a real SQLite file,
// then edited in that file behind the service's back (as someone with access
// to the database could), and read back as JSON, report and chart.
import Database from 'better-sqlite3';
import t, { type Test } from 'tap';
import { requestDigest, type NewRecord } from '../../src/audit/open.ts';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

function searchRecord(): NewRecord {
  // Demo scenario (invented): a stored search over kiln settings.
  const request = { response: 'shrinkage', pool: ['peakTemp', 'moisture'] };
  return {
    kind: 'search', caller: 'anonymous', label: 'pool of kiln settings', serviceVersion: '0.1.0', conventionsVersion: '1', policy: null,
    datasetFingerprint: 'sha256:' + 'a'.repeat(64), requestDigest: requestDigest(request), request,
    result: { evaluated: 4, models: [{ name: 'peakTemp + moisture', terms: ['peakTemp', 'moisture'] }] },
  };
}

/** Three demo comparisons and a search, stored through the service in an SQLite file. */
async function storedRecords(t: Test) {
  const built = await buildTestApp(t);
  const ids: string[] = [];
  for (const label of ['spring firing', 'summer firing', 'autumn firing']) {
    const res = await built.app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), label } });
    t.equal(res.statusCode, 200, res.body.slice(0, 200));
    ids.push(res.json().id);
  }
  const search = await built.store.append(searchRecord());
  const edit = (sql: string, ...params: unknown[]) => {
    const db = new Database(built.config.auditDb);
    try {
      db.prepare(sql).run(...params);
    } finally {
      db.close();
    }
  };
  return { ...built, ids, searchId: search.id, edit };
}

t.test('intact records read back with integrity ok, JSON, report and chart alike', async (t) => {
  const { app, ids, searchId } = await storedRecords(t);
  for (const [i, id] of ids.entries()) {
    const body = (await app.inject({ method: 'GET', url: `/v1/comparisons/${id}` })).json();
    t.same(body.integrity.ok, true, `record ${i + 1}`);
    t.equal(body.integrity.reason, null);
    t.match(body.integrity.detail, new RegExp(`^Record ${i + 1} hashes to its stored hash`));
  }
  const search = (await app.inject({ method: 'GET', url: `/v1/searches/${searchId}` })).json();
  t.same([search.integrity.ok, search.integrity.reason], [true, null], 'a search record too');
  t.match(search.integrity.detail, /it is the newest record, as the store's head says/);

  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[1]}/report` });
  t.match(report.body, /data-integrity="ok"/);
  t.match(report.headers['cache-control'], /immutable/, 'an intact record\'s pictures are cached as before');
  const chart = await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[1]}/chart.svg` });
  t.match(chart.body, /<svg[^>]* data-integrity="ok"/);
  t.notMatch(chart.body, /integrity-warning/);
});

t.test('a result edited in the database: served with 200, integrity false, the report and chart say so and are not cached', async (t) => {
  const { app, ids, edit } = await storedRecords(t);
  // Someone changes the best model's AICc in the stored result of the second record.
  edit("UPDATE audit_records SET result = replace(result, '\"aicc\":-93.6', '\"aicc\":-99.6') WHERE id = ?", ids[1]);
  const res = await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[1]}` });
  t.equal(res.statusCode, 200, 'still answered: hiding it would hide the evidence');
  const body = res.json();
  t.same([body.integrity.ok, body.integrity.reason], [false, 'hash_mismatch']);
  t.match(body.integrity.detail, /Record 2 no longer hashes to its stored hash/);
  t.match(body.integrity.detail, /run GET \/v1\/audit\/verify/);
  t.equal((await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[0]}` })).json().integrity.ok, true, 'record 1 is intact');
  t.equal((await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[2]}` })).json().integrity.ok, true, 'record 3 still links to the stored hash');

  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[1]}/report` });
  t.equal(report.statusCode, 200);
  t.equal(report.headers['cache-control'], 'no-store');
  t.match(report.body, /<div class="integrity failed" role="alert" data-integrity="failed">/);
  t.ok(report.body.indexOf('data-integrity="failed"') < report.body.indexOf('<h2'), 'the warning comes before the first section');
  t.match(report.body, /This record fails its integrity check \(hash_mismatch\)/);

  const chart = await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[1]}/chart.svg?size=tile` });
  t.equal(chart.statusCode, 200);
  t.equal(chart.headers['cache-control'], 'no-store');
  t.match(chart.body, /<svg[^>]* data-integrity="failed"/);
  t.match(chart.body, /class="integrity-warning"/);
  t.match(chart.body, /Integrity check failed \(hash_mismatch\)/);
});

t.test('a row re-hashed after editing, a row removed: the neighbours give them away', async (t) => {
  const { app, ids, searchId, edit } = await storedRecords(t);
  edit('UPDATE audit_records SET hash = ? WHERE id = ?', 'f'.repeat(64), ids[0]);
  const first = (await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[0]}` })).json();
  t.equal(first.integrity.reason, 'hash_mismatch');
  const second = (await app.inject({ method: 'GET', url: `/v1/comparisons/${ids[1]}` })).json();
  t.same([second.integrity.ok, second.integrity.reason], [false, 'prev_hash_mismatch'], 'record 2 no longer names its predecessor\'s hash');

  edit('DELETE FROM audit_records WHERE id = ?', ids[2]);
  const search = (await app.inject({ method: 'GET', url: `/v1/searches/${searchId}` })).json();
  t.same([search.integrity.ok, search.integrity.reason], [false, 'sequence_gap']);
  t.match(search.integrity.detail, /Record 3, the one before record 4, is missing/);
});
