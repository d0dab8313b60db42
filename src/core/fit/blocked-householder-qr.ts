// Blocked Householder QR with the same limited pivoting as householderQR, for
// tall designs: the reflectors of a panel reach the columns after it as one
// block (compact WY, block-reflector.ts), and a panel is itself factorised
// recursively (left half, its block onto the right half, right half; after
// Elmroth & Gustavson 2000), so that most of the O(n p^2) work is done by
// cache-tiled block products instead of one pass over memory per reflector.
//
// Pivoting decisions are the unblocked kernel's: candidates are decided in the
// caller's order, each from its remaining norm computed afresh once every
// accepted reflector has reached it. `upto[c]` counts the reflectors that have
// reached candidate c; a candidate beyond the window a block was applied to
// (a panel that lost a column to aliasing takes the next one) first catches up
// reflector by reflector. The result has the layout of householderQR, so
// applyQt, applyQ, the triangular solves and the covariance read it unchanged.
// Its last bits differ from the unblocked kernel's (sums in another order).

import type { HouseholderQR } from './householder-qr.ts';
import { applyBlock, blockFactor } from './block-reflector.ts';

/** Reflectors start..start+size-1 as I - V T V^T; t is size x size, row-major, upper triangular. */
export interface ReflectorBlock {
  start: number;
  size: number;
  t: Float64Array;
}

export interface BlockShape {
  /** Reflectors per top-level panel, applied as one block to every later column. */
  panel: number;
  /** Panel width below which the recursion factorises column by column. */
  leaf: number;
}

/** Panel and leaf widths tried at 100,000 x 31: 8/4, 16/4, 32/4 and 8/2. */
export const DEFAULT_BLOCK_SHAPE: BlockShape = { panel: 16, leaf: 4 };

export function blockedHouseholderQR(
  columns: ArrayLike<number>[],
  rows: number,
  candidates: number[],
  referenceNorm: ArrayLike<number>,
  tolerance: number,
  shape: BlockShape = DEFAULT_BLOCK_SHAPE,
): HouseholderQR & { blocks: ReflectorBlock[] } {
  const n = rows;
  const q = candidates.length;
  const work = new Float64Array(n * q);
  for (let c = 0; c < q; c++) {
    const src = columns[candidates[c]];
    const off = c * n;
    for (let i = 0; i < n; i++) work[off + i] = src[i];
  }
  const accepted: number[] = [];
  const aliased: number[] = [];
  const rdiag = new Float64Array(q);
  const beta = new Float64Array(q);
  const remainingNorm = new Float64Array(q);
  const upto = new Int32Array(q);
  let next = 0;

  /** Apply reflectors upto[c]..k-1 to candidate c one at a time (dot, then update). */
  const catchUp = (c: number, k: number) => {
    const offD = c * n;
    for (let j = upto[c]; j < k; j++) {
      const offV = accepted[j] * n;
      let s = 0;
      for (let i = j; i < n; i++) s += work[offV + i] * work[offD + i];
      const f = s / beta[j];
      for (let i = j; i < n; i++) work[offD + i] -= f * work[offV + i];
    }
    upto[c] = k;
  };

  /** Decide candidate c at position k (as householderQR does); form its reflector when accepted. */
  const decide = (c: number, k: number): boolean => {
    const off = c * n;
    let ss = 0;
    for (let i = k; i < n; i++) ss += work[off + i] * work[off + i];
    const nrm = Math.sqrt(ss);
    const ref = referenceNorm[candidates[c]];
    remainingNorm[c] = ref > 0 ? nrm / ref : 0;
    if (k >= n || !(nrm > tolerance * ref) || !Number.isFinite(nrm)) return false;
    const x0 = work[off + k];
    const alpha = x0 >= 0 ? -nrm : nrm;
    const v0 = x0 - alpha;
    work[off + k] = v0;
    rdiag[k] = alpha;
    beta[k] = -alpha * v0;
    return true;
  };

  const reflectorOffsets = (k0: number, k1: number) => accepted.slice(k0, k1).map((c) => c * n);

  /** Reflectors k0..k1-1 (T their block factor) as one block onto the next `count` undecided candidates. */
  const blockOnto = (k0: number, k1: number, tm: Float64Array, count: number) => {
    const targets: number[] = [];
    for (let c = next; c < Math.min(q, next + count); c++) {
      if (upto[c] < k0) catchUp(c, k0);
      if (upto[c] === k0) {
        targets.push(c * n);
        upto[c] = k1;
      }
    }
    applyBlock(work, n, k0, reflectorOffsets(k0, k1), tm, work, targets, true);
  };

  /** Accept up to `want` more reflectors from the next candidates. */
  const factor = (want: number) => {
    if (want <= shape.leaf) {
      const goal = accepted.length + want;
      while (accepted.length < goal && next < q) {
        const c = next++;
        const k = accepted.length;
        catchUp(c, k);
        if (decide(c, k)) accepted.push(c);
        else aliased.push(c);
      }
      return;
    }
    const half = want >> 1;
    const k0 = accepted.length;
    factor(half);
    const k1 = accepted.length;
    if (next < q && k1 > k0) blockOnto(k0, k1, blockFactor(work, n, k0, reflectorOffsets(k0, k1), beta), want - (k1 - k0));
    factor(want - (k1 - k0));
  };

  // Each top-level panel's block factor is kept: applyQt and applyQ use it too.
  const blocks: ReflectorBlock[] = [];
  while (next < q) {
    const k0 = accepted.length;
    factor(shape.panel);
    const k1 = accepted.length;
    if (k1 === k0) continue;
    const tm = blockFactor(work, n, k0, reflectorOffsets(k0, k1), beta);
    blocks.push({ start: k0, size: k1 - k0, t: tm });
    if (next < q) blockOnto(k0, k1, tm, q - next);
  }
  return { rows: n, rank: accepted.length, order: [...accepted, ...aliased], work, rdiag, beta, remainingNorm, blocks };
}
