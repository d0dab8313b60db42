// The work, memory and answer size of one least-squares model fitted here, by
// the steps src/core runs for it. Operation counts are the textbook ones
// (Golub & Van Loan, Matrix Computations, 4th ed., §5.2: Householder QR of an
// n×p matrix takes about 2np² flops, i.e. np² multiply-adds); the factors for
// double-double arithmetic and the refinement steps are this code's own,
// checked against measured times by scripts/bench-pricing.ts.

/** Double-double products and sums cost about ten double operations each (numeric/double-double.ts). */
const DOUBLE_DOUBLE = 10;
/** Refinement steps priced: the solver allows ten, and well-posed designs stop after two or three. */
const REFINEMENT_STEPS = 4;
/**
 * Work that does not grow with rows or columns, measured rather than counted
 * (scripts/bench-pricing.ts: sixty one-term models on 120 rows, twenty thousand
 * predictions of one model): per model fitted here, its result, p-values and
 * diagnostics; per model scored from figures fitted elsewhere, a tenth of
 * that; per prediction row of one model, its estimability check, interval and
 * answer object; per byte of answer, checking that every number is
 * representable against the response schema and measuring its size.
 */
export const FIXED_WORK = {
  modelFittedHere: 300_000,
  modelFittedElsewhere: 30_000,
  predictionRow: 1_200,
  answerByte: 5,
} as const;
/**
 * Bytes of JSON per item of the answer, measured on results of the demo data
 * (a model without coefficients ~3.7 KB, a coefficient ~90 B, a prediction
 * ~70 B, a ranking entry ~210 B, a nested test ~220 B) and rounded up for
 * numbers printed with all 17 digits and longer names.
 */
export const ANSWER_BYTES = {
  base: 6144,
  model: 4096,
  coefficient: 200,
  // estimate, standard error and the four interval bounds, with their keys
  prediction: 256,
  rankingEntry: 256,
  nestedTest: 256,
  averagedTerm: 320,
} as const;

export interface Cost {
  work: number;
  heldBytes: number;
  passingBytes: number;
  resultBytes: number;
}

export const NO_COST: Cost = { work: 0, heldBytes: 0, passingBytes: 0, resultBytes: 0 };

/**
 * From rows: build the design in double-double, equilibrate, factorise
 * (np²), refine against double-double residuals, form the covariance (p³);
 * then, unless only the fit is wanted (a search's refit of its best subsets),
 * the statistics after the ranking: a second factorisation for the shared
 * geometry, leave-one-out and diagnostics, each O(np) beyond it.
 */
export function leastSquaresFit(n: number, p: number, afterRanking = true): Cost {
  const fit = DOUBLE_DOUBLE * n * p + n * p * p + REFINEMENT_STEPS * DOUBLE_DOUBLE * n * p + p * p * p;
  const after = afterRanking ? n * p * p + 4 * DOUBLE_DOUBLE * n * p : 0;
  return {
    work: FIXED_WORK.modelFittedHere + fit + after,
    // The design (high and low parts), residuals and fitted values, and the p×p covariance stay until the answer.
    heldBytes: 16 * n * p + 16 * n + 8 * p * p,
    // The equilibrated copy of the design and its factorisation.
    passingBytes: 24 * n * p,
    resultBytes: ANSWER_BYTES.model + p * ANSWER_BYTES.coefficient,
  };
}

/** Predictions at m new rows: a design over data and new rows together (so factors code alike), then a p² quadratic form per new row. */
export function leastSquaresPrediction(n: number, p: number, m: number): Cost {
  if (m === 0) return NO_COST;
  return {
    work: DOUBLE_DOUBLE * (n + m) * p + m * (FIXED_WORK.predictionRow + p * p),
    heldBytes: m * ANSWER_BYTES.prediction,
    passingBytes: 32 * (n + m) * p,
    resultBytes: m * ANSWER_BYTES.prediction,
  };
}

/** From a data summary: the sweep of a p×p block of cross products (p³), nothing per row. */
export function leastSquaresFromSummary(p: number): Cost {
  return {
    work: FIXED_WORK.modelFittedHere + 2 * p * p * p,
    heldBytes: 8 * p * p,
    passingBytes: 8 * p * p,
    resultBytes: ANSWER_BYTES.model + p * ANSWER_BYTES.coefficient,
  };
}
