// Runs the store suite against PostgreSQL. Needs PARSIMETRY_TEST_PG_URL
// (scripts/postgres.sh start prints one); in CI its absence is a failure.
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import t from 'tap';
import { openAuditStore } from '../../src/audit/open.ts';
import { auditStoreSuite } from './store.suite.ts';
import { requirePgUrl } from './pg-url.ts';

const url = requirePgUrl(t);
if (url) {
  auditStoreSuite(t, async () => {
    const schema = `audit_test_${randomBytes(6).toString('hex')}`;
    const raw = () => new pg.Client({ connectionString: url, options: `-c search_path=${schema}` });
    return {
      open: (options) => openAuditStore(url, { ...options, schema }),
      async exec(sql) {
        const client = raw();
        await client.connect();
        try {
          await client.query(sql);
        } finally {
          await client.end();
        }
      },
      async cleanup() {
        const client = new pg.Client({ connectionString: url });
        await client.connect();
        await client.query(`DROP SCHEMA IF EXISTS ${schema} CASCADE`);
        await client.end();
      },
    };
  });

  t.test('an unreachable server is AuditUnavailable at open', async (t) => {
    await t.rejects(openAuditStore('postgres://postgres@127.0.0.1:1/none'), { name: 'AuditUnavailable' });
  });
}
