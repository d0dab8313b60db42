// The benchmarks' throwaway PostgreSQL schemas, dropped when a run ends.
import pg from 'pg';

export async function dropBenchSchemas(url: string | undefined, schemas: readonly string[]): Promise<void> {
  if (!url || schemas.length === 0) return;
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    for (const s of schemas) await client.query(`DROP SCHEMA IF EXISTS ${s} CASCADE`);
  } finally {
    await client.end();
  }
}
