// The shared store for several replicas: one PostgreSQL database, pg Pool.
// Appends serialise on the chain head: each transaction locks the single
// audit_head row (SELECT ... FOR UPDATE) before reading it, so no two appends
// anywhere can chain onto the same head; the primary key on seq is the last line
// of defence. The lock is held until COMMIT has flushed the WAL, so the chain's
// throughput is one commit at a time across all replicas; group commit puts every
// append waiting in this process into that one commit.
import pg from 'pg';
import type { RecordedHead as ChainHead, VerifyReport } from './chain.ts';
import { WriteProof } from './write-proof.ts';
import { AuditRecordCorrupt, AuditUnavailable } from './errors.ts';
import { GroupCommit } from './group-commit.ts';
import { recordIdSource, type RecordIdSource } from './ids.ts';
import { postgresMigrations } from './migrations/postgres.ts';
import { listFilter, listQuery, pageOf, postgresDialect } from './query.ts';
import { chainRecord, type ChainedNew, LISTING_COLUMNS, prepareRecord, RECORD_COLUMNS, recordToListingRow, recordToRow, rowToRecord, type ListedRow, type PreparedRecord, type RecordRow } from './rows.ts';
import type { ChainLinks } from './integrity.ts';
import { chainLinksFromRows, chainLinksSql } from './links.ts';
import type { WrittenTexts, AuditStore, AuditStoreOptions, ListPage, ListQuery, NewRecord, StoredRecord } from './store.ts';
import { headFromRow, rowsThatFit, verifyByPages } from './verify-pages.ts';

const COLUMNS = RECORD_COLUMNS.join(', ');
// Any fixed 64-bit key; only this program's migrations take it.
const MIGRATION_LOCK = 0x70617273696d; // "parsim"

export interface PostgresAuditStoreOptions extends AuditStoreOptions {
  /** Schema to keep the tables in (created if missing); default: the connection's search_path. */
  schema?: string;
  poolSize?: number;
}

export async function openPostgresAuditStore(url: string, options: PostgresAuditStoreOptions = {}): Promise<AuditStore> {
  if (options.schema !== undefined && !/^[a-z_][a-z0-9_]{0,62}$/.test(options.schema)) {
    throw new Error(`invalid schema name: ${options.schema}`);
  }
  const pool = new pg.Pool({
    connectionString: url,
    max: options.poolSize ?? 10,
    connectionTimeoutMillis: 5000,
    options: options.schema ? `-c search_path=${options.schema}` : undefined,
  });
  const store = new PostgresAuditStore(pool, recordIdSource(options.clock, options.random), options);
  try {
    await migrate(pool, options.schema);
  } catch (err) {
    await pool.end().catch(() => {});
    throw new AuditUnavailable(`cannot open the PostgreSQL audit store: ${(err as Error).message}`, { cause: err });
  }
  return store;
}

async function migrate(pool: pg.Pool, schema: string | undefined): Promise<void> {
  const client = await pool.connect();
  try {
    // Transactional DDL plus an advisory lock: replicas starting together apply each version once.
    await client.query('BEGIN');
    await client.query('SELECT pg_advisory_xact_lock($1)', [MIGRATION_LOCK]);
    if (schema) await client.query(`CREATE SCHEMA IF NOT EXISTS ${schema}`);
    await client.query(
      'CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TIMESTAMPTZ NOT NULL DEFAULT now())',
    );
    const applied = new Set((await client.query('SELECT version FROM schema_migrations')).rows.map((r) => Number(r.version)));
    for (const m of postgresMigrations) {
      if (applied.has(m.version)) continue;
      await client.query(m.sql);
      await client.query('INSERT INTO schema_migrations (version, name) VALUES ($1, $2)', [m.version, m.name]);
    }
    await client.query('COMMIT');
  } catch (err) {
    await client.query('ROLLBACK').catch(() => {});
    throw err;
  } finally {
    client.release();
  }
}

/** "($1, $2), ($3, $4)" for the rows, appending their values to params. */
function valuesList(rows: unknown[][], params: unknown[]): string {
  return rows.map((row) => `(${row.map((value) => `$${params.push(value)}`).join(', ')})`).join(', ');
}

class PostgresAuditStore implements AuditStore {
  readonly backend = 'postgres' as const;
  private closed = false;
  private readonly writes = new WriteProof();
  private readonly queue: GroupCommit | null;

  constructor(private readonly pool: pg.Pool, private readonly ids: RecordIdSource, options: AuditStoreOptions) {
    // An idle client losing its connection must not crash the process; the next query reports it.
    pool.on('error', () => {
      this.writes.failed();
    });
    this.queue = (options.groupCommit ?? true) ? new GroupCommit((r) => this.write(r), options.maxBatch ?? 256) : null;
  }

  async append(input: NewRecord, written?: WrittenTexts): Promise<StoredRecord> {
    const record = prepareRecord(input, written);
    if (this.closed) throw new AuditUnavailable('the audit store is closed');
    if (this.queue) return this.queue.submit(record);
    return (await this.write([record]))[0];
  }

