// Two service processes on one PostgreSQL database, both under concurrent load:
// the chain must come out as one unbroken line exactly as long as the
// comparisons the two acknowledged. Needs PARSIMETRY_TEST_PG_URL (scripts/postgres.sh
// start prints one); in CI its absence is a failure.
//
// Isolation: AUDIT_DB is a plain URL (the server takes no schema option), so the
// test creates a database of its own and drops it afterwards.
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import t from 'tap';
import { requirePgUrl } from '../audit/pg-url.ts';
import { driveLoad, getJson, sameJson, startService, stopService, type ServiceProcess } from './service-process.ts';

const PER_REPLICA = 200;
const IN_FLIGHT = 16;

async function admin(url: string, sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

const url = requirePgUrl(t);
if (url) {
  t.test('two replicas, one chain as long as the acknowledged comparisons', async (t) => {
    t.setTimeout(180_000); // bounded: a hung service fails the test instead of stalling the run
    const database = `parsimetry_2r_${randomBytes(6).toString('hex')}`;
    await admin(url, `CREATE DATABASE ${database}`);
    const own = new URL(url);
    own.pathname = `/${database}`;
    const running: ServiceProcess[] = [];
    t.teardown(async () => {
      for (const s of running) await stopService(s, 5000);
      await admin(url, `DROP DATABASE IF EXISTS ${database} WITH (FORCE)`);
    });

    // Both start at once, so they also race to apply the migrations.
    const replicas = await Promise.all([startService({ AUDIT_DB: own.href }), startService({ AUDIT_DB: own.href })]);
    running.push(...replicas);
    const runs = await Promise.all(replicas.map((r, i) => driveLoad(r.base, PER_REPLICA, IN_FLIGHT, { offset: i * PER_REPLICA })));
    const acked = runs.flatMap((r) => r.acked);
    runs.forEach((r, i) => t.ok(r.acked.length > 0, `replica ${i} acknowledged ${r.acked.length}, refused ${r.failed}`));
    t.equal(acked.length, 2 * PER_REPLICA, 'with nothing failing, every comparison is acknowledged');

    for (const [i, replica] of replicas.entries()) {
      const verify = await getJson(`${replica.base}/v1/audit/verify`);
      t.equal(verify.status, 200);
      t.equal(verify.body.ok, true, `replica ${i} verifies the chain: ${JSON.stringify(verify.body.firstBroken)}`);
      t.equal(verify.body.records, acked.length, `replica ${i}: chain length equals the ${acked.length} acknowledged comparisons`);
    }

    // Each id reads back with its result (asking the replicas in turn), at a place of its own.
    const seqs = new Set<number>();
    let unreadable = 0;
    for (const [n, { id, body }] of acked.entries()) {
      const res = await getJson(`${replicas[n % 2].base}/v1/comparisons/${id}`);
      if (res.status !== 200 || !sameJson(res.body.result, body)) unreadable += 1;
      else seqs.add(res.body.chain.seq);
    }
    t.equal(unreadable, 0, 'every acknowledged id reads back with the result it was answered with');
    t.same([...seqs].sort((a, b) => a - b), Array.from({ length: acked.length }, (_, i) => i + 1), 'seqs 1..n, none shared');
  });
}
