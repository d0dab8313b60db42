// Values a model fitted elsewhere sends per row (residuals, fitted means),
// lined up with the rows the comparison uses: either one per used row, or
// one per data row with null exactly where the comparison drops a row. Each
// kind words its own issues from what went wrong here.
import type { ScoringContext } from './scoring-context.ts';

/** Rows named in one issue; beyond this, counted. */
export const LISTED_ROWS = 20;

export type Misalignment =
  | { problem: 'count' }
  /** A used row without a value: `index` into what was sent, `row` the data row. */
  | { problem: 'missing'; index: number; row: number }
  /** Values at dropped data rows: the first, up to LISTED_ROWS of them, and how many. */
  | { problem: 'atDropped'; row: number; rows: number[]; count: number };

export function alignToUsedRows(values: readonly (number | null)[], ctx: ScoringContext): Float64Array | Misalignment {
  if (values.length === ctx.n) {
    const out = new Float64Array(ctx.n);
    for (let i = 0; i < ctx.n; i++) {
      const v = values[i];
      if (v === null) return { problem: 'missing', index: i, row: ctx.rows ? ctx.rows[i] : i };
      out[i] = v;
    }
    return out;
  }
  if (ctx.rows && ctx.dataRows !== null && values.length === ctx.dataRows) {
    const used = new Set(ctx.rows);
    const out = new Float64Array(ctx.n);
    const atDropped: number[] = [];
    let k = 0;
    for (let r = 0; r < values.length; r++) {
      const v = values[r];
      if (used.has(r)) {
        if (v === null) return { problem: 'missing', index: r, row: r };
        out[k++] = v;
      } else if (v !== null) {
        atDropped.push(r);
      }
    }
    // Every such row named (up to a limit), so one answer shows the whole mismatch.
    if (atDropped.length > 0) return { problem: 'atDropped', row: atDropped[0], rows: atDropped.slice(0, LISTED_ROWS), count: atDropped.length };
    return out;
  }
  return { problem: 'count' };
}
