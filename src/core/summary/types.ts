// A data summary: everything a Gaussian linear model needs from the rows,
// reduced where the data live. The unweighted form is fixed by the public
// contract: { rows, columns, means, centredCrossProducts }.
//
// Weighted variant (documented alongside the fixed form): the same fields
// plus `weights: { sum, sumLog }`, where `means` are weighted means
// sum(w x)/sum(w), `centredCrossProducts` are sum(w (x - mean)(z - mean)),
// `sum` is sum(w) and `sumLog` is sum(ln w) — the last is what the weighted
// log-likelihood adds (1/2 sum ln w), and it cannot be recovered from the
// moments, so a weighted summary must carry it. `rows` stays the row count n.

export interface SummaryWeights {
  sum: number;
  sumLog: number;
}

export interface DataSummary {
  rows: number;
  columns: string[];
  means: number[];
  centredCrossProducts: number[][];
  weights?: SummaryWeights;
}

export type SummaryIssueCode =
  | 'summary_rows_invalid'
  | 'summary_columns_invalid'
  | 'summary_size_mismatch'
  | 'summary_value_not_finite'
  | 'summary_not_symmetric'
  | 'summary_negative_variance'
  | 'summary_not_positive_semidefinite'
  | 'summary_weights_invalid'
  | 'summary_columns_differ'
  | 'summary_weighting_differs'
  | 'summary_column_unknown';

/** A problem with a summary, as data: a code, where, and the facts. */
export interface SummaryIssue {
  code: SummaryIssueCode;
  path: (string | number)[];
  message: string;
  facts: Record<string, number | string | string[] | null>;
}
