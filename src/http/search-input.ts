// The validated search request as the core's input (columns in an object
// without a prototype, as for comparisons).
import type { SearchRequestInput } from '../core/search/request-problem.ts';
import { ownColumns } from './comparison-input.ts';
import type { SearchRequest } from './schemas/search-request.ts';

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
  };
}
