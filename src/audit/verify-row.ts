// One stored row checked for verification: read back (JSON, schema) and its
// content hashed. The answer is small (the chain fields and the hash found),
// so the check can run in a worker thread and send back only that.
import { hashOfRecord, type WalkRow } from './chain.ts';
import { rowToRecord, type RecordRow } from './rows.ts';

export function checkVerifyRow(row: RecordRow): WalkRow {
  const reading = rowToRecord(row);
  if ('corrupt' in reading) return { unreadable: { seq: reading.corrupt.seq, id: reading.corrupt.id } };
  const r = reading.record;
  return { checked: { seq: r.seq, id: r.id, prevHash: r.prevHash, hash: r.hash, contentHash: hashOfRecord(r) } };
}

/** Characters of the row's request and result: what reading, parsing and hashing it costs grows with. */
export function rowBodyLength(row: Pick<RecordRow, 'request' | 'result'>): number {
  const length = (v: unknown) => (typeof v === 'string' ? v.length : 0);
  return length(row.request) + length(row.result);
}
