// One candidate fitted here: design -> least squares -> likelihood -> criteria,
// with the cautions a reader needs to trust (or distrust) its numbers.
import { fitLeastSquares } from '../fit/index.ts';
import { gaussianLogLikelihood } from '../likelihood.ts';
import { computeCriteria } from '../criteria.ts';
import type { DesignMatrix, LeastSquaresFit, Term } from '../types.ts';
import type { ModelDiagnostics } from '../diagnostics/index.ts';
import type { Caution } from './cautions.ts';
import type { ResponseTransformSpec } from './response-transform.ts';
import { criteriaFields, finiteOrNull, transformCaution } from './model-fields.ts';

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
  /** Exact leave-one-out: Σ w (e/(1−h))² from the hat matrix, and sqrt(press/n); null fitted elsewhere. */
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
  const n = fit.observations;
  const k = fit.rank + 1;
  const cautions: Caution[] = [];
  const logLikelihood = fit.exactFit
    ? null
    : gaussianLogLikelihood({ n, rss: fit.rss, sumLogWeights: weights?.sumLogWeights ?? 0, jacobian: response.jacobian });
  if (candidate.response) cautions.push(transformCaution(candidate.response));
  if (fit.exactFit) {
    cautions.push({
      code: 'exact_fit',
      message:
        'The model reproduces the response exactly (residuals at rounding level), so its Gaussian log-likelihood is unbounded; logLikelihood, AIC, AICc, BIC and HQC are null. Coefficients are still reported.',
    });
  }
  const criteria = computeCriteria({
    logLikelihood,
    parameters: k,
    observations: n,
    rss: fit.rss,
    tss: fit.tss,
    coefficientsIncludingIntercept: fit.rank,
    intercept: design.intercept,
  });
  for (const c of criteria.cautions) {
    // The exact-fit caution above already explains every null it would explain.
    if (fit.exactFit && c.code.startsWith('likelihood_undefined')) continue;
    cautions.push({ code: c.code, message: c.message });
  }
  if (fit.aliased.length > 0) {
    cautions.push({
      code: 'aliased_columns',
      message: `${fit.aliased.map((l: string) => JSON.stringify(l)).join(', ')} ${fit.aliased.length === 1 ? 'is a linear combination' : 'are linear combinations'} of earlier columns and cannot be estimated; ${fit.aliased.length === 1 ? 'its estimate is' : 'their estimates are'} null and the parameter count k = ${k} counts only the estimable coefficients plus the error variance.`,
    });
  }
  if (!design.intercept) {
    cautions.push({
      code: 'uncentred_r2',
      message: 'This model has no intercept, so R² and adjusted R² are uncentred (the total sum of squares is taken about zero) and are not comparable with the R² of models that have one.',
    });
  }
  const result: ModelResult = {
    name: candidate.name,
    source: 'fit',
    estimation: 'ml',
    intercept: design.intercept,
    parameters: k,
    observations: n,
    ...criteriaFields(logLikelihood, fit.rss, criteria),
    r2Basis: criteria.r2Basis,
    sigma: finiteOrNull(fit.sigma),
    responseTransform: candidate.response ? { ...candidate.response, jacobian: response.jacobian } : null,
    coefficients: design.labels.map((term, j) => ({
      term,
      estimate: finiteOrNull(fit.coefficients[j]),
      standardError: finiteOrNull(fit.standardErrors[j]),
    })),
    aliased: fit.aliased,
    conditionNumber: finiteOrNull(fit.conditionNumber),
    press: null,
    looRmse: null,
    diagnostics: null,
    predictions: null,
    cautions,
  };
  return { result, fit, design };
}
