// One row layout for both databases (same column names), and the checks that
// turn a row back into a record. A row that fails them is reported, never thrown
// past the store as a crash.
import { z } from 'zod';
import { canonicalJson, isPlainJsonData, recordHash, sha256Hex, toJsonValue } from './chain.ts';
import { AuditRecordInvalid } from './errors.ts';
import { ListedRecordSchema, NewRecordSchema, StoredRecordSchema, type CorruptRow, type ListedRecord, type NewRecord, type StoredRecord, type WrittenTexts } from './store.ts';

export const RECORD_COLUMNS = [
  'seq', 'id', 'created_at', 'kind', 'caller', 'label', 'service_version', 'conventions_version',
  'policy_name', 'policy_hash', 'dataset_fingerprint', 'request_digest', 'request', 'result', 'prev_hash', 'hash',
] as const;

export type RecordRow = Record<(typeof RECORD_COLUMNS)[number], unknown>;

/** The narrow table the listing reads beside audit_records (migration 2 says why). */
export const LISTING_COLUMNS = ['seq', 'best', 'hash'] as const;

/**
 * The listing's columns, as a SELECT list over audit_records r LEFT JOIN
 * audit_listing l: a record appended by an older version, without a listing
 * row, still lists (its hash read from the record itself, its best unknown).
 */
export const LISTED_SELECT = 'r.seq, r.id, r.created_at, r.kind, r.caller, r.label, r.dataset_fingerprint, l.best, COALESCE(l.hash, r.hash) AS hash';

export type ListedRow = Record<'seq' | 'id' | 'created_at' | 'kind' | 'caller' | 'label' | 'dataset_fingerprint' | 'best' | 'hash', unknown>;

const nameAt = (value: unknown): string | null => (typeof value === 'string' ? value : null);

/** What the listing shows as the best model: a comparison's verdict.chosen, a search's first model. */
export function bestModelOf(record: Pick<StoredRecord, 'kind' | 'result'>): string | null {
  const result = record.result as { verdict?: { chosen?: unknown }; models?: { name?: unknown }[] };
  if (record.kind === 'comparison') return nameAt(result.verdict?.chosen);
  return Array.isArray(result.models) ? nameAt(result.models[0]?.name) : null;
}

export function recordToListingRow(r: StoredRecord): unknown[] {
  return [r.seq, bestModelOf(r), r.hash];
}

export type ListedReading = { record: ListedRecord } | { corrupt: CorruptRow };

export function rowToListed(row: ListedRow): ListedReading {
  const seq = Number(row.seq); // pg returns bigint columns as strings
  const parsed = ListedRecordSchema.safeParse({
    seq, id: row.id, createdAt: row.created_at, kind: row.kind, caller: row.caller, label: row.label,
    datasetFingerprint: row.dataset_fingerprint, best: row.best, hash: row.hash,
  });
  if (parsed.success) return { record: parsed.data };
  return { corrupt: { seq, id: typeof row.id === 'string' ? row.id : null, problems: parsed.error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`) } };
}

/**
 * A validated new record in its JSON form (what will be hashed and stored),
 * with its request and result written once: as JSON for the row, and
 * canonically for the digest check and the record's hash.
 */
export interface PreparedRecord {
  record: z.output<typeof NewRecordSchema>;
  requestText: string | null;
  resultText: string;
  /** The canonical text of record.request and record.result (by identity), reused by chainRecord. */
  canonical: ReadonlyMap<object, string>;
}

// The text the row stores and what a JSON reader gets back from it (undefined
// members gone, non-finite numbers null); plain JSON data is already that, and
// is not parsed back. The text is the same as JSON.stringify of the parsed value.
// A value whose canonical text was written is plain JSON data (canonicalJson
// refuses anything else), so it is not walked again to find out.
function jsonForm(value: unknown, field: string, written?: string, knownPlain = false): { text: string; value: unknown } {
  const text = written ?? JSON.stringify(value);
  if (text === undefined) throw new AuditRecordInvalid([`${field}: value at (root) is not a JSON value: ${typeof value}`]);
  return { text, value: knownPlain || isPlainJsonData(value) ? value : JSON.parse(text) };
}

export function prepareRecord(input: NewRecord, written: WrittenTexts = {}): PreparedRecord {
  const { request: sentRequest, result: sentResult, ...envelope } = input;
  let request: { text: string; value: unknown } | null;
  let result: { text: string; value: unknown };
  let json: unknown;
  try {
    request = sentRequest === null || sentRequest === undefined ? null : jsonForm(sentRequest, 'request', undefined, written.requestCanonical !== undefined);
    result = jsonForm(sentResult, 'result', written.resultJson, written.resultCanonical !== undefined);
    json = { ...(toJsonValue(envelope) as object), request: request?.value ?? sentRequest, result: result.value };
  } catch (err) {
    if (err instanceof AuditRecordInvalid) throw err;
    throw new AuditRecordInvalid([(err as Error).message]);
  }
  const parsed = NewRecordSchema.safeParse(json);
  if (!parsed.success) {
    throw new AuditRecordInvalid(parsed.error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`));
  }
  const record = parsed.data;
  const canonical = new Map<object, string>();
  if (record.request !== null) {
    // record.request is a copy of the input's (the same JSON data), so the caller's text is its canonical text.
    const text = written.requestCanonical ?? canonicalJson(record.request);
    if (sha256Hex(text) !== record.requestDigest) {
      throw new AuditRecordInvalid(['requestDigest: does not match the SHA-256 of the canonical request']);
    }
    canonical.set(record.request, text);
  }
  canonical.set(record.result, written.resultCanonical ?? canonicalJson(record.result));
  return { record, requestText: request?.text ?? null, resultText: result.text, canonical };
}

