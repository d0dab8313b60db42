// One candidate fitted here: design -> least squares -> likelihood -> criteria,
// with the cautions a reader needs to trust (or distrust) its numbers.
import { fitLeastSquares } from '../fit/index.ts';
import type { DesignMatrix, LeastSquaresFit, Term } from '../types.ts';
import type { ModelDiagnostics } from '../diagnostics/index.ts';
import type { Caution } from '../scoring/cautions.ts';
import type { ResponseTransformSpec } from './response-transform.ts';
import { leastSquaresModelResult } from './least-squares-result.ts';
import { DEFAULT_INTERVAL_LEVEL, type CoefficientTest } from '../inference/coefficient-tests.ts';
import type { PredictionWithIntervals } from '../inference/prediction-intervals.ts';
import type { PredictionScale } from './extras/model-predictions.ts';

export interface FittedCandidateInput {
  name: string;
  terms: Term[];
  intercept: boolean;
  response?: ResponseTransformSpec;
}

/** A coefficient with its t test and confidence interval (null where they do not exist). */
export type CoefficientResult = { term: string; estimate: number | null; standardError: number | null } & CoefficientTest;

export interface ModelResult {
  name: string;
  source: 'fit' | 'residuals' | 'rss' | 'logLikelihood';
  estimation: 'ml' | 'reml';
  /** Null for a model fitted elsewhere: the service cannot know. */
  intercept: boolean | null;
  parameters: number;
  observations: number;
  logLikelihood: number | null;
  aic: number | null;
  aicc: number | null;
  bic: number | null;
  hqc: number | null;
  rss: number | null;
  r2: number | null;
  adjustedR2: number | null;
  r2Basis: 'centred' | 'uncentred' | null;
  sigma: number | null;
  responseTransform: (ResponseTransformSpec & { jacobian: number }) | null;
  coefficients: CoefficientResult[];
  aliased: string[];
  conditionNumber: number | null;
  /** Exact leave-one-out: Σ w (e/(1−h))² from the hat matrix, and sqrt(press/Σw); null fitted elsewhere. */
  press: number | null;
  looRmse: number | null;
  /** Assumption checks; null for a model fitted elsewhere (no rows to check). */
  diagnostics: ModelDiagnostics | null;
  /** Predictions at the options.predict rows on the response's original scale, with intervals; null when none were asked for. */
  predictions: PredictionWithIntervals[] | null;
  /** How the predictions relate to the response as sent (back-transformed for a transformed response); null without predictions. */
  predictionScale: PredictionScale | null;
  cautions: Caution[];
}


export interface FittedModel {
  result: ModelResult;
  fit: LeastSquaresFit;
  design: DesignMatrix;
}

/**
 * `response` is the response on the candidate's own scale (transformed when the
 * candidate says so) with the Jacobian that brings its likelihood back to the
 * scale of the data's response.
 */
export function fitCandidate(
  candidate: FittedCandidateInput,
  design: DesignMatrix,
  response: { values: Float64Array; jacobian: number },
  weights: { values: Float64Array; sumLogWeights: number } | null,
  intervalLevel: number = DEFAULT_INTERVAL_LEVEL,
): FittedModel {
  const fit = fitLeastSquares(design, response.values, weights?.values);
  const result = leastSquaresModelResult({
    name: candidate.name,
    intercept: design.intercept,
    observations: fit.observations,
    rank: fit.rank,
    rss: fit.rss,
    tss: fit.tss,
    sigma: fit.sigma,
    exactFit: fit.exactFit,
    sumLogWeights: weights?.sumLogWeights ?? 0,
    transform: candidate.response,
    jacobian: response.jacobian,
    labels: design.labels,
    coefficients: fit.coefficients,
    standardErrors: fit.standardErrors,
    aliased: fit.aliased,
    conditionNumber: fit.conditionNumber,
    intervalLevel,
  });
  return { result, fit, design };
}
