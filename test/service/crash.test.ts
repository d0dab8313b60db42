// Acknowledged means durable, for the whole service: a process under concurrent
// load is killed with SIGKILL (no shutdown handler runs); after a restart on the
// same SQLite file every id it answered with 200 is there with the same result,
// and the chain verifies.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import t from 'tap';
import { driveLoad, getJson, sameJson, startService, stopService, type ServiceProcess } from './service-process.ts';

const TOTAL = 300;
const IN_FLIGHT = 16;
const KILL_AFTER_ACKS = 100;

t.test('SIGKILL under load loses no acknowledged comparison', async (t) => {
  t.setTimeout(180_000); // bounded: a hung service fails the test instead of stalling the run
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-crash-'));
  const env = { AUDIT_DB: join(dir, 'audit.sqlite') };
  const running: ServiceProcess[] = [];
  t.teardown(async () => {
    for (const s of running) await stopService(s, 2000);
    rmSync(dir, { recursive: true, force: true });
  });

  const first = await startService(env);
  running.push(first);
  let killedAtAcks = -1;
  let inFlightAtKill = 0;
  const run = await driveLoad(first.base, TOTAL, IN_FLIGHT, {
    shouldStop: () => killedAtAcks >= 0,
    onAck: (sofar) => {
      if (sofar.acked.length >= KILL_AFTER_ACKS && killedAtAcks < 0) {
        killedAtAcks = sofar.acked.length;
        inFlightAtKill = sofar.sent - sofar.acked.length - sofar.failed;
        first.child.kill('SIGKILL');
      }
    },
  });
  const exit = await first.exited;
  t.equal(exit.signal, 'SIGKILL', 'the service was killed, not shut down');
  t.ok(killedAtAcks >= KILL_AFTER_ACKS, `killed after ${killedAtAcks} acknowledgements`);
  t.ok(run.sent < TOTAL, `killed mid-load: ${run.sent} of ${TOTAL} requests sent`);
  t.ok(inFlightAtKill > 0, `${inFlightAtKill} requests were in flight at the kill`);
  const acked = run.acked;
  t.ok(acked.length >= KILL_AFTER_ACKS);

  const second = await startService(env);
  running.push(second);
  let missing = 0;
  let different = 0;
  const seqs = new Set<number>();
  for (const { id, body } of acked) {
    const res = await getJson(`${second.base}/v1/comparisons/${id}`);
    if (res.status !== 200) {
      missing += 1;
      continue;
    }
    seqs.add(res.body.chain.seq);
    if (!sameJson(res.body.result, body)) different += 1;
  }
  t.equal(missing, 0, `every one of the ${acked.length} acknowledged ids is retrievable after the restart`);
  t.equal(different, 0, 'each with the result it was answered with');
  t.equal(seqs.size, acked.length, 'each at its own place in the chain');
  // One in full, so a failure shows what differs.
  t.same((await getJson(`${second.base}/v1/comparisons/${acked[0].id}`)).body.result, acked[0].body);

  const verify = await getJson(`${second.base}/v1/audit/verify`);
  t.equal(verify.status, 200);
  t.equal(verify.body.ok, true, JSON.stringify(verify.body.firstBroken));
  t.ok(verify.body.records >= acked.length,
    `${verify.body.records} records ≥ ${acked.length} acknowledged (a request can commit and die before its reply)`);
  t.ok(verify.body.records <= run.sent, `and no more than the ${run.sent} ever sent`);

  // The restarted service takes new records onto the same chain.
  const after = await driveLoad(second.base, 20, 4, { offset: TOTAL });
  t.equal(after.acked.length, 20);
  const again = await getJson(`${second.base}/v1/audit/verify`);
  t.equal(again.body.ok, true);
  t.equal(again.body.records, verify.body.records + 20);
});
