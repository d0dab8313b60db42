// Canonical serialisation and the hash chain shared by every audit store.
//
// Canonical JSON (so the chain can be re-verified by any other program):
//   - Input is a JSON value: null, true/false, a finite number, a string, an
//     array, or an object whose values are JSON values. Anything else (undefined,
//     NaN, Infinity, bigint, functions, symbols) is refused, so what is hashed is
//     always exactly what a JSON reader gets back.
//   - Objects: keys sorted by UTF-16 code units (JavaScript's default sort),
//     written as "key":value pairs separated by ",", no whitespace anywhere.
//   - Arrays keep their order, elements separated by ",".
//   - Strings and numbers are written as ECMAScript JSON.stringify writes them
//     (shortest round-trip decimal for numbers, e.g. 1e-7, 0.1, 1e+21; -0 as 0).
//   This coincides with RFC 8785 (JSON Canonicalization Scheme) for these values.
//
// The chain:
//   hash(n) = lowercase hex SHA-256 over the UTF-8 bytes of
//             prevHash(n) + canonical(body(n))
//   where prevHash(n) = hash(n-1) as 64 lowercase hex characters, the genesis
//   prevHash (for seq 1) is 64 "0" characters, and body(n) is the stored record
//   without its `prevHash` and `hash` fields (seq, id and createdAt included).
import { createHash } from 'node:crypto';

export const GENESIS_HASH = '0'.repeat(64);

export type JsonValue = null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

export class NotCanonicalisable extends Error {
  constructor(readonly path: string, readonly found: string) {
    super(`value at ${path || '(root)'} is not a JSON value: ${found}`);
    this.name = 'NotCanonicalisable';
  }
}

/**
 * `known` maps objects already written canonically to their text (a record's
 * request and result, written once for the digest check and reused in the
 * record's hash): the output is the same as writing them again.
 */
export function canonicalJson(value: unknown, known?: ReadonlyMap<object, string>): string {
  try {
    return writeFast(value, known);
  } catch (err) {
    if (err !== NOT_JSON) throw err;
    // Rare: walk again, this time keeping the path, to say where.
    return write(value, '');
  }
}

const NOT_JSON = Symbol('not a JSON value');

// Keys repeat across records (a result's field names), so their quoted form is
// kept; bounded, since column names come from callers.
const quotedKeys = new Map<string, string>();
function quotedKey(key: string): string {
  let quoted = quotedKeys.get(key);
  if (quoted === undefined) {
    if (quotedKeys.size >= 4096) quotedKeys.clear();
    quoted = JSON.stringify(key);
    quotedKeys.set(key, quoted);
  }
  return quoted;
}

// The hot path: plain concatenation, no path strings (building one per element
// cost more than the writing); anything not JSON throws NOT_JSON and the caller
// walks again with write() to name the place.
function writeFast(value: unknown, known: ReadonlyMap<object, string> | undefined): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw NOT_JSON;
      return String(value); // for a finite number the same text as JSON.stringify (-0 as 0 included)
    case 'string':
      return JSON.stringify(value);
    case 'object': {
      const given = known?.get(value);
      if (given !== undefined) return given;
      if (Array.isArray(value)) {
        // A column of numbers, strings or nulls (the bulk of a request): the
        // engine's own JSON.stringify writes it exactly as canonical JSON does.
        if (allScalars(value)) return JSON.stringify(value);
        let out = '[';
        for (let i = 0; i < value.length; i++) out += (i === 0 ? '' : ',') + writeFast(value[i], known);
        return out + ']';
      }
      const proto = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) throw NOT_JSON;
      const keys = Object.keys(value).sort();
      let out = '{';
      for (let i = 0; i < keys.length; i++) {
        out += (i === 0 ? '' : ',') + quotedKey(keys[i]) + ':' + writeFast((value as Record<string, unknown>)[keys[i]], known);
      }
      return out + '}';
    }
    default:
      throw NOT_JSON;
  }
}

function allScalars(items: unknown[]): boolean {
  for (let i = 0; i < items.length; i++) {
    const item = items[i];
    const t = typeof item;
    if (t === 'number' ? !Number.isFinite(item) : t !== 'string' && t !== 'boolean' && item !== null) return false;
  }
  return true;
}

// The slow walk, for the message only: the same rules, with the path of the first offender.
function write(value: unknown, path: string): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw new NotCanonicalisable(path, String(value));
      return JSON.stringify(value);
    case 'string':
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value)) {
        return '[' + value.map((item, i) => write(item, `${path}/${i}`)).join(',') + ']';
      }
      const proto = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) {
        throw new NotCanonicalisable(path, `object of type ${proto?.constructor?.name ?? 'unknown'}`);
      }
      const keys = Object.keys(value).sort();
      const parts: string[] = [];
      for (const key of keys) {
        const v = (value as Record<string, unknown>)[key];
        parts.push(JSON.stringify(key) + ':' + write(v, `${path}/${key}`));
      }
      return '{' + parts.join(',') + '}';
    }
    default:
      throw new NotCanonicalisable(path, typeof value);
  }
}

/**
 * True when `value` is plain JSON data: null, booleans, strings, finite
 * numbers, arrays without holes and plain objects of them. For such a value a
 * JSON round trip changes nothing that JSON.stringify or canonicalJson would
 * write (-0 is written 0 either way), so toJsonValue can be skipped.
 */
