// /readyz tells the truth at start: it proves a write before it says ready (a
// store that refuses writes is unready, though it reads fine), and a chain
// found behind the head last seen is shown in its detail and counted on /metrics.
import Database from 'better-sqlite3';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import t, { type Test } from 'tap';
import { checkChainAtStart } from '../../src/audit/chain-at-start.ts';
import { openAuditStore } from '../../src/audit/open.ts';
import { defaultConfig } from '../../src/config.ts';
import { buildApp, computePoolFor } from '../../src/http/app.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

function tempFile(t: Test): string {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-ready-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  return join(dir, 'audit.sqlite');
}

t.test('a store that refuses writes from the start is unready, though every read works', async (t) => {
  const file = tempFile(t);
  const store = await openAuditStore(file, { busyTimeoutMs: 50 });
  const app = await buildApp({ config: defaultConfig({ auditDb: file, eventLoopMaxDelayMs: 0 }), store, logger: false });
  t.teardown(async () => { await app.close(); await store.close(); });
  // Another writer holds the lock before the service has written anything (as a
  // full disk refuses the first write after a restart).
  const blocker = new Database(file);
  blocker.exec('BEGIN IMMEDIATE');
  const unready = await app.inject('/readyz');
  t.equal(unready.statusCode, 503);
  t.same(unready.json(), { status: 'unready', auditStore: 'sqlite' });
  t.equal((await app.inject('/v1/comparisons')).statusCode, 200, 'reads still answer');
  t.equal((await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).statusCode, 503, 'as every POST would');
  blocker.exec('COMMIT');
  blocker.close();
  t.equal((await app.inject('/readyz')).statusCode, 200, 'ready once a probe write succeeds');
  t.equal((await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).statusCode, 200);
});

t.test('a chain behind the head last seen: /readyz shows it, /metrics counts it', async (t) => {
  const file = tempFile(t);
  const first = await checkChainAtStart(await openAuditStore(file), file, () => {});
  const app1 = await buildApp({ config: defaultConfig({ auditDb: file }), store: first.store, logger: false, chainAtStart: first.chain });
  for (let i = 0; i < 4; i++) t.equal((await app1.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).statusCode, 200);
  t.same((await app1.inject('/readyz')).json(), { status: 'ok', auditStore: 'sqlite' }, 'nothing to report');
  await app1.close();
  await first.store.close();
  // Records 3 and 4 are lost with the head row, as with a lost write-ahead log.
  const db = new Database(file);
  db.exec(`DELETE FROM audit_records WHERE seq > 2; DELETE FROM audit_listing WHERE seq > 2;
    UPDATE audit_head SET seq = 2, record_id = (SELECT id FROM audit_records WHERE seq = 2), hash = (SELECT hash FROM audit_records WHERE seq = 2)`);
  db.close();

  const second = await checkChainAtStart(await openAuditStore(file), file, () => {});
  const app2 = await buildApp({ config: defaultConfig({ auditDb: file }), store: second.store, logger: false, chainAtStart: second.chain });
  t.teardown(async () => { await app2.close(); await second.store.close(); });
  const ready = await app2.inject('/readyz');
  t.equal(ready.statusCode, 200, 'the store still takes records: ready, with a warning');
  const warning = ready.json().chainWarning;
  t.match(warning, { kind: 'behind', missing: 2, headAtStart: { seq: 2 }, lastSeen: { seq: 4 } });
  t.match(warning.detail, /2 record\(s\) behind the head last seen .*audit\.sqlite\.head\.json.*Lost records/);
  const metrics = (await app2.inject('/metrics')).body;
  t.match(metrics, /^parsimetry_audit_chain_head_findings_total\{kind="behind"\} 1$/m);
  t.match(metrics, /^parsimetry_audit_chain_records_missing 2$/m);
});

t.test('unready while the compute workers start and warm up; ready once one is up, and it answered the worked examples first', async (t) => {
  const file = tempFile(t);
  const store = await openAuditStore(file);
  const config = defaultConfig({ auditDb: file, eventLoopMaxDelayMs: 0, computeWarmUp: true, computeWorkers: 1 });
  const compute = computePoolFor(config);
  const app = await buildApp({ config, store, logger: false, compute });
  t.teardown(async () => { await app.close(); await compute.close(); await store.close(); });
  compute.start();
  const starting = await app.inject('/readyz');
  t.equal(starting.statusCode, 503, 'a balancer sends nothing while no worker can take it');
  t.same(starting.json(), { status: 'unready', auditStore: 'sqlite', computeWorkers: 'starting' });
  while (compute.stats().ready === 0) await new Promise((resolve) => setTimeout(resolve, 20));
  const ready = await app.inject('/readyz');
  t.equal(ready.statusCode, 200);
  t.same(ready.json(), { status: 'ok', auditStore: 'sqlite' });
  t.equal(compute.stats().warmedUp, 1, 'the worker ran the worked examples before it said it was ready');
  const listed = (await app.inject('/v1/comparisons')).json() as { records: unknown[] };
  t.equal(listed.records.length, 0, 'the warm-up recorded nothing');
});

t.test('a pool never started (it starts on its first request) does not hold readiness back', async (t) => {
  const file = tempFile(t);
  const store = await openAuditStore(file);
  const app = await buildApp({ config: defaultConfig({ auditDb: file, eventLoopMaxDelayMs: 0 }), store, logger: false });
  t.teardown(async () => { await app.close(); await store.close(); });
  t.equal((await app.inject('/readyz')).statusCode, 200);
});
