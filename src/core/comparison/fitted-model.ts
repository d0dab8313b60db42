// One candidate fitted here: design -> least squares -> likelihood -> criteria,
// with the cautions a reader needs to trust (or distrust) its numbers.
import { fitLeastSquares } from '../fit/index.ts';
import type { DesignMatrix, LeastSquaresFit, Term } from '../types.ts';
import type { ModelDiagnostics } from '../diagnostics/index.ts';
import type { Caution } from './cautions.ts';
import type { ResponseTransformSpec } from './response-transform.ts';
import { leastSquaresModelResult } from './least-squares-result.ts';

export interface FittedCandidateInput {
  name: string;
  terms: Term[];
  intercept: boolean;
  response?: ResponseTransformSpec;
}

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
  coefficients: { term: string; estimate: number | null; standardError: number | null }[];
  aliased: string[];
  conditionNumber: number | null;
  /** Exact leave-one-out: Σ w (e/(1−h))² from the hat matrix, and sqrt(press/Σw); null fitted elsewhere. */
  press: number | null;
  looRmse: number | null;
  /** Assumption checks; null for a model fitted elsewhere (no rows to check). */
  diagnostics: ModelDiagnostics | null;
  /** Mean-response predictions for options.predict rows; null when none were asked for. */
  predictions: { estimate: number | null; standardError: number | null }[] | null;
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
  });
  return { result, fit, design };
}
