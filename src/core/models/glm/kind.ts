// Generalised linear candidates scored on the comparison's sample: designs
// built on the common rows (every bad term named before any fit), the offset
// and trials columns read there, each model fitted by fitGlm; and means
// fitted elsewhere scored by the same log-likelihood.
import { unknownColumn } from '../../design/columns.ts';
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import type { Columns } from '../../types.ts';
import { candidateDesigns } from '../candidate-designs.ts';
import { DEFAULT_INTERVAL_LEVEL } from '../../inference/coefficient-tests.ts';
import { computeCriteria } from '../../scoring/criteria.ts';
import type { Caution } from '../../scoring/cautions.ts';
import { criteriaFields, finiteOrNull, NOT_CHECKED } from '../model-fields.ts';
import type { ModelResult } from '../model-result.ts';
import { scoredModel, type ScoredModel } from '../scored-model.ts';
import type { ScoringContext } from '../scoring-context.ts';
import { alignToUsedRows } from '../aligned-rows.ts';
import type { FittedMeansCandidateInput, GlmCandidateInput } from './candidate.ts';
import { fitGlm } from './fit-glm.ts';
import { glmCapabilities } from './capabilities.ts';
import { scoreFittedMeans } from './fitted-means.ts';
import { glmModelResult, r2Caution } from './report.ts';

interface Sample {
  columns: Columns | null;
  ctx: ScoringContext;
  intervalLevel: number | undefined;
}

/** A numeric column on the used rows (offset, trials); rows missing a value were already left out of the sample. */
export function numericColumn(columns: Columns, name: string, rows: readonly number[], at: IssuePath): Float64Array | Issue {
  if (!Object.prototype.hasOwnProperty.call(columns, name)) return unknownColumn(at, name, columns);
  const column = columns[name];
  const out = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const v = column[rows[i]];
    if (typeof v !== 'number') return issue('glm_column_not_numeric', at, { column: name, row: rows[i], value: typeof v === 'string' ? v : null });
    out[i] = v;
  }
  return out;
}

const samePath = (a: IssuePath, b: IssuePath) => a.length === b.length && a.every((x, i) => x === b[i]);

/** A request-level field at fault (weights, trials, the response) is named once, not once per candidate. */
function pushOnce(issues: Issue[], found: readonly Issue[]): void {
  for (const f of found) if (!issues.some((i) => i.code === f.code && samePath(i.path, f.path))) issues.push(f);
}

function optionalColumn(columns: Columns, name: string | undefined, rows: readonly number[], at: IssuePath, issues: Issue[]): Float64Array | null {
  if (name === undefined) return null;
  const read = numericColumn(columns, name, rows, at);
  if (read instanceof Float64Array) return read;
  issues.push(read);
  return null;
}

export function scoreGlmCandidates(candidates: ReadonlyMap<number, GlmCandidateInput>, { columns, ctx, intervalLevel }: Sample, issues: Issue[]): Map<number, ScoredModel> {
  const scored = new Map<number, ScoredModel>();
  if (!columns || !ctx.rows || !ctx.y) return scored;
  const rows = ctx.rows;
  const designs = candidateDesigns(candidates, columns, rows, issues);
  if (issues.length > 0) return scored;
  for (const [i, design] of designs) {
    const c = candidates.get(i)!;
    const at: IssuePath = ['candidates', i];
    const own: Issue[] = [];
    const offset = optionalColumn(columns, c.offset, rows, [...at, 'offset'], own);
    const trials = c.family === 'binomial' ? optionalColumn(columns, c.trials, rows, ['trials'], own) : null;
    if (own.length > 0) {
      pushOnce(issues, own);
      continue;
    }
    const fit = fitGlm({
      family: c.family, link: c.link, design, response: ctx.y, trials, offset, weights: ctx.weights?.values ?? null, rows, at,
    });
    if ('issues' in fit) {
      pushOnce(issues, fit.issues);
      continue;
    }
    const capabilities = glmCapabilities({ fit, design, candidate: c, index: i, trials: trials === null ? null : c.trials ?? null });
    scored.set(i, scoredModel(glmModelResult(c.name, fit, design.intercept, intervalLevel ?? DEFAULT_INTERVAL_LEVEL), fit.measure, capabilities));
  }
  return scored;
}

