// The sample every candidate of one comparison is scored on, whatever its
// kind: the rows used, the response and the weights on them.
export interface ScoringContext {
  /** Rows the comparison uses. */
  n: number;
  /** Data positions of the used rows and the number of data rows; null without data. */
  rows: readonly number[] | null;
  dataRows: number | null;
  /** The response on the used rows; null without data. */
  y: Float64Array | null;
  weights: { values: Float64Array; sumLogWeights: number } | null;
  /** Where n comes from, in words that complete "but … n" (e.g. 'the rows this comparison uses number'). */
  nSource: string;
}
