// Censored observations, read from the data columns and checked. A row's
// status says what its response value means:
//   exact     the unit failed at that time;
//   right     it was still working at that time (it outlived it);
//   left      it had already failed when first looked at, at that time;
//   interval  it failed between that time and the upper column's value.
// The upper column is read on interval rows only, so a null there elsewhere
// drops nothing: the caller leaves the upper column out of the columns that
// decide the common rows and includes the status column.
import type { Columns } from '../../types.ts';
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import { unknownColumn } from '../../design/columns.ts';

export const CENSORING_STATUSES = ['exact', 'right', 'left', 'interval'] as const;
export type CensoringStatus = (typeof CENSORING_STATUSES)[number];

/** Status codes held in CensoredResponse.status: the index in CENSORING_STATUSES. */
export const EXACT = 0;
export const RIGHT = 1;
export const LEFT = 2;
export const INTERVAL = 3;

export interface CensoredResponse {
  /** Positions in the data of the rows used. */
  rows: readonly number[];
  /** The response: failure time (exact), last time seen working (right), time found failed (left), start of the window (interval). */
  time: Float64Array;
  /** End of the window on interval rows; NaN on the others. */
  upper: Float64Array;
  /** One code per row: EXACT, RIGHT, LEFT or INTERVAL. */
  status: Uint8Array;
  /** Column names, for issues. */
  timeColumn: string;
  upperColumn: string | null;
}

export interface CensoringColumns {
  status: string;
  upper?: string;
}

export type CensoringCounts = Record<CensoringStatus, number>;

function has(columns: Columns, name: unknown): name is string {
  return typeof name === 'string' && Object.prototype.hasOwnProperty.call(columns, name);
}

/** The response times on the used rows: numbers, present and finite, or the first problem. */
function readTimes(columns: Columns, name: string, rows: readonly number[], at: IssuePath): Float64Array | Issue {
  if (!has(columns, name)) return unknownColumn(at, name, columns);
  const out = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const v = columns[name][rows[i]];
    if (typeof v === 'string') return issue('response_not_numeric', at, { column: name, row: rows[i], value: v });
    if (typeof v !== 'number') return issue('value_missing', at, { column: name, row: rows[i] });
    if (!Number.isFinite(v)) return issue('value_not_finite', at, { column: name, row: rows[i] });
    out[i] = v;
  }
  return out;
}

/** A response without censoring: every row an exact observation (a measurement). */
export function uncensoredResponse(time: Float64Array, rows: readonly number[], timeColumn: string): CensoredResponse {
  return {
    rows, time, upper: new Float64Array(time.length).fill(Number.NaN), status: new Uint8Array(time.length), timeColumn, upperColumn: null,
  };
}

/**
 * The response and its censoring on the given rows (normally the common
 * rows), or every problem found: an unknown status, a missing or
 * non-numeric upper value on an interval row, an upper value not above the
 * response. `censoring` null reads every row as exact.
 */
export function censoredResponse(
  columns: Columns,
  response: string,
  censoring: CensoringColumns | null,
  rows: readonly number[],
  at: { response: IssuePath; censoring: IssuePath } = { response: ['response'], censoring: ['censoring'] },
): { response: CensoredResponse } | { issues: Issue[] } {
  const time = readTimes(columns, response, rows, at.response);
  if (!(time instanceof Float64Array)) return { issues: [time] };
  if (censoring === null) return { response: uncensoredResponse(time, rows, response) };
  const issues: Issue[] = [];
  const statusAt = [...at.censoring, 'status'];
  const upperAt = [...at.censoring, 'upper'];
  if (!has(columns, censoring.status)) issues.push(unknownColumn(statusAt, censoring.status, columns));
  const upperName = censoring.upper ?? null;
  if (upperName !== null && !has(columns, upperName)) issues.push(unknownColumn(upperAt, upperName, columns));
  if (issues.length > 0) return { issues };
  const status = new Uint8Array(rows.length);
  const upper = new Float64Array(rows.length).fill(Number.NaN);
  const codes = new Map<unknown, number>(CENSORING_STATUSES.map((s, k) => [s, k]));
  for (let i = 0; i < rows.length && issues.length < 50; i++) {
    const row = rows[i];
    const raw = columns[censoring.status][row];
    const code = codes.get(raw);
    if (code === undefined) {
      issues.push(raw === null || raw === undefined
        ? issue('value_missing', statusAt, { column: censoring.status, row })
        : issue('censoring_status_unknown', statusAt, { column: censoring.status, row, value: String(raw) }));
      continue;
    }
    status[i] = code;
    if (code !== INTERVAL) continue;
    const v = upperName === null ? null : columns[upperName][row];
    if (typeof v === 'string') issues.push(issue('censoring_upper_not_numeric', upperAt, { column: upperName!, row, value: v }));
    else if (typeof v !== 'number' || !Number.isFinite(v)) {
      issues.push(issue('censoring_upper_missing', upperName === null ? at.censoring : upperAt, { column: upperName, row }));
    } else if (!(v > time[i])) {
      issues.push(issue('censoring_upper_not_above', upperAt, { column: upperName!, row, lower: time[i], upper: v }));
    } else upper[i] = v;
  }
  if (issues.length > 0) return { issues };
  return { response: { rows, time, upper, status, timeColumn: response, upperColumn: upperName } };
}

/** True when any row is censored: least-squares and GLM candidates cannot use such a response. */
export function isCensored(response: CensoredResponse): boolean {
  return response.status.some((s) => s !== EXACT);
}

export function censoringCounts(response: CensoredResponse): CensoringCounts {
  const counts: CensoringCounts = { exact: 0, right: 0, left: 0, interval: 0 };
  for (const s of response.status) counts[CENSORING_STATUSES[s]]++;
  return counts;
}

/**
 * The first row whose times a distribution of positive time cannot hold:
 * exact, right and left times must be above 0; an interval may start at 0
 * (failed before its first inspection, i.e. left-censored at its upper time).
 */
export function firstNonPositiveTime(response: CensoredResponse): { row: number; value: number; status: CensoringStatus } | null {
  for (let i = 0; i < response.time.length; i++) {
    const t = response.time[i];
    const s = response.status[i];
    if (s === INTERVAL ? t < 0 : !(t > 0)) return { row: response.rows[i], value: t, status: CENSORING_STATUSES[s] };
  }
  return null;
}
