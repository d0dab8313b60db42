// The lower bound of branch and bound: no subset below a node can score
// better than this, so a node whose bound is above the worst kept model is
// not explored. Every subset below the node (S in, F open) is S + G with G
// a part of F.
//
// Residual sum of squares, per number g of added terms: RSS(S + G) is at
// least RSS(S + F) (Furnival & Wilson's bound: a model's RSS falls as terms
// are added), and at least RSS(S) minus the largest reduction g terms of F
// can make. That reduction is r_G' M_GG^-1 r_G (M: the cross products of
// F's columns after S is swept in, r: their cross products with the
// response); written with the column-scaled M (a correlation matrix C) it is
// at most sum over G's columns of r_c^2 / M_cc, divided by the smallest
// eigenvalue of C_GG, which is at least that of C_FF (Cauchy interlacing).
// r_c^2 / M_cc is what column c alone would take off RSS(S), so the bound is
// RSS(S) - (the g largest single-term reductions) / lambda_min. The same
// lambda stays valid below the node: after more of F is swept in, C of the
// remaining columns is a rescaled Schur complement of C_FF, whose smallest
// eigenvalue is no smaller (its inverse is a principal block of C_FF's
// inverse), and the rescaling only lengthens vectors. So lambda is computed
// once at a task's root and carried down.
//
// Criterion, across sizes: every criterion here is n ln RSS + a penalty
// rising with k, and a subset of S + g terms has k >= k(S) + g (each term
// adds its columns; in the 'skip' rule a subset with an aliased column is
// passed over, so the counted ones are of full rank). The bound is the
// smallest criterion over g of (RSS bound for g, k(S) + g).

import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { pivotUsable } from './sweep.ts';
import type { BaseMatrix } from './subset-state.ts';
import type { Layer } from './branch-layers.ts';
import type { SubsetScorer } from './scorer.ts';
import type { SearchSettings, SubsetProblem } from './types.ts';

/** Relative slack on the criterion before a bound counts as above the worst kept value. */
export const PRUNE_MARGIN = 1e-9;

/** Drift (branch-layers.ts) is an estimate: the bound takes this many times it off a residual sum of squares. */
const DRIFT_SAFETY = 16;

/**
 * Eigenvalue floors below this are not worth the arithmetic: the reduction
 * bound then exceeds what RSS(S + F) allows anyway.
 */
const SMALLEST_USEFUL_FLOOR = 0.02;

/** Absolute slack on a computed eigenvalue of a correlation matrix (rounding in it is ~1e-15 d; far below this). */
const EIGENVALUE_SLACK = 1e-6;

/**
 * A lower bound on the smallest eigenvalue of the correlation matrix of the
 * given unswept columns in `matrix` (their cross products after the swept
 * columns are taken out), or 0 when it is too small to help.
 */
export function correlationFloor(matrix: Float64Array, d: number, columns: readonly number[]): number {
  const p = columns.length;
  if (p <= 1) return p === 1 ? 1 - EIGENVALUE_SLACK : 0;
  const c = new Matrix(p, p);
  for (let i = 0; i < p; i++) {
    const ci = columns[i];
    for (let j = 0; j < p; j++) {
      const cj = columns[j];
      c.set(i, j, matrix[ci * d + cj] / Math.sqrt(matrix[ci * d + ci] * matrix[cj * d + cj]));
    }
  }
  const values = new EigenvalueDecomposition(c, { assumeSymmetric: true }).realEigenvalues;
  const floor = Math.min(...values) - EIGENVALUE_SLACK;
  return floor >= SMALLEST_USEFUL_FLOOR ? floor : 0;
}

/** What a bound needs to know about a node besides its two layers. */
export interface NodeView {
  /** Branch order and the depth: open terms are order[depth..]. */
  order: readonly number[];
  depth: number;
  /** Per pool term, > 0 when it can be in no counted subset below (a hierarchy need decided out, or blocked). */
  dead: Int32Array | Uint8Array;
  /** Eigenvalue floor valid at this node (0: unknown). */
  floor: number;
}

