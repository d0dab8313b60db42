// Householder QR with column pivoting by largest remaining norm (Businger &
// Golub 1965), J P = Q R, for the Levenberg–Marquardt subproblem. Unlike the
// linear engine's QR (src/core/fit), which keeps the caller's column order and
// sets dependent columns aside, Moré's method needs R complete for every
// column, with any rank deficiency pushed to the trailing diagonal, so that
// the damped system (R; sqrt(λ) D P) stays solvable.

export interface PivotedQR {
  /** Columns factorised. */
  cols: number;
  /** Row-major cols x cols: R on and above the diagonal; below it is workspace for lmParameter. */
  r: Float64Array;
  /** Column k of R belongs to column pivot[k] of the input. */
  pivot: Int32Array;
  /** The first `cols` entries of Q^T f. */
  qtf: Float64Array;
}

/**
 * Factorises the n x q column-major matrix `a` (overwritten) and applies
 * Q^T to f (not modified).
 */
export function pivotedQR(a: Float64Array, n: number, q: number, f: Float64Array): PivotedQR {
  const pivot = new Int32Array(q);
  for (let j = 0; j < q; j++) pivot[j] = j;
  const qf = f.slice();
  const r = new Float64Array(q * q);
  // Remaining norms, downdated after each step as LAPACK's dgeqp3 does, and
  // recomputed once cancellation could have eaten half their digits.
  const partial = new Float64Array(q);
  const reference = new Float64Array(q);
  for (let j = 0; j < q; j++) partial[j] = reference[j] = columnNorm(a, n, j, 0);
  const steps = Math.min(n, q);
  for (let k = 0; k < steps; k++) {
    let best = k;
    for (let j = k + 1; j < q; j++) if (partial[j] > partial[best]) best = j;
    if (best !== k) {
      swapColumns(a, n, k, best);
      swapEntries(pivot, k, best);
      swapEntries(partial, k, best);
      swapEntries(reference, k, best);
    }
    const off = k * n;
    const norm = columnNorm(a, n, k, k);
    if (norm === 0) continue; // the rest is zero: R's trailing block stays zero
    const x0 = a[off + k];
    const alpha = x0 >= 0 ? -norm : norm;
    const v0 = x0 - alpha;
    a[off + k] = v0;
    const beta = -alpha * v0; // v'v / 2
    // Columns two at a time: one pass over v serves both dot products and
    // both updates, halving the reads of v (the loops are memory-bound on
    // tall Jacobians). Each column's arithmetic is the same as one at a time.
    let j0 = k + 1;
    for (; j0 + 1 < q; j0 += 2) {
      const o1 = j0 * n;
      const o2 = o1 + n;
      let s1 = 0;
      let s2 = 0;
      for (let i = k; i < n; i++) {
        const v = a[off + i];
        s1 += v * a[o1 + i];
        s2 += v * a[o2 + i];
      }
      const c1 = s1 / beta;
      const c2 = s2 / beta;
      for (let i = k; i < n; i++) {
        const v = a[off + i];
        a[o1 + i] -= c1 * v;
        a[o2 + i] -= c2 * v;
      }
    }
    if (j0 < q) {
      const offj = j0 * n;
      let s = 0;
      for (let i = k; i < n; i++) s += a[off + i] * a[offj + i];
      const c = s / beta;
      for (let i = k; i < n; i++) a[offj + i] -= c * a[off + i];
    }
    for (let j = k + 1; j < q; j++) {
      const offj = j * n;
      if (partial[j] !== 0) {
        const ratio = Math.abs(a[offj + k]) / partial[j];
        const shrink = Math.max(0, (1 + ratio) * (1 - ratio));
        if (shrink * (partial[j] / reference[j]) ** 2 <= DOWNDATE_LIMIT) {
          partial[j] = reference[j] = columnNorm(a, n, j, k + 1);
        } else {
          partial[j] *= Math.sqrt(shrink);
        }
      }
    }
    let s = 0;
    for (let i = k; i < n; i++) s += a[off + i] * qf[i];
    const c = s / beta;
    for (let i = k; i < n; i++) qf[i] -= c * a[off + i];
    r[k * q + k] = alpha;
  }
  for (let k = 0; k < steps; k++) {
    for (let j = k + 1; j < q; j++) r[k * q + j] = a[j * n + k];
  }
  const qtf = new Float64Array(q);
  qtf.set(qf.subarray(0, steps));
  return { cols: q, r, pivot, qtf };
}

/** sqrt(eps): below this fraction of its last computed value a downdated norm is recomputed (LAPACK's tol3z). */
const DOWNDATE_LIMIT = Math.sqrt(Number.EPSILON);

function columnNorm(a: Float64Array, n: number, j: number, from: number): number {
  const off = j * n;
  let s = 0;
  for (let i = from; i < n; i++) s += a[off + i] * a[off + i];
  return Math.sqrt(s);
}

function swapEntries(v: Int32Array | Float64Array, j: number, k: number): void {
  const t = v[j];
  v[j] = v[k];
  v[k] = t;
}

function swapColumns(a: Float64Array, n: number, j: number, k: number): void {
  const oj = j * n;
  const ok = k * n;
  for (let i = 0; i < n; i++) {
    const t = a[oj + i];
    a[oj + i] = a[ok + i];
    a[ok + i] = t;
  }
}
