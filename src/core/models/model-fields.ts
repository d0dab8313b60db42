// Pieces of a model's result shared by models fitted here and elsewhere.
import type { CriteriaValues } from '../scoring/criteria.ts';
import type { Caution } from '../scoring/cautions.ts';
import { transformLabel, type ResponseTransformSpec } from './response-transform.ts';

export const finiteOrNull = (x: number | null | undefined): number | null =>
  typeof x === 'number' && Number.isFinite(x) ? x : null;

/** The after-ranking fields before any check or prediction fills them (src/core/comparison/extras). */
export const NOT_CHECKED = { press: null, looRmse: null, diagnostics: null, predictions: null, predictionScale: null } as const;

export function criteriaFields(logLikelihood: number | null, rss: number | null, criteria: CriteriaValues) {
  return {
    logLikelihood: finiteOrNull(logLikelihood),
    aic: finiteOrNull(criteria.aic),
    aicc: finiteOrNull(criteria.aicc),
    bic: finiteOrNull(criteria.bic),
    hqc: finiteOrNull(criteria.hqc),
    rss: finiteOrNull(rss),
    r2: finiteOrNull(criteria.r2),
    adjustedR2: finiteOrNull(criteria.adjustedR2),
  };
}

export function transformCaution(spec: ResponseTransformSpec): Caution {
  return {
    code: 'transformed_response',
    message: `This model describes ${transformLabel(spec)}(response); its log-likelihood includes the Jacobian, so AIC, AICc, BIC and HQC are on the scale of the response and comparable with the other models, but its RSS, R² and adjusted R² are on the transformed scale and are not.`,
  };
}

/** The report fields that need the rows' residuals (leave-one-out, checks, predictions), for a model that has none. */
export const NO_RESIDUAL_FIELDS = { conditionNumber: null, ...NOT_CHECKED } as const;
