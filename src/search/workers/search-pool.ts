// The search across every core: the pure kernel's work split into tasks
// (contiguous counting-order ranges, or subtrees of branch and bound under
// fixed first decisions from planBranchAndBound), run by the caller's runner —
// the workers of the process-wide compute pool (src/compute) — and joined by
// finishSearch in task order. Ranges start at multiples of the kernel's refresh
// interval, so exhaustive results are bit-identical to one thread's apart from
// the order of the final weight sums (agreement to ~1e-15 relative).
// Branch-and-bound tasks are pure functions of the plan, so their results are
// the same on any number of workers; only when the shared node budget runs out
// does which work was done depend on timing (the result then says it is not
// proven).

import {
  DEFAULT_SEARCH_BUDGET,
  finishSearch,
  keptThreshold,
  planBranchAndBound,
  planSearch,
  REFRESH_STEPS,
  type BudgetIssue,
  type SearchBudget,
  type SearchOutcome,
  type SearchPartial,
  type SearchSettings,
  type SubsetProblem,
} from '../../core/search/index.ts';
import type { SearchTask } from './messages.ts';

export interface SearchProgress {
  /** Subsets accounted for (scored, passed over or pruned) of `total`. */
  covered: number;
  total: number;
  tasksDone: number;
  tasks: number;
  /** Branch and bound: tree nodes visited so far, on every thread (0 exhaustive). */
  nodes: number;
  /**
   * Branch and bound: the criterion value a subset must beat to enter the
   * best `top` known so far (the stepwise start's and the finished tasks');
   * null until `top` are known, and for exhaustive searches.
   */
  bound: number | null;
}

/** Runs one task where the caller's work runs (a worker of the compute pool), and says which worker took it. */
export type TaskRunner = (task: SearchTask) => Promise<{ value: SearchPartial; worker: number }>;

export interface RunSearchOptions {
  run: TaskRunner;
  /** Workers that may run tasks at once: the work is cut into TASKS_PER_THREAD pieces for each. */
  parallelism: number;
  budget?: SearchBudget;
  /** Refuse rather than fall back to branch and bound when every subset is beyond the budget. */
  exhaustive?: boolean;
  onProgress?: (p: SearchProgress) => void;
}

export type RunSearchResult =
  /** threads: the distinct workers the tasks ran on. */
  | { ok: true; outcome: SearchOutcome; threads: number; budget: SearchBudget; estimatedFlops: number | null }
  | { ok: false; issue: BudgetIssue; budget: SearchBudget };

/** Below this many subsets the search is one task: splitting it would cost more than it saves. */
const ONE_TASK_SUBSETS = 2 ** 14;
/** Exhaustive ranges per worker, so workers finishing early take more. */
const TASKS_PER_THREAD = 8;

export async function runSearch(problem: SubsetProblem, settings: SearchSettings, options: RunSearchOptions): Promise<RunSearchResult> {
  const budget = options.budget ?? DEFAULT_SEARCH_BUDGET;
  const plan = planSearch(problem, { exhaustive: options.exhaustive }, budget);
  if (!plan.ok) return { ok: false, issue: plan.issue, budget };
  const m = problem.poolBlocks.length;
  const total = 2 ** m;
  const threads = total <= ONE_TASK_SUBSETS ? 1 : Math.max(1, Math.floor(options.parallelism));
  const branch = plan.method === 'branchAndBound' ? branchTasks(problem, settings, budget) : null;
  const tasks = branch ? branch.tasks : exhaustiveTasks(problem, settings, threads);
  const { partials, workers } = await runTasks(tasks, total, options, branch ? [branch.start] : [], branch?.nodeCounter);
  const outcome = finishSearch(plan.method, settings, m, branch ? [branch.start, ...partials] : partials);
  return { ok: true, outcome, threads: workers, budget, estimatedFlops: plan.estimatedFlops };
}

function exhaustiveTasks(problem: SubsetProblem, settings: SearchSettings, threads: number): SearchTask[] {
  const total = 2 ** problem.poolBlocks.length;
  const pieces = threads === 1 ? 1 : threads * TASKS_PER_THREAD;
  const step = Math.max(REFRESH_STEPS, Math.ceil(total / pieces / REFRESH_STEPS) * REFRESH_STEPS);
  const tasks: SearchTask[] = [];
  for (let from = 0; from < total; from += step) {
    tasks.push({ kind: 'exhaustive', id: tasks.length, problem, settings, from, to: Math.min(total, from + step) });
  }
  return tasks;
}

/** The plan's subtrees as tasks (the same on any number of workers), and the start's partial, counted once. */
function branchTasks(problem: SubsetProblem, settings: SearchSettings, budget: SearchBudget) {
  const plan = planBranchAndBound(problem, settings);
  const nodeCounter = new SharedArrayBuffer(4);
  const maxNodes = Math.min(budget.maxNodes, 2 ** 30);
  const tasks: SearchTask[] = plan.prefixes.map((prefix, id) => ({ kind: 'branchAndBound', id, problem, settings, prefix, start: plan.start, nodeCounter, maxNodes }));
  return { tasks, start: plan.startPartial, nodeCounter };
}

function covers(task: SearchTask): number {
  if (task.kind === 'exhaustive') return task.to - task.from;
  return 2 ** (task.problem.poolBlocks.length - task.prefix.decided.length);
}

async function runTasks(
  tasks: SearchTask[],
  total: number,
  options: RunSearchOptions,
  known: SearchPartial[],
  nodeCounter?: SharedArrayBuffer,
): Promise<{ partials: SearchPartial[]; workers: number }> {
  const results: SearchPartial[] = new Array(tasks.length);
  const workers = new Set<number>();
  const tops = known.map((p) => p.top);
  const nodes = nodeCounter ? new Int32Array(nodeCounter) : null;
  let covered = 0;
  let done = 0;
  await Promise.all(tasks.map(async (task) => {
    const { value, worker } = await options.run(task);
    results[task.id] = value;
    workers.add(worker);
    covered += covers(task);
    done++;
    if (!options.onProgress) return;
    tops.push(value.top);
    options.onProgress({
      covered,
      total,
      tasksDone: done,
      tasks: tasks.length,
      nodes: nodes ? Atomics.load(nodes, 0) : 0,
      bound: task.kind === 'branchAndBound' ? keptThreshold(tops, task.settings.top) : null,
    });
  }));
  return { partials: results, workers: workers.size };
}
