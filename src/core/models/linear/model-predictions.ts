// One fitted model's predictions at the prediction rows: the mean response on
// the model's own scale (predict.ts), its intervals, and — for a model of a
// transformed response — all of it taken back to the response's original
// scale as the median (inference/back-transform.ts), marked on the model.
import { predictMeanResponse } from '../../predict.ts';
import type { ModelGeometry } from '../../inference/model-geometry.ts';
import { twoSidedCritical } from '../../inference/coefficient-tests.ts';
import { responseScale } from '../../inference/back-transform.ts';
import {
  newObservationError,
  predictionWithIntervals,
  type PredictionWithIntervals,
  type ScaledPrediction,
} from '../../inference/prediction-intervals.ts';
import type { DesignMatrix } from '../../types.ts';
import type { Caution } from '../../scoring/cautions.ts';
import type { FittedModel } from './fitted-model.ts';
import type { ModelPredictions } from '../scored-model.ts';

export function modelPredictions(
  model: FittedModel,
  rows: DesignMatrix,
  weights: Float64Array | undefined,
  newWeights: readonly number[],
  intervalLevel: number,
  geometry: ModelGeometry,
): ModelPredictions {
  const { fit } = model;
  const spec = model.result.responseTransform;
  const scale = responseScale(spec);
  const mean = predictMeanResponse(fit, model.design, rows, weights, geometry);
  const df = fit.observations - fit.rank;
  const critical = twoSidedCritical(intervalLevel, df);
  const scaled: ScaledPrediction[] = mean.predictions.map((p, r) => ({
    location: p.estimate,
    standardError: p.standardError,
    newObservationError: newObservationError(fit.sigma, p.standardError, newWeights[r] ?? 1),
    df,
    scale,
  }));
  const results = scaled.map((p) => predictionWithIntervals(p, critical));
  const cautions: Caution[] = mean.issues.map((note) => ({ code: note.code, message: note.message }));
  const outside = results.flatMap((p, r) => (p.estimate === null && scaled[r].location !== null ? [r] : []));
  if (outside.length > 0) {
    cautions.push({
      code: 'prediction_outside_response_range',
      message: `At prediction row${outside.length === 1 ? '' : 's'} ${outside.join(', ')} this model's transformed-scale prediction lies outside what the transform can take back to the response, so the prediction there is null.`,
    });
  }
  return {
    results,
    scaled,
    scale: { backTransform: spec ? 'median' : 'none', description: scale.description },
    cautions,
  };
}
