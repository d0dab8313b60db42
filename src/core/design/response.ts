// The response and the weights on the common rows, checked: a response must
// be numeric and not constant (no variation to explain, R² undefined);
// relative weights must be positive numbers, since the weighted likelihood
// takes ln w for each row.

import type { Columns } from '../types.ts';
import { issue, type Issue, type IssuePath } from '../issues.ts';
import { sumOfLogs } from '../likelihood.ts';
import { unknownColumn } from './columns.ts';

export function responseValues(
  columns: Columns,
  name: string,
  rows: readonly number[],
  at: IssuePath = ['response'],
): { values: Float64Array } | { issues: Issue[] } {
  if (!Object.prototype.hasOwnProperty.call(columns, name)) {
    return { issues: [unknownColumn(at, name, columns)] };
  }
  const column = columns[name];
  const values = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const v = column[rows[i]];
    const row = rows[i];
    if (typeof v === 'string') return { issues: [issue('response_not_numeric', at, { column: name, row, value: v })] };
    if (typeof v !== 'number') return { issues: [issue('value_missing', at, { column: name, row })] };
    if (!Number.isFinite(v)) return { issues: [issue('value_not_finite', at, { column: name, row })] };
    values[i] = v;
  }
  if (values.length >= 2 && values.every((v) => v === values[0])) {
    return { issues: [issue('response_constant', at, { column: name, value: values[0], rows: values.length })] };
  }
  return { values };
}

/**
 * Relative weights on the rows, and sum(ln w_i) for the weighted likelihood
 * (compensated, so that many rows do not lose the digits that cancel against
 * the ln(sum w e²) term).
 */
export function weightValues(
  columns: Columns,
  name: string,
  rows: readonly number[],
  at: IssuePath = ['weights'],
): { values: Float64Array; sumLogWeights: number } | { issues: Issue[] } {
  if (!Object.prototype.hasOwnProperty.call(columns, name)) {
    return { issues: [unknownColumn(at, name, columns)] };
  }
  const column = columns[name];
  const values = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const v = column[rows[i]];
    const row = rows[i];
    if (typeof v === 'string') return { issues: [issue('weights_not_numeric', at, { column: name, row, value: v })] };
    if (typeof v !== 'number' || !(v > 0) || !Number.isFinite(v)) {
      return { issues: [issue('weights_not_positive', at, { column: name, row, value: typeof v === 'number' ? v : null })] };
    }
    values[i] = v;
  }
  return { values, sumLogWeights: sumOfLogs(values) };
}
