// Nonlinear mean functions: candidates written as expressions in their
// parameters and the data's columns, fitted by Levenberg–Marquardt to the
// accuracy the NIST StRD certifies, under the service's Gaussian convention.
// Pure: no I/O, clocks or randomness; results or issues, never throws for
// anything a caller sent.
export {
  prepareNonlinearCandidate, MAX_PARAMETERS,
  type NonlinearCandidate, type NonlinearCandidateSpec,
} from './candidate.ts';
export { expressionColumnValues } from './data.ts';
export { fitNonlinear, type NonlinearFitInput, type NonlinearFitOptions } from './fit.ts';
export type { NonlinearFit, NonlinearConvergence, StartSummary } from './result.ts';
export type { CoefficientRow } from './coefficient-table.ts';
export {
  nonlinearLeverages, nonlinearLeaveOneOut, nonlinearResidualChecks, predictNonlinear,
  LEAVE_ONE_OUT_APPROXIMATION,
  type LinearisedLeaveOneOut, type NonlinearPrediction, type NonlinearResidualChecks,
} from './capabilities.ts';
export { extraSumOfSquaresTest, type LeastSquaresFacts } from './extra-sum-of-squares.ts';
export { priceNonlinear, type NonlinearShape } from './price.ts';
export { NONLINEAR_CONVENTIONS, CONVERGENCE_RULE } from './conventions.ts';
export { EXPRESSION_LIMITS, FUNCTIONS } from './expression/syntax.ts';
