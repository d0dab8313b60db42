export { runInThread } from './run-task.ts';
export { runSearch, type RunSearchOptions, type RunSearchResult, type SearchProgress, type TaskRunner } from './search-pool.ts';
