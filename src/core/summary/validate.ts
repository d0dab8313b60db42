// Checks a caller's summary before anything is fitted from it. A summary
// that is not symmetric or not positive semidefinite cannot be the centred
// cross products of any real rows; fitting from it would give a negative
// residual sum of squares or nonsense, so it is refused with the reason.

import type { DataSummary, SummaryIssue } from './types.ts';

/**
 * Relative tolerance for symmetry and semidefiniteness, on the scale of the
 * correlation matrix. Sums formed in double by SQL engines in another order
 * differ by rounding (~1e-16 times the row count at worst ~1e-10 for 10^6
 * rows); 1e-8 accepts honest rounding and still rejects a wrong matrix.
 */
export const SUMMARY_TOLERANCE = 1e-8;

export function validateSummary(s: DataSummary, at: (string | number)[] = ['data', 'summary']): SummaryIssue[] {
  const issues: SummaryIssue[] = [];
  const issue = (code: SummaryIssue['code'], path: (string | number)[], message: string, facts: SummaryIssue['facts']) =>
    issues.push({ code, path: [...at, ...path], message, facts });
  if (!Number.isInteger(s.rows) || s.rows < 1) {
    issue('summary_rows_invalid', ['rows'], 'rows must be a whole number of at least 1.', { rows: Number.isFinite(s.rows) ? s.rows : null });
  }
  const p = s.columns.length;
  const seen = new Set<string>();
  for (const c of s.columns) {
    if (typeof c !== 'string' || c.length === 0 || seen.has(c)) {
      issue('summary_columns_invalid', ['columns'], 'columns must be distinct, non-empty names.', { column: String(c) });
      break;
    }
    seen.add(c);
  }
  if (s.means.length !== p) {
    issue('summary_size_mismatch', ['means'], `means has ${s.means.length} entries for ${p} columns.`, { length: s.means.length, expected: p });
  }
  const C = s.centredCrossProducts;
  if (C.length !== p || C.some((r) => r.length !== p)) {
    issue('summary_size_mismatch', ['centredCrossProducts'], `centredCrossProducts must be ${p} by ${p}, one row and column per listed column.`, {
      length: C.length,
      expected: p,
    });
  }
  if (s.weights !== undefined) {
    const { sum, sumLog } = s.weights;
    if (!Number.isFinite(sum) || sum <= 0 || !Number.isFinite(sumLog)) {
      issue('summary_weights_invalid', ['weights'], 'weights.sum must be a positive number and weights.sumLog a finite number.', {
        sum: Number.isFinite(sum) ? sum : null,
        sumLog: Number.isFinite(sumLog) ? sumLog : null,
      });
    }
  }
  if (issues.length > 0) return issues;
  for (let j = 0; j < p; j++) {
    if (!Number.isFinite(s.means[j])) {
      issue('summary_value_not_finite', ['means', j], `means[${j}] is not a finite number.`, { column: s.columns[j] });
    }
    for (let k = 0; k < p; k++) {
      if (!Number.isFinite(C[j][k])) {
        issue('summary_value_not_finite', ['centredCrossProducts', j, k], `centredCrossProducts[${j}][${k}] is not a finite number.`, {
          column: s.columns[j],
        });
      }
    }
  }
  if (issues.length > 0) return issues;
  for (let j = 0; j < p; j++) {
    if (C[j][j] < 0) {
      issue('summary_negative_variance', ['centredCrossProducts', j, j], `The centred sum of squares of ${JSON.stringify(s.columns[j])} is negative.`, {
        column: s.columns[j],
        value: C[j][j],
      });
    }
  }
  if (issues.length > 0) return issues;
  const scale = C.map((r, j) => Math.sqrt(r[j]));
  for (let j = 0; j < p; j++) {
    for (let k = 0; k < j; k++) {
      const bound = SUMMARY_TOLERANCE * scale[j] * scale[k] + Number.MIN_VALUE;
      if (Math.abs(C[j][k] - C[k][j]) > bound) {
        issue('summary_not_symmetric', ['centredCrossProducts', j, k], `centredCrossProducts[${j}][${k}] differs from [${k}][${j}].`, {
          row: j,
          column: k,
        });
      }
    }
  }
  if (issues.length > 0) return issues;
  const failing = firstIndefiniteColumn(C, scale);
  if (failing !== null) {
    issue(
      'summary_not_positive_semidefinite',
      ['centredCrossProducts'],
      `centredCrossProducts is not positive semidefinite (it fails at column ${JSON.stringify(s.columns[failing])}); no rows have these moments.`,
      { column: s.columns[failing] },
    );
  }
  return issues;
}

/**
 * Symmetric elimination on the correlation scale: a pivot below -tolerance
 * proves indefiniteness; a pivot within tolerance of zero is a dependent
 * column (allowed: collinear data are real data) and is dropped.
 */
function firstIndefiniteColumn(C: number[][], scale: number[]): number | null {
  const p = C.length;
  const R = C.map((r, j) => r.map((v, k) => (scale[j] > 0 && scale[k] > 0 ? v / (scale[j] * scale[k]) : 0)));
  for (let k = 0; k < p; k++) {
    if (scale[k] === 0) continue;
    const d = R[k][k];
    if (d < -SUMMARY_TOLERANCE) return k;
    if (d <= SUMMARY_TOLERANCE) continue;
    for (let i = k + 1; i < p; i++) {
      const f = R[i][k] / d;
      if (f === 0) continue;
      for (let j = k + 1; j < p; j++) R[i][j] -= f * R[k][j];
    }
  }
  return null;
}
