// What a generalised linear model fitted here offers after the ranking: the
// family's checks, predictions of the mean through the link, deviance tests
// against the other GLMs of its family and link, and its columns for
// averaging coefficients with them. One factorisation of the weighted design
// serves the checks and the predictions, made on first use.
import { twoSidedCritical } from '../../inference/coefficient-tests.ts';
import { modelGeometry, type ModelGeometry } from '../../inference/model-geometry.ts';
import { predictionWithIntervals, type ScaledPrediction } from '../../inference/prediction-intervals.ts';
import { predictionDesign } from '../../comparison/extras/prediction-rows.ts';
import { predictMeanResponse } from '../../predict.ts';
import type { Caution } from '../../scoring/cautions.ts';
import type { DesignMatrix } from '../../types.ts';
import type { ModelCapabilities, ModelPredictions, PredictionRequest } from '../scored-model.ts';
import type { GlmCandidateInput } from './candidate.ts';
import { glmModelChecks } from './model-checks.ts';
import { glmNestingOffer } from './nested-tests.ts';
import { linkResponseScale, linkScaleSign } from './prediction-scale.ts';
import type { GlmFit } from './types.ts';

export interface GlmModelContext {
  fit: GlmFit;
  design: DesignMatrix;
  candidate: GlmCandidateInput;
  /** The candidate's place in the request (paths of its issues). */
  index: number;
  /** The trials column the binomial read, or null (a 0/1 response). */
  trials: string | null;
}

/** The mean at new rows: η̂ and its standard error on the link scale, intervals there, ends mapped by the inverse link. */
export function glmModelPredictions(fit: GlmFit, design: DesignMatrix, rows: DesignMatrix, offset: ArrayLike<number> | null, intervalLevel: number, geometry?: ModelGeometry): ModelPredictions {
  const scale = linkResponseScale(fit.family, fit.link);
  const sign = linkScaleSign(fit.link);
  const mean = predictMeanResponse(fit.working.fit, design, rows, fit.working.weights, geometry);
  // The Gaussian family estimates φ from the residuals (t, as least squares); the others' intervals are large-sample (normal).
  const df = fit.family === 'gaussian' ? fit.residualDf : Number.POSITIVE_INFINITY;
  const scaled: ScaledPrediction[] = mean.predictions.map((p, r) => ({
    location: p.estimate === null ? null : sign * (p.estimate + (offset ? offset[r] : 0)),
    standardError: p.standardError,
    newObservationError: null,
    df,
    scale,
  }));
  const results = scaled.map((p) => predictionWithIntervals(p, twoSidedCritical(intervalLevel, df)));
  const cautions: Caution[] = mean.issues.map((note) => ({ code: note.code, message: note.message }));
  const outside = results.flatMap((p, r) => (p.estimate === null && scaled[r].location !== null ? [r] : []));
  if (outside.length > 0) {
    cautions.push({
      code: 'prediction_outside_response_range',
      message: `At prediction row${outside.length === 1 ? '' : 's'} ${outside.join(', ')} this model's linear predictor lies where its inverse link gives no mean inside the ${fit.family} family's range, so the prediction there is null.`,
    });
  }
  return { results, scaled, scale: { backTransform: 'inverseLink', description: scale.description }, cautions };
}

function offsetAt(at: PredictionRequest, column: string | undefined): number[] | null {
  if (column === undefined) return null;
  // checkPredictionRows has made sure the column is there, numeric and complete (it is one of the columns the candidates use).
  return at.predict[column].map((v) => v as number);
}

export function glmCapabilities({ fit, design, candidate, index, trials }: GlmModelContext): ModelCapabilities {
  let geometry: ModelGeometry | null = null;
  const geometryOnce = () => (geometry ??= modelGeometry(fit.working.fit, design, fit.working.weights));
  return {
    checks: (rows) => glmModelChecks(fit, design, { rows, grouped: trials !== null }, geometryOnce()),
    predict: (at) => {
      const built = predictionDesign(at.columns, at.rows, at.predict, at.count, candidate.terms, candidate.intercept, index);
      if ('issues' in built) return built;
      return glmModelPredictions(fit, design, built.design, offsetAt(at, candidate.offset), at.intervalLevel, geometryOnce());
    },
    // One sample: the response, weights and rows (the comparison's), and this model's trials and offset.
    nested: (sample) => glmNestingOffer({
      name: candidate.name, keys: design.keys ?? null, fit, sample: `${sample}|${JSON.stringify([trials, candidate.offset ?? null])}`,
    }),
    ...(design.keys ? { columnKeys: design.keys } : {}),
  };
}
