// One candidate fitted here: design -> least squares -> likelihood -> criteria,
// with the cautions a reader needs to trust (or distrust) its numbers.
import { fitLeastSquares } from '../../fit/index.ts';
import type { DesignMatrix, LeastSquaresFit, Term } from '../../types.ts';
import type { ResponseTransformSpec } from '../response-transform.ts';
import { leastSquaresModelResult } from './least-squares-result.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../../inference/coefficient-tests.ts';
import type { ModelResult } from '../model-result.ts';

export interface FittedCandidateInput {
  name: string;
  terms: Term[];
  intercept: boolean;
  response?: ResponseTransformSpec;
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
