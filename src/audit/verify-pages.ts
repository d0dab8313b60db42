// The verification walk over a database, page by page in ascending seq. Each
// page is read together with the recorded head in one snapshot, so the page that
// turns out to be the last is compared with the head as it stood at that moment,
// even while appends continue (records are only ever added at the end).
import { ChainWalk, type RecordedHead, type VerifyReport } from './chain.ts';
import { rowToRecord, type RecordRow } from './rows.ts';

export const VERIFY_PAGE = 1000;

export type ReadVerifyPage = (afterSeq: number, limit: number) => Promise<{ rows: RecordRow[]; head: RecordedHead }>;

export async function verifyByPages(readPage: ReadVerifyPage): Promise<VerifyReport> {
  const walk = new ChainWalk();
  let afterSeq = 0;
  for (;;) {
    const { rows, head } = await readPage(afterSeq, VERIFY_PAGE);
    for (const row of rows) {
      const reading = rowToRecord(row);
      if ('record' in reading) walk.push({ record: reading.record });
      else walk.push({ unreadable: { seq: reading.corrupt.seq, id: reading.corrupt.id } });
      afterSeq = Number(row.seq);
    }
    if (rows.length < VERIFY_PAGE) return walk.finish(head);
  }
}

export function headFromRow(row: { seq: unknown; record_id: unknown; hash: unknown }): RecordedHead {
  return { seq: Number(row.seq), id: (row.record_id as string | null) ?? null, hash: String(row.hash) };
}
