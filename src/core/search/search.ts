// One search on one thread: the plan's method over the whole pool. The
// worker pool (src/search/workers) runs the same tasks on other threads and
// joins them with finishSearch in the same order, so its results equal these.

import { branchAndBound } from './branch-and-bound.ts';
import { planBranchAndBound } from './branch-plan.ts';
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
  const plan = planBranchAndBound(problem, settings);
  let nodes = 0;
  const partials = [plan.startPartial];
  for (const prefix of plan.prefixes) {
    let before = 0;
    partials.push(
      branchAndBound(problem, settings, prefix, plan.start, (visited) => {
        nodes += visited - before;
        before = visited;
        return nodes < limit;
      }),
    );
  }
  return finishSearch(method, settings, m, partials);
}
