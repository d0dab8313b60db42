// What pricing reads from the data without building anything: the number of
// rows, whether a column holds text, and how many levels a column has when it
// is coded as a factor. Levels are counted only up to a bound (past it the
// candidate is refused anyway), so a column of a million distinct strings
// costs one pass and a set of bound + 2 entries, never a design.
import type { Columns } from '../types.ts';
import type { DataSummary } from '../summary/types.ts';

export interface DataShape {
  /** Rows of data (all of them: common rows can only be fewer, so prices are upper bounds). */
  rows: number;
  has(column: string): boolean;
  /** A text column: used as a plain term it is a factor. */
  categorical(column: string): boolean;
  /** Distinct values on non-missing rows, counted up to bound + 1 (more means "over the bound"). */
  levels(column: string, bound: number): number;
}

export function shapeOfColumns(columns: Columns): DataShape {
  const own = (name: string) => Object.prototype.hasOwnProperty.call(columns, name);
  let rows = 0;
  for (const values of Object.values(columns)) rows = Math.max(rows, values.length);
  // complete: counting reached the end, so count is exact; otherwise count = the bound it stopped past + 1.
  const counted = new Map<string, { count: number; complete: boolean }>();
  return {
    rows,
    has: own,
    categorical(name) {
      if (!own(name)) return false;
      // The request schema keeps a column to one kind, so its first value decides.
      const first = columns[name].find((v) => v !== null);
      return typeof first === 'string';
    },
    levels(name, bound) {
      if (!own(name)) return 0;
      const known = counted.get(name);
      if (known?.complete) return known.count;
      if (known && known.count > bound) return bound + 1;
      // A Set of the values themselves: factor coding treats 0 and -0 as one level, and so does SameValueZero.
      const seen = new Set<number | string>();
      let complete = true;
      for (const v of columns[name]) {
        if (v === null) continue;
        seen.add(v);
        if (seen.size > bound) {
          complete = false;
          break;
        }
      }
      counted.set(name, { count: seen.size, complete });
      return seen.size;
    },
  };
}

/** A data summary has numeric columns only: terms are its column names, one design column each. */
export function shapeOfSummary(summary: DataSummary): DataShape {
  const names = new Set(summary.columns);
  return {
    rows: summary.rows,
    has: (name) => names.has(name),
    categorical: () => false,
    levels: () => 0,
  };
}

/** No data at all (every candidate sent by its rss or log-likelihood). */
export const NO_DATA: DataShape = { rows: 0, has: () => false, categorical: () => false, levels: () => 0 };
