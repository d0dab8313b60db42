// Integrity on read against a real database: chainLinks reads the stored
// neighbours and head, and recordIntegrity names what was changed behind the
// store's back. Run for every store from store.suite.ts (SQLite and PostgreSQL).
import type { Test } from 'tap';
import { recordIntegrity, type AuditStore } from '../../src/audit/open.ts';
import { comparisonRecord, type StoreHarness } from './store.suite.ts';

export function integrityOnReadSuite(t: Test, withStore: (t: Test) => Promise<{ harness: StoreHarness; store: AuditStore }>): void {
  const integrityOf = async (store: AuditStore, id: string) => {
    const record = (await store.get(id))!;
    return recordIntegrity(record, await store.chainLinks(record.seq));
  };

  t.test('integrity on read: chainLinks holds the stored neighbours and head', async (t) => {
    const { store } = await withStore(t);
    const rows = [];
    for (let i = 1; i <= 3; i++) rows.push(await store.append(comparisonRecord(i)));
    t.same(await store.chainLinks(2), {
      previous: { seq: 1, hash: rows[0].hash },
      next: { seq: 3, prevHash: rows[1].hash },
      head: { seq: 3, hash: rows[2].hash },
    });
    t.same(await store.chainLinks(1), { previous: null, next: { seq: 2, prevHash: rows[0].hash }, head: { seq: 3, hash: rows[2].hash } });
    for (const r of rows) t.same(await integrityOf(store, r.id).then((i) => [i.ok, i.reason]), [true, null], `record ${r.seq} intact`);
  });

  t.test('integrity on read: an edited row, a re-hashed row and a removed row are named', async (t) => {
    const { harness, store } = await withStore(t);
    const rows = [];
    for (let i = 1; i <= 5; i++) rows.push(await store.append(comparisonRecord(i)));
    await harness.exec(`UPDATE audit_records SET label = 'run two (edited)' WHERE seq = 2`);
    t.same(await integrityOf(store, rows[1].id).then((i) => [i.ok, i.reason]), [false, 'hash_mismatch']);
    t.same(await integrityOf(store, rows[2].id).then((i) => [i.ok, i.reason]), [true, null], 'its successor links to the stored hash');
    // A new hash written over record 4's: its own check passes, the next record's link does not.
    await harness.exec(`UPDATE audit_records SET hash = '${'e'.repeat(64)}' WHERE seq = 4`);
    t.same(await integrityOf(store, rows[4].id).then((i) => i.reason), 'prev_hash_mismatch');
    await harness.exec('DELETE FROM audit_records WHERE seq = 3');
    t.same(await integrityOf(store, rows[3].id).then((i) => i.reason), 'hash_mismatch', 'record 4 fails on its own hash first');
    t.same(await integrityOf(store, rows[0].id).then((i) => [i.ok, i.reason]), [true, null], 'record 1 and its link to record 2 are intact');
  });
}
