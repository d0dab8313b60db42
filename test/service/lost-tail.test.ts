// A lost SQLite tail, detected at restart: the service as an operator runs it
// logs its chain head at start and at shutdown; it is killed with records still
// in the write-ahead log, the log is lost (deleted with its -shm file), and the
// next start finds the chain behind the head in the side file: an error-level
// log line, a warning on /readyz and a count on /metrics. The chain itself
// verifies, which is why the side file is needed.
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import t from 'tap';
import { getJson, loadComparison, startService, stopService, type ServiceProcess } from './service-process.ts';

const logLines = (service: ServiceProcess) => service.output().split('\n').flatMap((line) => {
  try {
    return [JSON.parse(line) as { level: number; msg: string; [k: string]: unknown }];
  } catch {
    return [];
  }
});

async function post(base: string, i: number): Promise<number> {
  const res = await fetch(`${base}/v1/comparisons`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(loadComparison(i)) });
  await res.text();
  return res.status;
}

t.test('the newest records lost with the write-ahead log are found at the next start', async (t) => {
  t.setTimeout(180_000);
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-lost-tail-'));
  const auditDb = join(dir, 'audit.sqlite');
  const witness = `${auditDb}.head.json`;
  const running: ServiceProcess[] = [];
  t.teardown(async () => {
    for (const s of running) await stopService(s, 2000);
    rmSync(dir, { recursive: true, force: true });
  });
  const env = { AUDIT_DB: auditDb };

  const first = await startService(env);
  running.push(first);
  for (let i = 0; i < 2; i++) t.equal(await post(first.base, i), 200);
  await stopService(first);
  const firstLog = logLines(first);
  t.ok(firstLog.some((l) => l.level === 30 && /^audit chain head at start: seq 0,/.test(l.msg)), 'the head is logged at start');
  t.ok(firstLog.some((l) => l.level === 30 && /^audit chain head at shutdown: seq 2,/.test(l.msg)), 'and at shutdown');
  t.equal(JSON.parse(readFileSync(witness, 'utf8')).seq, 2, 'and kept beside the store');

  const second = await startService(env);
  running.push(second);
  for (let i = 2; i < 5; i++) t.equal(await post(second.base, i), 200);
  for (let i = 0; i < 100 && JSON.parse(readFileSync(witness, 'utf8')).seq !== 5; i++) await sleep(50);
  t.equal(JSON.parse(readFileSync(witness, 'utf8')).seq, 5, 'the side file follows the appends');
  second.child.kill('SIGKILL');
  await second.exited;
  t.ok(existsSync(`${auditDb}-wal`), 'records 3 to 5 are in the write-ahead log');
  rmSync(`${auditDb}-wal`);
  rmSync(`${auditDb}-shm`, { force: true });

  const third = await startService(env);
  running.push(third);
  const errors = logLines(third).filter((l) => l.level === 50);
  t.equal(errors.length, 1, 'one error-level line at start');
  t.match(errors[0]?.msg, /ends at seq 2, 3 record\(s\) behind the head last seen/);
  t.match(errors[0]?.chainFinding, { kind: 'behind', missing: 3 });
  const ready = await getJson(`${third.base}/readyz`);
  t.equal(ready.status, 200);
  t.match(ready.body.chainWarning, { kind: 'behind', missing: 3, headAtStart: { seq: 2 }, lastSeen: { seq: 5 } });
  const metrics = await (await fetch(`${third.base}/metrics`)).text();
  t.match(metrics, /^parsimetry_audit_chain_records_missing 3$/m);
  const verify = await getJson(`${third.base}/v1/audit/verify`);
  t.same([verify.body.ok, verify.body.records], [true, 2], 'the chain alone cannot tell');
});
