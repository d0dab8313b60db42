// Every acknowledged append survives the process being killed mid-stream
// (SIGKILL: no close, no flush, no exit handlers), and the chain stays whole.
// Two processes on one file also share one chain (BEGIN IMMEDIATE).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import t from 'tap';
import { openAuditStore } from '../../src/audit/open.ts';
import { spawnAppender } from './child-appender.ts';

t.test('acknowledged appends survive SIGKILL', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-crash-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const file = join(dir, 'audit.sqlite');
  const child = spawnAppender(file, 1_000_000, 32);
  await child.ackedAtLeast(2000);
  child.child.kill('SIGKILL');
  const exit = await child.exited;
  t.equal(exit.signal, 'SIGKILL');
  const acked = child.acked.slice();
  t.ok(acked.length >= 2000);

  const store = await openAuditStore(file);
  t.teardown(() => store.close());
  const report = await store.verify();
  t.equal(report.ok, true, JSON.stringify(report.firstBroken));
  t.ok(report.records >= acked.length, `chain ${report.records} holds all ${acked.length} acknowledged`);
  let missing = 0;
  for (const a of acked) if ((await store.get(a.id))?.seq !== a.seq) missing += 1;
  t.equal(missing, 0, 'no acknowledged record is missing');
});

t.test('two processes on one SQLite file, one unbroken chain', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-2p-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const file = join(dir, 'audit.sqlite');
  const children = [spawnAppender(file, 500, 8), spawnAppender(file, 500, 8)];
  const exits = await Promise.all(children.map((c) => c.exited));
  for (const e of exits) t.equal(e.code, 0, e.stderr);
  const acked = children.flatMap((c) => c.acked);
  t.equal(acked.length, 1000);
  const store = await openAuditStore(file);
  t.teardown(() => store.close());
  const report = await store.verify();
  t.equal(report.ok, true);
  t.equal(report.records, acked.length);
});
