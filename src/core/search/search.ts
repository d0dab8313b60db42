// One search on one thread: the plan's method over the whole pool. The
// worker pool (src/search/workers) splits the same work into ranges and
// joins them with finishSearch; results agree with this one.

import { branchAndBound, branchOrder } from './branch-and-bound.ts';
import type { SearchBudget } from './budget.ts';
import { scoreSubsetRange } from './counting-search.ts';
import { finishSearch, type SearchMethod, type SearchOutcome } from './result.ts';
import type { SearchSettings, SubsetProblem } from './types.ts';

export function searchSubsets(problem: SubsetProblem, settings: SearchSettings, method: SearchMethod, budget?: SearchBudget): SearchOutcome {
  const m = problem.poolBlocks.length;
  if (method === 'exhaustive') {
    return finishSearch(method, settings, m, [scoreSubsetRange(problem, settings, 0, 2 ** m)]);
  }
  const limit = budget?.maxNodes ?? Infinity;
  const partial = branchAndBound(problem, settings, { order: branchOrder(problem), decided: [] }, (nodes) => nodes < limit);
  return finishSearch(method, settings, m, [partial]);
}
