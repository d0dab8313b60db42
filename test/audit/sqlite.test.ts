import Database from 'better-sqlite3';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import t from 'tap';
import { AuditUnavailable, openAuditStore } from '../../src/audit/open.ts';
import { auditStoreSuite, comparisonRecord } from './store.suite.ts';

auditStoreSuite(t, async () => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-audit-'));
  const file = join(dir, 'nested', 'audit.sqlite'); // parent directories are created on open
  return {
    open: (options) => openAuditStore(file, options),
    async exec(sql) {
      const raw = new Database(file);
      try {
        raw.exec(sql);
      } finally {
        raw.close();
      }
    },
    async cleanup() {
      rmSync(dir, { recursive: true, force: true });
    },
  };
});

t.test('the file is in WAL mode with synchronous=FULL', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-audit-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const file = join(dir, 'audit.sqlite');
  const store = await openAuditStore(file);
  await store.close();
  const raw = new Database(file);
  t.equal(raw.pragma('journal_mode', { simple: true }), 'wal');
  t.same(raw.prepare('SELECT version FROM schema_migrations ORDER BY version').pluck().all(), [1, 2]);
  raw.close();
});

t.test(':memory: is a working store', async (t) => {
  const store = await openAuditStore(':memory:');
  t.teardown(() => store.close());
  t.equal(store.backend, 'sqlite');
  t.equal(await store.ready(), true);
});

t.test('a store that cannot write refuses appends and turns unready until writes work again', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-audit-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  const file = join(dir, 'audit.sqlite');
  const store = await openAuditStore(file, { busyTimeoutMs: 50 });
  t.teardown(() => store.close());
  await store.append(comparisonRecord(1));
  const blocker = new Database(file);
  blocker.exec('BEGIN IMMEDIATE'); // another writer holds the lock
  await t.rejects(store.append(comparisonRecord(2)), AuditUnavailable);
  t.equal(await store.ready(), false, 'unready while writes fail');
  blocker.exec('COMMIT');
  blocker.close();
  t.equal(await store.ready(), true, 'ready again once a probe write succeeds');
  t.equal((await store.append(comparisonRecord(3))).seq, 2, 'the refused append left no trace in the chain');
  t.ok((await store.verify()).ok);
});
