// One task of a search, run wherever it lands (a worker thread or, for
// small searches, the calling thread): the pure kernel plus the shared node
// counter that enforces a branch-and-bound budget across threads.

import { branchAndBound, scoreSubsetRange, type SearchPartial } from '../../core/search/index.ts';
import type { SearchTask } from './messages.ts';

/** Nodes are counted in batches of this size (the kernel asks every 256 nodes). */
const NODE_BATCH = 256;

export function runTask(task: SearchTask): SearchPartial {
  if (task.kind === 'exhaustive') return scoreSubsetRange(task.problem, task.settings, task.from, task.to);
  const counter = new Int32Array(task.nodeCounter);
  return branchAndBound(task.problem, task.settings, task.prefix, () => {
    const total = Atomics.add(counter, 0, NODE_BATCH) + NODE_BATCH;
    return total <= task.maxNodes;
  });
}
