// Householder QR of a tall, thin matrix V (n x p, n >> p) streamed through
// in blocks of rows, and the rows of Q = V R^-1 formed block by block.
//
// Each block of rows is stacked under the current R and triangularised by p
// Householder reflections (the sequential form of "tall-skinny QR": Demmel,
// Grigori, Hoemmen & Langou 2012). That is Householder QR of V itself, so it
// is backward stable whatever the conditioning (V + dV = Q R with
// |dV| ~ eps |V|), at 2np^2 flops like any Householder QR; but a block of
// rows and R stay in cache, where modified Gram–Schmidt twice sweeps every
// column through memory about p^2 times (measured ~3x slower at 100,000 x 31).
// No Q is stored: the rows of Q are recomputed from R when asked for, so the
// memory is one block, not n x p.
//
// The columns are scaled to unit 2-norm first (V = sqrt(W) X D^-1), which
// makes R, its singular values and the tolerances free of the data's units.

/** Rows per block: a block of 31 columns stays in the L1/L2 cache (measured fastest between 64 and 256). */
const BLOCK_ROWS = 128;

export interface ScaledColumns {
  rows: number;
  /** Column values; `low` (double-double design) is added once, in double. */
  high: readonly ArrayLike<number>[];
  low: readonly (ArrayLike<number> | null)[];
  /** sqrt(w_i) per row, or null for unit weights. */
  rowScale: Float64Array | null;
  /** A value subtracted from each column before the row scaling (its centre), or null for none. */
  centre: Float64Array | null;
  /** 2-norm of each row-scaled (centred) column; a zero column has 0. */
  scale: Float64Array;
}

/** sqrt(w_i) with a weight that is not a positive finite number taken as 0 (the fit leaves such rows out). */
export function rowScaleOf(weights: ArrayLike<number> | undefined, rows: number): Float64Array | null {
  if (weights === undefined) return null;
  const s = new Float64Array(rows);
  for (let i = 0; i < rows; i++) {
    const w = weights[i];
    s[i] = w > 0 && Number.isFinite(w) ? Math.sqrt(w) : 0;
  }
  return s;
}

/**
 * The row-scaled columns and their 2-norms (two passes, so no square can
 * overflow). A column's value is (high - centre) + low, so a centre near the
 * values costs no digits of the low part.
 */
export function scaledColumns(
  high: readonly ArrayLike<number>[],
  low: readonly (ArrayLike<number> | null)[],
  rowScale: Float64Array | null,
  rows: number,
  centre: Float64Array | null = null,
): ScaledColumns {
  const scale = new Float64Array(high.length);
  const value = new Float64Array(rows);
  for (let j = 0; j < high.length; j++) {
    const h = high[j], l = low[j], c = centre ? centre[j] : 0;
    let max = 0;
    for (let i = 0; i < rows; i++) {
      const x = (rowScale ? rowScale[i] : 1) * (l ? h[i] - c + l[i] : h[i] - c);
      value[i] = x;
      const a = Math.abs(x);
      if (a > max) max = a;
    }
    if (!(max > 0) || !Number.isFinite(max)) continue;
    let s = 0;
    for (let i = 0; i < rows; i++) {
      const a = value[i] / max;
      s += a * a;
    }
    scale[j] = max * Math.sqrt(s);
  }
  return { rows, high, low, rowScale, centre, scale };
}

/** sum_i w_i x_ij / sum_i w_i per column (in double: a centre need only be near the mean). */
export function weightedMeans(
  high: readonly ArrayLike<number>[],
  low: readonly (ArrayLike<number> | null)[],
  rowScale: Float64Array | null,
  rows: number,
): Float64Array {
  const means = new Float64Array(high.length);
  let total = 0;
  for (let i = 0; i < rows; i++) total += rowScale ? rowScale[i] * rowScale[i] : 1;
  if (!(total > 0)) return means;
  for (let j = 0; j < high.length; j++) {
    const h = high[j], l = low[j];
    let s = 0;
    for (let i = 0; i < rows; i++) s += (rowScale ? rowScale[i] * rowScale[i] : 1) * (l ? h[i] + l[i] : h[i]);
    means[j] = s / total;
  }
  return means;
}

/** Rows [start, start + length) of the unit-length columns into block (column-major, stride BLOCK_ROWS). */
function loadBlock(v: ScaledColumns, start: number, length: number, block: Float64Array): void {
  for (let j = 0; j < v.high.length; j++) {
    const h = v.high[j], l = v.low[j], s = v.rowScale;
    const c = v.centre ? v.centre[j] : 0;
    const inv = v.scale[j] > 0 ? 1 / v.scale[j] : 0;
    const o = j * BLOCK_ROWS;
    for (let i = 0; i < length; i++) {
      const x = l ? h[start + i] - c + l[start + i] : h[start + i] - c;
      block[o + i] = (s ? s[start + i] * x : x) * inv;
    }
  }
}

/**
 * R (p x p, row-major, r[k * p + l] for l >= k) of the unit-length columns,
 * with a non-negative diagonal. r_kk is the length left of column k once the
 * earlier columns are projected out: near 0 means dependent.
 */