function fittedMeansIssue(c: FittedMeansCandidateInput, ctx: ScoringContext, at: IssuePath): Float64Array | Issue {
  const path = [...at, 'fitted'];
  const aligned = alignToUsedRows(c.fitted, ctx);
  if (aligned instanceof Float64Array) return aligned;
  if (aligned.problem === 'missing') return issue('glm_fitted_missing', [...path, aligned.index], { row: aligned.row });
  if (aligned.problem === 'atDropped') {
    return issue('glm_fitted_at_dropped_row', [...path, aligned.row], { row: aligned.row, rows: aligned.rows, count: aligned.count });
  }
  return issue('glm_fitted_count_mismatch', path, { fitted: c.fitted.length, rows: ctx.n, dataRows: ctx.dataRows ?? ctx.n });
}

export function scoreFittedMeansCandidates(candidates: ReadonlyMap<number, FittedMeansCandidateInput>, { columns, ctx }: Sample, issues: Issue[]): Map<number, ScoredModel> {
  const scored = new Map<number, ScoredModel>();
  if (!columns || !ctx.rows || !ctx.y) return scored;
  for (const [i, c] of candidates) {
    const at: IssuePath = ['candidates', i];
    const fitted = fittedMeansIssue(c, ctx, at);
    if (!(fitted instanceof Float64Array)) {
      issues.push(fitted);
      continue;
    }
    const own: Issue[] = [];
    const trials = c.family === 'binomial' ? optionalColumn(columns, c.trials, ctx.rows, ['trials'], own) : null;
    if (own.length > 0) {
      pushOnce(issues, own);
      continue;
    }
    const score = scoreFittedMeans({
      family: c.family, fitted, response: ctx.y, trials, weights: ctx.weights?.values ?? null, rows: ctx.rows, at,
      theta: c.theta, shape: c.shape, dispersion: c.dispersion,
    });
    if ('issues' in score) {
      issues.push(...score.issues);
      continue;
    }
    scored.set(i, scoredModel(fittedMeansResult(c, score.logLikelihood, score.deviance), score.measure));
  }
  return scored;
}

const STATED_PARAMETER = ['theta', 'shape', 'dispersion'] as const;

function fittedMeansResult(c: FittedMeansCandidateInput, logLikelihood: number | null, deviance: number): ModelResult {
  const gaussian = c.family === 'gaussian';
  const n = c.fitted.filter((v) => v !== null).length;
  const criteria = computeCriteria({
    logLikelihood, parameters: c.parameters, observations: n, rss: null, tss: null, coefficientsIncludingIntercept: null, intercept: true,
  });
  const cautions: Caution[] = criteria.cautions.map((x) => ({ code: x.code, message: x.message }));
  if (!gaussian) cautions.push(r2Caution(c.family));
  return {
    name: c.name,
    source: 'fitted',
    estimation: 'ml',
    intercept: null,
    parameters: c.parameters,
    observations: n,
    ...criteriaFields(logLikelihood, gaussian ? deviance : null, criteria),
    r2Basis: null,
    sigma: null,
    responseTransform: null,
    coefficients: [],
    aliased: [],
    conditionNumber: null,
    ...NOT_CHECKED,
    cautions,
    family: c.family,
    link: null,
    deviance: finiteOrNull(deviance),
    nullDeviance: null,
    pearsonChiSquare: null,
    // As the caller stated it: the service did not estimate it, so there is no standard error.
    distributionParameters: STATED_PARAMETER.flatMap((name) => (c[name] === undefined ? [] : [{ name, estimate: c[name]!, standardError: null }])),
    convergence: null,
    devianceExplained: null,
  };
}
