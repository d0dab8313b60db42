// What a fitted nonlinear candidate carries: everything the scoring side
// needs (log-likelihood, k, n, measure, coefficients, covariance,
// convergence) and what the statistics after the ranking ask for
// (fitted values, residuals, the weighted Jacobian for leverages and
// predictions). Plain data: it crosses a worker boundary by structured clone.
import type { ResponseTransformSpec } from '../response-transform.ts';
import type { CoefficientRow } from './coefficient-table.ts';
import type { LmStop } from './lm/levenberg-marquardt.ts';
import type { JacobianFactor } from './covariance.ts';

export interface StartSummary {
  /** Index of the start vector (0 for `start`). */
  start: number;
  status: 'converged' | 'iteration-cap' | 'no-minimum' | 'rank-deficient' | 'non-finite' | 'start-not-finite';
  /** Σ w e² at its solution; null unless converged. */
  rss: number | null;
  iterations: number;
}

export interface NonlinearConvergence {
  converged: true;
  /** Levenberg–Marquardt iterations (Jacobian evaluations) of the winning start. */
  iterations: number;
  /** Residual evaluations of the winning start, trial steps included. */
  evaluations: number;
  /** Gauss–Newton refinement steps with double-double residuals that lowered the sum of squares. */
  refinementSteps: number;
  /** Which of Moré's tests stopped the iteration. */
  stoppedBy: LmStop;
  /** The certificate: ||D δ|| / ||D b|| of the Gauss–Newton step from the solution (at most 1e-6 to count as converged). */
  finalStep: number;
  /** Largest cosine between the residual vector and a free parameter's Jacobian column at the solution (0 at an exact minimum). */
  gradientCosine: number;
  /** The start vector whose solution won (smallest sum of squares among converged ones). */
  start: number;
  /** Every start vector's outcome, in request order. */
  starts: StartSummary[];
  /** The convergence rule in words. */
  rule: string;
}

export interface NonlinearFit {
  kind: 'nonlinear';
  name: string;
  expression: string;
  /** The Gaussian likelihood is a density. */
  measure: 'density';
  observations: number;
  /** k: the expression's parameters plus one for the error variance. */
  parameters: number;
  /** Full Gaussian log-likelihood, constants included; null for an exact fit (unbounded). */
  logLikelihood: number | null;
  exactFit: boolean;
  /** Σ w e² on the candidate's scale, accumulated in double-double from double-double residuals. */
  rss: number;
  /** Σ w (y - ȳ_w)² on the candidate's scale. */
  tss: number;
  /** 1 - rss/tss; null when tss is 0. */
  r2: number | null;
  /** sqrt(rss / (n - p)). */
  sigma: number;
  residualDf: number;
  sumLogWeights: number;
  responseTransform: (ResponseTransformSpec & { jacobian: number }) | null;
  intervalLevel: number;
  /** One row per parameter, in the order of the start object's keys; `term` is the parameter's name. */
  coefficients: CoefficientRow[];
  estimates: number[];
  /** s² (J'WJ)^-1 in parameter order. */
  covariance: number[][];
  /** (J'WJ)^-1. */
  unscaledCovariance: number[][];
  /** 2-norm condition number of the Jacobian with unit-length columns. */
  conditionNumber: number | null;
  /** Parameters that ended on one of their bounds (their standard errors assume the bound is not there). */
  atBounds: string[];
  convergence: NonlinearConvergence;
  /** Model values on the candidate's scale, per row. */
  fitted: Float64Array;
  /** y - fitted (unweighted), each computed from a double-double evaluation. */
  residuals: Float64Array;
  weights: Float64Array | null;
  /** sqrt(w_i) d model_i / d b_j at the solution, column-major n x p. */
  jacobian: Float64Array;
  /** R of that Jacobian (unit-scaled columns), for leverages and prediction variances. */
  factor: JacobianFactor;
}
