// Where a branch-and-bound task starts: the branch order of the pool and the
// first decisions (in or out) taken along it. A prefix fixes a subtree of
// the tree; the subtrees of a set of prefixes that cover the tree's leaves
// partition the 2^m subsets, so tasks can run anywhere and their counts add.

import { baseInto, copyInto, emptyLayer, REBUILD_DRIFT, sweepTermIn, sweepTermOut, type Layer } from './branch-layers.ts';
import { sweepPivot } from './sweep.ts';
import { baseMatrix, type BaseMatrix } from './subset-state.ts';
import type { SubsetProblem } from './types.ts';

/**
 * A part of the tree: the first `decided.length` terms of `order` fixed in
 * (1) or out (0). The rest of `order` are the open terms, in the order the
 * root's branch order left them; a walk re-orders them as it goes.
 */
export interface BranchPrefix {
  order: number[];
  decided: number[];
}

/**
 * Terms most costly to drop from the full model first: excluding them early
 * raises the upper bound most, so whole subtrees fall away near the root
 * (Furnival & Wilson order by the full model's t statistics; this is the
 * block form of that, the rise in RSS when the term leaves the full model).
 */
export function branchOrder(problem: SubsetProblem): number[] {
  const base = baseMatrix(problem);
  const full = emptyLayer(problem.dimension);
  baseInto(base, full);
  const m = problem.poolBlocks.length;
  for (let t = 0; t < m; t++) sweepTermIn(problem, base, full, t);
  const d = problem.dimension;
  const rise = problem.poolBlocks.map((block) => {
    const trial = Float64Array.from(full.matrix);
    for (const c of block) if (full.swept[c]) sweepPivot(trial, d, c, -1);
    return trial[d * d - 1] - full.matrix[d * d - 1];
  });
  return [...rise.keys()].sort((a, b) => rise[b] - rise[a] || a - b);
}

/** Per pool term, the terms that need it under the hierarchy rule. */
export function dependentsOf(problem: SubsetProblem): number[][] {
  const out: number[][] = problem.poolBlocks.map(() => []);
  problem.requires.forEach((needs, j) => needs.forEach((r) => out[r].push(j)));
  return out;
}

/** The bookkeeping of a node: which terms are in its lower and upper models, and what the hierarchy rule rules out. */
export interface PrefixState {
  /** S: the terms decided in. */
  lowerMembers: Uint8Array;
  /** S + F: decided in or still open. */
  upperMembers: Uint8Array;
  /** Per term: blocked, or how many of its needs were decided out (> 0: in no admissible subset). */
  dead: Int32Array;
  /** Members of S that are dead: > 0 makes every subset below the node non-hierarchical. */
  broken: number;
}

export function prefixState(problem: SubsetProblem, prefix: BranchPrefix): PrefixState {
  const m = problem.poolBlocks.length;
  const lowerMembers = new Uint8Array(m);
  const upperMembers = new Uint8Array(m).fill(1);
  const dead = new Int32Array(m);
  for (const b of problem.blocked) dead[b]++;
  prefix.decided.forEach((inside, i) => {
    const t = prefix.order[i];
    if (inside) lowerMembers[t] = 1;
    else upperMembers[t] = 0;
  });
  for (let j = 0; j < m; j++) for (const r of problem.requires[j]) if (!upperMembers[r]) dead[j]++;
  let broken = 0;
  for (let t = 0; t < m; t++) if (lowerMembers[t] && dead[t] > 0) broken++;
  return { lowerMembers, upperMembers, dead, broken };
}

/** The node's lower (S swept in, in the prefix's order) and upper (then F, in that order): both fresh forward sweeps. */
export function prefixLayers(problem: SubsetProblem, base: BaseMatrix, prefix: BranchPrefix, lower: Layer, upper: Layer): void {
  baseInto(base, lower);
  prefix.decided.forEach((inside, i) => {
    if (inside) sweepTermIn(problem, base, lower, prefix.order[i]);
  });
  freshUpper(problem, base, lower, prefix.order, prefix.decided.length, -1, upper);
}

/** `to` = `lower` with the open terms order[from..] (except `skip`) swept in after it: a fresh upper. */
export function freshUpper(problem: SubsetProblem, base: BaseMatrix, lower: Layer, order: readonly number[], from: number, skip: number, to: Layer): void {
  copyInto(lower, to);
  for (let i = from; i < order.length; i++) if (order[i] !== skip) sweepTermIn(problem, base, to, order[i]);
}

/**
 * The open term a node branches on, as an index j >= i into `order`: a term
 * no admissible subset below can hold comes first (its "in" side is passed
 * over whole and its "out" side sheds it from the upper); otherwise the open
 * term costliest to drop from the upper model, b^2 / (X'X)^-1_cc summed over
 * its columns (Furnival & Wilson re-order the free variables at every node
 * in this spirit), whose "out" side then has the highest bound and is the
 * likeliest to be pruned at once. Any choice partitions the subtree alike;
 * this one keeps it small.
 */
export function branchTerm(problem: SubsetProblem, upper: Layer, order: readonly number[], i: number, dead: Int32Array): number {
  const d = problem.dimension;
  const a = upper.matrix;
  let best = i;
  let bestCost = -1;
  for (let j = i; j < order.length; j++) {
    const t = order[j];
    if (dead[t] > 0) return j;
    let cost = 0;
    // In the swept upper, row c holds the coefficient in the response's column and -(X'X)^-1_cc on the diagonal.
    for (const c of problem.poolBlocks[t]) if (upper.swept[c]) cost += a[c * d + d - 1] ** 2 / -a[c * d + c];
    if (cost > bestCost) {
      bestCost = cost;
      best = j;
    }
  }
  return best;
}

/** Swaps order[i] and order[j] (the walk's re-ordering of its open terms, undone by the same call). */
export function swapTerms(order: number[], i: number, j: number): void {
  const t = order[i];
  order[i] = order[j];
  order[j] = t;
}

/**
 * `to` = the upper `from` (of a node whose lower is `lower`) without its
 * next term order[i]: a downdate, or forward sweeps from the lower when the
 * model has aliased columns or its downdates have drifted past REBUILD_DRIFT.
 */
export function upperWithout(problem: SubsetProblem, base: BaseMatrix, from: Layer, lower: Layer, order: readonly number[], i: number, to: Layer): void {
  copyInto(from, to);
  if (!sweepTermOut(problem, base, to, order[i]) || to.downdateDrift > REBUILD_DRIFT) freshUpper(problem, base, lower, order, i + 1, -1, to);
}

/** True when no member is blocked and every member's needs are members. */
export function hierarchical(problem: SubsetProblem, members: Uint8Array, blocked: Uint8Array): boolean {
  for (let t = 0; t < members.length; t++) {
    if (!members[t]) continue;
    if (blocked[t]) return false;
    for (const r of problem.requires[t]) if (!members[r]) return false;
  }
  return true;
}

/** Per pool term, 1 when it is blocked (a need met by neither pool nor always). */
export function blockedFlags(problem: SubsetProblem): Uint8Array {
  const out = new Uint8Array(problem.poolBlocks.length);
  for (const b of problem.blocked) out[b] = 1;
  return out;
}
