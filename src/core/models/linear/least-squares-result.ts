// The result of one least-squares model, whether it was solved from the rows
// (fitted-model.ts) or from a data summary (summary/summary-model.ts): the
// likelihood by the one convention, every criterion, and the cautions a reader
// needs — so both paths say the same things in the same words.
import { gaussianLogLikelihood } from '../../likelihood.ts';
import { computeCriteria } from '../../scoring/criteria.ts';
import type { Caution } from '../../scoring/cautions.ts';
import type { ModelResult } from '../model-result.ts';
import type { ResponseTransformSpec } from '../response-transform.ts';
import { criteriaFields, finiteOrNull, NOT_CHECKED, transformCaution } from '../model-fields.ts';
import { coefficientTest, twoSidedCritical } from '../../inference/coefficient-tests.ts';

export interface LeastSquaresFacts {
  name: string;
  intercept: boolean;
  observations: number;
  rank: number;
  /** Σ w e² and the (weighted) TSS, centred with an intercept, about 0 without. */
  rss: number;
  tss: number;
  sigma: number | null;
  exactFit: boolean;
  sumLogWeights: number;
  /** The response transform the model describes and its log-Jacobian (0 without). */
  transform?: ResponseTransformSpec;
  jacobian: number;
  labels: readonly string[];
  coefficients: readonly (number | null)[];
  standardErrors: readonly (number | null)[];
  aliased: string[];
  conditionNumber: number | null;
  /** Confidence level of the coefficients' intervals. */
  intervalLevel: number;
  /** Cautions that come first, e.g. that the model was solved from a summary. */
  leadingCautions?: Caution[];
}

export function leastSquaresModelResult(f: LeastSquaresFacts): ModelResult {
  const n = f.observations;
  const k = f.rank + 1;
  // t on n − p degrees of freedom, p the rank (the estimable coefficients).
  const residualDf = n - f.rank;
  const critical = twoSidedCritical(f.intervalLevel, residualDf);
  const cautions: Caution[] = [...(f.leadingCautions ?? [])];
  const logLikelihood = f.exactFit
    ? null
    : gaussianLogLikelihood({ n, rss: f.rss, sumLogWeights: f.sumLogWeights, jacobian: f.jacobian });
  if (f.transform) cautions.push(transformCaution(f.transform));
  if (f.exactFit) {
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
    rss: f.rss,
    tss: f.tss,
    coefficientsIncludingIntercept: f.rank,
    intercept: f.intercept,
  });
  for (const c of criteria.cautions) {
    // The exact-fit caution above already explains every null it would explain.
    if (f.exactFit && c.code.startsWith('likelihood_undefined')) continue;
    cautions.push({ code: c.code, message: c.message });
  }
  if (f.aliased.length > 0) {
    const one = f.aliased.length === 1;
    cautions.push({
      code: 'aliased_columns',
      message: `${f.aliased.map((l) => JSON.stringify(l)).join(', ')} ${one ? 'is a linear combination' : 'are linear combinations'} of earlier columns and cannot be estimated; ${one ? 'its estimate is' : 'their estimates are'} null and the parameter count k = ${k} counts only the estimable coefficients plus the error variance.`,
    });
  }
  if (!f.intercept) {
    cautions.push({
      code: 'uncentred_r2',
      message: 'This model has no intercept, so R² and adjusted R² are uncentred (the total sum of squares is taken about zero) and are not comparable with the R² of models that have one.',
    });
  }
  return {
    name: f.name,
    source: 'fit',
    estimation: 'ml',
    intercept: f.intercept,
    parameters: k,
    observations: n,
    ...criteriaFields(logLikelihood, f.rss, criteria),
    r2Basis: criteria.r2Basis,
    sigma: finiteOrNull(f.sigma),
    responseTransform: f.transform ? { ...f.transform, jacobian: f.jacobian } : null,
    coefficients: f.labels.map((term, j) => {
      const estimate = finiteOrNull(f.coefficients[j]);
      const standardError = finiteOrNull(f.standardErrors[j]);
      return { term, estimate, standardError, ...coefficientTest(estimate, standardError, residualDf, critical) };
    }),
    aliased: f.aliased,
    conditionNumber: finiteOrNull(f.conditionNumber),
    ...NOT_CHECKED,
    cautions,
  };
}
