// Where a branch-and-bound task starts: the branch order of the pool and the
// first decisions (in or out) taken along it. A prefix fixes a subtree of
// the tree; the subtrees of a set of prefixes that cover the tree's leaves
// partition the 2^m subsets, so tasks can run anywhere and their counts add.

import { baseInto, emptyLayer, sweepTermIn, type Layer } from './branch-layers.ts';
import { sweepPivot } from './sweep.ts';
import { baseMatrix, type BaseMatrix } from './subset-state.ts';
import type { SubsetProblem } from './types.ts';

/** A part of the tree: the first `decided.length` terms of `order` fixed in (1) or out (0). */
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

/** The node's lower (S swept in, in branch order) and upper (then F, in branch order): both fresh forward sweeps. */
export function prefixLayers(problem: SubsetProblem, base: BaseMatrix, prefix: BranchPrefix, lower: Layer, upper: Layer): void {
  baseInto(base, lower);
  prefix.decided.forEach((inside, i) => {
    if (inside) sweepTermIn(problem, base, lower, prefix.order[i]);
  });
  freshUpper(problem, base, lower, prefix.order, prefix.decided.length, -1, upper);
}

/** `to` = `lower` with the open terms order[from..] (except `skip`) swept in after it: a fresh upper. */
export function freshUpper(problem: SubsetProblem, base: BaseMatrix, lower: Layer, order: readonly number[], from: number, skip: number, to: Layer): void {
  to.matrix.set(lower.matrix);
  to.swept.set(lower.swept);
  to.rank = lower.rank;
  to.aliased = lower.aliased;
  to.drift = lower.drift;
  to.downdated = lower.downdated;
  for (let i = from; i < order.length; i++) if (order[i] !== skip) sweepTermIn(problem, base, to, order[i]);
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
