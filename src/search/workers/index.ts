export { runSearch, type RunSearchOptions, type RunSearchResult, type SearchProgress } from './search-pool.ts';
