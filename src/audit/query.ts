// List queries, shared by both stores: bounds checked, times normalised to the
// stored createdAt form (so text comparison orders them), and an opaque cursor.
import { AuditCursorInvalid, AuditQueryInvalid } from './errors.ts';
import { LISTED_SELECT, rowToListed, type ListedRow } from './rows.ts';
import { LIST_LIMIT_DEFAULT, LIST_LIMIT_MAX, RecordKind, type ListPage, type ListQuery } from './store.ts';

export interface ListFilter {
  beforeSeq: number | null;
  limit: number;
  equal: { column: 'dataset_fingerprint' | 'caller' | 'kind'; value: string }[];
  /** Text the label must contain, or null. */
  labelContains: string | null;
  from: string | null;
  to: string | null;
}

/** How a database writes the n-th (1-based) placeholder, and "column contains text" (case-sensitive in both). */
export interface SqlDialect {
  param(n: number): string;
  contains(column: string, param: string): string;
}

export const sqliteDialect: SqlDialect = { param: () => '?', contains: (column, p) => `instr(${column}, ${p}) > 0` };
export const postgresDialect: SqlDialect = { param: (n) => `$${n}`, contains: (column, p) => `strpos(${column}, ${p}) > 0` };

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
  if (query.kind !== undefined) equal.push({ column: 'kind', value: query.kind });
  return {
    beforeSeq: query.cursor === undefined ? null : decodeCursor(query.cursor),
    limit: Math.min(limit, LIST_LIMIT_MAX),
    equal,
    labelContains: query.label === undefined || query.label === '' ? null : query.label,
    from,
    to,
  };
}

/** WHERE clause and parameters over audit_records aliased r. */
export function whereClause(filter: ListFilter, dialect: SqlDialect): { sql: string; params: unknown[] } {
  const parts: string[] = [];
  const params: unknown[] = [];
  const add = (sql: (p: string) => string, value: unknown) => {
    params.push(value);
    parts.push(sql(dialect.param(params.length)));
  };
  if (filter.beforeSeq !== null) add((p) => `r.seq < ${p}`, filter.beforeSeq);
  for (const { column, value } of filter.equal) add((p) => `r.${column} = ${p}`, value);
  if (filter.labelContains !== null) add((p) => dialect.contains('r.label', p), filter.labelContains);
  if (filter.from !== null) add((p) => `r.created_at >= ${p}`, filter.from);
  if (filter.to !== null) add((p) => `r.created_at < ${p}`, filter.to);
  return { sql: parts.length ? `WHERE ${parts.join(' AND ')}` : '', params };
}

/** The whole list query: newest first, one row more than the page to learn whether another page exists. */
export function listQuery(filter: ListFilter, dialect: SqlDialect): { sql: string; params: unknown[] } {
  const where = whereClause(filter, dialect);
  const params = [...where.params, filter.limit + 1];
  return {
    sql: `SELECT ${LISTED_SELECT} FROM audit_records r LEFT JOIN audit_listing l ON l.seq = r.seq ${where.sql} ORDER BY r.seq DESC LIMIT ${dialect.param(params.length)}`,
    params,
  };
}

/** Rows fetched with LIMIT limit+1, newest first, into a page; the extra row only says another page exists. */
export function pageOf(rows: ListedRow[], limit: number): ListPage {
  const page: ListPage = { records: [], corrupt: [], nextCursor: null };
  for (const row of rows.slice(0, limit)) {
    const reading = rowToListed(row);
    if ('record' in reading) page.records.push(reading.record);
    else page.corrupt.push(reading.corrupt);
  }
  if (rows.length > limit) page.nextCursor = encodeCursor(Number(rows[limit - 1].seq));
  return page;
}
