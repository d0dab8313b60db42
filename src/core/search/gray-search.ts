// The Gray-code walk, kept as the baseline of scripts/bench-search.ts and
// for well-conditioned pools; the service scores with counting-search.ts,
// which is as fast and keeps a fresh sweep's accuracy (see there).
// Exhaustive scoring of the subsets at Gray-code steps [from, to): one block
// sweep (in or out) per step, O(d^2) each, independent of the row count.
// Sweeping in and out accumulates rounding, so the state is rebuilt from the
// base at every multiple of REFRESH_STEPS (costing at most one sweep per
// member, under 2% extra at 1024) and after any step that met an aliased
// column (the swept set then depends on the order columns came in). Range
// ends that are multiples of REFRESH_STEPS give bit-identical results however
// the walk is split between workers.

import { repeatsColumnSpace } from './column-space.ts';
import { grayCode, toggledBit } from './gray-code.ts';
import { baseMatrix, SubsetState } from './subset-state.ts';
import { SubsetTally } from './tally.ts';
import type { SearchPartial, SearchSettings, SubsetProblem } from './types.ts';

export const REFRESH_STEPS = 1024;

import { MAX_EXHAUSTIVE_TERMS } from './counting-search.ts';

export function scoreGrayRange(
  problem: SubsetProblem,
  settings: SearchSettings,
  from: number,
  to: number,
  onSteps?: (done: number) => void,
): SearchPartial {
  const m = problem.poolBlocks.length;
  if (m > MAX_EXHAUSTIVE_TERMS) throw new RangeError(`exhaustive search addresses at most ${MAX_EXHAUSTIVE_TERMS} pool terms`);
  const base = baseMatrix(problem);
  const state = new SubsetState(problem, base);
  const tally = new SubsetTally(problem, settings, base.rssFloor);
  const repeats = () => repeatsColumnSpace(problem, base, state.matrix, state.members);
  const end = Math.min(to, 2 ** m);
  for (let i = from; i < end; i++) {
    if (i === from || i % REFRESH_STEPS === 0 || state.aliased > 0) {
      const code = grayCode(i);
      state.rebuild((t) => ((code >>> t) & 1) === 1);
      if (onSteps && i !== from) onSteps(i - from);
    } else {
      const t = toggledBit(i);
      if (state.members[t]) state.leave(t);
      else state.enter(t);
    }
    tally.add(state.members, state.rank, state.rss, state.aliased + base.aliased > 0, state.violations === 0, repeats);
  }
  return tally.partial();
}
