// A life model's values at the request's new rows (options.predict), in the
// shape the answer carries: the location with its Wald interval, the median
// life, the percentiles asked for (options.percentiles) and the survival
// probabilities at options.survivalAt, each with its interval. The rows are
// coded exactly as the data are (prediction-rows.ts) and the numbers come
// from predictLifetime; this file only shapes them and names the problems.
import type { Issue } from '../../issues.ts';
import type { Columns, DesignMatrix, Term } from '../../types.ts';
import type { Caution } from '../../scoring/cautions.ts';
import { predictionDesign, type PredictionColumns } from '../../comparison/extras/prediction-rows.ts';
import { DISTRIBUTIONS } from './distributions.ts';
import { waldQuantile, type LifePercentile, type LifeSurvival } from './life-quantities.ts';
import { predictLifetime } from './lifetime-predict.ts';
import type { LifetimeFit } from './lifetime-result.ts';

export interface LifeRowPrediction {
  /** μ = x'β: of ln t for the distributions of positive time, of t for the others. */
  location: { estimate: number; standardError: number | null; lower: number | null; upper: number | null };
  /** The 50th percentile of life at the row, with its interval. */
  medianLife: { estimate: number; lower: number | null; upper: number | null };
  percentiles: LifePercentile[];
  survival: LifeSurvival[];
}

export interface LifePredictionRequest {
  columns: Columns;
  rows: readonly number[];
  predict: PredictionColumns;
  count: number;
  percentiles?: readonly number[];
  survivalAt?: readonly number[];
  intervalLevel: number;
}

export interface LifePredictions {
  /** One per new row; null where the row breaks a relation among aliased columns. */
  rows: (LifeRowPrediction | null)[];
  cautions: Caution[];
}

/** What `location` is on, in words for the answer. */
export function locationScaleOf(fit: LifetimeFit): 'ln t' | 't' {
  return DISTRIBUTIONS[fit.distribution].scale === 'log' ? 'ln t' : 't';
}

export function lifePredictions(
  fit: LifetimeFit,
  design: DesignMatrix,
  terms: readonly Term[],
  candidateIndex: number,
  at: LifePredictionRequest,
): LifePredictions | { issues: Issue[] } {
  const built = predictionDesign(at.columns, at.rows, at.predict, at.count, terms, true, candidateIndex);
  if ('issues' in built) return built;
  // The median is always given, so ask for it alongside the caller's percentiles.
  const asked = at.percentiles ?? [];
  const out = predictLifetime(fit, design, built.design, {
    percentiles: [...asked, 0.5], survivalAt: at.survivalAt, intervalLevel: at.intervalLevel,
  });
  // The rows are coded with the data's, so their columns always match; were
  // they ever not to, every row is null and the caution says why.
  const predictions = out.predictions.length === at.count ? out.predictions : new Array(at.count).fill(null);
  const q = waldQuantile(at.intervalLevel);
  const rows = predictions.map((p): LifeRowPrediction | null => {
    if (p === null) return null;
    const { estimate, standardError: se } = p.location;
    const median = p.percentiles[p.percentiles.length - 1];
    return {
      location: { estimate, standardError: se, lower: se === null ? null : estimate - q * se, upper: se === null ? null : estimate + q * se },
      medianLife: { estimate: median.estimate, lower: median.lower, upper: median.upper },
      percentiles: p.percentiles.slice(0, asked.length),
      survival: p.survival,
    };
  });
  const cautions = out.issues.map((i) => ({ code: 'life_prediction_not_estimable', message: `${i.message} (${Object.entries(i.facts).map(([k, v]) => `${k}: ${v}`).join('; ')})` }));
  return { rows, cautions };
}
