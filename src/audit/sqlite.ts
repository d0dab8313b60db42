// The embedded default: one SQLite file, WAL journal, synchronous=FULL (a COMMIT
// has reached the disk before it returns, also across power loss).
// Appends run in BEGIN IMMEDIATE transactions: the write lock is taken before the
// head is read, so neither two connections in one process nor two processes on
// one file can read the same head and fork the chain.
import Database from 'better-sqlite3';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import type { RecordedHead as ChainHead, VerifyReport } from './chain.ts';
import { WriteProof } from './write-proof.ts';
import { AuditRecordCorrupt, AuditUnavailable } from './errors.ts';
import { GroupCommit } from './group-commit.ts';
import { recordIdSource, type RecordIdSource } from './ids.ts';
import { sqliteMigrations } from './migrations/sqlite.ts';
import { listFilter, listQuery, pageOf, sqliteDialect } from './query.ts';
import { chainRecord, LISTING_COLUMNS, prepareRecord, RECORD_COLUMNS, recordToListingRow, recordToRow, rowToRecord, type ListedRow, type PreparedRecord, type RecordRow } from './rows.ts';
import type { ChainLinks } from './integrity.ts';
import { chainLinksFromRows, chainLinksSql } from './links.ts';
import type { WrittenTexts, AuditStore, AuditStoreOptions, ListPage, ListQuery, NewRecord, StoredRecord } from './store.ts';
import { headFromRow, verifyByPages, type VerifyPage, type VerifyPageLimits } from './verify-pages.ts';
import { rowBodyLength } from './verify-row.ts';

const COLUMNS = RECORD_COLUMNS.join(', ');
const BUSY_TIMEOUT_MS = 5000;

export function openSqliteAuditStore(path: string, options: AuditStoreOptions = {}): AuditStore {
  if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true });
  let db: Database.Database;
  try {
    db = new Database(path);
    db.pragma('journal_mode = WAL');
    db.pragma('synchronous = FULL');
    db.pragma(`busy_timeout = ${options.busyTimeoutMs ?? BUSY_TIMEOUT_MS}`);
    migrate(db);
  } catch (err) {
    throw new AuditUnavailable(`cannot open the SQLite audit store at ${path}: ${(err as Error).message}`, { cause: err });
  }
  return new SqliteAuditStore(db, recordIdSource(options.clock, options.random), options);
}

function migrate(db: Database.Database): void {
  // IMMEDIATE: two processes starting on one new file apply each version once.
  db.transaction(() => {
    db.exec('CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, name TEXT NOT NULL, applied_at TEXT NOT NULL)');
    const applied = new Set(db.prepare('SELECT version FROM schema_migrations').pluck().all() as number[]);
    for (const m of sqliteMigrations) {
      if (applied.has(m.version)) continue;
      db.exec(m.sql);
      db.prepare('INSERT INTO schema_migrations (version, name, applied_at) VALUES (?, ?, ?)').run(m.version, m.name, new Date().toISOString());
    }
  }).immediate();
}

class SqliteAuditStore implements AuditStore {
  readonly backend = 'sqlite' as const;
  private closed = false;
  private readonly writes = new WriteProof();
  private readonly queue: GroupCommit | null;
  private readonly insert: Database.Statement;
  private readonly insertListing: Database.Statement;
  private readonly selectHead: Database.Statement;
  private readonly updateHead: Database.Statement;
  private readonly commitBatch: (records: PreparedRecord[]) => StoredRecord[];

  constructor(private readonly db: Database.Database, private readonly ids: RecordIdSource, options: AuditStoreOptions) {
    this.insert = db.prepare(`INSERT INTO audit_records (${COLUMNS}) VALUES (${RECORD_COLUMNS.map(() => '?').join(', ')})`);
    this.insertListing = db.prepare(`INSERT INTO audit_listing (${LISTING_COLUMNS.join(', ')}) VALUES (${LISTING_COLUMNS.map(() => '?').join(', ')})`);
    this.selectHead = db.prepare('SELECT seq, record_id, hash FROM audit_head WHERE singleton = 1');
    this.updateHead = db.prepare('UPDATE audit_head SET seq = ?, record_id = ?, hash = ? WHERE singleton = 1');
    const tx = db.transaction((records: PreparedRecord[]) => {
      let head = headFromRow(this.selectHead.get() as RecordRow & { record_id: unknown });
      const stored: StoredRecord[] = [];
      for (const record of records) {
        const chained = chainRecord(record, head, this.ids.next());
        const r = chained.stored;
        this.insert.run(...recordToRow(chained));
        this.insertListing.run(...recordToListingRow(r));
        stored.push(r);
        head = { seq: r.seq, id: r.id, hash: r.hash };
      }
      this.updateHead.run(head.seq, head.id, head.hash);
      return stored;
    });
    this.commitBatch = (records) => tx.immediate(records);
    const group = options.groupCommit ?? true;
    this.queue = group ? new GroupCommit(async (records) => this.write(records), options.maxBatch ?? 256) : null;
  }

