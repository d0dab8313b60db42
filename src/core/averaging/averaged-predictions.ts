// Model-averaged predictions at new rows, over every model that can predict,
// on the scale of the response as sent. Each model's prediction is first
// taken to that scale (a model of log y predicts the median exp(μ̂); see
// inference/back-transform.ts), so every model speaks of the same quantity,
// the median response (for a model of y itself, mean and median coincide).
//
// - estimate: Σ wᵢ ŷᵢ, weights renormalised over the predicting models;
// - standardError: the unconditional standard error of Burnham & Anderson
//   (2002), from each model's delta-method standard error;
// - lower/upper: the model-averaged tail-area (MATA) Wald interval of Turek
//   & Fletcher (2012, Computational Statistics & Data Analysis 56, 2809–2815;
//   citation from memory): the bound b solves Σ wᵢ Gᵢ(b) = α/2 (lower) or
//   1 − α/2 (upper), where Gᵢ(b) = T_dfᵢ((gᵢ(b) − μ̂ᵢ)/seᵢ) is the probability
//   model i's Wald pivot puts below b, built on the model's own scale gᵢ
//   (so a model of log y keeps its asymmetric interval). With one model it
//   is that model's own interval exactly.
// - predictionLower/predictionUpper: the same equation with each model's
//   new-observation spread: the central interval of the weighted mixture of
//   the models' predictive distributions.
import { tCdf, tPdf } from '../inference/distributions.ts';
import { twoSidedCritical } from '../inference/coefficient-tests.ts';
import { predictionWithIntervals, type PredictionWithIntervals, type ScaledPrediction } from '../inference/prediction-intervals.ts';
import type { StatisticsIssue } from '../inference/issue.ts';
import { averageWithUnconditionalSe, type UnconditionalSeEstimator } from './unconditional-se.ts';

export interface PredictingModel {
  name: string;
  /** Criterion weight (any positive scale; renormalised here). */
  weight: number;
  predictions: readonly ScaledPrediction[];
}

export type AveragedPrediction = PredictionWithIntervals;

const NULL_PREDICTION: AveragedPrediction = { estimate: null, standardError: null, lower: null, upper: null, predictionLower: null, predictionUpper: null };

interface Component {
  weight: number;
  p: ScaledPrediction;
  onY: PredictionWithIntervals;
}

/** Σ wᵢ Gᵢ(b) and its derivative in b, with `spread` choosing the mean or the new-observation spread. */
function mixtureCdf(parts: readonly Component[], b: number, spread: (p: ScaledPrediction) => number): { value: number; slope: number } {
  let value = 0;
  let slope = 0;
  for (const { weight, p } of parts) {
    const s = spread(p);
    const z = (p.scale.toModel(b) - (p.location as number)) / s;
    // A zero spread is a point mass: below it 0, at or above it 1.
    if (Number.isNaN(z)) {
      value += weight;
      continue;
    }
    value += weight * tCdf(z, p.df);
    if (Number.isFinite(z) && s > 0) slope += (weight * tPdf(z, p.df) * p.scale.toModelSlope(b)) / s;
  }
  return { value, slope };
}

/**
 * The smallest b with Σ wᵢ Gᵢ(b) ≥ target: Newton's method on the mixture's
 * distribution function (its density is the derivative), kept inside a
 * bracket that always holds the root and bisected whenever a Newton step
 * would leave it — quadratic convergence in a handful of evaluations, never
 * worse than bisection. The bracket starts from the models' own interval
 * ends (the mixture's bound lies between the smallest and the largest of
 * them) and is widened when a range edge (y ≥ 0 under a log model) makes a
 * component jump. Null when no finite b reaches the target.
 */