  private async write(records: PreparedRecord[]): Promise<StoredRecord[]> {
    let client: pg.PoolClient | undefined;
    let broken: Error | undefined;
    try {
      client = await this.pool.connect();
      // synchronous_commit is forced on: an acknowledged record must survive a crash
      // whatever the server's default.
      const begun = (await client.query(
        "BEGIN; SET LOCAL synchronous_commit TO on; SET LOCAL lock_timeout TO '10s';" +
          ' SELECT seq, record_id, hash FROM audit_head WHERE singleton = 1 FOR UPDATE',
      )) as unknown as pg.QueryResult[];
      let head = headFromRow(begun[3].rows[0]);
      const chained: ChainedNew[] = [];
      for (const record of records) {
        const c = chainRecord(record, head, this.ids.next());
        chained.push(c);
        head = { seq: c.stored.seq, id: c.stored.id, hash: c.stored.hash };
      }
      const stored = chained.map((c) => c.stored);
      const params: unknown[] = [];
      const recordValues = valuesList(chained.map(recordToRow), params);
      const listingValues = valuesList(stored.map(recordToListingRow), params);
      const n = params.length;
      await client.query(
        `WITH inserted AS (INSERT INTO audit_records (${COLUMNS}) VALUES ${recordValues} RETURNING 1),` +
          ` listed AS (INSERT INTO audit_listing (${LISTING_COLUMNS.join(', ')}) VALUES ${listingValues} RETURNING 1)` +
          ` UPDATE audit_head SET seq = $${n + 1}, record_id = $${n + 2}, hash = $${n + 3} WHERE singleton = 1`,
        [...params, head.seq, head.id, head.hash],
      );
      await client.query('COMMIT');
      this.writes.succeeded();
      return stored;
    } catch (err) {
      broken = err as Error;
      this.writes.failed();
      await client?.query('ROLLBACK').catch(() => {});
      throw new AuditUnavailable(`the PostgreSQL audit store refused the record: ${broken.message}`, { cause: err });
    } finally {
      client?.release(broken);
    }
  }

  async get(id: string): Promise<StoredRecord | null> {
    const { rows } = await this.query(`SELECT ${COLUMNS} FROM audit_records WHERE id = $1`, [id]);
    if (rows.length === 0) return null;
    const reading = rowToRecord(rows[0] as RecordRow);
    if ('corrupt' in reading) throw new AuditRecordCorrupt(reading.corrupt.seq, reading.corrupt.id, reading.corrupt.problems);
    return reading.record;
  }

  async chainLinks(seq: number): Promise<ChainLinks> {
    const { rows } = await this.query(chainLinksSql((n) => `$${n}`), [seq - 1, seq + 1]);
    return chainLinksFromRows(rows, seq);
  }

  async list(query?: ListQuery): Promise<ListPage> {
    const filter = listFilter(query);
    const { sql, params } = listQuery(filter, postgresDialect);
    const { rows } = await this.query(sql, params);
    return pageOf(rows as ListedRow[], filter.limit);
  }

  async verify(): Promise<VerifyReport> {
    return verifyByPages(async (afterSeq, limits) => {
      const client = await this.connect();
      try {
        await client.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
        const head = await client.query('SELECT seq, record_id, hash FROM audit_head WHERE singleton = 1');
        // Sizes first (octet_length reads TOAST headers, not the bodies), so a
        // page never fetches more than its byte limit plus one row.
        const sizes = await client.query(
          'SELECT COALESCE(octet_length(request), 0) + octet_length(result) AS length FROM audit_records WHERE seq > $1 ORDER BY seq LIMIT $2',
          [afterSeq, limits.rows],
        );
        const count = rowsThatFit(sizes.rows.map((r) => Number(r.length)), limits);
        const page = count === 0 ? { rows: [] }
          : await client.query(`SELECT ${COLUMNS} FROM audit_records WHERE seq > $1 ORDER BY seq LIMIT $2`, [afterSeq, count]);
        await client.query('COMMIT');
        return { rows: page.rows as RecordRow[], head: headFromRow(head.rows[0]), complete: sizes.rows.length < limits.rows && count === sizes.rows.length };
      } catch (err) {
        await client.query('ROLLBACK').catch(() => {});
        throw new AuditUnavailable(`the PostgreSQL audit store cannot be read: ${(err as Error).message}`, { cause: err });
      } finally {
        client.release();
      }
    });
  }

  async ready(): Promise<boolean> {
    if (this.closed) return false;
    try {
      await this.pool.query('SELECT seq FROM audit_head WHERE singleton = 1');
      if (this.writes.needsProbe) {
        // A committed transaction, as an append makes; bounded, so a probe
        // never hangs behind a lock longer than a load balancer waits.
        await this.pool.query(
          "BEGIN; SET LOCAL synchronous_commit TO on; SET LOCAL lock_timeout TO '2s'; SET LOCAL statement_timeout TO '5s';" +
            ` INSERT INTO audit_probe (singleton, at) VALUES (1, '${new Date().toISOString()}') ON CONFLICT (singleton) DO UPDATE SET at = EXCLUDED.at; COMMIT`,
        );
        this.writes.succeeded();
      }
      return true;
    } catch {
      this.writes.failed();
      return false;
    }
  }

  async head(): Promise<ChainHead> {
    const { rows } = await this.query('SELECT seq, record_id, hash FROM audit_head WHERE singleton = 1', []);
    return headFromRow(rows[0]);
  }

  async close(): Promise<void> {
    if (this.closed) return;
    await this.queue?.drained();
    this.closed = true;
    await this.pool.end();
  }

  private async connect(): Promise<pg.PoolClient> {
    if (this.closed) throw new AuditUnavailable('the audit store is closed');
    try {
      return await this.pool.connect();
    } catch (err) {
      throw new AuditUnavailable(`the PostgreSQL audit store is unreachable: ${(err as Error).message}`, { cause: err });
    }
  }

  private async query(sql: string, params: unknown[]): Promise<pg.QueryResult> {
    if (this.closed) throw new AuditUnavailable('the audit store is closed');
    try {
      return await this.pool.query(sql, params);
    } catch (err) {
      throw new AuditUnavailable(`the PostgreSQL audit store cannot be read: ${(err as Error).message}`, { cause: err });
    }
  }
}