export function streamedR(v: ScaledColumns): Float64Array {
  const p = v.high.length;
  const r = new Float64Array(p * p);
  const block = new Float64Array(p * BLOCK_ROWS);
  for (let start = 0; start < v.rows; start += BLOCK_ROWS) {
    const length = Math.min(BLOCK_ROWS, v.rows - start);
    loadBlock(v, start, length, block);
    for (let k = 0; k < p; k++) {
      const ok = k * BLOCK_ROWS;
      let below = 0;
      for (let i = 0; i < length; i++) below += block[ok + i] * block[ok + i];
      if (below === 0) continue;
      // Reflection of [r_kk; block column k] onto beta e_1, sign chosen against cancellation.
      const alpha = r[k * p + k];
      const norm = Math.sqrt(alpha * alpha + below);
      const beta = alpha > 0 ? -norm : norm;
      const head = alpha - beta;
      const tau = (beta - alpha) / beta;
      const inv = 1 / head;
      for (let i = 0; i < length; i++) block[ok + i] *= inv;
      r[k * p + k] = beta;
      let j = k + 1;
      // Four later columns per sweep: the reflection vector is read a quarter as often.
      for (; j + 3 < p; j += 4) {
        const oa = j * BLOCK_ROWS, ob = oa + BLOCK_ROWS, oc = ob + BLOCK_ROWS, od = oc + BLOCK_ROWS;
        let sa = r[k * p + j], sb = r[k * p + j + 1], sc = r[k * p + j + 2], sd = r[k * p + j + 3];
        for (let i = 0; i < length; i++) {
          const u = block[ok + i];
          sa += u * block[oa + i];
          sb += u * block[ob + i];
          sc += u * block[oc + i];
          sd += u * block[od + i];
        }
        sa *= tau; sb *= tau; sc *= tau; sd *= tau;
        r[k * p + j] -= sa;
        r[k * p + j + 1] -= sb;
        r[k * p + j + 2] -= sc;
        r[k * p + j + 3] -= sd;
        for (let i = 0; i < length; i++) {
          const u = block[ok + i];
          block[oa + i] -= sa * u;
          block[ob + i] -= sb * u;
          block[oc + i] -= sc * u;
          block[od + i] -= sd * u;
        }
      }
      for (; j < p; j++) {
        const oj = j * BLOCK_ROWS;
        let s = r[k * p + j];
        for (let i = 0; i < length; i++) s += block[ok + i] * block[oj + i];
        s *= tau;
        r[k * p + j] -= s;
        for (let i = 0; i < length; i++) block[oj + i] -= s * block[ok + i];
      }
    }
  }
  for (let k = 0; k < p; k++) {
    if (r[k * p + k] >= 0) continue;
    for (let l = k; l < p; l++) r[k * p + l] = -r[k * p + l];
  }
  return r;
}

/** Smallest r_kk over the diagonal (1 for no columns). */
export function smallestPivot(r: Float64Array, p: number): number {
  let min = 1;
  for (let k = 0; k < p; k++) min = Math.min(min, r[k * p + k]);
  return min;
}

/**
 * Visits the rows of Q = V R^-1 block by block: z holds rows
 * [start, start + length) column-major with stride `stride`. R must have a
 * positive diagonal. A triangular solve per row is backward stable, so the
 * rows of Q carry a relative error of about cond(V) * 1e-16.
 */
export function visitOrthonormalRows(
  v: ScaledColumns,
  r: Float64Array,
  visit: (start: number, length: number, z: Float64Array, stride: number) => void,
): void {
  const p = v.high.length;
  const z = new Float64Array(p * BLOCK_ROWS);
  const inverseDiagonal = new Float64Array(p);
  for (let k = 0; k < p; k++) inverseDiagonal[k] = 1 / r[k * p + k];
  for (let start = 0; start < v.rows; start += BLOCK_ROWS) {
    const length = Math.min(BLOCK_ROWS, v.rows - start);
    loadBlock(v, start, length, z);
    for (let k = 0; k < p; k++) {
      const ok = k * BLOCK_ROWS;
      let m = 0;
      // Four earlier columns per sweep: a quarter of the loads and stores of z_k.
      for (; m + 3 < k; m += 4) {
        const r0 = r[m * p + k], r1 = r[(m + 1) * p + k], r2 = r[(m + 2) * p + k], r3 = r[(m + 3) * p + k];
        const o0 = m * BLOCK_ROWS, o1 = o0 + BLOCK_ROWS, o2 = o1 + BLOCK_ROWS, o3 = o2 + BLOCK_ROWS;
        for (let i = 0; i < length; i++) {
          z[ok + i] -= r0 * z[o0 + i] + r1 * z[o1 + i] + r2 * z[o2 + i] + r3 * z[o3 + i];
        }
      }
      for (; m < k; m++) {
        const rmk = r[m * p + k];
        const om = m * BLOCK_ROWS;
        for (let i = 0; i < length; i++) z[ok + i] -= rmk * z[om + i];
      }
      const d = inverseDiagonal[k];
      for (let i = 0; i < length; i++) z[ok + i] *= d;
    }
    visit(start, length, z, BLOCK_ROWS);
  }
}

/** h_i = |Q_i|^2 and, for each vector u given, Q'u (one pass over the rows). */
export function leveragesAndProjections(
  v: ScaledColumns,
  r: Float64Array,
  vectors: readonly ArrayLike<number>[] = [],
  withLeverages = true,
): { leverages: Float64Array | null; projections: Float64Array[] } {
  const p = v.high.length;
  const leverages = withLeverages ? new Float64Array(v.rows) : null;
  const projections = vectors.map(() => new Float64Array(p));
  visitOrthonormalRows(v, r, (start, length, z, stride) => {
    for (let k = 0; k < p; k++) {
      const ok = k * stride;
      if (leverages) for (let i = 0; i < length; i++) leverages[start + i] += z[ok + i] * z[ok + i];
      for (let t = 0; t < vectors.length; t++) {
        const u = vectors[t];
        let s = 0;
        for (let i = 0; i < length; i++) s += z[ok + i] * u[start + i];
        projections[t][k] += s;
      }
    }
  });
  return { leverages, projections };
}
