// Intervals for a prediction of a least-squares model at a new row x.
//   mean response:    μ̂ ± t · se,             se = σ̂ √(x'(X'WX)⁻¹x)
//   new observation:  μ̂ ± t · √(σ̂²/w₀ + se²)
// with t the (1 + L)/2 quantile of Student's t on n − p degrees of freedom
// (common practice for the Gaussian linear model). With relative weights, σ̂²
// is the variance of an observation of weight 1, so a new observation of
// weight w₀ has variance σ̂²/w₀; w₀ is 1 unless the prediction rows carry the
// weights column. Intervals are built on the model's own scale and, for a
// model of a transformed response, taken back to the scale of y
// (back-transform.ts): they then describe the median response.
import { backTransformedEnd, type ResponseScale } from './back-transform.ts';

/** One prediction on the model's own scale, with what its intervals need. */
export interface ScaledPrediction {
  /** μ̂ on the model's scale; null when the row is not estimable. */
  location: number | null;
  /** Standard error of μ̂; null when σ̂ is undefined. */
  standardError: number | null;
  /** √(σ̂²/w₀ + se²): the spread of a new observation about μ̂; null when σ̂ is undefined. */
  newObservationError: number | null;
  /** Residual degrees of freedom n − p. */
  df: number;
  scale: ResponseScale;
}

export interface PredictionWithIntervals {
  estimate: number | null;
  standardError: number | null;
  lower: number | null;
  upper: number | null;
  predictionLower: number | null;
  predictionUpper: number | null;
}

/** σ̂² / w₀ + se², square-rooted: the standard deviation of a new observation's prediction error. */
export function newObservationError(sigma: number | null, standardError: number | null, newWeight: number): number | null {
  if (sigma === null || standardError === null || !(newWeight > 0)) return null;
  return Math.sqrt((sigma * sigma) / newWeight + standardError * standardError);
}

/**
 * The prediction on the scale of y with both intervals; `critical` is the t
 * quantile for the interval level on p.df degrees of freedom (null: no interval).
 */
export function predictionWithIntervals(p: ScaledPrediction, critical: number | null): PredictionWithIntervals {
  const { location: mu, scale } = p;
  if (mu === null) {
    return { estimate: null, standardError: null, lower: null, upper: null, predictionLower: null, predictionUpper: null };
  }
  const centre = scale.fromModel(mu);
  const estimate = typeof centre === 'number' && Number.isFinite(centre) ? centre : null;
  const se = estimate !== null && p.standardError !== null ? Math.abs(scale.slope(mu)) * p.standardError : null;
  const end = (spread: number | null, sign: 1 | -1) =>
    critical === null || spread === null ? null : backTransformedEnd(scale, mu + sign * critical * spread);
  return {
    estimate,
    standardError: se !== null && Number.isFinite(se) ? se : null,
    lower: end(p.standardError, -1),
    upper: end(p.standardError, 1),
    predictionLower: end(p.newObservationError, -1),
    predictionUpper: end(p.newObservationError, 1),
  };
}
