// What a lifetime fit costs, priced from the request's shape before anything
// is allocated, in floating-point operations (a plain number for the cost
// model). An upper estimate: every Newton iteration up to the cap is paid
// for, each one derivative pass (per-row contributions, then the gradient
// and the Hessian's p(p+1)/2 + p + 1 sums) and two likelihood passes for the
// line search, plus the least-squares start. Per-row costs of a contribution
// are counted in flop-equivalents of its special functions (a log, exp or
// erfc counted as 20): a location-scale row about 100, a censored gamma row
// about 2,000 (its incomplete gamma series or continued fraction with their
// shape derivatives, ~60 terms of ~30 operations).
import { DEFAULT_MAX_ITERATIONS } from './options.ts';
import type { DistributionName } from './distributions.ts';
import { TURNBULL_MAX_ITERATIONS } from './nonparametric/turnbull.ts';
import { PICTURE_GROUPS, PICTURE_POINTS } from './life-picture.ts';

export interface LifetimeShape {
  rows: number;
  /** Design columns of the location, the intercept included. */
  designColumns: number;
  distribution: DistributionName;
  /** The Newton–Raphson cap (options.maxIterations); 50 by default. */
  maxIterations?: number;
  /** Rows that are not exact failures; all rows when unknown (the dearer bound). */
  censoredRows?: number;
}

// First counted at ~100 (a few special functions at 20 each); timed in
// scripts/bench-pricing.ts (one iteration of a Weibull or lognormal AFT fit
// on 20,000 rows, a busy shared machine) a row's iteration costs about six
// times that count against the other kinds' rate, so 600. The exact gamma
// row (log-gamma and digamma of the shape) is taken as the same.
const LOCATION_SCALE_ROW = 600;
const GAMMA_EXACT_ROW = 600;
const GAMMA_CENSORED_ROW = 2_000;
/** Two starts may be tried (fit-lifetime.ts). */
const STARTS = 2;

export function priceLifetime(shape: LifetimeShape): number {
  const n = Math.max(0, shape.rows);
  const p = Math.max(1, shape.designColumns);
  const cap = shape.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  const censored = Math.min(n, shape.censoredRows ?? n);
  const perRow = shape.distribution === 'gamma'
    ? (GAMMA_EXACT_ROW * (n - censored) + GAMMA_CENSORED_ROW * censored) / Math.max(n, 1)
    : LOCATION_SCALE_ROW;
  const locations = 2 * p;
  const derivativePass = n * (perRow + locations + 2 * ((p * (p + 1)) / 2 + 2 * p + 2));
  const valuePass = n * (perRow + locations);
  const leastSquares = 10 * n * p * p;
  return leastSquares + STARTS * cap * (derivativePass + 2 * valuePass);
}

/**
 * The nonparametric estimate for a picture: Kaplan–Meier is a sort and one
 * pass; Turnbull's EM pays up to its iteration cap, each iteration about 12
 * operations per row and innermost interval (at most one per row).
 */
export function priceNonparametric(shape: { rows: number; leftOrIntervalCensored: boolean }): number {
  const n = Math.max(1, shape.rows);
  if (!shape.leftOrIntervalCensored) return 30 * n * Math.log2(n + 1);
  return 30 * n * Math.log2(n + 1) + TURNBULL_MAX_ITERATIONS * 12 * 2 * n;
}

/**
 * Values at new rows (life-predictions.ts): the prediction rows' design
 * (built with the data's rows, as for least squares), then per row and
 * value one quantile or survival function (a gamma percentile about five
 * incomplete gamma evaluations) and a quadratic form in the covariance.
 */
export function priceLifePredictions(shape: { rows: number; designColumns: number; predictionRows: number; valuesPerRow: number; distribution: DistributionName }): number {
  const m = Math.max(0, shape.predictionRows);
  if (m === 0) return 0;
  const d = Math.max(1, shape.designColumns) + 1;
  const perValue = (shape.distribution === 'gamma' ? 5 * GAMMA_CENSORED_ROW : LOCATION_SCALE_ROW) + 2 * d * d;
  return 4 * (shape.rows + m) * d + m * (Math.max(1, shape.valuesPerRow) * perValue + 2 * d * d);
}

/**
 * The life-data picture stored with a comparison (life-picture.ts): the
 * nonparametric estimate once, then each model's curve — a sort of its
 * rows' locations and PICTURE_POINTS times × at most PICTURE_GROUPS
 * locations, each a distribution function at the cost of a censored row.
 */
export function priceLifePicture(shape: { rows: number; models: number; gammaModels: number; leftOrIntervalCensored: boolean }): number {
  const n = Math.max(1, shape.rows);
  const groups = Math.min(n, PICTURE_GROUPS);
  const perModel = 2 * n * Math.log2(n + 1) + PICTURE_POINTS * groups * LOCATION_SCALE_ROW;
  const perGamma = PICTURE_POINTS * groups * (GAMMA_CENSORED_ROW - LOCATION_SCALE_ROW);
  return priceNonparametric({ rows: n, leftOrIntervalCensored: shape.leftOrIntervalCensored }) + shape.models * perModel + shape.gammaModels * perGamma;
}
