// What a fitted nonlinear candidate offers after the ranking: its checks
// (model-checks.ts) and the mean response at new rows with delta-method
// standard errors, taken to the response's original scale as for a
// least-squares model (the median, for a transformed response), so averaged
// predictions can mix linear and nonlinear models. It offers no nested-model
// capability of the linear kind (that one reads a design's column keys), but
// its sums for an extra-sum-of-squares test of a pair the caller names
// (comparison/extras/stated-nesting.ts), and no column keys: its parameters
// are not design columns to average across models.
import { twoSidedCritical } from '../../inference/coefficient-tests.ts';
import { responseScale } from '../../inference/back-transform.ts';
import { newObservationError, predictionWithIntervals, type ScaledPrediction } from '../../inference/prediction-intervals.ts';
import type { ModelCapabilities, ModelPredictions, PredictionRequest } from '../scored-model.ts';
import type { NonlinearCandidate } from './candidate.ts';
import { predictNonlinear } from './capabilities.ts';
import { nonlinearModelChecks } from './model-checks.ts';
import type { NonlinearFit } from './result.ts';

function predictions(fit: NonlinearFit, candidate: NonlinearCandidate, at: PredictionRequest): ModelPredictions {
  // The prediction rows were checked against the data (numeric, present, no nulls) before any model predicts.
  const columns = candidate.columns.map((name) => Float64Array.from(at.predict[name] as readonly number[]));
  const made = predictNonlinear(fit, candidate, columns, at.count, at.intervalLevel);
  const scale = responseScale(fit.responseTransform);
  const df = fit.residualDf;
  const scaled: ScaledPrediction[] = made.predictions.map((p, r) => ({
    location: p.estimate,
    standardError: p.standardError,
    newObservationError: newObservationError(fit.sigma, p.standardError, at.newWeights[r] ?? 1),
    df,
    scale,
  }));
  const critical = twoSidedCritical(at.intervalLevel, df);
  return {
    results: scaled.map((p) => predictionWithIntervals(p, critical)),
    scaled,
    scale: { backTransform: fit.responseTransform ? 'median' : 'none', description: scale.description },
    cautions: made.issues.map((i) => ({ code: i.code, message: i.message })),
  };
}

export function nonlinearCapabilities(fit: NonlinearFit, candidate: NonlinearCandidate): ModelCapabilities {
  return {
    checks: (rows) => nonlinearModelChecks(fit, rows),
    predict: (at) => predictions(fit, candidate, at),
    // The sample's identity is built as a linear model's is, so a linear and a nonlinear model of one response scale match.
    leastSquaresFacts: (sample) => ({
      name: fit.name, rss: fit.rss, meanParameters: fit.estimates.length, observations: fit.observations,
      sample: `${sample}|${JSON.stringify(candidate.response ?? null)}`, exactFit: fit.exactFit,
    }),
  };
}
