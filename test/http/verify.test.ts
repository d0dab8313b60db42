// GET /v1/audit/verify through HTTP: an intact chain, and each way of breaking it
// behind the service's back (as someone with database access could) named at
// the first record whose content, order or link is wrong. Always a 200.
import Database from 'better-sqlite3';
import t, { type Test } from 'tap';
import { buildTestApp } from '../helper.ts';

// Demo scenario (invented): a small shrinkage data set, varied per request.
function smallComparison(i: number) {
  const peakTemp = [1150, 1170, 1190, 1210, 1230, 1250];
  return {
    data: { columns: { peakTemp, shrinkage: peakTemp.map((x, j) => 5 + 0.01 * (x - 1150) + ((j * 3) % 4) / 40 + i / 1000) } },
    response: 'shrinkage',
    candidates: [{ name: 'linear', terms: ['peakTemp'] }],
  };
}

async function chainOf(t: Test, n: number) {
  const { app, config } = await buildTestApp(t);
  const ids: string[] = [];
  for (let i = 0; i < n; i++) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: smallComparison(i) });
    t.equal(res.statusCode, 200);
    ids.push(res.json().id);
  }
  const sql = (statement: string, ...params: unknown[]) => {
    const raw = new Database(config.auditDb);
    try {
      raw.prepare(statement).run(...params);
    } finally {
      raw.close();
    }
  };
  const verify = async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/audit/verify' });
    t.equal(res.statusCode, 200, 'verify answers 200 whether or not the chain holds');
    return res.json();
  };
  return { app, ids, sql, verify };
}

t.test('an empty chain and an intact one', async (t) => {
  const empty = await chainOf(t, 0);
  t.same(await empty.verify(), { ok: true, records: 0, head: null, firstBroken: null });
  const { ids, verify } = await chainOf(t, 4);
  const report = await verify();
  t.equal(report.ok, true);
  t.equal(report.records, 4);
  t.equal(report.head.seq, 4);
  t.equal(report.head.id, ids[3]);
  t.match(report.head.hash, /^[0-9a-f]{64}$/);
  t.equal(report.firstBroken, null);
});

t.test('edited content: hash_mismatch at the edited record', async (t) => {
  const { ids, sql, verify } = await chainOf(t, 4);
  // A plausible forgery: a valid record whose numbers were changed.
  sql(`UPDATE audit_records SET result = replace(result, '"observations":6', '"observations":7') WHERE seq = 2`);
  const report = await verify();
  t.equal(report.ok, false);
  t.same(report.firstBroken, { seq: 2, id: ids[1], reason: 'hash_mismatch' });
  t.equal(report.records, 4, 'the walk still counts every record');
});

t.test('a record removed from the middle: sequence_gap at the next one', async (t) => {
  const { ids, sql, verify } = await chainOf(t, 4);
  sql('DELETE FROM audit_records WHERE seq = 2');
  t.same((await verify()).firstBroken, { seq: 3, id: ids[2], reason: 'sequence_gap' });
});

t.test('two records swapped: prev_hash_mismatch where the order breaks', async (t) => {
  const { ids, sql, verify } = await chainOf(t, 4);
  // Renumber: record 3 now sits at seq 2 and record 2 at seq 3.
  sql('UPDATE audit_records SET seq = -2 WHERE seq = 2');
  sql('UPDATE audit_records SET seq = 2 WHERE seq = 3');
  sql('UPDATE audit_records SET seq = 3 WHERE seq = -2');
  t.same((await verify()).firstBroken, { seq: 2, id: ids[2], reason: 'prev_hash_mismatch' });
});

t.test('the newest record removed: head_mismatch', async (t) => {
  const { ids, sql, verify } = await chainOf(t, 3);
  sql('DELETE FROM audit_records WHERE seq = 3');
  const report = await verify();
  t.equal(report.ok, false);
  t.same(report.firstBroken, { seq: 3, id: ids[2], reason: 'head_mismatch' });
  t.equal(report.head.seq, 2, 'head names the last record still there');
});

t.test('a row that no longer parses: unreadable', async (t) => {
  const { ids, sql, verify } = await chainOf(t, 2);
  sql(`UPDATE audit_records SET request = '{"data":' WHERE seq = 1`);
  t.same((await verify()).firstBroken, { seq: 1, id: ids[0], reason: 'unreadable' });
});

t.test('the OpenAPI document says how to act on a broken chain', async (t) => {
  const { app } = await buildTestApp(t);
  const doc = (await app.inject({ method: 'GET', url: '/openapi.json' })).json();
  const op = doc.paths['/v1/audit/verify'].get;
  t.match(op.description, /200 whether or not the chain is intact/);
  t.match(op.description, /firstBroken\.seq/);
  t.ok(op.responses['200'].content['application/json'].schema, 'the report schema is documented');
});
