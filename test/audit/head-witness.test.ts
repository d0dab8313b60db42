// The chain head kept beside an SQLite store (src/audit/head-witness.ts,
// witnessed-store.ts, chain-at-start.ts): what a start finds when the
// database's head is behind the one last seen, and how the side file follows
// the chain without ever moving back on its own.
import Database from 'better-sqlite3';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import t, { type Test } from 'tap';
import { checkChainAtStart } from '../../src/audit/chain-at-start.ts';
import { compareWithWitness, readWitness, witnessPath, writeWitness } from '../../src/audit/head-witness.ts';
import { openAuditStore } from '../../src/audit/open.ts';
import { withHeadWitness } from '../../src/audit/witnessed-store.ts';
import { comparisonRecord } from './store.suite.ts';

const hash = (c: string) => c.repeat(64);
const tempDir = (t: Test) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-witness-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  return dir;
};

t.test('compareWithWitness: behind, rewritten, or nothing to say', async (t) => {
  const lastSeen = { seq: 7, id: 'r7', hash: hash('a'), seenAt: '2026-03-01T08:00:00.000Z' };
  t.equal(compareWithWitness({ seq: 7, id: 'r7', hash: hash('a') }, lastSeen), null, 'the same head');
  t.equal(compareWithWitness({ seq: 9, id: 'r9', hash: hash('b') }, lastSeen), null, 'ahead: appended since (another process, or a crash before the witness was written)');
  t.equal(compareWithWitness({ seq: 0, id: null, hash: '0'.repeat(64) }, null), null, 'no witness yet');
  t.same(compareWithWitness({ seq: 4, id: 'r4', hash: hash('c') }, lastSeen), { kind: 'behind', current: { seq: 4, id: 'r4', hash: hash('c') }, lastSeen, missing: 3 });
  t.match(compareWithWitness({ seq: 7, id: 'x7', hash: hash('d') }, lastSeen), { kind: 'rewritten', missing: 0 });
});

t.test('the side file: written atomically, read back, and ignored when it is not one of ours', async (t) => {
  const dir = tempDir(t);
  const path = witnessPath(join(dir, 'audit.sqlite'));
  t.equal(path, join(dir, 'audit.sqlite.head.json'));
  t.equal(await readWitness(path), null, 'absent');
  await writeWitness(path, { seq: 3, id: 'r3', hash: hash('e') }, '2026-03-01T09:00:00.000Z');
  t.same(await readWitness(path), { seq: 3, id: 'r3', hash: hash('e'), seenAt: '2026-03-01T09:00:00.000Z' });
  writeFileSync(path, '{"seq": "three"}');
  t.equal(await readWitness(path), null, 'not a witness');
});

t.test('a lost tail is found at start; the witness keeps saying so until the chain passes it', async (t) => {
  const dir = tempDir(t);
  const file = join(dir, 'audit.sqlite');
  const errors: unknown[] = [];
  const start = async () => checkChainAtStart(await openAuditStore(file), file, (e) => errors.push(e));

  const first = await start();
  t.same(first.chain.finding, null, 'a new store: nothing seen before');
  for (let i = 1; i <= 5; i++) await first.store.append(comparisonRecord(i));
  await first.store.close();
  t.equal(JSON.parse(readFileSync(witnessPath(file), 'utf8')).seq, 5, 'closing writes the head');

  // The newest records go, head row and all, as when the write-ahead log holding them is lost.
  const db = new Database(file);
  db.exec(`DELETE FROM audit_records WHERE seq > 2; DELETE FROM audit_listing WHERE seq > 2;
    UPDATE audit_head SET seq = 2, record_id = (SELECT id FROM audit_records WHERE seq = 2), hash = (SELECT hash FROM audit_records WHERE seq = 2)`);
  db.close();

  const second = await start();
  t.match(second.chain.finding, { kind: 'behind', missing: 3, current: { seq: 2 }, lastSeen: { seq: 5 } });
  t.ok((await second.store.verify()).ok, 'the chain itself is intact: only the witness can tell');
  await second.store.append(comparisonRecord(6));
  await second.store.close();
  t.equal(JSON.parse(readFileSync(witnessPath(file), 'utf8')).seq, 5, 'the witness does not move back');

  const third = await start();
  t.match(third.chain.finding, { kind: 'behind', missing: 2 }, 'said again at the next start');
  for (let i = 7; i <= 9; i++) await third.store.append(comparisonRecord(i));
  await third.store.close();
  t.equal(JSON.parse(readFileSync(witnessPath(file), 'utf8')).seq, 6, 'past the old head it follows the chain again');
  const fourth = await start();
  t.equal(fourth.chain.finding, null);
  await fourth.store.close();
  t.same(errors, []);
});

t.test('appends are witnessed at most once per interval, the newest head each time', async (t) => {
  const dir = tempDir(t);
  const file = join(dir, 'audit.sqlite');
  const store = withHeadWitness(await openAuditStore(file), witnessPath(file), { intervalMs: 50 });
  t.teardown(() => store.close());
  const appended = await Promise.all(Array.from({ length: 20 }, (_, i) => store.append(comparisonRecord(i))));
  const newest = appended.reduce((a, b) => (a.seq > b.seq ? a : b));
  for (let i = 0; i < 100 && (await readWitness(witnessPath(file)))?.seq !== 20; i++) await sleep(20);
  t.match(await readWitness(witnessPath(file)), { seq: 20, id: newest.id, hash: newest.hash });
});

t.test('PostgreSQL and :memory: stores keep no side file', async (t) => {
  const store = await openAuditStore(':memory:');
  const { store: same, chain } = await checkChainAtStart(store, ':memory:', () => {});
  t.equal(same, store);
  t.same(chain, { head: { seq: 0, id: null, hash: '0'.repeat(64) }, finding: null, witnessFile: null });
  await store.close();
});