  async append(input: NewRecord, written?: WrittenTexts): Promise<StoredRecord> {
    const record = prepareRecord(input, written);
    if (this.closed) throw new AuditUnavailable('the audit store is closed');
    if (this.queue) return this.queue.submit(record);
    return this.write([record])[0];
  }

  private write(records: PreparedRecord[]): StoredRecord[] {
    if (this.closed) throw new AuditUnavailable('the audit store is closed');
    try {
      const stored = this.commitBatch(records);
      this.writes.succeeded();
      return stored;
    } catch (err) {
      this.writes.failed();
      throw new AuditUnavailable(`the SQLite audit store refused the record: ${(err as Error).message}`, { cause: err });
    }
  }

  async get(id: string): Promise<StoredRecord | null> {
    const row = this.read(() => this.db.prepare(`SELECT ${COLUMNS} FROM audit_records WHERE id = ?`).get(id)) as RecordRow | undefined;
    if (!row) return null;
    const reading = rowToRecord(row);
    if ('corrupt' in reading) throw new AuditRecordCorrupt(reading.corrupt.seq, reading.corrupt.id, reading.corrupt.problems);
    return reading.record;
  }

  async chainLinks(seq: number): Promise<ChainLinks> {
    const rows = this.read(() => this.db.prepare(chainLinksSql(() => '?')).all(seq - 1, seq + 1)) as Parameters<typeof chainLinksFromRows>[0];
    return chainLinksFromRows(rows, seq);
  }

  async list(query?: ListQuery): Promise<ListPage> {
    const filter = listFilter(query);
    const { sql, params } = listQuery(filter, sqliteDialect);
    const rows = this.read(() => this.db.prepare(sql).all(...params)) as ListedRow[];
    return pageOf(rows, filter.limit);
  }

  async verify(): Promise<VerifyReport> {
    const after = this.db.prepare(`SELECT ${COLUMNS} FROM audit_records WHERE seq > ? ORDER BY seq`);
    // One read transaction per page: its rows and the head from one snapshot.
    const snapshot = this.db.transaction((afterSeq: number, limits: VerifyPageLimits): VerifyPage => {
      const rows: RecordRow[] = [];
      let bytes = 0;
      let complete = true;
      // Row by row, so the row that fills the page is the last one read.
      for (const row of after.iterate(afterSeq) as IterableIterator<RecordRow>) {
        rows.push(row);
        bytes += rowBodyLength(row);
        if (rows.length >= limits.rows || bytes >= limits.bytes) {
          complete = false;
          break;
        }
      }
      const head = headFromRow(this.selectHead.get() as { seq: unknown; record_id: unknown; hash: unknown });
      return { rows, head, complete };
    });
    return verifyByPages(async (afterSeq, limits) => this.read(() => snapshot.deferred(afterSeq, limits)));
  }

  async ready(): Promise<boolean> {
    if (this.closed) return false;
    try {
      this.selectHead.get();
      if (this.writes.needsProbe) {
        // A committed transaction, as an append makes (WAL frame and fsync).
        this.db.prepare('INSERT OR REPLACE INTO audit_probe (singleton, at) VALUES (1, ?)').run(new Date().toISOString());
        this.writes.succeeded();
      }
      return true;
    } catch {
      this.writes.failed();
      return false;
    }
  }

  async head(): Promise<ChainHead> {
    return headFromRow(this.read(() => this.selectHead.get()) as { seq: unknown; record_id: unknown; hash: unknown });
  }

  async close(): Promise<void> {
    if (this.closed) return;
    await this.queue?.drained();
    this.closed = true;
    this.db.close();
  }

  private read<T>(query: () => T): T {
    if (this.closed) throw new AuditUnavailable('the audit store is closed');
    try {
      return query();
    } catch (err) {
      throw new AuditUnavailable(`the SQLite audit store cannot be read: ${(err as Error).message}`, { cause: err });
    }
  }
}