export class SubsetBound {
  private readonly d: number;
  private readonly gains: Float64Array;
  private readonly widths: Float64Array;
  private readonly skip: boolean;
  /** The response's sum of squares with the always terms in: the scale of every drift. */
  private readonly scale: number;

  constructor(
    private readonly problem: SubsetProblem,
    private readonly base: BaseMatrix,
    private readonly score: SubsetScorer,
    settings: SearchSettings,
  ) {
    this.d = problem.dimension;
    this.gains = new Float64Array(problem.poolBlocks.length);
    this.widths = new Float64Array(problem.poolBlocks.length);
    this.skip = settings.rankDeficient === 'skip';
    this.scale = base.matrix[this.d * this.d - 1];
  }

  /** The columns of the open terms that can still enter a counted subset: where the eigenvalue floor is taken. */
  liveColumns(lower: Layer, node: NodeView): number[] {
    const out: number[] = [];
    for (let i = node.depth; i < node.order.length; i++) {
      const t = node.order[i];
      if (node.dead[t] > 0) continue;
      const block = this.problem.poolBlocks[t];
      if (block.every((c) => pivotUsable(lower.matrix, this.d, c, this.base.original[c]))) out.push(...block);
    }
    return out;
  }

  /** True when no subset strictly below the node (S plus one or more open terms) can score `threshold` or better. */
  cannotEnter(lower: Layer, upper: Layer, node: NodeView, threshold: number): boolean {
    if (threshold === Infinity) return false;
    const limit = threshold + PRUNE_MARGIN * (1 + Math.abs(threshold));
    const { d, problem, base } = this;
    const a = lower.matrix;
    // A subset of S with an aliased column: every subset below has it too, and the 'skip' rule passes them all over.
    if (this.skip && lower.aliased + base.aliased > 0) return true;
    const floorRss = base.rssFloor;
    const rssUpper = Math.max(upper.matrix[d * d - 1] - DRIFT_SAFETY * upper.drift * this.scale, floorRss);
    const kS = lower.rank + 1;
    let live = 0;
    let unusable = false;
    let narrowest = Infinity;
    let allSingle = true;
    for (let i = node.depth; i < node.order.length; i++) {
      const t = node.order[i];
      if (node.dead[t] > 0) continue;
      let gain = 0;
      let usable = true;
      for (const c of problem.poolBlocks[t]) {
        const pivot = a[c * d + c];
        if (!pivotUsable(a, d, c, base.original[c])) {
          usable = false;
          continue;
        }
        const r = a[c * d + d - 1];
        gain += (r * r) / pivot;
      }
      if (!usable) {
        // 'skip': the term can only enter rank-deficient subsets, all passed over. 'score': they are scored
        // with their rank, so an added term may add nothing to k; fall back to the bound at k(S).
        if (this.skip) continue;
        unusable = true;
      }
      const width = problem.poolBlocks[t].length;
      if (width !== 1) allSingle = false;
      narrowest = Math.min(narrowest, width);
      this.gains[live] = gain;
      this.widths[live] = width;
      live++;
    }
    if (live === 0) return true;
    if (unusable) return !(this.score(rssUpper, kS) <= limit);
    if (node.floor <= 0) return !(this.score(rssUpper, kS + narrowest) <= limit);
    const gains = this.gains.subarray(0, live).sort().reverse();
    const widths = allSingle ? null : this.widths.subarray(0, live).sort();
    const rssLower = a[d * d - 1] - DRIFT_SAFETY * lower.drift * this.scale;
    let reduction = 0;
    let k = kS;
    for (let g = 0; g < live; g++) {
      reduction += gains[g];
      k += widths ? widths[g] : 1;
      const rss = Math.max(rssUpper, rssLower - reduction / node.floor);
      const value = this.score(rss, k);
      // NaN: the criterion is undefined from this k on (AICc with n - k - 1 <= 0), so no larger subset counts.
      if (Number.isNaN(value)) return true;
      if (value <= limit) return false;
      if (rss === rssUpper) return true;
    }
    return true;
  }
}
