// A model fitted from a data summary, in the same result shape as a model
// fitted on the rows (src/core/models/linear/fitted-model.ts), with the same
// likelihood, criteria and cautions. What needs the rows is reported as
// unavailable, with the reason: residuals and every residual diagnostic,
// leave-one-out (PRESS), the design's condition number.
import type { Caution } from '../scoring/cautions.ts';
import type { ModelResult } from '../models/model-result.ts';
import { leastSquaresModelResult } from '../models/linear/least-squares-result.ts';
import type { SummaryFit } from './fit.ts';
import type { DataSummary } from './types.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../inference/coefficient-tests.ts';

/** Stated on every model computed from a summary. */
export const ROWS_UNAVAILABLE_CAUTION: Caution = {
  code: 'rows_unavailable',
  message:
    'Computed from a data summary, not from rows: residuals, residual diagnostics, leave-one-out (PRESS) and the condition number need the rows and are unavailable. Coefficients come from the normal equations, which lose digits on an ill-conditioned design; the criteria agree with a fit on the rows to about 1e-9 on well-conditioned data.',
};

export function summaryModelResult(
  name: string, fit: SummaryFit, summary: DataSummary, response: string, intercept: boolean, intervalLevel: number = DEFAULT_INTERVAL_LEVEL,
): ModelResult {
  return leastSquaresModelResult({
    name,
    intercept,
    observations: fit.observations,
    rank: fit.rank,
    rss: fit.rss,
    tss: fit.tss,
    sigma: fit.sigma,
    // The normal equations' floor (summary/fit.ts exactFitFloor), not the rows' ||e|| rule.
    exactFit: fit.exactFit,
    sumLogWeights: summary.weights?.sumLog ?? 0,
    jacobian: 0,
    labels: fit.labels,
    coefficients: fit.coefficients,
    standardErrors: fit.standardErrors,
    aliased: fit.aliased,
    conditionNumber: null,
    intervalLevel,
    leadingCautions: [ROWS_UNAVAILABLE_CAUTION],
  });
}
