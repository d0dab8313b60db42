// A model fitted from a data summary, in the same result shape as a model
// fitted on the rows (src/core/comparison/fitted-model.ts), with the same
// likelihood, criteria and cautions. What needs the rows is reported as
// unavailable, with the reason: residuals and every residual diagnostic,
// leave-one-out (PRESS), the design's condition number.
import { computeCriteria } from '../criteria.ts';
import { gaussianLogLikelihood } from '../likelihood.ts';
import { isExactFit } from '../fit/exact-fit.ts';
import type { Caution } from '../comparison/cautions.ts';
import type { ModelResult } from '../comparison/fitted-model.ts';
import { criteriaFields, finiteOrNull } from '../comparison/model-fields.ts';
import type { SummaryFit } from './fit.ts';
import type { DataSummary } from './types.ts';

/** Stated on every model computed from a summary. */
export const ROWS_UNAVAILABLE_CAUTION: Caution = {
  code: 'rows_unavailable',
  message:
    'Computed from a data summary, not from rows: residuals, residual diagnostics, leave-one-out (PRESS) and the condition number need the rows and are unavailable. Coefficients come from the normal equations, which lose digits on an ill-conditioned design; the criteria agree with a fit on the rows to about 1e-9 on well-conditioned data.',
};

/** The response's raw sum of squares Σ w y² = C_yy + W ȳ², the scale of an exact fit. */
function responseSquares(summary: DataSummary, response: string): number {
  const j = summary.columns.indexOf(response);
  const w = summary.weights ? summary.weights.sum : summary.rows;
  return summary.centredCrossProducts[j][j] + w * summary.means[j] ** 2;
}

export function summaryModelResult(name: string, fit: SummaryFit, summary: DataSummary, response: string, intercept: boolean): ModelResult {
  const n = fit.observations;
  const k = fit.rank + 1;
  const exactFit = isExactFit(Math.sqrt(fit.rss), Math.sqrt(responseSquares(summary, response)));
  const logLikelihood = exactFit ? null : gaussianLogLikelihood({ n, rss: fit.rss, sumLogWeights: summary.weights?.sumLog ?? 0 });
  const criteria = computeCriteria({
    logLikelihood,
    parameters: k,
    observations: n,
    rss: fit.rss,
    tss: fit.tss,
    coefficientsIncludingIntercept: fit.rank,
    intercept,
  });
  const cautions: Caution[] = [ROWS_UNAVAILABLE_CAUTION];
  if (exactFit) {
    cautions.push({
      code: 'exact_fit',
      message:
        'The model reproduces the response exactly (residual sum of squares at rounding level), so its Gaussian log-likelihood is unbounded; logLikelihood, AIC, AICc, BIC and HQC are null. Coefficients are still reported.',
    });
  }
  for (const c of criteria.cautions) {
    if (exactFit && c.code.startsWith('likelihood_undefined')) continue;
    cautions.push({ code: c.code, message: c.message });
  }
  if (fit.aliased.length > 0) {
    cautions.push({
      code: 'aliased_columns',
      message: `${fit.aliased.map((l) => JSON.stringify(l)).join(', ')} ${fit.aliased.length === 1 ? 'is a linear combination' : 'are linear combinations'} of earlier columns and cannot be estimated; the parameter count k = ${k} counts only the estimable coefficients plus the error variance.`,
    });
  }
  if (!intercept) {
    cautions.push({
      code: 'uncentred_r2',
      message: 'This model has no intercept, so R² and adjusted R² are uncentred (the total sum of squares is taken about zero) and are not comparable with the R² of models that have one.',
    });
  }
  return {
    name,
    source: 'fit',
    estimation: 'ml',
    intercept,
    parameters: k,
    observations: n,
    ...criteriaFields(logLikelihood, fit.rss, criteria),
    r2Basis: criteria.r2Basis,
    sigma: finiteOrNull(fit.sigma),
    responseTransform: null,
    coefficients: fit.labels.map((term, j) => ({
      term,
      estimate: finiteOrNull(fit.coefficients[j]),
      standardError: finiteOrNull(fit.standardErrors[j]),
    })),
    aliased: fit.aliased,
    conditionNumber: null,
    press: null,
    looRmse: null,
    diagnostics: null,
    predictions: null,
    cautions,
  };
}
