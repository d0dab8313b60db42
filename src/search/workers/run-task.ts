// One task of a search, run wherever it lands (a worker thread or, for
// small searches, the calling thread): the pure kernel plus the shared node
// counter that enforces a branch-and-bound budget across threads.

import { branchAndBound, scoreSubsetRange, type SearchPartial } from '../../core/search/index.ts';
import type { SearchTask } from './messages.ts';
import type { TaskRunner } from './search-pool.ts';

export function runTask(task: SearchTask): SearchPartial {
  if (task.kind === 'exhaustive') return scoreSubsetRange(task.problem, task.settings, task.from, task.to);
  const counter = new Int32Array(task.nodeCounter);
  let reported = 0;
  // The kernel asks at its first node and every 256 after: the nodes since the last ask go to the shared count.
  const partial = branchAndBound(task.problem, task.settings, task.prefix, task.start, (nodes) => {
    const total = Atomics.add(counter, 0, nodes - reported) + nodes - reported;
    reported = nodes;
    return total <= task.maxNodes;
  });
  Atomics.add(counter, 0, partial.nodes - reported);
  return partial;
}

/** Runs every task on the calling thread, one after another: tests, benchmarks and tools without a pool. */
export const runInThread: TaskRunner = async (task) => ({ value: runTask(task), worker: 0 });
