// Branch and bound over subsets after Furnival & Wilson's leaps and bounds
// (Technometrics 16, 1974): a regression tree paired with an inverse tree.
// A node holds S (terms decided in) and F (terms still open) with two swept
// matrices, the lower S and the upper S + F. Deciding the next term in
// sweeps it into a copy of the lower (the regression tree); deciding it out
// reverse-sweeps it out of a copy of the upper (the inverse tree). Each new
// lower and each new upper is itself a subset and is scored where it is made,
// so the big models of the inverse tree come at the price of the bound they
// were needed for, and every subset is made exactly once: a subset is the
// lower of the node after its last "in" or the upper of the node after its
// last "out". subset-bound.ts says why no subset below a node can beat its
// bound; a node above the worst kept model (or the stepwise start's, see
// stepwise-start.ts) is not explored, and its subsets count as pruned.
// Which open term a node branches on is chosen there (branchTerm: the one
// costliest to drop from the upper), so the order of the open terms changes
// along a path. The hierarchy rule cuts whole subtrees: once a term is in and
// a term it needs is out, nothing below is admissible.

import { copyInto, emptyLayer, sweepTermIn, type Layer } from './branch-layers.ts';
import { blockedFlags, branchTerm, dependentsOf, freshUpper, hierarchical, prefixLayers, prefixState, swapTerms, upperWithout, type BranchPrefix } from './branch-prefix.ts';
import { repeatsColumnSpace } from './column-space.ts';
import { correlationFloor, PRUNE_MARGIN, SubsetBound } from './subset-bound.ts';
import { baseMatrix } from './subset-state.ts';
import { CountedSubsets, subsetKey } from './subset-keys.ts';
import { SubsetTally } from './tally.ts';
import type { SearchPartial, SearchSettings, SubsetProblem } from './types.ts';

/** What a task is given besides its subtree: the stepwise start. */
export interface BranchStart {
  /** The worst value among the `top` models the start kept (Infinity when it kept fewer): nothing worse can enter. */
  threshold: number;
  /** The start's kept subsets (pool term indices): counted by the start, so passed over here. */
  counted: number[][];
  /** Eigenvalue floor at the search's root (subset-bound.ts), valid at every node; 0 when unknown. */
  floor: number;
}

export const NO_START: BranchStart = { threshold: Infinity, counted: [], floor: 0 };

/** Open terms below which a task does not compute its own eigenvalue floor (the root's serves). */
const OWN_FLOOR_TERMS = 6;

/**
 * The subsets of one subtree. `keepGoing` is asked every 256 nodes (and at
 * the first) with the nodes visited so far; false stops the walk, and the
 * partial says so (`stopped`).
 */
