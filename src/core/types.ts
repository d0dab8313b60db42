// The shapes the pure core trades in. The HTTP layer validates callers' JSON
// into these; the core never sees raw request bodies.

/** A term of a candidate model, in the fixed forms of the public contract. */
export type Term =
  | string
  | { kind: 'power'; of: string; degree: number }
  | { kind: 'product'; of: string[] }
  | { kind: 'transform'; of: string; fn: 'log' | 'sqrt' | 'reciprocal' }
  | { kind: 'factor'; of: string; reference?: string };

/** One data column: numbers (numeric), strings (categorical) or null (missing). */
export type ColumnValues = ReadonlyArray<number | string | null>;

export type Columns = Readonly<Record<string, ColumnValues>>;

/**
 * A design matrix for the rows a comparison uses, column-major.
 * `high[j][i] + low[j][i]` is the value of column j in row i to double-double
 * accuracy: powers, products and transforms are formed in extended precision
 * so that iterative refinement sees the design the caller asked for, not its
 * double rounding. `low` is all zeros for columns that are exact doubles.
 */
export interface DesignMatrix {
  rows: number;
  /** One readable label per column, e.g. "intercept", "peakTemp^2", "kiln=west", "peakTemp×kiln=west". */
  labels: string[];
  /**
   * One identity per column, built from the structured term (see
   * design/column-identity.ts): equal keys are the same column formed the
   * same way, factor reference included. Labels can collide (a data column
   * named "x^2"); keys cannot. Set by buildDesign; nested tests and model
   * averaging need it and treat a design without keys as matching nothing.
   */
  keys?: string[];
  high: Float64Array[];
  low: Float64Array[];
  intercept: boolean;
  /** Index into the candidate's terms of the term each column comes from; -1 for the intercept. */
  termOfColumn: number[];
}

/** Least-squares fit of y on a design, optionally with relative weights. */
export interface LeastSquaresFit {
  /** Number of rows used. */
  observations: number;
  /** Numerical rank of the (weighted, equilibrated) design. */
  rank: number;
  /** Per design column; null for an aliased column. */
  coefficients: (number | null)[];
  /** Per design column; null for an aliased column or when sigma is 0. */
  standardErrors: (number | null)[];
  /** Labels of aliased columns, in design order. */
  aliased: string[];
  /** Unscaled covariance (X'WX)^-1 over the non-aliased columns, in design order of those columns. */
  unscaledCovariance: number[][];
  /** Indices of the non-aliased columns (the order of unscaledCovariance). */
  estimable: number[];
  /** y - X b, one per row (unweighted). */
  residuals: Float64Array;
  fitted: Float64Array;
  /** Weighted residual sum of squares sum(w e^2) (plain RSS without weights). */
  rss: number;
  /** Weighted total sum of squares: about the weighted mean with an intercept, about 0 without. */
  tss: number;
  /** sqrt(rss / (n - rank)); null when n = rank. */
  sigma: number | null;
  /** True when the residuals are at rounding level relative to the response. */
  exactFit: boolean;
  /** 2-norm condition estimate of the equilibrated design the solver factorised; NaN when no column was accepted (rank 0), reported as null. */
  conditionNumber: number;
  /** Refinement steps taken and the final relative size of the correction. */
  refinement: { steps: number; lastCorrection: number };
}
