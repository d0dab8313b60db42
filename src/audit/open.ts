// The audit store's public face for the rest of the service.
import { openPostgresAuditStore, type PostgresAuditStoreOptions } from './postgres.ts';
import { openSqliteAuditStore } from './sqlite.ts';
import type { AuditStore } from './store.ts';

export const AUDIT_DB_DEFAULT = './data/audit.sqlite';

/**
 * AUDIT_DB -> store: a postgres:// or postgresql:// URL opens the shared
 * PostgreSQL store; anything else is an SQLite file path (parent directories are
 * created), or ":memory:" for tests. Migrations are applied before it resolves.
 */
export async function openAuditStore(url: string, options: PostgresAuditStoreOptions = {}): Promise<AuditStore> {
  if (/^postgres(ql)?:\/\//i.test(url)) return openPostgresAuditStore(url, options);
  return openSqliteAuditStore(url, options);
}

export type { AuditStore, AuditStoreOptions, ListPage, ListQuery, NewRecord, StoredRecord, CorruptRow, RecordKind } from './store.ts';
export { LIST_LIMIT_DEFAULT, LIST_LIMIT_MAX } from './store.ts';
export type { VerifyReport, BreakReason } from './chain.ts';
export { canonicalJson, requestDigest, sha256Hex, GENESIS_HASH } from './chain.ts';
export { AuditUnavailable, AuditRecordInvalid, AuditRecordCorrupt, AuditCursorInvalid, AuditQueryInvalid } from './errors.ts';
export type { AuditClock, RandomBytes } from './ids.ts';
export { recordIntegrity, integrityReasons } from './integrity.ts';
export type { RecordIntegrity, IntegrityReason, ChainLinks } from './integrity.ts';