/** A record chained onto the head, with the texts its row stores. */
export interface ChainedNew {
  stored: StoredRecord;
  requestText: string | null;
  resultText: string;
}

/** Chains a prepared record onto the head: the one place seq, prevHash and hash are assigned. */
export function chainRecord(
  prepared: PreparedRecord,
  head: { seq: number; hash: string },
  stamp: { id: string; createdAt: string },
): ChainedNew {
  const body = { ...prepared.record, id: stamp.id, createdAt: stamp.createdAt, seq: head.seq + 1 };
  const hash = recordHash(head.hash, canonicalJson(body, prepared.canonical));
  return { stored: { ...body, prevHash: head.hash, hash }, requestText: prepared.requestText, resultText: prepared.resultText };
}

export function recordToRow({ stored: r, requestText, resultText }: ChainedNew): unknown[] {
  return [
    r.seq, r.id, r.createdAt, r.kind, r.caller, r.label, r.serviceVersion, r.conventionsVersion,
    r.policy?.name ?? null, r.policy?.hash ?? null, r.datasetFingerprint, r.requestDigest,
    requestText, resultText, r.prevHash, r.hash,
  ];
}

export type RowReading = { record: StoredRecord } | { corrupt: CorruptRow };

export function rowToRecord(row: RecordRow): RowReading {
  const seq = Number(row.seq); // pg returns bigint columns as strings
  const id = typeof row.id === 'string' ? row.id : null;
  const problems: string[] = [];
  const json = (column: 'request' | 'result'): unknown => {
    const text = row[column];
    if (text === null) return null;
    if (typeof text !== 'string') {
      problems.push(`${column}: not text`);
      return undefined;
    }
    try {
      return JSON.parse(text);
    } catch {
      problems.push(`${column}: not valid JSON`);
      return undefined;
    }
  };
  const request = json('request');
  const result = json('result');
  const policy =
    row.policy_name === null && row.policy_hash === null ? null : { name: row.policy_name, hash: row.policy_hash };
  const candidate = {
    kind: row.kind, caller: row.caller, label: row.label, serviceVersion: row.service_version,
    conventionsVersion: row.conventions_version, policy, datasetFingerprint: row.dataset_fingerprint,
    requestDigest: row.request_digest, request, result, id: row.id, createdAt: row.created_at, seq,
    prevHash: row.prev_hash, hash: row.hash,
  };
  if (problems.length === 0) {
    const parsed = StoredRecordSchema.safeParse(candidate);
    if (parsed.success) return { record: parsed.data };
    problems.push(...parsed.error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`));
  }
  return { corrupt: { seq, id, problems } };
}
