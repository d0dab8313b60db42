// The rows a comparison or a search scores every model on, with the response
// and the weights there. A row is left out for every model when any column a
// model uses (response and weights included) is missing in it — criteria
// compare only on the same observations — or when its weight is 0: a zero
// weight is the practitioner's way of saying "this row does not count", and
// it cannot enter the weighted likelihood (its ½ ln w would be −∞). Negative
// weights stay refused (response.ts).
import type { Columns } from '../types.ts';
import { issue, type Issue } from '../issues.ts';
import { commonRows } from './columns.ts';
import { responseValues, weightValues } from './response.ts';

export interface SampleRows {
  /** Data positions of the rows used, in data order. */
  rows: number[];
  /** Rows left out, for a missing value or a zero weight. */
  dropped: number;
  /** Of the dropped rows, those whose weight is missing (null). */
  missingWeights: number;
  /** Of the dropped rows, those with weight 0 (and no missing value). */
  zeroWeights: number;
  y: Float64Array;
  weights: { values: Float64Array; sumLogWeights: number } | null;
}

export function sampleRows(
  columns: Columns,
  response: string,
  weights: string | null,
  termColumns: readonly string[],
): SampleRows | { issues: Issue[] } {
  const complete = commonRows(columns, [response, ...(weights ? [weights] : []), ...termColumns]);
  const w = weights !== null && Object.prototype.hasOwnProperty.call(columns, weights) ? columns[weights] : null;
  const rows = w ? complete.rows.filter((r) => w[r] !== 0) : complete.rows;
  const zeroWeights = complete.rows.length - rows.length;
  let missingWeights = 0;
  if (w) for (let r = 0; r < w.length; r++) if (w[r] === null || w[r] === undefined) missingWeights++;
  const dropped = complete.dropped + zeroWeights;
  const issues: Issue[] = [];
  const y = responseValues(columns, response, rows);
  if ('issues' in y) issues.push(...y.issues);
  const wv = weights ? weightValues(columns, weights, rows) : null;
  if (wv && 'issues' in wv) issues.push(...wv.issues);
  if (rows.length === 0) issues.push(issue('all_rows_dropped', ['data', 'columns'], { rows: dropped, dropped }));
  if (issues.length > 0) return { issues };
  return {
    rows, dropped, missingWeights, zeroWeights,
    y: (y as { values: Float64Array }).values,
    weights: wv && 'values' in wv ? wv : null,
  };
}
