// The work of fitting one generalised linear model, estimated from the
// request's shape before anything is allocated, in floating-point operations.
// It bounds what the fit may do, because the fit obeys the same caps: every
// IRLS run stops at maxIterations weighted solves (a negative binomial at
// NB_SOLVE_BUDGET times as many over all its alternations), each step is
// halved at most MAX_RUN_HALVINGS times in a run, each θ estimate makes at most
// THETA_MAX_PASSES passes over the rows. Constants per row were measured
// roughly against the kernels (one Householder QR flop = one multiply-add
// pair counted as 2; a double-double operation as about 20).
import { DEFAULT_MAX_ITERATIONS, MAX_RUN_HALVINGS } from './irls.ts';
import { NB_MAX_ALTERNATIONS, NB_SOLVE_BUDGET } from './negative-binomial.ts';
import { THETA_MAX_PASSES } from './theta.ts';
import type { GlmFamilyName, GlmLinkName } from './types.ts';

export interface GlmShape {
  rows: number;
  /** Design columns (intercept included), as the cost model predicts them from the terms. */
  columns: number;
  family: GlmFamilyName;
  /** Default: the family's canonical link. */
  link?: GlmLinkName;
  /** The request's iteration cap (default 25). */
  maxIterations?: number;
}

/** Link and family evaluations per row and step (exp, log, erfc and a deviance term). */
const PER_ROW_EVALUATION = 80;
/** One pass of a θ estimate per row: up to 64 logarithms or reciprocals and a log-gamma. */
const PER_ROW_THETA_PASS = 200;

/** One lean step: QR of the n × (p + 1) augmented matrix, its preparation, η and the working quantities. */
export function leanStepFlops(n: number, p: number): number {
  return 2 * n * (p + 1) ** 2 + 10 * n * (p + 1) + 2 * n * p + PER_ROW_EVALUATION * n;
}

/**
 * One fitLeastSquares solve at its worst: double-double equilibration, the
 * pivoted QR, the double-double Gram covariance and ten refinement steps.
 */
export function leastSquaresSolveFlops(n: number, p: number): number {
  return 12 * n * p * p + 500 * n * p;
}

function irlsRunFlops(n: number, p: number, iterations: number): number {
  const halvings = MAX_RUN_HALVINGS * (2 * n * p + PER_ROW_EVALUATION * n);
  return iterations * leanStepFlops(n, p) + halvings + 2 * leastSquaresSolveFlops(n, p);
}

export function priceGlm(shape: GlmShape): number {
  const n = Math.max(0, shape.rows);
  const p = Math.max(1, shape.columns);
  const cap = shape.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  // The Gaussian identity model is one least-squares solve (and its null model a mean).
  if (shape.family === 'gaussian' && (shape.link ?? 'identity') === 'identity') return leastSquaresSolveFlops(n, p);
  const solves = shape.family === 'negativeBinomial' ? NB_SOLVE_BUDGET * cap : cap;
  let flops = irlsRunFlops(n, p, solves) + irlsRunFlops(n, 1, cap);
  // Separation check: one least-squares solve on at most n rows.
  if (shape.family === 'binomial' || shape.family === 'poisson' || shape.family === 'negativeBinomial') {
    flops += leastSquaresSolveFlops(n, p);
  }
  if (shape.family === 'negativeBinomial') {
    flops += (NB_MAX_ALTERNATIONS + 1) * (THETA_MAX_PASSES + 2) * PER_ROW_THETA_PASS * n;
  }
  return flops;
}

/** The after-ranking statistics of one model: leverages (one QR pass) and predictions at new rows. */
export function priceGlmAfterRanking(shape: { rows: number; columns: number; predictionRows: number }): number {
  const { rows: n, columns: p, predictionRows: m } = shape;
  return 2 * n * p * p + 20 * n * p + m * (2 * p * p + PER_ROW_EVALUATION);
}
