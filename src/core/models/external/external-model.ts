// Candidates fitted elsewhere, scored by the one convention: residuals or an
// RSS become the full Gaussian log-likelihood computed here; a stated
// log-likelihood is taken as it is (the caller vouches for its constants). A
// stated response transform adds the Jacobian from the data's response column.
import { gaussianLogLikelihood, residualSumOfSquares } from '../../likelihood.ts';
import { computeCriteria } from '../../scoring/criteria.ts';
import { centredTotalSumOfSquares } from '../../sums-of-squares.ts';
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import type { ModelResult } from '../model-result.ts';
import type { ScoringContext } from '../scoring-context.ts';
import { transformResponse, type ResponseTransformSpec } from '../response-transform.ts';
import type { Caution } from '../../scoring/cautions.ts';
import { criteriaFields, NO_RESIDUAL_FIELDS, transformCaution } from '../model-fields.ts';
import { alignToUsedRows } from '../aligned-rows.ts';

export type ExternalCandidateInput =
  | { form: 'residuals'; name: string; residuals: (number | null)[]; parameters: number; response?: ResponseTransformSpec }
  | { form: 'rss'; name: string; rss: number; parameters: number; observations: number; response?: ResponseTransformSpec }
  | {
      form: 'logLikelihood'; name: string; logLikelihood: number; parameters: number; observations: number;
      estimation: 'ml' | 'reml'; fixedEffects?: string[]; response?: ResponseTransformSpec;
    };

/** Residuals lined up with the used rows, or the issue saying how they are not. */
function alignedResiduals(values: (number | null)[], ctx: ScoringContext, at: IssuePath): Float64Array | Issue {
  const path = [...at, 'residuals'];
  const aligned = alignToUsedRows(values, ctx);
  if (aligned instanceof Float64Array) return aligned;
  if (aligned.problem === 'missing') return issue('residual_missing', [...path, aligned.index], { row: aligned.row });
  if (aligned.problem === 'atDropped') {
    return issue('residual_at_dropped_row', [...path, aligned.row], { row: aligned.row, rows: aligned.rows, count: aligned.count });
  }
  return issue('residuals_count_mismatch', path, { residuals: values.length, rows: ctx.n, dataRows: ctx.dataRows ?? ctx.n });
}

export function scoreExternalCandidate(
  candidate: ExternalCandidateInput,
  at: IssuePath,
  ctx: ScoringContext,
): { result: ModelResult } | { issues: Issue[] } {
  const cautions: Caution[] = [];
  if ('observations' in candidate && candidate.observations !== ctx.n) {
    return { issues: [issue('observations_mismatch', [...at, 'observations'], { observations: candidate.observations, expected: ctx.n, against: ctx.nSource })] };
  }
  let jacobian = 0;
  let yScale: Float64Array | null = ctx.y;
  if (candidate.response) {
    if (!ctx.y || !ctx.rows) return { issues: [issue('data_required', [...at, 'response'], { form: 'a response transform' })] };
    const t = transformResponse(ctx.y, ctx.rows, candidate.response, [...at, 'response']);
    if ('issues' in t) return t;
    jacobian = t.jacobian;
    yScale = t.values;
    cautions.push(transformCaution(candidate.response));
  }

  let rss: number | null = null;
  if (candidate.form === 'residuals') {
    const e = alignedResiduals(candidate.residuals, ctx, at);
    if (!(e instanceof Float64Array)) return { issues: [e] };
    rss = residualSumOfSquares(e, ctx.weights?.values);
  } else if (candidate.form === 'rss') {
    rss = candidate.rss;
  }

  const n = ctx.n;
  const k = candidate.parameters;
  let logLikelihood: number | null;
  if (candidate.form === 'logLikelihood') {
    logLikelihood = candidate.logLikelihood + jacobian;
  } else {
    logLikelihood = gaussianLogLikelihood({ n, rss: rss!, sumLogWeights: ctx.weights?.sumLogWeights ?? 0, jacobian });
  }
  // R² needs the response: taken about its (weighted) mean, as for a model with
  // an intercept, with p = k − 1 coefficients (stated in the conventions).
  const tss = rss !== null && yScale ? centredTotalSumOfSquares(yScale, ctx.weights?.values) : null;
  const criteria = computeCriteria({
    logLikelihood,
    parameters: k,
    observations: n,
    rss,
    tss,
    coefficientsIncludingIntercept: k - 1,
    intercept: true,
  });
  for (const c of criteria.cautions) cautions.push({ code: c.code, message: c.message });
  const residualDf = n - (k - 1);
  return {
    result: {
      name: candidate.name,
      source: candidate.form,
      estimation: candidate.form === 'logLikelihood' ? candidate.estimation : 'ml',
      intercept: null,
      parameters: k,
      observations: n,
      ...criteriaFields(logLikelihood, rss, criteria),
      r2Basis: tss === null ? null : 'centred',
      sigma: rss !== null && residualDf > 0 ? Math.sqrt(rss / residualDf) : null,
      responseTransform: candidate.response ? { ...candidate.response, jacobian } : null,
      coefficients: [],
      aliased: [],
      ...NO_RESIDUAL_FIELDS,
      cautions,
    },
  };
}
