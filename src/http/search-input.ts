// The validated search request as the core's input (columns in an object
// without a prototype, as for comparisons).
import type { SearchRequestInput } from '../core/search/request-problem.ts';
import { ownColumns } from './comparison-input.ts';
import type { SearchRequest } from './schemas/search-request.ts';

/** As for a comparison candidate: no family other than gaussian, no link other than identity, no offset is least squares, unchanged. */
export const isLeastSquaresSearch = (body: Pick<SearchRequest, 'family' | 'link' | 'offset'>): boolean =>
  (body.family ?? 'gaussian') === 'gaussian' && (body.link ?? 'identity') === 'identity' && body.offset === undefined;

export function toSearchInput(body: SearchRequest): SearchRequestInput {
  return {
    columns: 'columns' in body.data ? ownColumns(body.data.columns) : null,
    summary: 'summary' in body.data ? body.data.summary : null,
    response: body.response,
    weights: body.weights ?? null,
    pool: body.pool,
    always: body.always,
    hierarchy: body.hierarchy,
    intercept: body.intercept,
    top: body.top,
    responseTransform: body.responseTransform ?? null,
    trials: body.trials ?? null,
    glm: isLeastSquaresSearch(body) ? null : { family: body.family ?? 'gaussian', link: body.link, offset: body.offset, trials: body.trials },
  };
}
