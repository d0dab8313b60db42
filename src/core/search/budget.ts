// The compute budget of one search request, checked before any work starts
// (and, for branch and bound, whose cost is not known in advance, by a node
// count while it runs: when it runs out, the search answers the best found so
// far, marked unproven). The work of one subset is one block sweep, about d^2
// multiply-adds for d design columns plus the response.

import { MAX_EXHAUSTIVE_TERMS } from './counting-search.ts';
import { MAX_KEYED_TERMS } from './subset-keys.ts';
import type { SubsetProblem } from './types.ts';

export interface SearchBudget {
  /** Most subsets the exhaustive walk may score (2^m for m pool terms). */
  maxSubsets: number;
  /** Largest pool branch and bound accepts. */
  maxBranchAndBoundTerms: number;
  /** Most tree nodes branch and bound may visit before it gives up. */
  maxNodes: number;
}

/**
 * Measured on the 2-core development machine (scripts/bench-search.ts):
 * about 1e6 subsets/s per core for a 20-term pool, so 2^24 subsets take
 * some 8 s on two cores; a node of branch and bound costs about two sweeps
 * and a bound, so 2^24 nodes take longer (README: speed figures), but a
 * 40-term pool of the kind the budget is for needs thousands, not millions.
 */
export const DEFAULT_SEARCH_BUDGET: SearchBudget = { maxSubsets: 2 ** 24, maxBranchAndBoundTerms: 40, maxNodes: 2 ** 24 };

export type SearchPlan =
  | { ok: true; method: 'exhaustive' | 'branchAndBound'; subsets: number; estimatedFlops: number | null; budget: SearchBudget }
  | { ok: false; issue: BudgetIssue };

export interface BudgetIssue {
  code: 'search_over_budget';
  path: (string | number)[];
  message: string;
  facts: { budget: keyof SearchBudget; limit: number; required: number; poolTerms: number };
}

/**
 * Exhaustive when every subset fits the budget (weights then cover all
 * subsets); branch and bound when only the best `top` are wanted and the
 * pool is within its limit; otherwise a refusal naming the budget.
 */
export function planSearch(problem: SubsetProblem, request: { exhaustive?: boolean }, budget: SearchBudget = DEFAULT_SEARCH_BUDGET): SearchPlan {
  const m = problem.poolBlocks.length;
  const subsets = 2 ** m;
  const d = problem.dimension;
  if (subsets <= budget.maxSubsets && m <= MAX_EXHAUSTIVE_TERMS) {
    return { ok: true, method: 'exhaustive', subsets, estimatedFlops: subsets * 2 * d * d, budget };
  }
  if (request.exhaustive) {
    return refusal('maxSubsets', budget.maxSubsets, subsets, m, `every subset of ${m} pool terms is ${subsets} subsets, beyond the budget of ${budget.maxSubsets}.`);
  }
  // Branch and bound names a subset by one exact double (subset-keys.ts), whatever budget a caller configures.
  const branchLimit = Math.min(budget.maxBranchAndBoundTerms, MAX_KEYED_TERMS);
  if (m > branchLimit) {
    return refusal(
      'maxBranchAndBoundTerms',
      branchLimit,
      m,
      m,
      `a pool of ${m} terms is beyond the branch-and-bound budget of ${branchLimit} terms.`,
    );
  }
  return { ok: true, method: 'branchAndBound', subsets, estimatedFlops: null, budget };
}

function refusal(budget: keyof SearchBudget, limit: number, required: number, poolTerms: number, why: string): SearchPlan {
  return {
    ok: false,
    issue: { code: 'search_over_budget', path: ['pool'], message: `The search cannot run: ${why} Narrow the pool or add always terms.`, facts: { budget, limit, required, poolTerms } },
  };
}
