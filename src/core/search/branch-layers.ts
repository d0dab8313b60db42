// The swept matrices of branch and bound. A node of the tree holds two: the
// lower model S (the terms decided in) and the upper model S + F (F: the terms
// still open). Lowers are only ever built by forward sweeps from the base in
// the order their path decided the terms (a parent's lower copied, one term
// swept in), so a lower is bit-identical to a fresh sweep of its terms in that
// order: the counting-order discipline of the exhaustive kernel. Uppers lose a term at each "out" decision by a
// reverse sweep (a downdate), which costs accuracy in proportion to the
// variance inflation of the pivot (reverse sweeps divide by the swept
// diagonal, -(X'X)^-1_kk). Each layer therefore carries `drift`, an estimate
// of the rounding in its residual sum of squares relative to the response's
// (one unit roundoff times d times the pivot's variance inflation factor per
// sweep, in or out: the usual first-order error growth of Gauss–Jordan steps),
// and an upper whose downdates have drifted past REBUILD_DRIFT is rebuilt by
// forward sweeps from its lower instead. On mildly correlated pools (inflation
// factors near 1) that never happens; on polynomial pools it happens at once,
// and every upper is then a fresh sweep too.

import { pivotUsable, sweepPivot } from './sweep.ts';
import type { BaseMatrix } from './subset-state.ts';
import type { SubsetProblem } from './types.ts';

export interface Layer {
  matrix: Float64Array;
  swept: Uint8Array;
  rank: number;
  aliased: number;
  /** Estimated rounding in the residual sum of squares, as a fraction of the response's sum of squares. */
  drift: number;
  /** The part of `drift` its reverse sweeps added since it was last a fresh forward sweep (0: fresh). */
  downdateDrift: number;
}

/** Unit roundoff of binary64. */
const UNIT_ROUNDOFF = 2 ** -53;

/** Downdate drift beyond which an upper is rebuilt by forward sweeps (relative to the response's sum of squares). */
export const REBUILD_DRIFT = 1e-11;

export function emptyLayer(d: number): Layer {
  return { matrix: new Float64Array(d * d), swept: new Uint8Array(d), rank: 0, aliased: 0, drift: 0, downdateDrift: 0 };
}

/** The base (always terms swept in) as a layer, written into `to`. */
export function baseInto(base: BaseMatrix, to: Layer): void {
  to.matrix.set(base.matrix);
  to.swept.set(base.swept);
  to.rank = base.rank;
  to.aliased = 0;
  to.drift = 0;
  to.downdateDrift = 0;
}

export function copyInto(from: Layer, to: Layer): void {
  to.matrix.set(from.matrix);
  to.swept.set(from.swept);
  to.rank = from.rank;
  to.aliased = from.aliased;
  to.drift = from.drift;
  to.downdateDrift = from.downdateDrift;
}

/** Sweeps pool term t's columns in (aliased ones, below the pivot tolerance, are counted and left out). */
export function sweepTermIn(problem: SubsetProblem, base: BaseMatrix, layer: Layer, t: number): void {
  const d = problem.dimension;
  const a = layer.matrix;
  for (const c of problem.poolBlocks[t]) {
    if (pivotUsable(a, d, c, base.original[c])) {
      layer.drift += UNIT_ROUNDOFF * d * (base.original[c] / a[c * d + c]);
      sweepPivot(a, d, c, 1);
      layer.swept[c] = 1;
      layer.rank++;
    } else {
      layer.aliased++;
    }
  }
}

/**
 * Removes term t from an upper model by reverse sweeps; false (layer left
 * unusable) when the model has aliased columns. Removing t might free one
 * of them (aliased only through t), and which columns a model with aliases
 * holds depends on the order they came in, so such an upper is rebuilt by
 * forward sweeps from its lower instead of guessing.
 */
export function sweepTermOut(problem: SubsetProblem, base: BaseMatrix, layer: Layer, t: number): boolean {
  if (layer.aliased > 0) return false;
  const d = problem.dimension;
  const a = layer.matrix;
  const block = problem.poolBlocks[t];
  for (let i = block.length - 1; i >= 0; i--) {
    const c = block[i];
    const added = UNIT_ROUNDOFF * d * (-a[c * d + c] * base.original[c]);
    layer.drift += added;
    layer.downdateDrift += added;
    sweepPivot(a, d, c, -1);
    layer.swept[c] = 0;
    layer.rank--;
  }
  return true;
}

/** The residual sum of squares of a layer's model (the response's diagonal). */
export function layerRss(layer: Layer, d: number): number {
  return layer.matrix[d * d - 1];
}
