// Integrity on read: one record checked against its own hash and against its
// neighbours in the chain, each time it is read back. verify() walks the whole
// chain; this is the part of that walk that concerns one record, cheap enough
// for every read (one indexed query for the neighbours' hashes).
//
// Checked, in this order (the first failure is the reason):
//   1. hash_mismatch       the record's content no longer hashes to its stored hash;
//   2. sequence_gap        the record before it (seq − 1) is missing;
//      prev_hash_mismatch  its prevHash is not the stored hash of the record before it
//                          (64 zeros for the first record);
//   3. next_link_mismatch  the record after it names another hash as its previous one:
//                          this record was rewritten with a freshly computed hash
//                          (or the next one was replaced), which checks 1 and 2 alone miss;
//      sequence_gap        no record after it, though the store's head is further on;
//      head_mismatch       it is the newest record, but the store's head names another
//                          hash or an earlier position.
// Someone able to rewrite the database can rewrite every record from here to the
// head, and the head itself, consistently; only an outside copy of an earlier
// head detects that (README: the audit record). This check says so in its detail.
import { GENESIS_HASH, hashOfRecord, type ChainedRecord } from './chain.ts';

export const integrityReasons = ['hash_mismatch', 'prev_hash_mismatch', 'sequence_gap', 'next_link_mismatch', 'head_mismatch'] as const;
export type IntegrityReason = (typeof integrityReasons)[number];

export interface RecordIntegrity {
  ok: boolean;
  /** The first check that failed; null when every check passed. */
  reason: IntegrityReason | null;
  /** The finding in words, with the positions it concerns. */
  detail: string;
}

/** What the store holds around one record, as stored (raw columns, not validated records). */
export interface ChainLinks {
  /** The row at seq − 1; null when there is none. */
  previous: { seq: number; hash: string } | null;
  /** The row at seq + 1; null when there is none. */
  next: { seq: number; prevHash: string } | null;
  /** The head the store committed last; null when it keeps none. */
  head: { seq: number; hash: string } | null;
}

const WHOLE_CHAIN = 'GET /v1/audit/verify checks the whole chain.';
const broken = (reason: IntegrityReason, finding: string): RecordIntegrity => ({
  ok: false,
  reason,
  detail: `${finding} Do not rely on this record; keep a copy of the database as it is and run GET /v1/audit/verify to find where the chain first breaks.`,
});

export function recordIntegrity(record: ChainedRecord, links: ChainLinks): RecordIntegrity {
  const { seq } = record;
  if (hashOfRecord(record) !== record.hash) {
    return broken('hash_mismatch', `Record ${seq} no longer hashes to its stored hash: its content was changed after it was written.`);
  }

  let backward: string;
  if (seq === 1) {
    if (record.prevHash !== GENESIS_HASH) {
      return broken('prev_hash_mismatch', 'Record 1 should follow 64 zeros, but names another previous hash.');
    }
    backward = 'it is the first record';
  } else if (links.previous === null || links.previous.seq !== seq - 1) {
    return broken('sequence_gap', `Record ${seq - 1}, the one before record ${seq}, is missing.`);
  } else if (links.previous.hash !== record.prevHash) {
    return broken('prev_hash_mismatch', `Record ${seq} names a previous hash that is not the stored hash of record ${seq - 1}: one of them was replaced.`);
  } else {
    backward = `it names the hash of record ${seq - 1}`;
  }

  let forward: string;
  if (links.next !== null && links.next.seq === seq + 1) {
    if (links.next.prevHash !== record.hash) {
      return broken('next_link_mismatch', `Record ${seq + 1} names another hash as its previous one: record ${seq} (or record ${seq + 1}) was rewritten after the chain moved on.`);
    }
    forward = `record ${seq + 1} names its hash`;
  } else if (links.head !== null && links.head.seq > seq) {
    return broken('sequence_gap', `Record ${seq + 1}, the one after record ${seq}, is missing, though the chain's head is record ${links.head.seq}.`);
  } else if (links.head !== null && (links.head.seq < seq || links.head.hash !== record.hash)) {
    return broken('head_mismatch', `Record ${seq} is the newest record, but the store's committed head names ${links.head.seq === seq ? 'another hash' : `record ${links.head.seq}`}.`);
  } else {
    forward = links.head === null ? 'no record follows it' : "it is the newest record, as the store's head says";
  }

  return { ok: true, reason: null, detail: `Record ${seq} hashes to its stored hash, ${backward}, and ${forward}. ${WHOLE_CHAIN}` };
}
