// The search across every core: the pure kernel's work split into tasks
// (contiguous counting-order ranges, or subtrees of branch and bound under
// fixed first decisions from planBranchAndBound), run on worker threads,
// joined by finishSearch in task order. Exhaustive results are bit-identical
// to one thread's apart from the order of the final weight sums (agreement to
// ~1e-15 relative). Branch-and-bound tasks are pure functions of the plan, so
// their results are the same on any number of threads; only when the shared
// node budget runs out does which work was done depend on timing (the result
// then says it is not proven).

import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
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
import type { SearchReply, SearchTask } from './messages.ts';
import { runTask } from './run-task.ts';

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

export interface RunSearchOptions {
  /** Worker threads; default os.availableParallelism(). 1 runs on the calling thread. */
  threads?: number;
  budget?: SearchBudget;
  /** Refuse rather than fall back to branch and bound when every subset is beyond the budget. */
  exhaustive?: boolean;
  onProgress?: (p: SearchProgress) => void;
  signal?: AbortSignal;
}

export type RunSearchResult =
  | { ok: true; outcome: SearchOutcome; threads: number; budget: SearchBudget; estimatedFlops: number | null }
  | { ok: false; issue: BudgetIssue; budget: SearchBudget };

/** Below this many subsets the search runs on the calling thread: starting workers would cost more. */
const IN_THREAD_SUBSETS = 2 ** 14;
/** Exhaustive ranges per thread, so threads finishing early take more. */
const TASKS_PER_THREAD = 8;

export async function runSearch(problem: SubsetProblem, settings: SearchSettings, options: RunSearchOptions = {}): Promise<RunSearchResult> {
  const budget = options.budget ?? DEFAULT_SEARCH_BUDGET;
  const plan = planSearch(problem, { exhaustive: options.exhaustive }, budget);
  if (!plan.ok) return { ok: false, issue: plan.issue, budget };
  const m = problem.poolBlocks.length;
  const total = 2 ** m;
  const wanted = Math.max(1, Math.floor(options.threads ?? availableParallelism()));
  const threads = total <= IN_THREAD_SUBSETS ? 1 : wanted;
  const branch = plan.method === 'branchAndBound' ? branchTasks(problem, settings, budget) : null;
  const tasks = branch ? branch.tasks : exhaustiveTasks(problem, settings, threads);
  const partials = await runTasks(tasks, threads, total, options, branch ? [branch.start] : [], branch?.nodeCounter);
  const outcome = finishSearch(plan.method, settings, m, branch ? [branch.start, ...partials] : partials);
  return { ok: true, outcome, threads, budget, estimatedFlops: plan.estimatedFlops };
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

/** The plan's subtrees as tasks (the same on any number of threads), and the start's partial, counted once. */
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

function startWorker(): Worker {
  // Run from sources (tsx, tap) the worker module is the .ts beside this one; built, the .js.
  const ext = import.meta.url.endsWith('.ts') ? '.ts' : '.js';
  const entry = new URL(`./search-worker${ext}`, import.meta.url).href;
  return new Worker(new URL('./worker-entry.mjs', import.meta.url), { workerData: { entry } });
}

async function runTasks(
  tasks: SearchTask[],
  threads: number,
  total: number,
  options: RunSearchOptions,
  known: SearchPartial[],
  nodeCounter?: SharedArrayBuffer,
): Promise<SearchPartial[]> {
  const results: SearchPartial[] = new Array(tasks.length);
  const tops = known.map((p) => p.top);
  const nodes = nodeCounter ? new Int32Array(nodeCounter) : null;
  let covered = 0;
  let done = 0;
  const report = (task: SearchTask, p: SearchPartial) => {
    results[task.id] = p;
    covered += covers(task);
    done++;
    if (!options.onProgress) return;
    tops.push(p.top);
    options.onProgress({
      covered,
      total,
      tasksDone: done,
      tasks: tasks.length,
      nodes: nodes ? Atomics.load(nodes, 0) : 0,
      bound: task.kind === 'branchAndBound' ? keptThreshold(tops, task.settings.top) : null,
    });
  };
  if (threads === 1) {
    for (const task of tasks) {
      if (options.signal?.aborted) throw new Error('search aborted');
      report(task, runTask(task));
    }
    return results;
  }
  const queue = [...tasks];
  const workers = Array.from({ length: Math.min(threads, tasks.length) }, startWorker);
  try {
    await new Promise<void>((resolve, reject) => {
      let running = 0;
      const abort = () => reject(new Error('search aborted'));
      options.signal?.addEventListener('abort', abort, { once: true });
      const feed = (w: Worker) => {
        const task = queue.shift();
        if (!task) {
          if (running === 0) resolve();
          return;
        }
        running++;
        w.postMessage(task);
      };
      for (const w of workers) {
        w.on('message', (reply: SearchReply) => {
          running--;
          if (!reply.ok) return reject(new Error(reply.error));
          report(tasks[reply.id], reply.partial);
          feed(w);
        });
        w.on('error', reject);
        feed(w);
      }
    });
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return results;
}
