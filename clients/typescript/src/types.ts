// Names for the shapes callers handle, taken from the types generated out of the service's
// OpenAPI document (openapi.ts: `npm run types`, never edited by hand). Requests use the
// document's input forms (defaults optional); answers its output forms.
import type { components, paths } from './openapi.js';

type Schemas = components['schemas'];

export type ComparisonRequest = Schemas['ComparisonRequestInput'];
export type Candidate = Schemas['CandidateInput'];
export type Term = Schemas['TermInput'];
export type ComparisonResult = Schemas['ComparisonResult'];
export type ModelResult = Schemas['ModelResult'];
export type RankingEntry = Schemas['RankingEntry'];
export type SearchRequest = Schemas['SearchRequestInput'];
export type SearchResult = Schemas['SearchResult'];
export type StoredComparison = Schemas['StoredComparison'];
export type ComparisonListItem = Schemas['ComparisonListItem'];
export type ComparisonList = Schemas['ComparisonList'];
export type VerifyReport = Schemas['VerifyReport'];
export type ReplayReport = Schemas['ReplayReport'];
export type SummaryUploadResult = Schemas['SummaryUploadResult'];
export type Problem = Schemas['Problem'];

/** Filters of GET /v1/comparisons (the cursor is the client's business; limit is the page size). */
export type ListFilter = Omit<NonNullable<paths['/v1/comparisons']['get']['parameters']['query']>, 'cursor' | 'limit'> & {
  limit?: number;
};

/** Query options of the chart and the report (criterion, size, or width and height in pixels). */
export type PictureOptions = Omit<NonNullable<paths['/v1/comparisons/{id}/chart.svg']['get']['parameters']['query']>, 'width' | 'height'> & {
  width?: number;
  height?: number;
};

/**
 * A `progress` event of a streamed search: subsets accounted for (`covered`) of all (`total`); for
 * branch and bound the tree nodes visited and the criterion value a subset must beat to enter the
 * best `top` so far (else 0 and null). Described in words by the document, so written here.
 */
export interface SearchProgress {
  covered: number;
  total: number;
  nodes: number;
  bound: number | null;
}

export type SearchEvent =
  | { event: 'progress'; data: SearchProgress }
  | { event: 'result'; data: SearchResult };
