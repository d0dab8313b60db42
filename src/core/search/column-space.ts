// Counting each model once. Two subsets of the pool are the same model when
// their design columns span the same space (c = a + b makes {a, b}, {a, c},
// {b, c} one model): same fitted values, RSS and k. Such a set of subsets
// (every independent subset whose span is a given space) gets one
// representative, the greedy basis in pool order of the terms lying in that
// space — the independent sets of a matroid's flat have exactly one greedy
// basis, so exactly one subset per column space is kept (Oxley, "Matroid
// Theory", 1.8: the greedy algorithm). A subset is passed over when it is not
// that representative. Only a pool with exactly collinear columns pays for the
// check; otherwise no term outside a subset lies in its span and it returns at
// once.
//
// A factor is a block of columns and may lie partly in a span; then no
// subset of whole terms is a clean basis, and the subset is kept (counted
// as its own model) rather than risk dropping the space altogether.

import { pivotUsable, sweepPivot } from './sweep.ts';
import type { BaseMatrix } from './subset-state.ts';
import type { SubsetProblem } from './types.ts';

/**
 * True when the full-rank subset `members`, held swept in `matrix` (its
 * columns and the always columns swept, nothing else), spans the same
 * column space as another admissible subset that counts instead.
 */
export function repeatsColumnSpace(problem: SubsetProblem, base: BaseMatrix, matrix: Float64Array, members: Uint8Array): boolean {
  const d = problem.dimension;
  const m = problem.poolBlocks.length;
  // Terms outside the subset lying wholly in its span: unswept columns whose remaining sum of squares is at rounding level.
  let inSpan: number[] | null = null;
  for (let t = 0; t < m; t++) {
    if (members[t]) continue;
    const block = problem.poolBlocks[t];
    if (block.length > 0 && block.every((c) => !pivotUsable(matrix, d, c, base.original[c]))) (inSpan ??= []).push(t);
  }
  if (inSpan === null) return false;
  // The greedy basis, in pool order, of the terms in the span.
  const closure = new Uint8Array(m);
  for (let t = 0; t < m; t++) closure[t] = members[t];
  for (const t of inSpan) closure[t] = 1;
  const trial = Float64Array.from(base.matrix);
  const greedy = new Uint8Array(m);
  for (let t = 0; t < m; t++) {
    if (!closure[t]) continue;
    const block = problem.poolBlocks[t];
    let usable = 0;
    for (const c of block) {
      if (pivotUsable(trial, d, c, base.original[c])) {
        sweepPivot(trial, d, c, 1);
        usable++;
      }
    }
    if (usable === block.length) greedy[t] = 1;
    else if (usable > 0) return false; // a factor partly in the span: no clean representative
  }
  let same = true;
  for (let t = 0; t < m; t++) if (greedy[t] !== members[t]) same = false;
  if (same) return false;
  // The representative counts only if the search admits it; otherwise this subset stands for the space.
  for (let t = 0; t < m; t++) {
    if (!greedy[t]) continue;
    if (problem.blocked.includes(t)) return false;
    for (const r of problem.requires[t]) if (!greedy[r]) return false;
  }
  return true;
}
