// The audit store's one face: the record's shape (validated on the way in and on
// the way back out) and the AuditStore interface both databases implement.
import { z } from 'zod';
import type { RecordedHead, VerifyReport } from './chain.ts';
import type { ChainLinks } from './integrity.ts';

const hex64 = z.string().regex(/^[0-9a-f]{64}$/, 'expected 64 lowercase hex characters');
const jsonObject = z.record(z.string(), z.unknown());

export const RecordKind = z.enum(['comparison', 'search']);
export type RecordKind = z.infer<typeof RecordKind>;

export const PolicyRef = z.object({ name: z.string().min(1), hash: z.string().min(1) }).strict();

/** What the HTTP layer hands to append(); the store adds id, createdAt, seq, prevHash and hash. */
export const NewRecordSchema = z
  .object({
    kind: RecordKind,
    /** The API key id, or "anonymous". */
    caller: z.string().min(1).max(200),
    label: z.string().max(1000).nullable(),
    serviceVersion: z.string().min(1),
    conventionsVersion: z.string().min(1),
    policy: PolicyRef.nullable(),
    datasetFingerprint: z.string().min(1).max(200).nullable(),
    /** requestDigest(request) from chain.ts: SHA-256 of the canonical request. */
    requestDigest: hex64,
    /** The request as received, or null when only its digest is kept (sensitive data). */
    request: jsonObject.nullable(),
    result: jsonObject,
  })
  .strict();
export type NewRecord = z.input<typeof NewRecordSchema>;

export const StoredRecordSchema = NewRecordSchema.extend({
  id: z.string().regex(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/),
  createdAt: z.iso.datetime({ precision: 3 }),
  seq: z.number().int().positive(),
  prevHash: hex64,
  hash: hex64,
}).strict();
export type StoredRecord = z.output<typeof StoredRecordSchema>;

/**
 * What a list shows of a record: the envelope, the best model and the chain
 * position. Read without touching the request or result (a page of large
 * records would otherwise be parsed whole).
 */
export const ListedRecordSchema = StoredRecordSchema.pick({
  seq: true, id: true, createdAt: true, kind: true, caller: true, label: true, datasetFingerprint: true, hash: true,
}).extend({
  /** A comparison's verdict.chosen, a search's first model; null when the record has none (or predates the listing table and its result did not say). */
  best: z.string().nullable(),
}).strict();
export type ListedRecord = z.output<typeof ListedRecordSchema>;

export const LIST_LIMIT_DEFAULT = 20;
export const LIST_LIMIT_MAX = 100;

export interface ListQuery {
  /** nextCursor from the previous page; absent for the newest page. */
  cursor?: string;
  /** Page size, 1..LIST_LIMIT_MAX; larger values are capped at LIST_LIMIT_MAX. */
  limit?: number;
  fingerprint?: string;
  caller?: string;
  /** Records whose label contains this text (case as written). */
  label?: string;
  kind?: RecordKind;
  /** Inclusive lower bound on createdAt (any ISO 8601 date or date-time). */
  from?: string;
  /** Exclusive upper bound on createdAt. */
  to?: string;
}

/** A row that no longer reads back as a record; listed apart so one bad row does not hide a page. */
export interface CorruptRow {
  seq: number;
  id: string | null;
  problems: string[];
}

export interface ListPage {
  /** Newest first (descending seq: the chain's order is the store's order). */
  records: ListedRecord[];
  corrupt: CorruptRow[];
  /** Pass back as `cursor` for the next (older) page; null on the last page. */
  nextCursor: string | null;
}

/**
 * Texts the caller has already written of this very input, so the store does
 * not write them again: `resultJson` is JSON.stringify(input.result),
 * `resultCanonical` canonicalJson(input.result) and `requestCanonical`
 * canonicalJson(input.request) (chain.ts). Only what is exactly that may be
 * passed; the request's digest is still checked against it.
 */
export interface WrittenTexts {
  resultJson?: string;
  resultCanonical?: string;
  requestCanonical?: string;
}

export interface AuditStore {
  /** 'sqlite' or 'postgres', for logs and /readyz details. */
  readonly backend: 'sqlite' | 'postgres';
  /**
   * Resolves only after the record is committed durably; rejects with
   * AuditUnavailable when the database cannot take it (reply 503, no result).
   */
  append(input: NewRecord, written?: WrittenTexts): Promise<StoredRecord>;
  /** null when no record has this id; rejects with AuditRecordCorrupt when the row is unreadable. */
  get(id: string): Promise<StoredRecord | null>;
  /** The stored hashes around position `seq` and the committed head, for integrity on read (integrity.ts). */
  chainLinks(seq: number): Promise<ChainLinks>;
  list(query?: ListQuery): Promise<ListPage>;
  /** Re-hashes the whole chain in seq order. */
  verify(): Promise<VerifyReport>;
  /**
   * The database answers and a write has been proven: by an append or a write
   * probe since the store opened, not after a failed write, and not longer ago
   * than PROBE_AFTER_MS (src/audit/write-proof.ts); otherwise ready() probes one.
   */
  ready(): Promise<boolean>;
  /** The committed chain head: seq 0 and 64 zeros for an empty chain. */
  head(): Promise<RecordedHead>;
  close(): Promise<void>;
}

export interface AuditStoreOptions {
  clock?: import('./ids.ts').AuditClock;
  random?: import('./ids.ts').RandomBytes;
  /**
   * Commit the appends that arrive while a commit is in flight (PostgreSQL) or in
   * the same event-loop turn (SQLite) together in one transaction. Each append
   * still resolves only after its COMMIT. Default true.
   */
  groupCommit?: boolean;
  /** Most records per group commit. Default 256. */
  maxBatch?: number;
  /** SQLite: how long to wait for another connection's write lock before refusing. Default 5000 ms. */
  busyTimeoutMs?: number;
}