function mixtureQuantile(parts: readonly Component[], target: number, ends: readonly number[], spread: (p: ScaledPrediction) => number): number | null {
  let lo = Math.min(...ends);
  let hi = Math.max(...ends);
  const at = (b: number) => mixtureCdf(parts, b, spread);
  // Every end is a model's own quantile unless a bounded back-transform cut it
  // at the edge of y's range; only then can the bracket miss and need widening.
  if (parts.some((c) => c.p.scale.bounded)) {
    for (let k = 0; at(lo).value >= target; k++) {
      if (k === 64) return null;
      lo -= (hi - lo + Math.abs(lo) + 1) * 2 ** k;
    }
    for (let k = 0; at(hi).value < target; k++) {
      if (k === 64) return null;
      hi += (hi - lo + Math.abs(hi) + 1) * 2 ** k;
    }
  }
  // Start from the weighted mean of the models' own ends.
  let b = parts.reduce((s, c, i) => s + c.weight * ends[i], 0);
  if (!(b > lo && b < hi)) b = lo + (hi - lo) / 2;
  for (let i = 0; i < 200; i++) {
    const { value, slope } = at(b);
    if (value >= target) hi = b;
    else lo = b;
    let next = slope > 0 ? b - (value - target) / slope : Number.NaN;
    if (!(next > lo && next < hi)) next = lo + (hi - lo) / 2;
    if (next <= lo || next >= hi || Math.abs(next - b) <= 4 * Number.EPSILON * Math.abs(b)) {
      b = next;
      break;
    }
    b = next;
  }
  return Number.isFinite(b) ? b : null;
}

/** Normalised weight below which a model cannot move an averaged bound (see averagedRow). */
const NEGLIGIBLE_WEIGHT = 1e-18;

/** Which interval end of a model's own prediction brackets which averaged bound. */
const END_FIELD = {
  standardError: { lower: 'lower', upper: 'upper' },
  newObservationError: { lower: 'predictionLower', upper: 'predictionUpper' },
} as const;

function averagedRow(parts: readonly Component[], level: number, estimator: UnconditionalSeEstimator): AveragedPrediction {
  if (parts.some((c) => c.onY.estimate === null)) return NULL_PREDICTION;
  const average = averageWithUnconditionalSe(
    parts.map((c) => ({ weight: c.weight, estimate: c.onY.estimate as number, standardError: c.onY.standardError })),
    estimator,
  );
  if (!average) return NULL_PREDICTION;
  const alpha = 1 - level;
  // A model whose weight is below 1e-18 moves Σ wᵢ Gᵢ by less than the rounding
  // of a double near α/2, so it cannot move a bound: the bounds are solved
  // without it (it stays in the estimate and its standard error).
  const bounding = parts.filter((c) => c.weight > NEGLIGIBLE_WEIGHT);
  const bound = (spread: 'standardError' | 'newObservationError', end: 'lower' | 'upper', target: number): number | null => {
    if (bounding.some((c) => c.p[spread] === null)) return null;
    const ends = bounding.map((c) => c.onY[END_FIELD[spread][end]]);
    if (ends.some((e) => e === null)) return null;
    return mixtureQuantile(bounding, target, ends as number[], (p) => p[spread] as number);
  };
  return {
    estimate: average.estimate,
    standardError: average.unconditionalStandardError,
    lower: bound('standardError', 'lower', alpha / 2),
    upper: bound('standardError', 'upper', 1 - alpha / 2),
    predictionLower: bound('newObservationError', 'lower', alpha / 2),
    predictionUpper: bound('newObservationError', 'upper', 1 - alpha / 2),
  };
}

export function averagePredictions(
  models: readonly PredictingModel[],
  level: number,
  estimator: UnconditionalSeEstimator = 'eq6.12',
): { predictions: AveragedPrediction[]; issues: StatisticsIssue[] } {
  const issues: StatisticsIssue[] = [];
  const rows = models[0]?.predictions.length ?? 0;
  const total = models.reduce((s, m) => s + (m.weight > 0 ? m.weight : 0), 0);
  if (rows === 0 || !(total > 0)) return { predictions: [], issues };
  const criticals = models.map((m) => m.predictions.map((p) => twoSidedCritical(level, p.df)));
  const predictions: AveragedPrediction[] = [];
  for (let r = 0; r < rows; r++) {
    const parts: Component[] = [];
    models.forEach((m, i) => {
      if (!(m.weight > 0)) return;
      const p = m.predictions[r];
      parts.push({ weight: m.weight / total, p, onY: predictionWithIntervals(p, criticals[i][r]) });
    });
    predictions.push(averagedRow(parts, level, estimator));
  }
  const missing = predictions.flatMap((p, r) => (p.estimate === null ? [r] : []));
  if (missing.length > 0) {
    issues.push({
      code: 'averaging-prediction-missing',
      message: `A model with positive weight could not predict row${missing.length === 1 ? '' : 's'} ${missing.join(', ')} on the scale of the response (a row its aliased columns cannot reach, or a back-transform outside the response's range), so the averaged prediction there is null.`,
      facts: { rows: missing.join(', ') },
    });
  }
  return { predictions, issues };
}