export function branchAndBound(
  problem: SubsetProblem,
  settings: SearchSettings,
  prefix: BranchPrefix,
  start: BranchStart = NO_START,
  keepGoing?: (nodes: number) => boolean,
): SearchPartial {
  const m = problem.poolBlocks.length;
  const d = problem.dimension;
  const base = baseMatrix(problem);
  const tally = new SubsetTally(problem, settings, base.rssFloor);
  const bound = new SubsetBound(problem, base, tally.score, settings);
  const blocked = blockedFlags(problem);
  const dependents = dependentsOf(problem);
  const counted = new CountedSubsets(start.counted);
  // The task's own copy: the walk re-orders the open part as it branches (branchTerm), and puts it back.
  const order = [...prefix.order];
  const state = prefixState(problem, prefix);
  const { lowerMembers, upperMembers, dead } = state;
  const depth0 = prefix.decided.length;
  const open0 = m - depth0;
  if (state.broken > 0) {
    // A term in S needs one decided out: nothing in this subtree is admissible (and nothing the start counted is here).
    tally.notHierarchical += 2 ** open0;
    return tally.partial();
  }
  // One lower and one upper per depth, made when the walk first reaches it (most tasks end near their root).
  const lowers: Layer[] = [];
  const uppers: Layer[] = [];
  const at = (layers: Layer[], i: number): Layer => (layers[i] ??= emptyLayer(d));
  const scratch = emptyLayer(d);
  let lowKey = subsetKey(lowerMembers);
  let upKey = subsetKey(upperMembers);
  const threshold = () => Math.min(tally.top.threshold, start.threshold);

  let current = scratch.matrix;
  let currentMembers = lowerMembers;
  const repeats = () => repeatsColumnSpace(problem, base, current, currentMembers);
  const add = (layer: Layer, members: Uint8Array): void => {
    current = layer.matrix;
    currentMembers = members;
    tally.add(members, layer.rank, layer.matrix[d * d - 1], layer.aliased + base.aliased > 0, hierarchical(problem, members, blocked), repeats);
  };
  const scoreLower = (layer: Layer): void => {
    if (!counted.has(lowKey)) add(layer, lowerMembers);
  };
  /** The upper of a node whose lower is `lower` and whose open terms are order[from..]. */
  const scoreUpper = (layer: Layer, lower: Layer, from: number): void => {
    if (counted.has(upKey)) return;
    if (layer.downdateDrift > 0) {
      // A downdate is a few roundings off a fresh sweep: good enough for weights, not for the top list. A subset
      // within reach of the top is swept afresh, so a listed value is a fresh sweep's whatever path found it.
      const t = threshold();
      const value = tally.score(Math.max(layer.matrix[d * d - 1], base.rssFloor), layer.rank + 1);
      if (!(value > t + PRUNE_MARGIN * (1 + Math.abs(t)))) {
        freshUpper(problem, base, lower, order, from, -1, scratch);
        add(scratch, upperMembers);
        return;
      }
    }
    add(layer, upperMembers);
  };

  /** Node at depth i (order[0..i-1] decided, |F| = m - i >= 2); its lower and upper are already counted. */
  const explore = (i: number, lo: Layer, up: Layer, floor: number): void => {
    tally.nodes++;
    if (keepGoing && (tally.nodes & 255) === 1 && !keepGoing(tally.nodes)) tally.stopped = true;
    if (tally.stopped) return;
    if (bound.cannotEnter(lo, up, { order, depth: i, dead, floor }, threshold())) {
      tally.pruned += 2 ** (m - i) - 2 - counted.inside(lowKey, upKey);
      return;
    }
    const chosen = branchTerm(problem, up, order, i, dead);
    swapTerms(order, i, chosen);
    const t = order[i];
    const bit = 2 ** t;
    const half = 2 ** (m - i - 1);
    // In: S + t with F - t; the upper stays.
    if (dead[t] > 0) {
      // t needs a term decided out (or is blocked): nothing with it is admissible; the upper, which holds t, is counted.
      tally.notHierarchical += half - 1;
    } else {
      const nl = at(lowers, i + 1);
      copyInto(lo, nl);
      sweepTermIn(problem, base, nl, t);
      lowerMembers[t] = 1;
      lowKey += bit;
      scoreLower(nl);
      if (i + 2 < m) explore(i + 1, nl, up, floor);
      lowerMembers[t] = 0;
      lowKey -= bit;
    }
    if (!tally.stopped) branchOut(i, t, lo, up, floor);
    swapTerms(order, i, chosen);
  };

  /** Out: S with F - t; the lower stays. */
  const branchOut = (i: number, t: number, lo: Layer, up: Layer, floor: number): void => {
    const bit = 2 ** t;
    const half = 2 ** (m - i - 1);
    let broken = 0;
    for (const j of dependents[t]) {
      if (lowerMembers[j] && dead[j] === 0) broken++;
      dead[j]++;
    }
    upperMembers[t] = 0;
    upKey -= bit;
    if (broken > 0) {
      // A term of S needs t: nothing below is admissible; S itself is counted.
      tally.notHierarchical += half - 1;
    } else {
      const nu = at(uppers, i + 1);
      upperWithout(problem, base, up, lo, order, i, nu);
      scoreUpper(nu, lo, i + 1);
      if (i + 2 < m) explore(i + 1, lo, nu, floor);
    }
    upperMembers[t] = 1;
    upKey += bit;
    for (const j of dependents[t]) dead[j]--;
  };

  const lower = at(lowers, depth0);
  const upper = at(uppers, depth0);
  prefixLayers(problem, base, prefix, lower, upper);
  scoreLower(lower);
  if (open0 > 0) scoreUpper(upper, lower, depth0);
  if (open0 >= 2) {
    let floor = start.floor;
    const view = { order, depth: depth0, dead, floor };
    if (open0 >= OWN_FLOOR_TERMS && !bound.cannotEnter(lower, upper, view, threshold())) {
      // A task's open terms are fewer than the root's, and its S is swept out of them: often a better-conditioned C.
      floor = Math.max(floor, correlationFloor(lower.matrix, d, bound.liveColumns(lower, view)));
    }
    explore(depth0, lower, upper, floor);
  }
  return tally.partial();
}
