// The neighbours of one record, read for integrity on read (integrity.ts): the
// hashes of the rows just before and after it and the committed head, in one
// statement, so both databases answer from one snapshot (an append between two
// separate reads could otherwise show a head beyond a "missing" next row).
import type { ChainLinks } from './integrity.ts';

/** `param(n)` writes the n-th (1-based) placeholder in the database's style; parameters: [seq − 1, seq + 1]. */
export function chainLinksSql(param: (n: number) => string): string {
  return (
    `SELECT 'row' AS source, seq, prev_hash, hash FROM audit_records WHERE seq IN (${param(1)}, ${param(2)})` +
    " UNION ALL SELECT 'head' AS source, seq, NULL AS prev_hash, hash FROM audit_head WHERE singleton = 1"
  );
}

type LinkRow = { source: unknown; seq: unknown; prev_hash: unknown; hash: unknown };

export function chainLinksFromRows(rows: LinkRow[], seq: number): ChainLinks {
  const links: ChainLinks = { previous: null, next: null, head: null };
  for (const row of rows) {
    const at = Number(row.seq); // pg returns bigint columns as strings
    const hash = String(row.hash);
    if (row.source === 'head') links.head = { seq: at, hash };
    else if (at === seq - 1) links.previous = { seq: at, hash };
    else if (at === seq + 1) links.next = { seq: at, prevHash: String(row.prev_hash) };
  }
  return links;
}
