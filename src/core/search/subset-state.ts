// One subset held as a swept cross-product matrix, with the bookkeeping a
// walk over subsets needs: which columns are swept, the rank, columns that
// were found aliased (not swept), and how many hierarchy needs are unmet.

import { exactFitFloor } from '../summary/fit.ts';
import { pivotUsable, sweepPivot } from './sweep.ts';
import type { SubsetProblem } from './types.ts';

/** The cross products with the always terms swept in: the start of every subset. */
export interface BaseMatrix {
  matrix: Float64Array;
  swept: Uint8Array;
  rank: number;
  /** Always columns found aliased (rank-deficient in every subset). */
  aliased: number;
  /** Original sums of squares (diagonal) for the relative pivot test. */
  original: Float64Array;
  /** Rounding floor for a residual sum of squares: at or below it the fit is exact (the summary fit's rule). */
  rssFloor: number;
}

export function baseMatrix(problem: SubsetProblem): BaseMatrix {
  const d = problem.dimension;
  const matrix = Float64Array.from(problem.crossProducts);
  const original = new Float64Array(d);
  for (let k = 0; k < d; k++) original[k] = matrix[k * d + k];
  const swept = new Uint8Array(d);
  let rank = problem.intercept ? 1 : 0;
  let aliased = 0;
  for (const c of problem.alwaysColumns) {
    if (pivotUsable(matrix, d, c, original[c])) {
      sweepPivot(matrix, d, c, 1);
      swept[c] = 1;
      rank++;
    } else {
      aliased++;
    }
  }
  const yy = original[d - 1];
  return { matrix, swept, rank, aliased, original, rssFloor: exactFitFloor(yy) };
}

export class SubsetState {
  readonly d: number;
  readonly matrix: Float64Array;
  readonly swept: Uint8Array;
  readonly members: Uint8Array;
  rank = 0;
  /** Pool columns found aliased (not swept) since the last rebuild. */
  aliased = 0;
  /** Unmet hierarchy needs of the member terms (0: hierarchical). */
  violations = 0;
  private readonly dependents: number[][];
  private readonly blocked: Uint8Array;

  constructor(
    private readonly problem: SubsetProblem,
    private readonly base: BaseMatrix,
  ) {
    this.d = problem.dimension;
    this.matrix = new Float64Array(this.d * this.d);
    this.swept = new Uint8Array(this.d);
    const m = problem.poolBlocks.length;
    this.members = new Uint8Array(m);
    this.dependents = Array.from({ length: m }, () => [] as number[]);
    problem.requires.forEach((needs, j) => needs.forEach((r) => this.dependents[r].push(j)));
    this.blocked = new Uint8Array(m);
    for (const b of problem.blocked) this.blocked[b] = 1;
  }

  get rss(): number {
    return this.matrix[this.d * this.d - 1];
  }

  /** Starts afresh from the base and sweeps in the terms of `mask` (bit t: pool term t) in index order. */
  rebuild(isMember: (t: number) => boolean): void {
    this.matrix.set(this.base.matrix);
    this.swept.set(this.base.swept);
    this.rank = this.base.rank;
    this.aliased = 0;
    this.members.fill(0);
    this.violations = 0;
    for (let t = 0; t < this.members.length; t++) if (isMember(t)) this.enter(t);
  }

  /** Adds pool term t (not a member). */
  enter(t: number): void {
    const { d, matrix, swept } = this;
    for (const c of this.problem.poolBlocks[t]) {
      if (pivotUsable(matrix, d, c, this.base.original[c])) {
        sweepPivot(matrix, d, c, 1);
        swept[c] = 1;
        this.rank++;
      } else {
        this.aliased++;
      }
    }
    for (const r of this.problem.requires[t]) if (!this.members[r]) this.violations++;
    for (const j of this.dependents[t]) if (this.members[j]) this.violations--;
    this.violations += this.blocked[t];
    this.members[t] = 1;
  }

  /** Removes pool term t (a member). Only exact while no column is aliased; callers rebuild otherwise. */
  leave(t: number): void {
    const { d, matrix, swept } = this;
    const block = this.problem.poolBlocks[t];
    for (let i = block.length - 1; i >= 0; i--) {
      const c = block[i];
      if (swept[c]) {
        sweepPivot(matrix, d, c, -1);
        swept[c] = 0;
        this.rank--;
      }
    }
    this.members[t] = 0;
    for (const r of this.problem.requires[t]) if (!this.members[r]) this.violations--;
    for (const j of this.dependents[t]) if (this.members[j]) this.violations++;
    this.violations -= this.blocked[t];
  }
}
