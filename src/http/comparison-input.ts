// The validated request body as the core's input. Columns go into an object
// without a prototype, so a term naming "toString" or "constructor" finds no
// inherited property where the caller has no column.
import { compareModels, type ComparisonInput, type CandidateInput } from '../core/compare.ts';
import { compareFromSummary } from '../core/comparison/from-summary.ts';
import type { Columns } from '../core/types.ts';
import type { ActivePolicy } from '../policy-file.ts';
import type { ComparisonRequest } from './schemas/comparison-request.ts';

export function ownColumns(columns: Record<string, ReadonlyArray<number | string | null>>): Columns {
  const own: Record<string, ReadonlyArray<number | string | null>> = Object.create(null);
  for (const [name, values] of Object.entries(columns)) own[name] = values;
  return own;
}

type RequestCandidate = ComparisonRequest['candidates'][number];

/** True for a fitted candidate that is least squares as before: no family other than gaussian, no link other than identity, no offset. */
const isLeastSquares = (c: { family?: string; link?: string; offset?: string }) =>
  (c.family ?? 'gaussian') === 'gaussian' && (c.link ?? 'identity') === 'identity' && c.offset === undefined;

function candidateInput(c: RequestCandidate, trials: string | undefined): CandidateInput {
  if ('distribution' in c) return { form: 'lifetime', name: c.name, distribution: c.distribution, terms: c.terms };
  if ('terms' in c) {
    if (isLeastSquares(c)) return { form: 'fit', name: c.name, terms: c.terms, intercept: c.intercept, response: c.response };
    return { form: 'glm', name: c.name, terms: c.terms, intercept: c.intercept, family: c.family ?? 'gaussian', link: c.link, offset: c.offset, trials };
  }
  if ('fitted' in c) {
    return {
      form: 'fitted', name: c.name, family: c.family, fitted: c.fitted, parameters: c.parameters,
      theta: c.theta, shape: c.shape, dispersion: c.dispersion, trials,
    };
  }
  if ('residuals' in c) return { form: 'residuals', name: c.name, residuals: c.residuals, parameters: c.parameters, response: c.response };
  if ('expression' in c) return { form: 'expression', name: c.name, expression: c.expression, start: c.start, starts: c.starts, bounds: c.bounds, response: c.response };
  if ('rss' in c) return { form: 'rss', name: c.name, rss: c.rss, parameters: c.parameters, observations: c.observations, response: c.response };
  return {
    form: 'logLikelihood', name: c.name, logLikelihood: c.logLikelihood, parameters: c.parameters,
    observations: c.observations, estimation: c.estimation, fixedEffects: c.fixedEffects, response: c.response,
  };
}

export function toComparisonInput(body: ComparisonRequest, policy: ActivePolicy): ComparisonInput {
  return {
    columns: body.data && 'columns' in body.data ? ownColumns(body.data.columns) : null,
    response: body.response ?? null,
    weights: body.weights ?? null,
    candidates: body.candidates.map((c) => candidateInput(c, body.trials)),
    rankBy: body.options.rankBy ?? body.rankBy,
    rankByPath: body.options.rankBy === undefined && body.rankBy !== undefined ? ['rankBy'] : ['options', 'rankBy'],
    confidenceLevel: body.options.confidenceLevel,
    intervalLevel: body.options.intervalLevel,
    expectedFingerprint: body.datasetFingerprint,
    trials: body.trials ?? null,
    censoring: body.censoring ?? null,
    percentiles: body.options.percentiles,
    survivalAt: body.options.survivalAt,
    extras: {
      tests: body.options.tests,
      average: body.options.average,
      predict: body.options.predict ? { columns: ownColumns(body.options.predict.columns) } : undefined,
    },
    overdispersion: body.options.overdispersion,
    policy: policy.policy,
    policyHash: policy.hash,
  };
}

/** One comparison, from rows or from a summary: what POST and replay both run (priced beforehand, see http/pricing.ts). */
export function computeComparison(body: ComparisonRequest, policy: ActivePolicy) {
  const input = toComparisonInput(body, policy);
  return body.data && 'summary' in body.data
    ? compareFromSummary({ ...input, summary: body.data.summary, response: body.response! })
    : compareModels(input);
}
