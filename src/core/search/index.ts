// The subset search's public face.
export type { SearchCriterion, SearchPartial, SearchSettings, ScoredSubset, SubsetProblem, WeightSumsData } from './types.ts';
export { hierarchyRules, noHierarchy, type HierarchyRules } from './hierarchy.ts';
export { subsetProblemFromDesign, subsetProblemFromSummary, type SummarySearchSpec, type ProblemOutcome } from './problem.ts';
export { scoreGrayRange, REFRESH_STEPS } from './gray-search.ts';
export { scoreSubsetRange, MAX_EXHAUSTIVE_TERMS } from './counting-search.ts';
export { branchAndBound, NO_START, type BranchStart } from './branch-and-bound.ts';
export { branchOrder, type BranchPrefix } from './branch-prefix.ts';
export { planBranchAndBound, BRANCH_TASKS, type BranchPlan } from './branch-plan.ts';
export { stepwiseStart } from './stepwise-start.ts';
export { finishSearch, type SearchOutcome, type RankedSubset, type SearchMethod } from './result.ts';
export { planSearch, DEFAULT_SEARCH_BUDGET, type SearchBudget, type SearchPlan, type BudgetIssue } from './budget.ts';
export { searchSubsets } from './search.ts';
export { subsetScorer, type SubsetScorer } from './scorer.ts';
export { sweepPivot, PIVOT_TOLERANCE } from './sweep.ts';
export { keptThreshold } from './top-models.ts';
