// Branch and bound over subsets in the manner of Furnival & Wilson's leaps
// and bounds (Technometrics 16, 1974): a node holds S (terms decided in) and
// F (terms still open); every subset below it is S plus part of F, so the
// residual sum of squares of S + F bounds theirs from below, and with the
// smallest parameter count below the node (that of S) it bounds the
// criterion from below — every criterion here rises with RSS and with k.
// A subtree whose bound is above the worst kept model cannot enter the top
// and is skipped. Two matrices per depth: `lower` (S swept in) and `upper`
// (S + F swept in); a branch costs one sweep into lower (term in) or one
// reverse sweep out of upper (term out). Weights and importance then cover
// only the evaluated subsets; the partial says how many were pruned.

import { repeatsColumnSpace } from './column-space.ts';
import { pivotUsable, sweepPivot } from './sweep.ts';
import { baseMatrix, type BaseMatrix } from './subset-state.ts';
import { SubsetTally } from './tally.ts';
import type { SearchPartial, SearchSettings, SubsetProblem } from './types.ts';

/** A part of the tree: the first `decided.length` terms of `order` fixed in (1) or out (0). */
export interface BranchPrefix {
  order: number[];
  decided: number[];
}

/** Criterion noise allowance for pruning: a bound must exceed the worst kept value by this much (relative). */
const PRUNE_MARGIN = 1e-9;

interface Layer {
  matrix: Float64Array;
  swept: Uint8Array;
  rank: number;
  aliased: number;
}

/**
 * Terms most costly to drop from the full model first: excluding them early
 * raises the upper bound most, so whole subtrees fall away near the root
 * (Furnival & Wilson order by the full model's t statistics; this is the
 * block form of that, the rise in RSS when the term leaves the full model).
 */
export function branchOrder(problem: SubsetProblem): number[] {
  const base = baseMatrix(problem);
  const full = layerFrom(base);
  const m = problem.poolBlocks.length;
  for (let t = 0; t < m; t++) sweepBlockIn(problem, base, full, t);
  const d = problem.dimension;
  const rise = problem.poolBlocks.map((block) => {
    const trial = cloneLayer(full);
    for (const c of block) if (trial.swept[c]) sweepPivot(trial.matrix, d, c, -1);
    return trial.matrix[d * d - 1] - full.matrix[d * d - 1];
  });
  return [...rise.keys()].sort((a, b) => rise[b] - rise[a] || a - b);
}

export function branchAndBound(
  problem: SubsetProblem,
  settings: SearchSettings,
  prefix: BranchPrefix,
  keepGoing?: (nodes: number, covered: number) => boolean,
): SearchPartial {
  const m = problem.poolBlocks.length;
  const d = problem.dimension;
  const base = baseMatrix(problem);
  const tally = new SubsetTally(problem, settings, base.rssFloor);
  const { order } = prefix;
  const members = new Uint8Array(m);
  const lowers: Layer[] = [];
  const uppers: Layer[] = [];
  for (let i = 0; i <= m; i++) {
    lowers.push(emptyLayer(d));
    uppers.push(emptyLayer(d));
  }
  // The prefix root: S = decided-in terms, F = the undecided ones.
  const depth0 = prefix.decided.length;
  const lower = lowers[depth0];
  copyInto(layerFrom(base), lower);
  const upper = uppers[depth0];
  copyInto(layerFrom(base), upper);
  for (let i = 0; i < depth0; i++) {
    if (prefix.decided[i] === 1) {
      members[order[i]] = 1;
      sweepBlockIn(problem, base, lower, order[i]);
      sweepBlockIn(problem, base, upper, order[i]);
    }
  }
  for (let i = depth0; i < m; i++) sweepBlockIn(problem, base, upper, order[i]);

  const hierarchical = (): boolean => {
    for (let t = 0; t < m; t++) {
      if (!members[t]) continue;
      if (problem.blocked.includes(t)) return false;
      for (const r of problem.requires[t]) if (!members[r]) return false;
    }
    return true;
  };
  let current = lower.matrix;
  const repeats = () => repeatsColumnSpace(problem, base, current, members);
  const evaluate = (layer: Layer): void => {
    current = layer.matrix;
    tally.add(members, layer.rank, layer.matrix[d * d - 1], layer.aliased + base.aliased > 0, hierarchical(), repeats);
  };

  let covered = 0;
  const explore = (i: number, lo: Layer, up: Layer): void => {
    if (tally.stopped || i >= m) return;
    tally.nodes++;
    if (keepGoing && (tally.nodes & 255) === 0 && !keepGoing(tally.nodes, covered + tally.pruned)) {
      tally.stopped = true;
      return;
    }
    const worst = tally.top.threshold;
    if (worst !== Infinity) {
      const rss = Math.max(up.matrix[d * d - 1], base.rssFloor);
      const bound = tally.score(rss, lo.rank + 1);
      // NaN: no subset below is scorable (AICc past n - k - 1 <= 0 only grows k).
      if (Number.isNaN(bound) || bound > worst + PRUNE_MARGIN * (1 + Math.abs(worst))) {
        tally.pruned += 2 ** (m - i) - 1;
        return;
      }
    }
    const t = order[i];
    const inLower = lowers[i + 1];
    copyInto(lo, inLower);
    sweepBlockIn(problem, base, inLower, t);
    members[t] = 1;
    evaluate(inLower);
    covered++;
    explore(i + 1, inLower, up);
    members[t] = 0;
    const outUpper = uppers[i + 1];
    copyInto(up, outUpper);
    sweepBlockOut(problem, base, outUpper, t, members, order, i + 1);
    explore(i + 1, lo, outUpper);
  };
  evaluate(lower);
  explore(depth0, lower, upper);
  return tally.partial();
}

