// Two processes append concurrently to one PostgreSQL database: the chain must
// not fork, and its length must equal the appends the two acknowledged.
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import t from 'tap';
import { openAuditStore } from '../../src/audit/open.ts';
import { spawnAppender } from './child-appender.ts';
import { requirePgUrl } from './pg-url.ts';

const url = requirePgUrl(t);
if (url) {
  t.test('two processes, one unbroken chain', async (t) => {
    const schema = `audit_2p_${randomBytes(6).toString('hex')}`;
    t.teardown(async () => {
      const c = new pg.Client({ connectionString: url });
      await c.connect();
      await c.query(`DROP SCHEMA IF EXISTS ${schema} CASCADE`);
      await c.end();
    });
    // Both children start at once, so they also race to apply the migrations.
    const children = [spawnAppender(url, 600, 16, schema), spawnAppender(url, 600, 16, schema)];
    const exits = await Promise.all(children.map((c) => c.exited));
    for (const e of exits) t.equal(e.code, 0, `child exited cleanly ${e.stderr}`);
    const acked = children.flatMap((c) => c.acked);
    t.equal(acked.length, 1200, 'every append was acknowledged');
    t.same(acked.map((a) => a.seq).sort((a, b) => a - b), Array.from({ length: acked.length }, (_, i) => i + 1),
      'acknowledged seqs are 1..n with no repeats');
    t.ok(children.every((c) => c.acked.length > 0));

    const store = await openAuditStore(url, { schema });
    t.teardown(() => store.close());
    const report = await store.verify();
    t.equal(report.ok, true, JSON.stringify(report.firstBroken));
    t.equal(report.records, acked.length, 'chain length equals acknowledged appends');
    for (const a of acked.slice(0, 50)) t.equal((await store.get(a.id))?.seq, a.seq);
  });
}
