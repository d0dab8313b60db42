// What a fitted life model offers after the ranking: its location,
// percentiles and survival probabilities at new design rows (built by the
// same design builder as the data, as prediction-rows.ts does for linear
// models), Cox–Snell residuals, and the distribution function averaged over
// the rows for a picture against the nonparametric estimate.
import type { DesignMatrix } from '../../types.ts';
import { isEstimable } from '../../predict.ts';
import type { StatisticsIssue } from '../../inference/issue.ts';
import { EXACT, INTERVAL, LEFT, RIGHT, type CensoredResponse } from './censoring.ts';
import {
  cumulativeHazardAt, locationAt, percentileAt, survivalAt, waldQuantile,
  type LifePercentile, type LifeSurvival,
} from './life-quantities.ts';
import type { LifetimeFit } from './lifetime-result.ts';
import { bilinear } from './small-matrix.ts';
import { DEFAULT_INTERVAL_LEVEL } from './options.ts';

export interface LifetimeRowPrediction {
  /** The location μ = x'β (of ln t, or of t for the time-scale distributions) and its standard error. */
  location: { estimate: number; standardError: number | null };
  percentiles: LifePercentile[];
  survival: LifeSurvival[];
}

export interface LifetimePredictionRequest {
  percentiles?: readonly number[];
  survivalAt?: readonly number[];
  intervalLevel?: number;
}

function estimableRowOf(fit: LifetimeFit, rows: DesignMatrix, i: number): Float64Array {
  return Float64Array.from(fit.estimates.estimable, (j) => rows.high[j][i] + rows.low[j][i]);
}

/** Values of the fitted model at new rows; null for a row that breaks a relation among aliased columns. */
export function predictLifetime(
  fit: LifetimeFit,
  data: DesignMatrix,
  rows: DesignMatrix,
  request: LifetimePredictionRequest,
): { predictions: (LifetimeRowPrediction | null)[]; issues: StatisticsIssue[] } {
  if (rows.labels.length !== data.labels.length || rows.labels.some((l, j) => l !== data.labels[j])) {
    return {
      predictions: [],
      issues: [{
        code: 'prediction-columns-differ',
        message: 'The prediction rows did not produce the same design columns as the data, so the model cannot be applied to them.',
        facts: { expected: data.labels.join(', '), received: rows.labels.join(', ') },
      }],
    };
  }
  const q = waldQuantile(request.intervalLevel ?? DEFAULT_INTERVAL_LEVEL);
  const est = fit.estimates;
  const notEstimable: number[] = [];
  const predictions = Array.from({ length: rows.rows }, (_, i): LifetimeRowPrediction | null => {
    const x = estimableRowOf(fit, rows, i);
    if (fit.aliasRelations && !isEstimable(rows, i, x, fit.aliasRelations)) {
      notEstimable.push(i);
      return null;
    }
    const g = new Float64Array(est.dimension);
    g.set(x);
    const v = bilinear(est.covariance, est.dimension, g, g);
    return {
      location: { estimate: locationAt(est, x), standardError: v >= 0 ? Math.sqrt(v) : null },
      percentiles: (request.percentiles ?? []).map((p) => percentileAt(est, x, p, q)),
      survival: (request.survivalAt ?? []).map((t) => survivalAt(est, x, t, q)),
    };
  });
  const issues: StatisticsIssue[] = notEstimable.length === 0 ? [] : [{
    code: 'prediction-not-estimable',
    message: 'Some prediction rows break a linear relation among columns that holds exactly in the data (aliased columns), so the model cannot say what the life would be there.',
    facts: { rows: notEstimable.join(', '), aliased: fit.aliased.join(', ') },
  }];
  return { predictions, issues };
}

/**
 * Cox–Snell residuals r = -ln S(t | x_i), the fitted cumulative hazard: a
 * unit exponential sample when the model is right. A censored row bounds its
 * residual: right-censored [H(t), ∞), left-censored [0, H(t)], interval
 * [H(lower), H(upper)]; an exact row has lower = upper.
 */
export function coxSnellResiduals(fit: LifetimeFit, response: CensoredResponse): { lower: Float64Array; upper: Float64Array } {
  const n = response.time.length;
  const lower = new Float64Array(n);
  const upper = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const mu = fit.fittedLocation[i];
    const at = cumulativeHazardAt(fit.estimates, mu, response.time[i]);
    const s = response.status[i];
    if (s === EXACT) lower[i] = upper[i] = at;
    else if (s === RIGHT) { lower[i] = at; upper[i] = Number.POSITIVE_INFINITY; }
    else if (s === LEFT) { lower[i] = 0; upper[i] = at; }
    else if (s === INTERVAL) { lower[i] = at; upper[i] = cumulativeHazardAt(fit.estimates, mu, response.upper[i]); }
  }
  return { lower, upper };
}

/**
 * F(t) averaged over the rows, (1/n) Σ_i F(t | x_i), at each time: the
 * fitted counterpart of a nonparametric estimate of the whole sample's
 * distribution (one curve for a model without terms).
 */
export function fittedDistributionCurve(fit: LifetimeFit, times: readonly number[]): number[] {
  const locations = fit.fittedLocation;
  const constant = locations.every((v) => v === locations[0]);
  return times.map((t) => {
    if (constant) return -Math.expm1(-cumulativeHazardAt(fit.estimates, locations[0], t));
    let total = 0;
    for (const mu of locations) total += -Math.expm1(-cumulativeHazardAt(fit.estimates, mu, t));
    return total / locations.length;
  });
}
