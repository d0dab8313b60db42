// The verification walk over a database, page by page in ascending seq. Each
// page is read together with the recorded head in one snapshot, so the page that
// turns out to be the last is compared with the head as it stood at that moment,
// even while appends continue (records are only ever added at the end).
//
// Memory is bounded by the page, not the chain: a page ends at VERIFY_PAGE_ROWS
// rows or once its bodies pass VERIFY_PAGE_BYTES (one row at least, however
// large), and each row is checked and dropped before the next page is read.
import { ChainWalk, type RecordedHead, type VerifyReport } from './chain.ts';
import { RowChecker } from './row-checker.ts';
import type { RecordRow } from './rows.ts';

export const VERIFY_PAGE_ROWS = 1000;
export const VERIFY_PAGE_BYTES = 8 * 1024 * 1024;

export interface VerifyPageLimits {
  rows: number;
  /** Characters of request and result; the row that passes it ends the page. */
  bytes: number;
}

export interface VerifyPage {
  rows: RecordRow[];
  head: RecordedHead;
  /** No row after these existed in the page's snapshot. */
  complete: boolean;
}

export type ReadVerifyPage = (afterSeq: number, limits: VerifyPageLimits) => Promise<VerifyPage>;

export async function verifyByPages(readPage: ReadVerifyPage, limits: VerifyPageLimits = { rows: VERIFY_PAGE_ROWS, bytes: VERIFY_PAGE_BYTES }): Promise<VerifyReport> {
  const walk = new ChainWalk();
  const checker = new RowChecker();
  try {
    let afterSeq = 0;
    for (;;) {
      const page = await readPage(afterSeq, limits);
      for (const row of page.rows) {
        walk.push(await checker.check(row));
        afterSeq = Number(row.seq);
      }
      if (page.complete) return walk.finish(page.head);
      // Let requests in between pages.
      await new Promise((resolve) => setImmediate(resolve));
    }
  } finally {
    await checker.close();
  }
}

/** How many of the rows, in order, fill a page: at least one, then while under both limits. */
export function rowsThatFit(lengths: readonly number[], limits: VerifyPageLimits): number {
  let bytes = 0;
  let count = 0;
  for (const length of lengths) {
    if (count >= limits.rows || (count > 0 && bytes >= limits.bytes)) break;
    bytes += length;
    count++;
  }
  return count;
}

export function headFromRow(row: { seq: unknown; record_id: unknown; hash: unknown }): RecordedHead {
  return { seq: Number(row.seq), id: (row.record_id as string | null) ?? null, hash: String(row.hash) };
}
