// A fitted lifetime candidate as a model of the comparison: its report in
// the shape every model shares (criteria from the full likelihood on the time
// scale; no RSS, R², leave-one-out or residual checks, which assume the
// response is observed) plus the fields of a life model.
import { computeCriteria } from '../../scoring/criteria.ts';
import type { CoefficientResult, ModelResult } from '../model-result.ts';
import { criteriaFields, NO_RESIDUAL_FIELDS } from '../model-fields.ts';
import type { LifetimeFit } from './lifetime-result.ts';
import { waldQuantile } from './life-quantities.ts';
import { normalLogSurvival } from './normal-tail.ts';

/**
 * The Wald test and interval of a coefficient from its observed-information
 * standard error: z = b/se against the standard normal, b ± z_{(1+L)/2} se
 * (common practice for maximum-likelihood estimates; survreg reports the
 * same z and p). Not Student's t: there is no residual variance to estimate.
 */
function waldCoefficient(c: LifetimeFit['coefficients'][number], q: number): CoefficientResult {
  const { term, estimate, standardError: se } = c;
  if (estimate === null || se === null || !(se > 0)) {
    return { term, estimate, standardError: se, tStatistic: null, pValue: null, lower: null, upper: null };
  }
  const z = estimate / se;
  return {
    term, estimate, standardError: se,
    tStatistic: z,
    pValue: Math.min(1, 2 * Math.exp(normalLogSurvival(Math.abs(z)))),
    lower: estimate - q * se,
    upper: estimate + q * se,
  };
}

export function lifetimeReport(fit: LifetimeFit): ModelResult {
  const criteria = computeCriteria({
    logLikelihood: fit.logLikelihood,
    parameters: fit.parameters,
    observations: fit.observations,
    rss: null,
    tss: null,
    coefficientsIncludingIntercept: null,
    intercept: true,
  });
  const q = waldQuantile(fit.intervalLevel);
  return {
    name: fit.name,
    source: 'lifetime',
    estimation: 'ml',
    intercept: true,
    parameters: fit.parameters,
    observations: fit.observations,
    ...criteriaFields(fit.logLikelihood, null, criteria),
    r2Basis: null,
    sigma: null,
    responseTransform: null,
    coefficients: fit.coefficients.map((c) => waldCoefficient(c, q)),
    aliased: fit.aliased,
    // Censored times have no residuals: no leave-one-out, residual checks or predictions yet.
    ...NO_RESIDUAL_FIELDS,
    cautions: criteria.cautions.map((c) => ({ code: c.code, message: c.message })),
    distribution: fit.distribution,
    distributionParameters: fit.distributionParameters,
    convergence: fit.convergence,
    percentiles: fit.percentiles,
    survival: fit.survival,
    logLikelihoodLogTime: fit.logLikelihoodLogTime,
    censoring: fit.censoring,
  };
}
