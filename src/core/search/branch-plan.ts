// Branch and bound cut into tasks. The plan orders the pool, runs the
// stepwise start, and then opens the tree breadth first from the root,
// setting aside every node the start's threshold already rules out, until
// BRANCH_TASKS nodes are still open: each becomes a task (a prefix of
// decisions, branching on the terms the walk would choose), and so does
// each node set aside (its task prunes at once and
// counts its subsets). The prefixes' subtrees partition the tree, so the
// tasks' counts add up to all 2^m subsets, and each task is a pure function
// of the plan, whatever thread runs it: a search gives the same answer on
// one thread or many. Tasks do not share the bounds they find as they go
// (that would make the counts depend on timing); the start's threshold is
// what lets a task deep in the tree prune from its first node.

import { copyInto, emptyLayer, sweepTermIn } from './branch-layers.ts';
import { branchOrder, branchTerm, prefixLayers, prefixState, swapTerms, upperWithout, type BranchPrefix } from './branch-prefix.ts';
import type { BranchStart } from './branch-and-bound.ts';
import { correlationFloor, SubsetBound } from './subset-bound.ts';
import { stepwiseStart } from './stepwise-start.ts';
import { baseMatrix } from './subset-state.ts';
import { subsetScorer } from './scorer.ts';
import type { ScoredSubset, SearchPartial, SearchSettings, SubsetProblem } from './types.ts';
import { WeightSums } from './weight-sums.ts';

/** Open subtrees a plan aims for: enough for a few threads to balance, few enough that each is worth a message. */
export const BRANCH_TASKS = 64;

/** Nodes the plan opens at most (each costs a fresh sweep of its terms). */
export const BRANCH_PLAN_NODES = 4096;

export interface BranchPlan {
  start: BranchStart;
  /** The start's kept subsets as a partial result: they count here, once. */
  startPartial: SearchPartial;
  /** The tasks: each a subtree under its first decisions (1 in, 0 out) along its own order. */
  prefixes: BranchPrefix[];
  /** Moves stepwise selection took. */
  stepwiseMoves: number;
}

export function planBranchAndBound(problem: SubsetProblem, settings: SearchSettings, tasks = BRANCH_TASKS): BranchPlan {
  const m = problem.poolBlocks.length;
  const d = problem.dimension;
  const order = branchOrder(problem);
  const stepwise = stepwiseStart(problem, settings, order);
  const base = baseMatrix(problem);
  const bound = new SubsetBound(problem, base, subsetScorer(settings.criterion, problem.observations, problem.logWeightSum, problem.logJacobian), settings);
  const root = { decided: [] as number[], lower: emptyLayer(d), upper: emptyLayer(d) };
  const rootState = prefixState(problem, { order, decided: [] });
  prefixLayers(problem, base, { order, decided: [] }, root.lower, root.upper);
  const floor = m >= 2 ? correlationFloor(root.lower.matrix, d, bound.liveColumns(root.lower, { order, depth: 0, dead: rootState.dead, floor: 0 })) : 0;
  const start: BranchStart = { threshold: stepwise.threshold, counted: stepwise.kept.map((s) => s.terms), floor };

  // Breadth first; a child shares the layer it does not change with its parent (the plan only reads them), and
  // the order its parent's branching left (copied before the next swap).
  const open = [{ order, ...root }];
  const setAside: BranchPrefix[] = [];
  let opened = 0;
  while (open.length > 0 && open.length < tasks && opened < BRANCH_PLAN_NODES) {
    const node = open.shift() as (typeof open)[number];
    const { decided, lower, upper } = node;
    // Subtrees of two or fewer open terms are not worth a task of their own.
    if (m - decided.length <= 2) {
      setAside.push({ order: node.order, decided });
      continue;
    }
    opened++;
    const state = prefixState(problem, { order: node.order, decided });
    const i = decided.length;
    if (state.broken > 0 || bound.cannotEnter(lower, upper, { order: node.order, depth: i, dead: state.dead, floor }, start.threshold)) {
      setAside.push({ order: node.order, decided });
      continue;
    }
    // The same choice of term as the walk's (branchTerm), so a task continues the tree the plan began.
    const childOrder = [...node.order];
    swapTerms(childOrder, i, branchTerm(problem, upper, childOrder, i, state.dead));
    const lowerIn = emptyLayer(d);
    copyInto(lower, lowerIn);
    sweepTermIn(problem, base, lowerIn, childOrder[i]);
    const upperOut = emptyLayer(d);
    upperWithout(problem, base, upper, lower, childOrder, i, upperOut);
    open.push({ order: childOrder, decided: [...decided, 1], lower: lowerIn, upper }, { order: childOrder, decided: [...decided, 0], lower, upper: upperOut });
  }
  const prefixes = [...open.map(({ order: o, decided }) => ({ order: o, decided })), ...setAside];
  return { start, startPartial: keptPartial(stepwise.kept, m), prefixes, stepwiseMoves: stepwise.moves };
}

/** The counts and sums of exactly the start's kept subsets. */
function keptPartial(kept: readonly ScoredSubset[], m: number): SearchPartial {
  const sums = new WeightSums(m);
  const members = new Uint8Array(m);
  for (const s of kept) {
    members.fill(0);
    for (const t of s.terms) members[t] = 1;
    sums.add(s.value, members);
  }
  return {
    evaluated: kept.length,
    notHierarchical: 0,
    unscorable: 0,
    rankDeficient: kept.filter((s) => s.rankDeficient).length,
    sameColumnSpace: 0,
    exactFits: 0,
    exactFitSubsets: [],
    pruned: 0,
    nodes: 0,
    stopped: false,
    top: [...kept],
    sums: sums.toData(),
  };
}
