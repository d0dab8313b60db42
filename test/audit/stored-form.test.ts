// Records written before the audit path wrote each request and result once must
// still verify, and the same records written today must be stored byte for byte
// as they were: the same request and result texts, digest and chain hash.
// The fixture was written by the SQLite store of commit b7aa693 (its `source`
// says how); the clock and ids below repeat its clock and generator.
import { readFileSync } from 'node:fs';
import Database from 'better-sqlite3';
import t from 'tap';
import { openAuditStore } from '../../src/audit/open.ts';
import type { NewRecord } from '../../src/audit/store.ts';

interface Row { [column: string]: string | number | null }
const fixture = JSON.parse(readFileSync(new URL('./fixtures/chain-v1-records.json', import.meta.url), 'utf8')) as { odd: NewRecord; rows: Row[] };

// The fixture's -0 did not survive its own JSON: put it back where the hand-made record had it.
const odd = structuredClone(fixture.odd) as NewRecord & { request: { b: unknown[] }; result: { models: { value: number }[] } };
odd.request.b[0] = -0;
odd.result.models[0].value = -0;

function inputOf(row: Row): NewRecord {
  return {
    kind: row.kind as NewRecord['kind'], caller: row.caller as string, label: row.label as string | null,
    serviceVersion: row.service_version as string, conventionsVersion: row.conventions_version as string,
    policy: row.policy_name === null ? null : { name: row.policy_name as string, hash: row.policy_hash as string },
    datasetFingerprint: row.dataset_fingerprint as string | null, requestDigest: row.request_digest as string,
    request: row.request === null ? null : JSON.parse(row.request as string), result: JSON.parse(row.result as string),
  };
}

t.test('the same records are stored as the earlier version stored them', async (t) => {
  const dir = t.testdir();
  const path = `${dir}/audit.sqlite`;
  let now = Date.parse('2026-12-01T12:00:00.000Z');
  let seed = 1;
  const store = await openAuditStore(path, {
    clock: { now: () => (now += 1000) },
    random: (n) => Uint8Array.from({ length: n }, () => (seed = (seed * 48271) % 2147483647) & 255),
  });
  const inputs = [inputOf(fixture.rows[0]), inputOf(fixture.rows[1]), odd];
  for (const input of inputs) await store.append(input);
  const report = await store.verify();
  await store.close();
  t.equal(report.ok, true);
  const db = new Database(path, { readonly: true });
  const rows = db.prepare('SELECT * FROM audit_records ORDER BY seq').all() as Row[];
  db.close();
  t.equal(rows.length, fixture.rows.length);
  rows.forEach((row, i) => t.strictSame(row, fixture.rows[i], `record ${i + 1}: every column as before`));
});

t.test('a store holding the earlier version\'s rows verifies, and takes new records', async (t) => {
  const dir = t.testdir();
  const path = `${dir}/audit.sqlite`;
  (await openAuditStore(path)).close();
  const db = new Database(path);
  const columns = Object.keys(fixture.rows[0]);
  const insert = db.prepare(`INSERT INTO audit_records (${columns.join(', ')}) VALUES (${columns.map(() => '?').join(', ')})`);
  for (const row of fixture.rows) insert.run(...columns.map((c) => row[c]));
  const last = fixture.rows.at(-1)!;
  db.prepare('UPDATE audit_head SET seq = ?, record_id = ?, hash = ? WHERE singleton = 1').run(last.seq, last.id, last.hash);
  db.close();
  const store = await openAuditStore(path);
  t.teardown(() => store.close());
  t.match(await store.verify(), { ok: true, records: 3 });
  await store.append(inputOf(fixture.rows[0]));
  t.match(await store.verify(), { ok: true, records: 4 });
});
