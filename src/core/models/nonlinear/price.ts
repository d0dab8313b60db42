// A pure estimate of the work of fitting one nonlinear candidate, in
// floating-point operations, from the request's shape alone, for the cost
// model: it is the worst case the iteration cap allows, since how many
// iterations a fit takes is known only after it ran.
//
// Per Levenberg–Marquardt iteration: one Jacobian by reverse-mode
// differentiation (~3 operations per tape entry and row, forward and
// backward), up to EVALUATIONS_PER_ITERATION residual evaluations (~1 per
// entry and row), the gradient and column norms (4np) and the pivoted QR with
// recomputed norms (~3np²). Refinement: each step evaluates the model in
// double-double (~30 operations per entry and row: a double-double operation
// costs 10 to 20 double ones, measured ~25x slower than the double
// evaluation), a Jacobian and a QR. The covariance at the end: a QR (2np²) and,
// for an ill-conditioned Jacobian, the double-double Gram matrix (~20np²).
import { MAX_REFINEMENT_STEPS } from './refine.ts';
import { DEFAULT_MAX_ITERATIONS, EVALUATIONS_PER_ITERATION } from './solve.ts';

export interface NonlinearShape {
  rows: number;
  parameters: number;
  /** Entries of the compiled tape; the expression's length in characters bounds it from above. */
  tapeEntries: number;
  starts: number;
  /** Iteration cap per start (default 1000). */
  maxIterations?: number;
}

export function priceNonlinear(shape: NonlinearShape): number {
  const { rows: n, parameters: p, tapeEntries: t, starts } = shape;
  const iterations = shape.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  const perIteration = 3 * n * t + EVALUATIONS_PER_ITERATION * n * t + 4 * n * p + 3 * n * p * p;
  const perRefinement = 30 * n * t + 3 * n * t + 3 * n * p * p;
  const covariance = 22 * n * p * p;
  return starts * (iterations * perIteration + MAX_REFINEMENT_STEPS * perRefinement) + covariance;
}
