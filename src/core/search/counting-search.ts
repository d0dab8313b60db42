// Exhaustive scoring of the subsets with bit masks in [from, to), in binary
// counting order. Subset i is its parent i & (i - 1) (i without its lowest
// term) plus one term: the parent's swept matrix is copied and one block is
// swept in, O(d^2) per subset independent of the row count, like a Gray-code
// walk. Unlike a Gray-code walk it never sweeps a term back out: reverse
// sweeps on correlated pools (x with x^2, products with their factors) lose
// about eps * kappa per in-out cycle, and on the demo pool that changed the
// best models within 4096 steps. Here every subset's matrix is the result of
// forward sweeps from the base in a fixed order, so its accuracy is that of
// a fresh sweep and results are bit-identical however the range is split.
// The parent of i is still held: between i & (i - 1) and i every mask has
// more terms than the parent, so one matrix per term count suffices.

import { repeatsColumnSpace } from './column-space.ts';
import { pivotUsable, sweepPivot } from './sweep.ts';
import { baseMatrix } from './subset-state.ts';
import { SubsetTally } from './tally.ts';
import type { SearchPartial, SearchSettings, SubsetProblem } from './types.ts';

/** Largest pool the exhaustive walk addresses (31-bit masks). */
export const MAX_EXHAUSTIVE_TERMS = 30;

interface Level {
  matrix: Float64Array;
  rank: number;
  aliased: number;
}

export function scoreSubsetRange(problem: SubsetProblem, settings: SearchSettings, from: number, to: number): SearchPartial {
  const m = problem.poolBlocks.length;
  if (m > MAX_EXHAUSTIVE_TERMS) throw new RangeError(`exhaustive search addresses at most ${MAX_EXHAUSTIVE_TERMS} pool terms`);
  const d = problem.dimension;
  const base = baseMatrix(problem);
  const tally = new SubsetTally(problem, settings, base.rssFloor);
  const levels: Level[] = Array.from({ length: m + 1 }, () => ({ matrix: new Float64Array(d * d), rank: 0, aliased: 0 }));
  const requireMask = problem.requires.map((needs) => needs.reduce((mask, r) => mask | (1 << r), 0));
  const blockedMask = problem.blocked.reduce((mask, b) => mask | (1 << b), 0);
  const members = new Uint8Array(m);
  const sweepIn = (level: Level, t: number) => {
    for (const c of problem.poolBlocks[t]) {
      if (pivotUsable(level.matrix, d, c, base.original[c])) {
        sweepPivot(level.matrix, d, c, 1);
        level.rank++;
      } else {
        level.aliased++;
      }
    }
  };
  const setLevel = (to: Level, fromLevel: { matrix: Float64Array; rank: number; aliased: number }) => {
    to.matrix.set(fromLevel.matrix);
    to.rank = fromLevel.rank;
    to.aliased = fromLevel.aliased;
  };
  // One closure for the walk (not one per subset): the matrix of the subset being scored.
  let current = levels[0].matrix;
  const repeats = () => repeatsColumnSpace(problem, base, current, members);
  const end = Math.min(to, 2 ** m);
  for (let i = from; i < end; i++) {
    const count = popcount(i);
    const level = levels[count];
    if (i === 0) {
      setLevel(level, { matrix: base.matrix, rank: base.rank, aliased: 0 });
    } else if (i === from) {
      // Range start: rebuild the chain of ancestors, highest term first, as the walk from 0 would have.
      setLevel(levels[0], { matrix: base.matrix, rank: base.rank, aliased: 0 });
      for (let t = m - 1, c = 0; t >= 0; t--) {
        if (!((i >>> t) & 1)) continue;
        c++;
        setLevel(levels[c], levels[c - 1]);
        sweepIn(levels[c], t);
      }
    } else {
      const low = i & -i;
      setLevel(level, levels[count - 1]);
      sweepIn(level, 31 - Math.clz32(low));
    }
    let hierarchical = (i & blockedMask) === 0;
    for (let t = 0; t < m; t++) {
      const bit = (i >>> t) & 1;
      members[t] = bit;
      if (bit && (requireMask[t] & ~i) !== 0) hierarchical = false;
    }
    current = level.matrix;
    tally.add(members, level.rank, level.matrix[d * d - 1], level.aliased + base.aliased > 0, hierarchical, repeats);
  }
  return tally.partial();
}

function popcount(x: number): number {
  let v = x - ((x >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return (((v + (v >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}
