// The price of a search from its shape alone, before anything is allocated:
// the most arithmetic it may do and the working memory it holds, for a cost
// model to admit or refuse it. Upper bounds, not estimates: branch and bound
// usually visits far fewer nodes than its budget allows.
//
// Units: one sweep of a d-by-d matrix is d^2 multiply-adds (2 d^2 flops) and
// a copy of one is d^2 moves, counted as flops too (the kernels are bound by
// memory traffic as much as by arithmetic).

import { BRANCH_PLAN_NODES } from './branch-plan.ts';
import { RESCORED_EXTRA, STEPWISE_ROUNDS } from './stepwise-start.ts';
import type { SearchBudget } from './budget.ts';

export interface SearchPrice {
  /** Most floating-point operations the search may take, on all threads together. */
  flops: number;
  /** Most bytes of working matrices held at once, on all threads together (the problem itself not counted). */
  bytes: number;
}

export interface SearchShape {
  /** Pool terms m. */
  poolTerms: number;
  /** d: design columns of pool and always terms, plus the response. */
  dimension: number;
  method: 'exhaustive' | 'branchAndBound';
  /** Threads the tasks run on at once. */
  threads: number;
}

const BYTES_PER_DOUBLE = 8;

/** The largest `top` a request may ask for (src/http/schemas/search-request.ts). */
const MAX_TOP = 100;

export function priceSearch(shape: SearchShape, budget: SearchBudget): SearchPrice {
  const { poolTerms: m, dimension: d, threads } = shape;
  const sweep = 3 * d * d; // a copy and a sweep
  const layers = (count: number) => count * d * d * BYTES_PER_DOUBLE;
  if (shape.method === 'exhaustive') {
    // One copy and one block sweep per subset; one matrix per term count per running range.
    return { flops: 2 ** m * sweep, bytes: threads * layers(m + 1) };
  }
  // Stepwise start: per round m adds, and per member a fresh drop (m sweeps) and m swaps; then the best met
  // rescored afresh (at most the largest top plus the extra, m sweeps each).
  const stepwise = (STEPWISE_ROUNDS(m) * (m + m * (2 * m)) + (MAX_TOP + RESCORED_EXTRA) * m) * sweep;
  // The plan opens at most BRANCH_PLAN_NODES nodes, each a fresh sweep of every term.
  const plan = BRANCH_PLAN_NODES * m * sweep;
  // A node: a sweep in and a sweep out, each after a copy, and at worst (ill-conditioned pools) an upper rebuilt
  // from its lower (m sweeps); its bound is O(m log m); one eigenvalue problem per task, about 10 m^3.
  const nodes = budget.maxNodes * (2 + m) * sweep;
  return { flops: stepwise + plan + nodes + 10 * m ** 3 * BRANCH_PLAN_NODES, bytes: threads * layers(2 * (m + 1) + 1) + layers(3) };
}
