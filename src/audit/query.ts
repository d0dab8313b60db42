// List queries, shared by both stores: bounds checked, times normalised to the
// stored createdAt form (so text comparison orders them), and an opaque cursor.
import { AuditCursorInvalid, AuditQueryInvalid } from './errors.ts';
import { rowToRecord, type RecordRow } from './rows.ts';
import { LIST_LIMIT_DEFAULT, LIST_LIMIT_MAX, RecordKind, type ListPage, type ListQuery } from './store.ts';

export interface ListFilter {
  beforeSeq: number | null;
  limit: number;
  equal: { column: 'dataset_fingerprint' | 'caller' | 'label' | 'kind'; value: string }[];
  from: string | null;
  to: string | null;
}

// The cursor is the seq of the last record on the page, base64url-wrapped so
// callers treat it as opaque and the encoding can change without a contract change.
export function encodeCursor(seq: number): string {
  return Buffer.from(`s${seq}`, 'utf8').toString('base64url');
}

function decodeCursor(cursor: string): number {
  const text = Buffer.from(cursor, 'base64url').toString('utf8');
  const match = /^s([1-9][0-9]{0,15})$/.exec(text);
  if (!match || encodeCursor(Number(match[1])) !== cursor) throw new AuditCursorInvalid();
  return Number(match[1]);
}

function instant(value: string, name: string, problems: string[]): string | null {
  const ms = Date.parse(value);
  if (!/^\d{4}-\d{2}-\d{2}/.test(value) || Number.isNaN(ms)) {
    problems.push(`${name}: not an ISO 8601 date or date-time`);
    return null;
  }
  return new Date(ms).toISOString();
}

export function listFilter(query: ListQuery = {}): ListFilter {
  const problems: string[] = [];
  const limit = query.limit ?? LIST_LIMIT_DEFAULT;
  if (!Number.isInteger(limit) || limit < 1) problems.push('limit: must be a positive integer');
  if (query.kind !== undefined && !RecordKind.safeParse(query.kind).success) problems.push('kind: unknown kind');
  const from = query.from === undefined ? null : instant(query.from, 'from', problems);
  const to = query.to === undefined ? null : instant(query.to, 'to', problems);
  if (problems.length > 0) throw new AuditQueryInvalid(problems);
  const equal: ListFilter['equal'] = [];
  if (query.fingerprint !== undefined) equal.push({ column: 'dataset_fingerprint', value: query.fingerprint });
  if (query.caller !== undefined) equal.push({ column: 'caller', value: query.caller });
  if (query.label !== undefined) equal.push({ column: 'label', value: query.label });
  if (query.kind !== undefined) equal.push({ column: 'kind', value: query.kind });
  return {
    beforeSeq: query.cursor === undefined ? null : decodeCursor(query.cursor),
    limit: Math.min(limit, LIST_LIMIT_MAX),
    equal,
    from,
    to,
  };
}

/** WHERE clause and parameters; `param(n)` writes the n-th (1-based) placeholder in the database's style. */
export function whereClause(filter: ListFilter, param: (n: number) => string): { sql: string; params: unknown[] } {
  const parts: string[] = [];
  const params: unknown[] = [];
  const add = (sql: (p: string) => string, value: unknown) => {
    params.push(value);
    parts.push(sql(param(params.length)));
  };
  if (filter.beforeSeq !== null) add((p) => `seq < ${p}`, filter.beforeSeq);
  for (const { column, value } of filter.equal) add((p) => `${column} = ${p}`, value);
  if (filter.from !== null) add((p) => `created_at >= ${p}`, filter.from);
  if (filter.to !== null) add((p) => `created_at < ${p}`, filter.to);
  return { sql: parts.length ? `WHERE ${parts.join(' AND ')}` : '', params };
}

/** Rows fetched with LIMIT limit+1, newest first, into a page; the extra row only says another page exists. */
export function pageOf(rows: RecordRow[], limit: number): ListPage {
  const page: ListPage = { records: [], corrupt: [], nextCursor: null };
  for (const row of rows.slice(0, limit)) {
    const reading = rowToRecord(row);
    if ('record' in reading) page.records.push(reading.record);
    else page.corrupt.push(reading.corrupt);
  }
  if (rows.length > limit) page.nextCursor = encodeCursor(Number(rows[limit - 1].seq));
  return page;
}