export function isPlainJsonData(value: unknown): boolean {
  switch (typeof value) {
    case 'number':
      return Number.isFinite(value);
    case 'string':
    case 'boolean':
      return true;
    case 'object': {
      if (value === null) return true;
      if (Array.isArray(value)) {
        for (let i = 0; i < value.length; i++) if (!(i in value) || !isPlainJsonData(value[i])) return false;
        return true;
      }
      const proto = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) return false;
      for (const key in value) if (Object.hasOwn(value, key) && !isPlainJsonData((value as Record<string, unknown>)[key])) return false;
      return true;
    }
    default:
      return false;
  }
}

/**
 * What a JSON reader would get back from `value`: Dates become strings, NaN and
 * Infinity become null, undefined members vanish. The store keeps this form, so
 * the record read back hashes the same as the record written.
 */
export function toJsonValue(value: unknown): JsonValue {
  const text = JSON.stringify(value);
  if (text === undefined) throw new NotCanonicalisable('', typeof value);
  return JSON.parse(text) as JsonValue;
}

export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** The digest kept for every request, also when the request itself is not stored. */
export function requestDigest(request: unknown): string {
  return sha256Hex(canonicalJson(toJsonValue(request)));
}

/**
 * requestDigest of a value JSON.parse returned (a request body as parsed): the
 * same digest without the stringify-and-parse round trip, which leaves such a
 * value as it is.
 */
export function requestDigestOfParsed(parsed: JsonValue): string {
  return sha256Hex(canonicalJson(parsed));
}

export function recordHash(prevHash: string, canonicalRecord: string): string {
  return sha256Hex(prevHash + canonicalRecord);
}

/** A record as the chain sees it; the rest of its fields form the hashed body. */
export interface ChainedRecord {
  seq: number;
  id: string;
  prevHash: string;
  hash: string;
}

export function chainBody<R extends ChainedRecord>(record: R): Omit<R, 'prevHash' | 'hash'> {
  const { prevHash: _p, hash: _h, ...body } = record;
  return body;
}

export function hashOfRecord(record: ChainedRecord): string {
  return recordHash(record.prevHash, canonicalJson(chainBody(record)));
}

export type BreakReason =
  | 'unreadable' // the row fails validation (corrupt JSON, missing field, wrong type)
  | 'sequence_gap' // seq is not one more than the previous record's (a record is missing or reordered)
  | 'prev_hash_mismatch' // prevHash is not the previous record's hash (reordered, replaced or removed)
  | 'hash_mismatch' // the record's content no longer hashes to its stored hash (edited)
  | 'head_mismatch'; // the chain ends before, or differently from, the recorded head (tail removed)

export interface VerifyReport {
  ok: boolean;
  records: number;
  head: { seq: number; id: string; hash: string } | null;
  firstBroken: { seq: number; id: string | null; reason: BreakReason } | null;
}

/** A record's chain fields with the hash its content was found to have (computed elsewhere, e.g. in a worker thread). */
export interface CheckedRecord {
  seq: number;
  id: string;
  prevHash: string;
  hash: string;
  contentHash: string;
}

/** One row as read for verification: a record, a record already hashed, or the reason it could not be read. */
export type WalkRow = { record: ChainedRecord } | { checked: CheckedRecord } | { unreadable: { seq: number; id: string | null } };

/** The head the store recorded when it last committed (null: the store keeps none). */
export interface RecordedHead {
  seq: number;
  id: string | null;
  hash: string;
}

/**
 * Walks records in ascending seq order, one at a time, so a long chain is
 * verified page by page without holding it in memory. After the first break it
 * keeps counting but stops judging: everything after a break is suspect anyway.
 */
export class ChainWalk {
  private records = 0;
  private expectedSeq = 1;
  private prevHash = GENESIS_HASH;
  private last: VerifyReport['head'] = null;
  private broken: VerifyReport['firstBroken'] = null;

  push(row: WalkRow): void {
    this.records += 1;
    if ('unreadable' in row) {
      this.breakAt(row.unreadable.seq, row.unreadable.id, 'unreadable');
      return;
    }
    const r = 'record' in row ? row.record : row.checked;
    this.last = { seq: r.seq, id: r.id, hash: r.hash };
    if (this.broken) return;
    if (r.seq !== this.expectedSeq) this.breakAt(r.seq, r.id, 'sequence_gap');
    else if (r.prevHash !== this.prevHash) this.breakAt(r.seq, r.id, 'prev_hash_mismatch');
    else if (('record' in row ? hashOfRecord(row.record) : row.checked.contentHash) !== r.hash) this.breakAt(r.seq, r.id, 'hash_mismatch');
    this.expectedSeq = r.seq + 1;
    this.prevHash = r.hash;
  }

  finish(recorded: RecordedHead | null): VerifyReport {
    if (!this.broken && recorded) {
      const lastSeq = this.last?.seq ?? 0;
      const lastHash = this.last?.hash ?? GENESIS_HASH;
      if (lastSeq < recorded.seq) {
        // The newest records are gone: name the first one that should be there.
        const seq = lastSeq + 1;
        this.breakAt(seq, seq === recorded.seq ? recorded.id : null, 'head_mismatch');
      } else if (lastSeq > recorded.seq) {
        this.breakAt(recorded.seq + 1, null, 'head_mismatch'); // rows beyond the committed head
      } else if (lastHash !== recorded.hash) {
        this.breakAt(lastSeq, this.last?.id ?? null, 'head_mismatch');
      }
    }
    return { ok: this.broken === null, records: this.records, head: this.last, firstBroken: this.broken };
  }

  private breakAt(seq: number, id: string | null, reason: BreakReason): void {
    if (!this.broken) this.broken = { seq, id, reason };
  }
}