function emptyLayer(d: number): Layer {
  return { matrix: new Float64Array(d * d), swept: new Uint8Array(d), rank: 0, aliased: 0 };
}

function layerFrom(base: BaseMatrix): Layer {
  return { matrix: Float64Array.from(base.matrix), swept: Uint8Array.from(base.swept), rank: base.rank, aliased: 0 };
}

function cloneLayer(l: Layer): Layer {
  return { matrix: Float64Array.from(l.matrix), swept: Uint8Array.from(l.swept), rank: l.rank, aliased: l.aliased };
}

function copyInto(from: Layer, to: Layer): void {
  to.matrix.set(from.matrix);
  to.swept.set(from.swept);
  to.rank = from.rank;
  to.aliased = from.aliased;
}

function sweepBlockIn(problem: SubsetProblem, base: BaseMatrix, layer: Layer, t: number): void {
  const d = problem.dimension;
  for (const c of problem.poolBlocks[t]) {
    if (pivotUsable(layer.matrix, d, c, base.original[c])) {
      sweepPivot(layer.matrix, d, c, 1);
      layer.swept[c] = 1;
      layer.rank++;
    } else {
      layer.aliased++;
    }
  }
}

/**
 * Removes term t from an upper model. If that model had aliased columns,
 * removing t may free some of them (they were aliased only through t), so
 * the still-open and decided-in terms' unswept columns are tried again;
 * otherwise the bound would be too high and could prune a subset wrongly.
 */
function sweepBlockOut(
  problem: SubsetProblem,
  base: BaseMatrix,
  layer: Layer,
  t: number,
  members: Uint8Array,
  order: number[],
  openFrom: number,
): void {
  const d = problem.dimension;
  const block = problem.poolBlocks[t];
  let freed = false;
  for (let i = block.length - 1; i >= 0; i--) {
    const c = block[i];
    if (layer.swept[c]) {
      sweepPivot(layer.matrix, d, c, -1);
      layer.swept[c] = 0;
      layer.rank--;
    } else {
      layer.aliased--;
      freed = true;
    }
  }
  if (layer.aliased === 0 && !freed) return;
  const retry = (u: number) => {
    for (const c of problem.poolBlocks[u]) {
      if (!layer.swept[c] && pivotUsable(layer.matrix, d, c, base.original[c])) {
        sweepPivot(layer.matrix, d, c, 1);
        layer.swept[c] = 1;
        layer.rank++;
        layer.aliased--;
      }
    }
  };
  for (let u = 0; u < members.length; u++) if (members[u]) retry(u);
  for (let i = openFrom; i < order.length; i++) retry(order[i]);
}
