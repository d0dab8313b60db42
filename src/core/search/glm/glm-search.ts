// One generalised-linear subset search: the method its budget allows (every
// subset when the pool is small and the price affords them all, else
// stepwise selection with swaps within a number of fits), run on one thread.
import type { BudgetIssue, SearchBudget } from '../budget.ts';
import type { HierarchyRules } from '../hierarchy.ts';
import type { SearchCriterion } from '../types.ts';
import { walkEverySubset } from './exhaustive-walk.ts';
import { GlmTally } from './glm-tally.ts';
import { stepwiseWithSwaps } from './stepwise-swaps.ts';
import type { GlmSearchData, GlmSearchMethod, GlmSearchOutcome } from './types.ts';

/** Largest pool fitted subset by subset: 2^16 IRLS fits is already minutes on small data. */
export const GLM_EXHAUSTIVE_TERMS = 16;

export type GlmSearchPlan = { ok: true; method: GlmSearchMethod; maxVisits: number } | { ok: false; issue: BudgetIssue };

/**
 * The budget comes from the price (src/core/pricing/glm-search-price.ts):
 * maxSubsets is how many fits the work cap affords, maxNodes how many the
 * heuristic may make.
 */
export function planGlmSearch(poolSize: number, exhaustive: boolean, budget: SearchBudget): GlmSearchPlan {
  const all = 2 ** poolSize;
  if (poolSize <= GLM_EXHAUSTIVE_TERMS && all <= budget.maxSubsets) return { ok: true, method: 'exhaustive', maxVisits: all };
  if (exhaustive) {
    const limit = Math.min(budget.maxSubsets, 2 ** GLM_EXHAUSTIVE_TERMS);
    return {
      ok: false,
      issue: {
        code: 'search_over_budget',
        path: ['pool'],
        message: `The search cannot run: fitting every subset of ${poolSize} pool terms by IRLS is ${all} fits, beyond the budget of ${limit}. Narrow the pool or add always terms, or leave exhaustive out to accept stepwise selection with swaps.`,
        facts: { budget: 'maxSubsets', limit, required: all, poolTerms: poolSize },
      },
    };
  }
  return { ok: true, method: 'stepwiseSwaps', maxVisits: budget.maxNodes };
}

export function searchGlmSubsets(
  data: GlmSearchData,
  rules: HierarchyRules,
  settings: { criterion: SearchCriterion; top: number },
  plan: Extract<GlmSearchPlan, { ok: true }>,
): GlmSearchOutcome {
  const tally = new GlmTally(data.poolSize, rules);
  if (plan.method === 'exhaustive') {
    walkEverySubset(data, settings.criterion, tally);
    return tally.outcome('exhaustive', settings.criterion, settings.top, false);
  }
  const stopped = stepwiseWithSwaps(data, settings.criterion, tally, plan.maxVisits);
  return tally.outcome('stepwiseSwaps', settings.criterion, settings.top, stopped);
}
