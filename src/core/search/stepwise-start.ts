// The start of branch and bound: stepwise selection with swaps (from the
// model of the always terms alone, take at each step the best of adding one
// term, dropping one, or swapping one in for one out, while the criterion
// falls: the sequential replacement of Miller, "Subset Selection in
// Regression", 2nd ed., ch. 3, cited from memory). It is cheap and usually
// lands on or near the best subset, so the best `top` subsets it met give
// branch and bound a threshold from its first node, and a task that starts
// anywhere in the tree prunes against it. Being only a start, it changes no
// answer: its kept subsets are scored as the tree scores a subset (a fresh
// forward sweep, through the same tally rules), counted once here and passed
// over by the tree. When a node budget stops the tree, the best found so far
// are at least as good as this stepwise answer.

import { baseInto, copyInto, emptyLayer, sweepTermIn, sweepTermOut, type Layer } from './branch-layers.ts';
import { pivotUsable } from './sweep.ts';
import { blockedFlags, hierarchical } from './branch-prefix.ts';
import { repeatsColumnSpace } from './column-space.ts';
import { baseMatrix, type BaseMatrix } from './subset-state.ts';
import { subsetKey } from './subset-keys.ts';
import { SubsetTally } from './tally.ts';
import type { ScoredSubset, SearchSettings, SubsetProblem } from './types.ts';

export interface StepwiseStart {
  /** The best `top` subsets met (fewer if fewer were admissible), best first. */
  kept: ScoredSubset[];
  /** The worst kept value once `top` are kept, else Infinity. */
  threshold: number;
  /** Moves taken from the always-only model. */
  moves: number;
}

/** Most moves the start takes on a pool of m terms (each move lowers the criterion; this only caps a pathological pool). */
export const STEPWISE_ROUNDS = (m: number): number => 4 * m + 8;

/** Candidates re-scored afresh beyond `top`, so a near-tie between the quick and the fresh value cannot drop one. */
export const RESCORED_EXTRA = 16;

export function stepwiseStart(problem: SubsetProblem, settings: SearchSettings, order: readonly number[]): StepwiseStart {
  const m = problem.poolBlocks.length;
  const d = problem.dimension;
  const base = baseMatrix(problem);
  const blocked = blockedFlags(problem);
  const quick = new SubsetTally(problem, settings, base.rssFloor);
  const met = new Map<number, { terms: number[]; value: number }>();
  const current = emptyLayer(d);
  const dropped = emptyLayer(d);
  const trial = emptyLayer(d);
  const members = new Uint8Array(m);

  let best: { value: number; terms: number[] } | null = null;
  /** Records the subset `members` with residual sum of squares `rss` and design rank `rank`, if it is admissible. */
  const consider = (rss: number, rank: number): void => {
    if (rank >= problem.observations || !(rss > base.rssFloor) || !hierarchical(problem, members, blocked)) return;
    const value = quick.score(rss, rank + 1);
    if (Number.isNaN(value)) return;
    const terms: number[] = [];
    for (let t = 0; t < m; t++) if (members[t]) terms.push(t);
    const key = subsetKey(members);
    if (!met.has(key)) met.set(key, { terms, value });
    if (best === null || value < best.value || (value === best.value && terms.length < best.terms.length)) best = { value, terms };
  };
  /**
   * Considers `from`'s model plus term t: a one-column term by the update
   * RSS - r^2 / D from `from`'s swept matrix (no sweep), a factor by a block
   * sweep into `trial`; skipped when a column is aliased.
   */
  const considerWith = (from: Layer, t: number): void => {
    const block = problem.poolBlocks[t];
    members[t] = 1;
    if (block.length === 1) {
      const c = block[0];
      if (pivotUsable(from.matrix, d, c, base.original[c])) {
        const r = from.matrix[c * d + d - 1];
        consider(from.matrix[d * d - 1] - (r * r) / from.matrix[c * d + c], from.rank + 1);
      }
    } else {
      copyInto(from, trial);
      sweepTermIn(problem, base, trial, t);
      if (trial.aliased === from.aliased) consider(trial.matrix[d * d - 1], trial.rank);
    }
    members[t] = 0;
  };

  // Every subset holds the aliased always columns: none is counted under 'skip', and the start has nothing to offer.
  if (base.aliased > 0) return { kept: [], threshold: Infinity, moves: 0 };
  freshLayer(problem, base, order, members, current);
  consider(current.matrix[d * d - 1], current.rank);
  let value = (best as { value: number } | null)?.value ?? NaN;
  let moves = 0;
  for (let step = 0; step < STEPWISE_ROUNDS(m); step++) {
    best = null;
    for (const t of order) if (!members[t]) considerWith(current, t);
    for (const j of order) {
      if (!members[j]) continue;
      // Dropping j by a downdate of the current model: a few roundings off a fresh sweep, which only steer the
      // moves here; what the start keeps is re-scored afresh below.
      copyInto(current, dropped);
      sweepTermOut(problem, base, dropped, j);
      members[j] = 0;
      consider(dropped.matrix[d * d - 1], dropped.rank);
      for (const t of order) if (!members[t] && t !== j) considerWith(dropped, t);
      members[j] = 1;
    }
    const move = best as { value: number; terms: number[] } | null;
    if (move === null || !(Number.isNaN(value) || move.value < value)) break;
    members.fill(0);
    for (const t of move.terms) members[t] = 1;
    freshLayer(problem, base, order, members, current);
    value = move.value;
    moves++;
  }

  // The best subsets met, scored afresh through the tally's rules (aliasing, column-space repeats, exact fits).
  const tally = new SubsetTally(problem, settings, base.rssFloor);
  const candidates = [...met.values()].sort((a, b) => a.value - b.value || a.terms.length - b.terms.length);
  let matrix = trial.matrix;
  const repeats = () => repeatsColumnSpace(problem, base, matrix, members);
  for (const c of candidates.slice(0, settings.top + RESCORED_EXTRA)) {
    members.fill(0);
    for (const t of c.terms) members[t] = 1;
    freshLayer(problem, base, order, members, trial);
    matrix = trial.matrix;
    tally.add(members, trial.rank, trial.matrix[d * d - 1], trial.aliased + base.aliased > 0, hierarchical(problem, members, blocked), repeats);
  }
  const kept = tally.top.sorted();
  return { kept, threshold: kept.length >= settings.top ? kept[kept.length - 1].value : Infinity, moves };
}

/** `to` = the base with `members` swept in, in the root's branch order: a fresh forward sweep, as a lower of the tree is. */
function freshLayer(problem: SubsetProblem, base: BaseMatrix, order: readonly number[], members: Uint8Array, to: Layer): void {
  baseInto(base, to);
  for (const t of order) if (members[t]) sweepTermIn(problem, base, to, t);
}
